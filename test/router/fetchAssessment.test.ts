import { describe, expect, it, vi } from 'vitest';
import type { ForecastSeries } from '../../src/forecast/forecastSource.ts';
import { fetchAssessment } from '../../src/router/fetchAssessment.ts';
import type { ResolvedPlace } from '../../src/router/resolvePlace.ts';
import * as assessing from '../../src/watch/assessSeries.ts';
import { syntheticSeries } from '../watch/support/syntheticSeries.ts';

// The real assessSeries runs; the spy only counts how often it is asked.
vi.mock('../../src/watch/assessSeries.ts', { spy: true });

const place: ResolvedPlace = { displayName: 'Cinder Flats (invented)', latitudeDeg: 44.81, longitudeDeg: -115.43, elevationM: 1200, savedName: null, locationKey: '44.8100,-115.4300' };

/** A source that hands out one cached series object, as the forecast cache does within a run. */
function contextWith(series: ForecastSeries) {
  return {
    source: { fetchSeries: async () => ({ ok: true as const, series }), fetchMany: async () => [] } as never,
    forecastHours: series.profiles.length,
    nowMs: () => Date.parse(series.profiles[0]!.validTime),
  };
}

describe('one assessment per forecast series', () => {
  it('serves a lookup and then the detail view of the same series from one assessment', async () => {
    const series = syntheticSeries();
    const context = contextWith(series);
    const before = vi.mocked(assessing.assessSeries).mock.calls.length;
    const lookup = await fetchAssessment(context, place, { keepAnalysis: false });
    const detail = await fetchAssessment(context, place, { keepAnalysis: true });
    expect(vi.mocked(assessing.assessSeries).mock.calls.length - before).toBe(1);
    if (!lookup.ok || !detail.ok) throw new Error('no assessment');
    expect(detail.series.hours.every((hour) => hour.analysis !== undefined)).toBe(true);
    expect(lookup.series.hours.some((hour) => 'analysis' in hour)).toBe(false);
    // The lookup's hours are exactly what an assessment without analyses gives.
    expect(lookup.series).toEqual(assessing.assessSeries(series, { keepAnalysis: false }));
    // Asked again, the same objects come back.
    const again = await fetchAssessment(context, place, { keepAnalysis: false });
    expect(again.ok && again.series).toBe(lookup.series);
  });
});
