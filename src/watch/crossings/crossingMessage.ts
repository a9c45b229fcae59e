import { formatLocalDateHourFast, formatRunTimeFast } from '../time/localLabel.ts';
import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Crossing } from './crossing.ts';

const grouped = new Intl.NumberFormat('en-US', { maximumFractionDigits: 1 });

/** A value in its rule's unit: heights to 10 m, the rest to one decimal. */
export function formatRuleValue(value: number | null, unit: string): string {
  if (value === null || !Number.isFinite(value)) return 'n/a';
  const rounded = unit === 'm' ? Math.round(value / 10) * 10 : Math.round(value * 10) / 10;
  const text = grouped.format(rounded === 0 ? 0 : rounded);
  return unit === 'index' ? text : unit === '%' ? `${text}%` : `${text} ${unit}`;
}

/** "threshold ≥ 0 m (turns off below -100 m)": the values the channel's rule used. */
export function thresholdPhrase(crossing: Pick<Crossing, 'threshold' | 'hysteresis' | 'unit' | 'comparison'>): string {
  const above = crossing.comparison === 'at-or-above';
  const clearAt = above ? crossing.threshold - crossing.hysteresis : crossing.threshold + crossing.hysteresis;
  return `threshold ${above ? '≥' : '≤'} ${formatRuleValue(crossing.threshold, crossing.unit)}, clears ${above ? 'below' : 'above'} ${formatRuleValue(clearAt, crossing.unit)}`;
}

/**
 * The crossing in plain words for the channel, in SI units (the rule's own); the render layer
 * converts units where a channel asks. Always states the threshold used.
 */
export function crossingMessage(crossing: Omit<Crossing, 'message'>, timeZone: string): string {
  const measure = RULE_MEASURES[crossing.ruleId];
  const when = formatLocalDateHourFast(crossing.validTime, timeZone);
  const value = `${measure.valueLabel}: ${formatRuleValue(crossing.value, crossing.unit)}`;
  const limits = thresholdPhrase(crossing);
  const peak = formatRuleValue(crossing.episodePeakEffectiveMixingHeightAglM, 'm');
  const depth = !measure.concernsMixingDepth
    ? ''
    : crossing.direction === 'end'
      ? `; the effective mixing height had reached ${peak} AGL`
      : `; effective mixing height ${formatRuleValue(crossing.effectiveMixingHeightAglM, 'm')} AGL, up to ${peak} while it lasts`;
  const gap = crossing.hoursMissingBefore > 0 ? ` (${crossing.hoursMissingBefore} forecast hour${crossing.hoursMissingBefore === 1 ? '' : 's'} before this could not be assessed)` : '';
  switch (crossing.direction) {
    case 'onset': {
      const start = crossing.atSeriesStart ? `already at ${when}, the first forecast hour` : `from ${when}`;
      return `${crossing.ruleName} ${start}: ${value} (${limits})${depth}${gap}.`;
    }
    case 'end':
      return `${crossing.ruleName} ends at ${when}: ${value} (${limits})${depth}${gap}.`;
    case 'worsened':
      return `${crossing.ruleName}: forecast worse for ${when} in the ${formatRunTimeFast(crossing.modelRun)} run, which has it on where the ${crossing.previousModelRun ? formatRunTimeFast(crossing.previousModelRun) : 'previous'} run had it off: ${value} (${limits})${depth}.`;
  }
}
