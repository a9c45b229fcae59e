import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { assessSeries } from '../../src/watch/assessSeries.ts';
import type { Crossing } from '../../src/watch/crossings/crossing.ts';
import { findCrossings } from '../../src/watch/crossings/findCrossings.ts';
import { hourToHourCrossings } from '../../src/watch/crossings/hourToHourCrossings.ts';
import { isMaterialUpdate } from '../../src/watch/crossings/isMaterialUpdate.ts';
import { locationKey } from '../../src/watch/crossings/locationKey.ts';
import { nextRuleState } from '../../src/watch/crossings/ruleState.ts';
import { runToRunWorsenings } from '../../src/watch/crossings/runToRunWorsenings.ts';
import { selectAnnouncements } from '../../src/watch/crossings/selectAnnouncements.ts';
import { formatConfigProblem } from '../../src/watch/rules/configProblem.ts';
import { loadRulesFile } from '../../src/watch/rules/loadRules.ts';
import type { Rule } from '../../src/watch/rules/rule.ts';
import type { HourAssessment, SeriesAssessment } from '../../src/watch/seriesAssessment.ts';
import { syntheticSeries } from './support/syntheticSeries.ts';

// Series here are invented (test/watch/support/syntheticSeries.ts); the place is not real.

const loaded = await loadRulesFile();
if (!loaded.ok) throw new Error(loaded.problems.map(formatConfigProblem).join('\n'));
const RULES: Rule[] = loaded.rules;
const COUPLING = RULES.filter((rule) => rule.id === 'mixing-reaches-dry-layer');

function assessed(couplingLocalHourByDay: Array<number | null>, runTime = '2026-08-14T00:00:00Z'): SeriesAssessment {
  return assessSeries(syntheticSeries({ couplingLocalHourByDay, runTime }));
}

describe('hysteresis', () => {
  it('a value oscillating by less than the hysteresis around the threshold gives one onset and no end', () => {
    const rule = { threshold: 15, hysteresis: 2 };
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1.9, max: 1.9, noNaN: true }), { minLength: 2, maxLength: 60 }), (wobbles) => {
        // RH falls to the threshold, then wobbles around it: on at the first touch, never off.
        const values = [30, 20, 15, ...wobbles.map((w) => 15 + w)];
        let on = false;
        let onsets = 0;
        let ends = 0;
        for (const value of values) {
          const next = nextRuleState(on, value, rule, 'at-or-below');
          if (next && !on) onsets++;
          if (!next && on) ends++;
          on = next;
        }
        return onsets === 1 && ends === 0;
      }),
    );
  });

  it('without hysteresis the same wobble flips every hour (so the hysteresis is what holds it)', () => {
    const values = [16, 14.9, 15.1, 14.9, 15.1, 14.9];
    let on = false;
    let flips = 0;
    for (const value of values) {
      const next = nextRuleState(on, value, { threshold: 15, hysteresis: 0 }, 'at-or-below');
      if (next !== on) flips++;
      on = next;
    }
    expect(flips).toBe(5);
  });

  it('turns on at the threshold itself, off only beyond threshold − hysteresis', () => {
    const rule = { threshold: 3000, hysteresis: 200 };
    expect(nextRuleState(false, 3000, rule, 'at-or-above')).toBe(true);
    expect(nextRuleState(false, 2999, rule, 'at-or-above')).toBe(false);
    expect(nextRuleState(true, 2800, rule, 'at-or-above')).toBe(true);
    expect(nextRuleState(true, 2799, rule, 'at-or-above')).toBe(false);
    expect(nextRuleState(true, null, rule, 'at-or-above')).toBe(false);
  });
});

describe('crossings between consecutive hours', () => {
  it('the first-afternoon coupling is one onset at 14:00 local with a stable key', () => {
    const series = assessed([14, null]);
    const onsets = hourToHourCrossings(series, COUPLING).filter((c) => c.direction === 'onset');
    expect(onsets).toHaveLength(1);
    const [onset] = onsets;
    expect(onset.localTime).toBe('2026-08-14T14:00:00-06:00');
    expect(onset.validTime).toBe('2026-08-14T20:00:00Z');
    expect(onset.key).toBe('44.12,-114.93|mixing-reaches-dry-layer|2026-08-14|onset');
    expect(onset).toMatchObject({ severity: 'warning', threshold: 0, hysteresis: 100, unit: 'm', modelRun: '2026-08-14T00:00:00Z', atSeriesStart: false });
    expect(onset.value!).toBeGreaterThanOrEqual(0);
    expect(onset.episodePeakEffectiveMixingHeightAglM).toBeGreaterThanOrEqual(4400);
    expect(onset.message).toMatch(/^Mixed layer reaches a dry layer aloft from Fri 14 Aug 14:00 MDT/);
    expect(onset.message).toContain('threshold ≥ 0 m');
    const end = hourToHourCrossings(series, COUPLING).find((c) => c.direction === 'end')!;
    expect(end.localTime).toBe('2026-08-14T17:00:00-06:00');
  });

  it('the same series twice gives the same keys', () => {
    const keys = (series: SeriesAssessment): string[] => findCrossings(series, RULES).map((c) => c.key);
    const first = keys(assessed([14, 15]));
    expect(first.length).toBeGreaterThan(2);
    expect(keys(assessed([14, 15]))).toEqual(first);
    expect(new Set(first).size).toBe(first.length);
  });

  it('a rule already on at the first hour is an onset there, flagged', () => {
    const series = assessed([14, null]);
    const fromAfternoon = { ...series, hours: series.hours.slice(15) };
    const onset = hourToHourCrossings(fromAfternoon, COUPLING)[0];
    expect(onset).toMatchObject({ direction: 'onset', atSeriesStart: true, localTime: '2026-08-14T15:00:00-06:00' });
    expect(onset.message).toContain('the first forecast hour');
  });

  it('a crossing after missing hours says how many were missing', () => {
    const series = assessSeries(syntheticSeries({ faultyHourIndices: [13, 14] }));
    const onset = hourToHourCrossings(series, COUPLING)[0];
    expect(onset.localTime).toBe('2026-08-14T15:00:00-06:00');
    expect(onset.hoursMissingBefore).toBe(2);
    expect(onset.message).toContain('2 forecast hours before this could not be assessed');
  });

  it('a channel threshold shows in the crossing and its message', () => {
    const lowered = COUPLING.map((rule) => ({ ...rule, threshold: -700 }));
    const onset = hourToHourCrossings(assessed([14, null]), lowered)[0];
    // With 700 m of warning the onset comes when the mixed layer is within 700 m of the base: 13:00 (mixing ≈ 2040 m).
    expect(onset.localTime).toBe('2026-08-14T13:00:00-06:00');
    expect(onset.threshold).toBe(-700);
    expect(onset.message).toContain('threshold ≥ -700 m');
  });
});

describe('material updates', () => {
  const onsetOf = (series: SeriesAssessment): Crossing =>
    hourToHourCrossings(series, COUPLING).find((c) => c.direction === 'onset' && c.localDate === '2026-08-14')!;

  it('coupling 2 h earlier in a newer run keeps the key and is a material update', () => {
    const previous = onsetOf(assessed([14, null], '2026-08-14T00:00:00Z'));
    const next = onsetOf(assessed([12, null], '2026-08-14T06:00:00Z'));
    expect(next.key).toBe(previous.key);
    expect(next.localTime).toBe('2026-08-14T12:00:00-06:00');
    expect(isMaterialUpdate(previous, next)).toBe(true);
    expect(isMaterialUpdate(next, next)).toBe(false);
  });

  it('30 minutes earlier is not; 60 minutes is', () => {
    const previous = onsetOf(assessed([14, null]));
    const shifted = (minutes: number): Crossing => ({ ...previous, validTime: new Date(Date.parse(previous.validTime) - minutes * 60_000).toISOString() });
    expect(isMaterialUpdate(previous, shifted(30))).toBe(false);
    expect(isMaterialUpdate(previous, shifted(60))).toBe(true);
  });

  it('mixing deeper by 500 m is material, by 400 m is not; an end later by an hour is, earlier is not', () => {
    const previous = onsetOf(assessed([14, null]));
    const deeper = (metres: number): Crossing => ({ ...previous, episodePeakEffectiveMixingHeightAglM: previous.episodePeakEffectiveMixingHeightAglM + metres });
    expect(isMaterialUpdate(previous, deeper(500))).toBe(true);
    expect(isMaterialUpdate(previous, deeper(400))).toBe(false);
    const end = hourToHourCrossings(assessed([14, null]), COUPLING).find((c) => c.direction === 'end')!;
    const moved = (hours: number): Crossing => ({ ...end, validTime: new Date(Date.parse(end.validTime) + hours * 3_600_000).toISOString() });
    expect(isMaterialUpdate(end, moved(1))).toBe(true);
    expect(isMaterialUpdate(end, moved(-1))).toBe(false);
  });

  it('announcements: the same run again posts nothing; the run with earlier coupling posts the earlier onset and the later end as updates', () => {
    const firstRun = findCrossings(assessed([14, null], '2026-08-14T00:00:00Z'), RULES);
    const announced = new Map(firstRun.map((c) => [c.key, c]));
    expect(selectAnnouncements(findCrossings(assessed([14, null], '2026-08-14T00:00:00Z'), RULES), announced)).toEqual([]);
    const newer = findCrossings(assessed([12, null], '2026-08-14T06:00:00Z'), COUPLING);
    const posts = selectAnnouncements(newer, announced);
    expect(posts.map((p) => [p.reason, p.crossing.ruleId, p.crossing.direction, p.crossing.localTime])).toEqual([
      ['update', 'mixing-reaches-dry-layer', 'onset', '2026-08-14T12:00:00-06:00'],
      // Coupled 12:00–18:00 now, so the end moves from 17:00 to 19:00: later by more than an hour.
      ['update', 'mixing-reaches-dry-layer', 'end', '2026-08-14T19:00:00-06:00'],
    ]);
  });
});

describe('run-to-run worsening', () => {
  it('a newer run that couples on day two where the previous did not is a worsening at the first such hour', () => {
    const previous = assessed([14, null], '2026-08-14T00:00:00Z');
    const current = assessed([14, 15], '2026-08-14T06:00:00Z');
    const worsenings = runToRunWorsenings(previous, current, COUPLING);
    expect(worsenings).toHaveLength(1);
    expect(worsenings[0]).toMatchObject({
      key: '44.12,-114.93|mixing-reaches-dry-layer|2026-08-15|worsened',
      localTime: '2026-08-15T15:00:00-06:00',
      modelRun: '2026-08-14T06:00:00Z',
      previousModelRun: '2026-08-14T00:00:00Z',
    });
    expect(worsenings[0].message).toContain('forecast worse for Sat 15 Aug 15:00 MDT in the 06Z 14 Aug 2026 run');
    // The same run compared with itself is no worse.
    expect(runToRunWorsenings(current, current, COUPLING)).toEqual([]);
  });

  it('findCrossings keeps a worsening that no onset carries, and drops the one that an onset at the same hour does', () => {
    const previous = assessed([14, null], '2026-08-14T00:00:00Z');
    const current = assessed([14, 15], '2026-08-14T06:00:00Z');
    // Day two: the onset at 15:00 carries the news, so no separate worsening.
    expect(findCrossings(current, COUPLING, previous).filter((c) => c.direction === 'worsened')).toEqual([]);
    // Day one: the newer run keeps the mixed layer at the dry layer one hour longer (17:00), same onset.
    const longer: HourAssessment[] = current.hours.map((hour) =>
      hour.localTime === '2026-08-14T17:00:00-06:00' ? { ...hour, mixingHeightAglM: 2650, effectiveMixingHeightAglM: 4400, coupled: true } : hour,
    );
    const crossings = findCrossings({ ...current, hours: longer }, COUPLING, previous);
    const worsened = crossings.filter((c) => c.direction === 'worsened');
    expect(worsened.map((c) => c.localTime)).toEqual(['2026-08-14T17:00:00-06:00']);
    expect(crossings.filter((c) => c.direction === 'onset').map((c) => c.localTime)).toEqual(['2026-08-14T14:00:00-06:00', '2026-08-15T15:00:00-06:00']);
  });
});

describe('location key', () => {
  it('rounds to 0.01° and writes no negative zero', () => {
    expect(locationKey(44.1234, -114.9251)).toBe('44.12,-114.93');
    expect(locationKey(-0.001, 0.004)).toBe('0.00,0.00');
  });
});
