import { describe, expect, it } from 'vitest';
import { assessSeries } from '../../src/watch/assessSeries.ts';
import { syntheticSeries } from './support/syntheticSeries.ts';

// The series is invented (test/watch/support/syntheticSeries.ts): a dry near-dry-adiabatic layer at
// 2600–4400 m AGL that the afternoon mixed layer reaches at a chosen local hour.

describe('assessSeries', () => {
  it('assesses every hour in time order with local times in the point\u2019s own zone', () => {
    const series = syntheticSeries();
    const shuffled = { ...series, profiles: [...series.profiles].reverse() };
    const assessment = assessSeries(shuffled);
    expect(assessment.timeZone).toBe('America/Boise');
    expect(assessment.hours).toHaveLength(48);
    expect(assessment.gaps).toEqual([]);
    expect(assessment.hours[0].validTime).toBe('2026-08-14T06:00:00Z');
    expect(assessment.hours[0].localTime).toBe('2026-08-14T00:00:00-06:00');
    expect(assessment.hours[47].localTime).toBe('2026-08-15T23:00:00-06:00');
    expect(assessment.invented).toBe(true);
    expect(assessment.hours.every((hour) => hour.analysis === undefined)).toBe(true);
  });

  it('finds the coupling at the chosen local hour, with the effective height at the dry layer top or above', () => {
    const assessment = assessSeries(syntheticSeries({ couplingLocalHourByDay: [14, null] }));
    const coupled = assessment.hours.filter((hour) => hour.coupled);
    expect(coupled.map((hour) => hour.localTime.slice(11, 16))).toEqual(['14:00', '15:00', '16:00']);
    const beforeCoupling = assessment.hours.find((hour) => hour.localTime.startsWith('2026-08-14T13:00'))!;
    expect(beforeCoupling.mixingHeightAglM).toBeLessThan(2600);
    expect(beforeCoupling.effectiveMixingHeightAglM).toBe(beforeCoupling.mixingHeightAglM);
    for (const hour of coupled) {
      expect(hour.coupledLayer).toMatchObject({ baseAglM: 2600, topAglM: 4400 });
      expect(hour.effectiveMixingHeightAglM).toBeGreaterThanOrEqual(4400);
      // Ventilation is mixing height × transport wind speed (DESIGN.md).
      expect(hour.ventilationM2s).toBeCloseTo(hour.mixingHeightAglM * hour.transportWind.speedMs, 6);
      // Inside the dry layer the mixed-layer minimum RH is the layer's 20 %.
      expect(hour.mixedLayerMinRelativeHumidityPct).toBeCloseTo(20, 0);
    }
  });

  it('reports an hour that fails quality control as a gap with its reason, not as a quiet hour', () => {
    const assessment = assessSeries(syntheticSeries({ faultyHourIndices: [3, 14] }));
    expect(assessment.hours).toHaveLength(46);
    expect(assessment.gaps!.map((gap) => gap.localTime)).toEqual(['2026-08-14T03:00:00-06:00', '2026-08-14T14:00:00-06:00']);
    expect(assessment.gaps![1].reasons.join(' ')).toMatch(/dewpointC .* is above temperatureC/);
    const dayOne = assessment.days[0];
    expect(dayOne.gapHours).toEqual(['2026-08-14T03:00:00-06:00', '2026-08-14T14:00:00-06:00']);
    expect(dayOne.assessedHourCount).toBe(22);
    // With the 14:00 hour missing, the first coupled hour seen is 15:00: the day says so, and the gap is listed beside it.
    expect(dayOne.couplingHour).toBe('2026-08-14T15:00:00-06:00');
  });

  it('keeps the full analysis only when asked', () => {
    const assessment = assessSeries(syntheticSeries({ hours: 2 }), { keepAnalysis: true });
    expect(assessment.hours[0].analysis?.levels.length).toBeGreaterThan(30);
  });

  it('a series where every hour fails has no day summaries but every gap', () => {
    const assessment = assessSeries(syntheticSeries({ hours: 3, faultyHourIndices: [0, 1, 2] }));
    expect(assessment.hours).toEqual([]);
    expect(assessment.days).toEqual([]);
    expect(assessment.gaps).toHaveLength(3);
  });
});

describe('assessSeries with hours left out by the source', () => {
  it('lists each missing hour as a gap with the reason', () => {
    const series = syntheticSeries({ hours: 6 });
    const holed = { ...series, profiles: series.profiles.filter((_, index) => index !== 2 && index !== 3) };
    const assessment = assessSeries(holed);
    expect(assessment.hours).toHaveLength(4);
    expect(assessment.gaps).toEqual([
      { validTime: '2026-08-14T08:00:00Z', localTime: '2026-08-14T02:00:00-06:00', reasons: ['the source supplied no profile for this hour'] },
      { validTime: '2026-08-14T09:00:00Z', localTime: '2026-08-14T03:00:00-06:00', reasons: ['the source supplied no profile for this hour'] },
    ]);
  });
});
