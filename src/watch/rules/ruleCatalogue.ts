import { lowestDryLayerAloft } from '../dryLayerAloft.ts';
import type { HourAssessment } from '../seriesAssessment.ts';
import type { RuleId } from './rule.ts';

/**
 * What each rule measures. Config chooses names, severities, thresholds and hysteresis; the code
 * fixes what quantity a rule reads, which way it trips and in what unit, so a config file cannot
 * point a rule at the wrong number.
 */
export interface RuleMeasure {
  /** The rule's value for an hour, in `unit`; null when it cannot apply (the rule is then off). */
  valueOf: (hour: HourAssessment) => number | null;
  /** 'at-or-above': on when value ≥ threshold; 'at-or-below': on when value ≤ threshold. */
  comparison: 'at-or-above' | 'at-or-below';
  unit: string;
  /** What the value is, in plain words, for messages. */
  valueLabel: string;
  thresholdRange: readonly [number, number];
  hysteresisRange: readonly [number, number];
  /** True for rules about the depth of mixing: an update deeper by 500 m is material for them. */
  concernsMixingDepth: boolean;
}

/** The base to reach: set by assessSeries; for a hand-built hour, the lowest layer aloft. */
function dryLayerAloftBaseAglM(hour: HourAssessment): number | null {
  if (hour.dryLayerAloftBaseAglM !== undefined) return hour.dryLayerAloftBaseAglM;
  return lowestDryLayerAloft(hour.dryNearAdiabaticLayers)?.baseAglM ?? null;
}

export const RULE_MEASURES: Readonly<Record<RuleId, RuleMeasure>> = {
  // Coupling as DESIGN.md defines it: mixing height at or above the base of the dry layer aloft
  // (see markCouplingAloft). The value is the margin, so a threshold below 0 warns before the
  // mixed layer gets there.
  'mixing-reaches-dry-layer': {
    valueOf: (hour) => {
      const baseAglM = dryLayerAloftBaseAglM(hour);
      return baseAglM === null ? null : hour.mixingHeightAglM - baseAglM;
    },
    comparison: 'at-or-above',
    unit: 'm',
    valueLabel: 'mixing height above the base of the dry near-dry-adiabatic layer aloft',
    thresholdRange: [-3000, 3000],
    hysteresisRange: [0, 2000],
    concernsMixingDepth: true,
  },
  'effective-mixing-height-above': {
    valueOf: (hour) => hour.effectiveMixingHeightAglM,
    comparison: 'at-or-above',
    unit: 'm',
    valueLabel: 'effective mixing height (after coupling) above ground',
    thresholdRange: [0, 15000],
    hysteresisRange: [0, 3000],
    concernsMixingDepth: true,
  },
  'hdw-above': {
    valueOf: (hour) => hour.hdw,
    comparison: 'at-or-above',
    unit: 'hPa·m/s',
    valueLabel: 'Hot-Dry-Windy Index',
    thresholdRange: [0, 5000],
    hysteresisRange: [0, 1000],
    concernsMixingDepth: false,
  },
  'c-haines-above': {
    valueOf: (hour) => hour.cHaines,
    comparison: 'at-or-above',
    unit: 'index',
    valueLabel: 'Continuous Haines (a dryness-and-lapse-rate index)',
    thresholdRange: [0, 13],
    hysteresisRange: [0, 5],
    concernsMixingDepth: false,
  },
  // PFT null means no pyroCb is possible within the profile: the rule is off.
  'pft-below': {
    valueOf: (hour) => hour.pftGw,
    comparison: 'at-or-below',
    unit: 'GW',
    valueLabel: 'PyroCb Firepower Threshold',
    thresholdRange: [0, 100000],
    hysteresisRange: [0, 10000],
    concernsMixingDepth: false,
  },
  'mixed-layer-rh-below': {
    valueOf: (hour) => hour.mixedLayerMinRelativeHumidityPct,
    comparison: 'at-or-below',
    unit: '%',
    valueLabel: 'lowest relative humidity in the mixed layer',
    thresholdRange: [0, 100],
    hysteresisRange: [0, 30],
    concernsMixingDepth: false,
  },
  'transport-wind-above': {
    valueOf: (hour) => hour.transportWind.speedMs,
    comparison: 'at-or-above',
    unit: 'm/s',
    valueLabel: 'transport wind speed',
    thresholdRange: [0, 80],
    hysteresisRange: [0, 20],
    concernsMixingDepth: false,
  },
  // DESIGN.md: mixing height at or above the surface parcel's LCL; the value is the margin.
  'plume-cloud-possible': {
    valueOf: (hour) => hour.mixingHeightAglM - hour.lclHeightAglM,
    comparison: 'at-or-above',
    unit: 'm',
    valueLabel: 'mixing height above the lifting condensation level',
    thresholdRange: [-3000, 3000],
    hysteresisRange: [0, 2000],
    concernsMixingDepth: false,
  },
};
