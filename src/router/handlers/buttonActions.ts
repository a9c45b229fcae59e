import { parseDetailValue, parseMuteValue } from '../../render/actionValues.ts';
import type { Message } from '../../render/message.ts';
import { locationKeyOf } from '../../store/storeKeys.ts';
import { isRuleId } from '../../watch/rules/rule.ts';
import { errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import { describePoint } from '../resolvePlace.ts';
import type { HandlerContext } from '../routerContext.ts';
import { showDetailAt } from './forecastCommands.ts';

/** How long the mute button silences a rule at a place (common practice: one operational period's half). */
export const MUTE_DURATION_MS = 6 * 3_600_000;

export async function muteRule(context: HandlerContext, rawValue: string): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const parsed = parseMuteValue(rawValue);
  if (!parsed.ok) return errorMessage(parsed.message, context.localFooterLine);
  const { ruleId, placeKey } = parsed.value;
  const rule = context.defaultRules.find((candidate) => candidate.id === ruleId);
  if (!isRuleId(ruleId) || !rule) return errorMessage(`The button names an unknown rule "${ruleId}". Nothing was changed.`, context.localFooterLine);
  const point = /^(-?\d+(?:\.\d+)?),(-?\d+(?:\.\d+)?)$/.exec(placeKey);
  if (!point) return errorMessage(`The button names an unknown place "${placeKey}". Nothing was changed.`, context.localFooterLine);
  const locationKey = locationKeyOf(Number(point[1]), Number(point[2]));
  const untilMs = context.nowMs() + MUTE_DURATION_MS;
  await context.store.rules.setMute(context.channel.id, ruleId, locationKey, untilMs, context.nowMs());
  const lines = [
    'Other rules and places still alert. When the mute ends, its warnings that still stand are posted here again.',
    // The button's point, which the command resolves to the same location key.
    `End it early: \`unmute ${ruleId} ${placeKey}\``,
  ];
  return noticeMessage(`Muted "${rule.name}" at ${describePoint(Number(point[1]), Number(point[2]))} for 6 hours (until ${new Date(untilMs).toISOString().slice(11, 16)}Z).`, lines, context.localFooterLine);
}

export async function detailFromButton(context: HandlerContext, rawValue: string): Promise<Message> {
  const parsed = parseDetailValue(rawValue);
  if (!parsed.ok) return errorMessage(parsed.message, context.localFooterLine);
  const { latitude, longitude, validTime } = parsed.value;
  const saved = (await context.store.places.listPlaces(context.channel.id)).find(
    (place) => locationKeyOf(place.latitudeDeg, place.longitudeDeg) === locationKeyOf(latitude, longitude),
  );
  return showDetailAt(
    context,
    {
      displayName: saved?.name ?? describePoint(latitude, longitude),
      savedName: saved?.name ?? null,
      latitudeDeg: latitude,
      longitudeDeg: longitude,
      elevationM: saved?.elevationM ?? null,
      locationKey: locationKeyOf(latitude, longitude),
    },
    validTime,
  );
}
