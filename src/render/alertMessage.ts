import { encodeMuteValue, placeKeyOf } from './actionValues.ts';
import { HAINES_LABEL } from './hainesWording.ts';
import { formatLocalDateHour } from './localTime.ts';
import type { Message } from './message.ts';
import type { RenderOptions } from './renderOptions.ts';
import { buildMessage } from './safetyFooter.ts';
import { sourceLine } from './sourceLine.ts';
import {
  formatCHaines,
  formatHdw,
  formatHeightAgl,
  formatPft,
  formatRelativeHumidity,
  formatVentilation,
  formatWindSpeed,
  type UnitSystem,
} from './units.ts';

/** The id of the headline rule: the mixed layer reaching a dry near-dry-adiabatic layer. */
export const HEADLINE_RULE_ID = 'mixing-reaches-dry-layer';

/** What kind of quantity an alert's value and threshold are; sets the unit and the words. */
export type AlertValueKind =
  | 'height'
  | 'wind-speed'
  | 'ventilation'
  | 'relative-humidity'
  | 'hdw'
  | 'c-haines'
  | 'pft'
  | 'haines';

/** Everything an alert says. Values are in the project's units: m, m/s, m²/s, %, GW. */
export interface AlertContent {
  ruleId: string;
  /** The rule in plain words, e.g. "Mixing reaches the dry layer aloft". */
  ruleName: string;
  severity: Message['severity'];
  placeName: string;
  latitude: number;
  longitude: number;
  /** Stable key of the place for the mute button; the point to four decimals when absent. */
  placeKey?: string;
  /** IANA zone of the place, e.g. "America/Boise". */
  timeZone: string;
  /** Forecast hour the crossing is for, ISO 8601 instant. */
  validTime: string;
  value: number;
  valueKind: AlertValueKind;
  threshold: number;
  direction: 'rising' | 'falling';
  /** Name of the quantity in the first line; a sensible one per kind when absent. */
  quantityLabel?: string;
  /** What the threshold is, when it is not a fixed value, e.g. "the base of the dry layer aloft". */
  thresholdLabel?: string;
  /** One more line after the first, e.g. how deep mixing runs once it couples. */
  consequenceLine?: string;
  model: string;
  runTime: string;
  sourceName: string;
  invented: boolean;
  /** Button value for muting; built from the rule id and place key when absent. */
  muteValue?: string;
}

const QUANTITY: Record<AlertValueKind, string> = {
  height: 'Mixing height',
  'wind-speed': 'Transport wind',
  ventilation: 'Ventilation',
  'relative-humidity': 'Driest mixed-layer humidity',
  hdw: 'Hot-Dry-Windy Index',
  'c-haines': 'Continuous Haines',
  pft: 'PyroCb Firepower Threshold',
  haines: `Haines Index (${HAINES_LABEL})`,
};

export function formatAlertValue(value: number, kind: AlertValueKind, units: UnitSystem): string {
  switch (kind) {
    case 'height':
      return formatHeightAgl(value, units);
    case 'wind-speed':
      return formatWindSpeed(value, units);
    case 'ventilation':
      return formatVentilation(value, units);
    case 'relative-humidity':
      return formatRelativeHumidity(value);
    case 'hdw':
      return formatHdw(value);
    case 'c-haines':
      return formatCHaines(value);
    case 'pft':
      return formatPft(value);
    case 'haines':
      return Number.isFinite(value) ? String(Math.round(value)) : 'n/a';
  }
}

/** What the crossing means on the ground, in one sentence. */
export function groundMeaning(alert: Pick<AlertContent, 'ruleId' | 'valueKind' | 'direction'>): string {
  if (alert.ruleId === HEADLINE_RULE_ID) {
    return 'Deep mixing brings dry air and stronger winds aloft down to the fire: expect erratic fire behaviour and a taller smoke column.';
  }
  if (/plume/.test(alert.ruleId)) {
    return 'The smoke plume can reach its condensation level and build cloud: watch for a column that grows fast and can collapse.';
  }
  const rising = alert.direction === 'rising';
  switch (alert.valueKind) {
    case 'height':
      return rising
        ? 'A deep mixed layer brings winds aloft down to the surface and lets the smoke column grow tall.'
        : 'A shallow mixed layer holds smoke near the ground; fire activity usually eases.';
    case 'wind-speed':
      return rising ? 'Stronger winds through the mixed layer: faster spread and smoke and embers carried farther.' : 'Winds through the mixed layer ease.';
    case 'ventilation':
      return rising ? 'Smoke mixes up and away more readily.' : 'Poor ventilation: smoke lingers near the ground.';
    case 'relative-humidity':
      return rising ? 'The mixed layer moistens; fine fuels take up moisture.' : 'Very dry air in the mixed layer: fine fuels dry out and ignite readily.';
    case 'hdw':
      return rising ? 'Hot, dry and windy near the ground: the atmosphere favours faster fire spread.' : 'Less hot, dry and windy near the ground.';
    case 'c-haines':
    case 'haines':
      return rising
        ? 'Dry air and a steep lapse rate aloft: a plume can grow tall and fire behaviour can turn erratic.'
        : 'Air aloft is moister or its lapse rate gentler.';
    case 'pft':
      return rising
        ? 'A pyrocumulonimbus needs more fire power than before.'
        : 'Less fire power is needed for a pyrocumulonimbus: a large, intense fire could build its own thunderstorm cloud.';
  }
}

/**
 * An alert: a headline, at most four lines, the footer. Names the rule in plain words, the place,
 * the forecast hour in the place's local time, the value against the threshold, what it means on
 * the ground, and the model run.
 */
export function buildAlertMessage(alert: AlertContent, units: UnitSystem, options: RenderOptions = {}): Message {
  const when = formatLocalDateHour(alert.validTime, alert.timeZone);
  const value = formatAlertValue(alert.value, alert.valueKind, units);
  const threshold = formatAlertValue(alert.threshold, alert.valueKind, units);
  const quantity = alert.quantityLabel ?? QUANTITY[alert.valueKind] ?? 'Value';
  const thresholdName = alert.thresholdLabel ?? 'the threshold';
  const crossing = alert.direction === 'rising' ? `at or above ${thresholdName} of ${threshold}` : `at or below ${thresholdName} of ${threshold}`;
  const placeKey = alert.placeKey ?? placeKeyOf(alert.latitude, alert.longitude);
  return buildMessage(
    {
      kind: 'alert',
      title: `${alert.ruleName}: ${alert.placeName}, ${when}`,
      severity: alert.severity,
      inventedData: alert.invented,
      sections: [
        {
          lines: [
            `${quantity} ${value} at ${when}, ${crossing}.`,
            ...(alert.consequenceLine ? [alert.consequenceLine] : []),
            groundMeaning(alert),
            sourceLine(alert.model, alert.runTime, alert.sourceName, alert.invented),
          ],
        },
      ],
      actions: [
        {
          actionId: 'mute-rule',
          label: 'Mute this rule here for 6 h',
          value: alert.muteValue ?? encodeMuteValue(alert.ruleId, placeKey),
        },
      ],
    },
    options.footerLocalLine,
  );
}
