import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Crossing } from './crossing.ts';

/** An announced time must move by this much to be worth saying again. */
export const MATERIAL_SHIFT_MS = 3_600_000;
/** Mixing must come this much deeper to be worth saying again, m. */
export const MATERIAL_DEEPENING_M = 500;

/**
 * Whether a new version of an already announced crossing (same key) changes it enough to announce
 * again. Onsets and worsenings: earlier by an hour or more, or, for rules about the depth of mixing,
 * a peak effective mixing height deeper by 500 m or more. Ends: later by an hour or more (the
 * hazard lasts longer); an end coming earlier is good news that does not need a second alert.
 * A crossing under a different key is a new event, not an update: false.
 */
export function isMaterialUpdate(previous: Crossing, next: Crossing): boolean {
  if (previous.key !== next.key) return false;
  const shiftMs = Date.parse(next.validTime) - Date.parse(previous.validTime);
  if (next.direction === 'end') return shiftMs >= MATERIAL_SHIFT_MS;
  if (-shiftMs >= MATERIAL_SHIFT_MS) return true;
  return (
    RULE_MEASURES[next.ruleId].concernsMixingDepth &&
    next.episodePeakEffectiveMixingHeightAglM - previous.episodePeakEffectiveMixingHeightAglM >= MATERIAL_DEEPENING_M
  );
}
