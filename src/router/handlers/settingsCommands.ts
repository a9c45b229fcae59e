import type { Message } from '../../render/message.ts';
import { CANNOT_POST_HERE, errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import type { HandlerContext } from '../routerContext.ts';

export async function setMorningTime(context: HandlerContext, localTime: string | null): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  if (localTime !== null && context.request.botCanPost === false) return errorMessage(CANNOT_POST_HERE, context.localFooterLine);
  await context.store.channels.setSummaryLocalTime(context.channel.id, localTime, context.nowMs());
  if (localTime === null) return noticeMessage('Morning summary off for this channel.', [], context.localFooterLine);
  // Summaries are posted by the bot: the adapter checks it can post here (as for a watch).
  return { ...noticeMessage(`Morning summary at ${localTime}, in each watched place's own time zone.`, [], context.localFooterLine), postsToChannel: true };
}

export async function setUnits(context: HandlerContext, unitSystem: 'metric' | 'us'): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  await context.store.channels.setUnitSystem(context.channel.id, unitSystem, context.nowMs());
  return noticeMessage(unitSystem === 'us' ? 'Units: US customary (ft, mph, °F).' : 'Units: metric (m, km/h, °C).', [], context.localFooterLine);
}
