import { encodeMuteValue } from '../../render/actionValues.ts';
import type { Message } from '../../render/message.ts';
import { buildMessage } from '../../render/safetyFooter.ts';
import { locationKeyOf } from '../../store/storeKeys.ts';
import { ALL_LOCATIONS, type Mute } from '../../store/storeTypes.ts';
import { ruleValueProblems } from '../../watch/rules/checkRuleValues.ts';
import { isRuleId, RULE_IDS, type Rule } from '../../watch/rules/rule.ts';
import { CANNOT_POST_HERE, errorMessage, NEEDS_MANAGE_CHANNEL, noticeMessage } from '../replies.ts';
import type { PlaceRef } from '../commandGrammar.ts';
import { describePoint, resolvePlace, type ResolvedPlace } from '../resolvePlace.ts';
import type { HandlerContext } from '../routerContext.ts';

/** How long a mute silences a rule at a place (common practice: one operational period's half). */
export const MUTE_DURATION_MS = 6 * 3_600_000;

/**
 * Where a mute holds, as people read it: the channel's saved name for the point, else a place name
 * the source knows (the demo's invented places), else the point; or everywhere.
 */
async function muteLocationNames(context: HandlerContext, mutes: readonly Mute[]): Promise<Map<string, string>> {
  const known = new Map<string, string>();
  for (const name of context.suggestedPlaceNames) {
    const place = context.findNamedPlace(name);
    if (place) known.set(locationKeyOf(place.latitude, place.longitude), name);
  }
  // Saved names last, so that they win over the source's.
  for (const place of await context.store.places.listPlaces(context.channel.id)) known.set(locationKeyOf(place.latitudeDeg, place.longitudeDeg), place.name);
  const names = new Map<string, string>();
  for (const mute of mutes) {
    if (names.has(mute.locationKey)) continue;
    if (mute.locationKey === ALL_LOCATIONS) {
      names.set(mute.locationKey, 'all places');
      continue;
    }
    const [latitude, longitude] = mute.locationKey.split(',').map(Number);
    names.set(mute.locationKey, known.get(mute.locationKey) ?? (Number.isFinite(latitude) && Number.isFinite(longitude) ? describePoint(latitude!, longitude!) : mute.locationKey));
  }
  return names;
}

/** When a mute ends, "2026-08-14 21:00Z": in UTC, as a channel's places may lie in different time zones. */
function muteEnd(untilMs: number): string {
  return new Date(untilMs).toISOString().slice(0, 16).replace('T', ' ') + 'Z';
}

export async function listRules(context: HandlerContext): Promise<Message> {
  const overrides = new Map((await context.store.rules.listOverrides(context.channel.id)).map((override) => [override.ruleId, override]));
  const mutes = await context.store.rules.listActiveMutes(context.channel.id, context.nowMs());
  const lines = context.defaultRules.map((rule) => {
    const override = overrides.get(rule.id);
    const threshold = override
      ? `${override.thresholdValue} ${rule.unit} (this channel; default ${rule.threshold})`
      : `${rule.threshold} ${rule.unit}`;
    const state = rule.enabled ? rule.severity : 'off';
    return `\`${rule.id}\` ${rule.name}: ${threshold} [${state}]`;
  });
  const places = await muteLocationNames(context, mutes);
  for (const mute of mutes) lines.push(`muted: \`${mute.ruleId}\` at ${places.get(mute.locationKey)} until ${muteEnd(mute.untilMs)}`);
  const hints = ['Change one for this channel: `threshold hdw-above 300`; back to the default: `threshold hdw-above default`.'];
  if (mutes.length > 0) hints.push(`End a mute early: \`unmute ${mutes[0]!.ruleId}\` (everywhere) or with a place after the rule.`);
  return noticeMessage('Alert rules', [...lines, ...hints], context.localFooterLine);
}

/** The shipped rule with this id, or null: commands and buttons name rules by id. */
export function shippedRule(context: HandlerContext, ruleId: string): Rule | null {
  return (isRuleId(ruleId) && context.defaultRules.find((candidate) => candidate.id === ruleId)) || null;
}

/** The shipped rule with this id, or the message that lists the rules. */
function ruleNamed(context: HandlerContext, ruleId: string): { ok: true; rule: Rule } | { ok: false; message: Message } {
  const rule = shippedRule(context, ruleId);
  if (rule) return { ok: true, rule };
  return { ok: false, message: errorMessage(`There is no rule "${ruleId}". Rules: ${RULE_IDS.join(', ')}. Nothing was changed.`, context.localFooterLine) };
}

export async function setThreshold(context: HandlerContext, ruleId: string, value: number | 'default'): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const named = ruleNamed(context, ruleId);
  if (!named.ok) return named.message;
  const { rule } = named;
  if (value === 'default') {
    const cleared = await context.store.rules.clearOverride(context.channel.id, ruleId);
    return noticeMessage(cleared ? `${rule.name}: back to the default ${rule.threshold} ${rule.unit}.` : `${rule.name} already uses the default ${rule.threshold} ${rule.unit}.`, [], context.localFooterLine);
  }
  const problems = ruleValueProblems(rule.id, { threshold: value });
  if (problems.length > 0) {
    return errorMessage(`"${ruleId}" threshold ${problems[0].reason}. Nothing was changed. Try \`threshold ${ruleId} ${rule.threshold}\`.`, context.localFooterLine);
  }
  await context.store.rules.setOverride(context.channel.id, ruleId, value, null, context.nowMs());
  return noticeMessage(`${rule.name}: threshold ${value} ${rule.unit} for this channel (default ${rule.threshold}).`, [], context.localFooterLine);
}

/**
 * Mutes a rule at a place for six hours and says so, with the button and the command that end it
 * early. The mute button and `mute RULE PLACE` both come here; the caller has checked that the
 * asker may change the channel.
 */
export async function muteAt(context: HandlerContext, rule: Rule, place: ResolvedPlace, extraLines: string[] = []): Promise<Message> {
  const nowMs = context.nowMs();
  const untilMs = nowMs + MUTE_DURATION_MS;
  await context.store.rules.setMute(context.channel.id, rule.id, place.locationKey, untilMs, nowMs);
  const point = `${place.latitudeDeg},${place.longitudeDeg}`;
  const lines = [
    ...extraLines,
    'Other rules and places still alert. When the mute ends, its warnings that still stand are posted here again.',
    // A form the command takes: the saved name, else the point (which resolves to the same location key).
    `End it early with the button, or \`unmute ${rule.id} ${place.savedName ?? point}\``,
  ];
  return buildMessage(
    {
      kind: 'notice',
      title: `Muted "${rule.name}" at ${place.displayName} for 6 hours (until ${new Date(untilMs).toISOString().slice(11, 16)}Z).`,
      sections: [{ lines }],
      actions: [{ actionId: 'end-mute', label: 'End this mute', value: encodeMuteValue(rule.id, point) }],
    },
    context.localFooterLine,
  );
}

/** `mute RULE PLACE`: what the mute button does, for any rule, from the command line. */
export async function startMute(context: HandlerContext, ruleId: string, placeRef: PlaceRef): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const named = ruleNamed(context, ruleId);
  if (!named.ok) return named.message;
  const resolved = await resolvePlace(context, placeRef);
  if (!resolved.ok) return errorMessage(`${resolved.error} Nothing was changed.`, context.localFooterLine);
  const watched = (await context.store.watches.listWatches(context.channel.id)).some((watch) => watch.locationKey === resolved.place.locationKey);
  // Muting a place the channel does not watch holds all the same (it may be watched later); say so.
  const notWatched = watched ? [] : [`This channel does not watch ${resolved.place.displayName}; the mute holds if it starts to.`];
  return muteAt(context, named.rule, resolved.place, notWatched);
}

/**
 * Ends the channel's mutes of a rule now, at one place or (without one) everywhere. Its warnings
 * that still stand are told at the next alert check, as when a mute runs out (alertCheckCycle.ts).
 * That turns the bot's posts back on, so, as for a watch, it is refused where the platform says
 * the bot may not post, and its confirmation is marked for the adapter to post as the bot.
 * (A mute needs no such check: it only holds posts back.)
 */
export async function endMute(context: HandlerContext, ruleId: string, placeRef: PlaceRef | null): Promise<Message> {
  if (!context.request.canManageChannel) return errorMessage(NEEDS_MANAGE_CHANNEL, context.localFooterLine);
  const named = ruleNamed(context, ruleId);
  if (!named.ok) return named.message;
  if (context.request.botCanPost === false) return errorMessage(CANNOT_POST_HERE, context.localFooterLine);
  const { rule } = named;
  let where: { locationKey: string | null; name: string } = { locationKey: null, name: 'everywhere' };
  if (placeRef) {
    const resolved = await resolvePlace(context, placeRef);
    if (!resolved.ok) return errorMessage(`${resolved.error} Nothing was changed.`, context.localFooterLine);
    where = { locationKey: resolved.place.locationKey, name: `at ${resolved.place.displayName}` };
  }
  const nowMs = context.nowMs();
  const ended = await context.store.rules.endMutes(context.channel.id, ruleId, where.locationKey, nowMs);
  if (ended.length === 0) {
    const stillMuted = (await context.store.rules.listActiveMutes(context.channel.id, nowMs)).filter((mute) => mute.ruleId === ruleId);
    const places = await muteLocationNames(context, stillMuted);
    const lines = stillMuted.map((mute) => `muted at ${places.get(mute.locationKey)} until ${muteEnd(mute.untilMs)}`);
    return noticeMessage(`"${rule.name}" is not muted ${placeRef ? `${where.name} ` : ''}in this channel. Nothing was changed.`, lines, context.localFooterLine);
  }
  const places = await muteLocationNames(context, ended);
  const lines = placeRef ? [] : [`Mutes ended: ${ended.map((mute) => places.get(mute.locationKey)).join('; ')}.`];
  lines.push('Its warnings that still stand are posted here at the next alert check.');
  return { ...noticeMessage(`"${rule.name}" alerts again ${where.name}${placeRef ? '' : ' in this channel'}.`, lines, context.localFooterLine), postsToChannel: true };
}
