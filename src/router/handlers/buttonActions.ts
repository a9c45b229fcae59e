import { parseDetailValue, parseMuteValue } from '../../render/actionValues.ts';
import type { Message } from '../../render/message.ts';
import { locationKeyOf } from '../../store/storeKeys.ts';
import type { Rule } from '../../watch/rules/rule.ts';
import { errorMessage, NEEDS_MANAGE_CHANNEL } from '../replies.ts';
import { describePoint } from '../resolvePlace.ts';
import type { HandlerContext } from '../routerContext.ts';
import { showDetailAt } from './forecastCommands.ts';
import { endMute, muteAt, shippedRule } from './ruleCommands.ts';

/** The rule and point a mute button (or its end button) names, or the message that says what is wrong with it. */
function mutedRuleAt(context: HandlerContext, rawValue: string): { ok: true; rule: Rule; latitudeDeg: number; longitudeDeg: number } | { ok: false; message: Message } {
  const parsed = parseMuteValue(rawValue);
  if (!parsed.ok) return { ok: false, message: errorMessage(parsed.message, context.localFooterLine) };
  const { ruleId, placeKey } = parsed.value;
  const rule = shippedRule(context, ruleId);
  if (!rule) return { ok: false, message: errorMessage(`The button names an unknown rule "${ruleId}". Nothing was changed.`, context.localFooterLine) };
  const point = /^(-?\d+(?:\.\d+)?),(-?\d+(?:\.\d+)?)$/.exec(placeKey);
  if (!point) return { ok: false, message: errorMessage(`The button names an unknown place "${placeKey}". Nothing was changed.`, context.localFooterLine) };
  return { ok: true, rule, latitudeDeg: Number(point[1]), longitudeDeg: Number(point[2]) };
}

/** The alert's mute button: the rule at the alert's point. */
export async function muteRule(context: HandlerContext, rawValue: string): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const target = mutedRuleAt(context, rawValue);
  if (!target.ok) return target.message;
  const { rule, latitudeDeg, longitudeDeg } = target;
  const locationKey = locationKeyOf(latitudeDeg, longitudeDeg);
  return muteAt(context, rule, { displayName: describePoint(latitudeDeg, longitudeDeg), savedName: null, latitudeDeg, longitudeDeg, elevationM: null, locationKey });
}

/** The mute notice's button: ends that mute now, as `unmute RULE LAT,LON` does. */
export async function endMuteFromButton(context: HandlerContext, rawValue: string): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const target = mutedRuleAt(context, rawValue);
  if (!target.ok) return target.message;
  return endMute(context, target.rule.id, { kind: 'point', latitudeDeg: target.latitudeDeg, longitudeDeg: target.longitudeDeg });
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
