import { describe, expect, it } from 'vitest';
import { assessSeries } from '../../src/watch/assessSeries.ts';
import { summarizeDays } from '../../src/watch/daySummaries.ts';
import type { HourAssessment } from '../../src/watch/seriesAssessment.ts';
import { syntheticSeries } from './support/syntheticSeries.ts';

/** A plain invented hour; tests change only what they look at. */
function hour(localTime: string, changes: Partial<HourAssessment> = {}): HourAssessment {
  return {
    validTime: new Date(Date.parse(localTime)).toISOString().replace('.000Z', 'Z'),
    localTime,
    mixingHeightAglM: 500,
    effectiveMixingHeightAglM: 500,
    coupled: false,
    dryNearAdiabaticLayers: [],
    transportWind: { speedMs: 4, dirDeg: 230 },
    ventilationM2s: 2000,
    hdw: 50,
    cHaines: 5,
    pftGw: null,
    lclHeightAglM: 2500,
    plumeCloudPossible: false,
    mixedLayerMinRelativeHumidityPct: 40,
    hainesTotal: 4,
    hainesVariant: 'high',
    surfaceTemperatureC: 20,
    surfaceRelativeHumidityPct: 40,
    ...changes,
  };
}

describe('summarizeDays', () => {
  it('splits days at local midnight, not UTC midnight', () => {
    // 05:00Z and 06:00Z on 15 Aug are 23:00 on the 14th and 00:00 on the 15th at UTC−6.
    const days = summarizeDays([hour('2026-08-14T23:00:00-06:00'), hour('2026-08-15T00:00:00-06:00')]);
    expect(days.map((day) => day.localDate)).toEqual(['2026-08-14', '2026-08-15']);
  });

  it('names the peak, driest, windiest, highest-HDW and lowest-PFT hours; ties go to the earliest', () => {
    const days = summarizeDays([
      hour('2026-08-14T12:00:00-06:00', { mixingHeightAglM: 1800, hdw: 120, pftGw: 30, mixedLayerMinRelativeHumidityPct: 12 }),
      hour('2026-08-14T13:00:00-06:00', { mixingHeightAglM: 2400, hdw: 180, pftGw: null, transportWind: { speedMs: 11, dirDeg: 240 } }),
      hour('2026-08-14T14:00:00-06:00', { mixingHeightAglM: 2400, effectiveMixingHeightAglM: 4400, coupled: true, hdw: 150, pftGw: 12, mixedLayerMinRelativeHumidityPct: 12 }),
      hour('2026-08-14T15:00:00-06:00', { mixingHeightAglM: 2000, coupled: true, pftGw: 8 }),
    ]);
    expect(days).toHaveLength(1);
    expect(days[0]).toMatchObject({
      peakMixingHeightAglM: 2400,
      peakMixingHour: '2026-08-14T13:00:00-06:00',
      peakEffectiveMixingHeightAglM: 4400,
      peakEffectiveMixingHour: '2026-08-14T14:00:00-06:00',
      couplingHour: '2026-08-14T14:00:00-06:00',
      driestHour: '2026-08-14T12:00:00-06:00',
      minMixedLayerRelativeHumidityPct: 12,
      windiestHour: '2026-08-14T13:00:00-06:00',
      maxTransportWindMs: 11,
      maxHdw: 180,
      maxHdwHour: '2026-08-14T13:00:00-06:00',
      minPftGw: 8,
      minPftHour: '2026-08-14T15:00:00-06:00',
    });
  });

  it('a day when no pyroCb is possible has no lowest PFT, and a day without coupling no coupling hour', () => {
    const [day] = summarizeDays([hour('2026-08-15T14:00:00-06:00'), hour('2026-08-15T15:00:00-06:00')]);
    expect(day.minPftGw).toBeNull();
    expect(day.minPftHour).toBeNull();
    expect(day.couplingHour).toBeNull();
  });

  it('on the invented two-day series: coupling on day one at 14:00 only, peak mixing at 15:00', () => {
    const { days } = assessSeries(syntheticSeries({ couplingLocalHourByDay: [14, null] }));
    expect(days.map((day) => day.couplingHour)).toEqual(['2026-08-14T14:00:00-06:00', null]);
    expect(days[0].peakMixingHour).toBe('2026-08-14T15:00:00-06:00');
    expect(days[1].peakMixingHeightAglM).toBeLessThan(2600);
  });
});
