/** How urgent a rule's message is; encoders may colour by it. */
export type RuleSeverity = 'info' | 'watch' | 'warning';

export const RULE_IDS = [
  'mixing-reaches-dry-layer',
  'effective-mixing-height-above',
  'hdw-above',
  'c-haines-above',
  'pft-below',
  'mixed-layer-rh-below',
  'transport-wind-above',
  'plume-cloud-possible',
] as const;

export type RuleId = (typeof RULE_IDS)[number];

/** A rule as configured: defaults from config/rules.yaml, possibly with a channel's overrides merged in. */
export interface Rule {
  id: RuleId;
  /** Plain words, e.g. "Mixed layer reaches a dry layer aloft". */
  name: string;
  severity: RuleSeverity;
  /** The value at which the rule turns on, in `unit`. */
  threshold: number;
  /** How far back past the threshold the value must go before the rule turns off, in `unit`. */
  hysteresis: number;
  unit: string;
  enabled: boolean;
}

export function isRuleId(text: string): text is RuleId {
  return (RULE_IDS as readonly string[]).includes(text);
}
