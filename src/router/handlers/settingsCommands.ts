import type { Message } from '../../render/message.ts';
import { errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function setMorningTime(context: HandlerContext, localTime: string | null): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  await context.store.channels.setSummaryLocalTime(context.channel.id, localTime, context.nowMs());
  return noticeMessage(
    localTime === null ? 'Morning summary off for this channel.' : `Morning summary at ${localTime}, in each watched place's own time zone.`,
    [],
    context.localFooterLine,
  );
}

export async function setUnits(context: HandlerContext, unitSystem: 'metric' | 'us'): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  await context.store.channels.setUnitSystem(context.channel.id, unitSystem, context.nowMs());
  return noticeMessage(unitSystem === 'us' ? 'Units: US customary (ft, mph, °F).' : 'Units: metric (m, km/h, °C).', [], context.localFooterLine);
}
