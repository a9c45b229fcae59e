import { encodeMuteValue, placeKeyOf } from './actionValues.ts';
import { formatAlertValue, groundMeaning, HEADLINE_RULE_ID, type AlertContent } from './alertMessage.ts';
import { formatLocalDateHour } from './localTime.ts';
import type { Message, MessageAction } from './message.ts';
import type { RenderOptions } from './renderOptions.ts';
import { buildMessage } from './safetyFooter.ts';
import { sourceLine } from './sourceLine.ts';
import type { UnitSystem } from './units.ts';
import { mostSevere, SEVERITY_RANK } from '../watch/rules/severityRank.ts';

/** Alert lines a digest lists before it says how many more there are: it must fit a phone screen. */
export const DIGEST_MAX_LINES = 8;
/** Mute buttons on a digest (Slack shows two such buttons on one message). */
const DIGEST_MAX_MUTES = 2;

/** One alert as a digest line: when, the rule, the value against its threshold. */
function digestLine(alert: AlertContent, units: UnitSystem): string {
  const when = formatLocalDateHour(alert.validTime, alert.timeZone);
  const value = formatAlertValue(alert.value, alert.valueKind, units);
  const threshold = formatAlertValue(alert.threshold, alert.valueKind, units);
  const side = alert.direction === 'rising' ? '≥' : '≤';
  return `${when} · ${alert.ruleName}: ${value} (${side} ${threshold})`;
}

/**
 * The alerts that stand for a place when a channel starts watching it, in one message instead of
 * one post each (a first check can find a dozen over 48 hours, which would bury the channel):
 * a headline with the count, the alerts in forecast order (the most severe first within an hour),
 * what the most severe one means on the ground, the model run, and mute buttons for the first
 * rules (the others by `mute RULE LAT,LON`). `alerts` are those of one place and one forecast
 * run, already in forecast order.
 */
export function buildAlertDigestMessage(alerts: readonly AlertContent[], units: UnitSystem, options: RenderOptions = {}): Message {
  const first = alerts[0];
  if (!first) throw new Error('an alert digest needs at least one alert');
  const severity = mostSevere(alerts.map((alert) => alert.severity));
  const shown = alerts.slice(0, DIGEST_MAX_LINES).map((alert) => digestLine(alert, units));
  const more = alerts.length - shown.length;
  if (more > 0) shown.push(`…and ${more} more; a lookup of the place shows the whole 48 hours.`);
  // What it means: the headline rule's words when it is among them, else the most severe alert's.
  const meaningOf = alerts.find((alert) => alert.ruleId === HEADLINE_RULE_ID) ?? alerts.find((alert) => alert.severity === severity) ?? first;
  const placeKey = first.placeKey ?? placeKeyOf(first.latitude, first.longitude);
  const muteOrder = [...alerts].sort((a, b) => Number(b.ruleId === HEADLINE_RULE_ID) - Number(a.ruleId === HEADLINE_RULE_ID) || SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity]);
  const actions: MessageAction[] = [];
  const buttoned = new Set<string>();
  for (const alert of muteOrder) {
    if (actions.length === DIGEST_MAX_MUTES) break;
    const value = alert.muteValue ?? encodeMuteValue(alert.ruleId, placeKey);
    if (actions.some((action) => action.value === value)) continue;
    actions.push({ actionId: 'mute-rule', label: `Mute "${alert.ruleName}" here for 6 h`, value });
    buttoned.add(alert.ruleId);
  }
  // Rules beyond the buttons can be muted by command, at the digest's point.
  const unbuttoned = [...new Set(muteOrder.map((alert) => alert.ruleId))].filter((ruleId) => !buttoned.has(ruleId));
  const muteOthers = unbuttoned.length === 0 ? [] : [`Mute another rule here: \`mute ${unbuttoned[0]} ${first.latitude},${first.longitude}\`${unbuttoned.length > 1 ? ` (or ${unbuttoned.slice(1).join(', ')})` : ''}.`];
  return buildMessage(
    {
      // A summary of alerts, not an alert: an alert is a headline and at most four lines.
      kind: 'summary',
      title: `${first.placeName}: ${alerts.length} alert${alerts.length === 1 ? '' : 's'} stand in the forecast`,
      severity,
      inventedData: alerts.some((alert) => alert.invented),
      sections: [
        { lines: shown },
        { lines: [groundMeaning(meaningOf), 'New crossings and material changes come as alerts of their own.', ...muteOthers, sourceLine(first.model, first.runTime, first.sourceName, first.invented)] },
      ],
      actions,
    },
    options.footerLocalLine,
  );
}
