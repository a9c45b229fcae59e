import { describe, expect, it } from 'vitest';
import type { DryNearAdiabaticLayer } from '../../src/core/analysisResult.ts';
import { markCouplingAloft } from '../../src/watch/dryLayerAloft.ts';
import type { HourAssessment } from '../../src/watch/seriesAssessment.ts';

function layer(baseAglM: number, topAglM: number): DryNearAdiabaticLayer {
  return { baseAglM, topAglM, basePressureHpa: 0, topPressureHpa: 0, meanLapseRateCPerKm: 9.4, maxRelativeHumidityPct: 20, triggerTemperatureC: null };
}

/** Invented hours: only the mixing height and the dry layers matter here. */
function hour(mixingHeightAglM: number, layers: DryNearAdiabaticLayer[]): HourAssessment {
  return {
    validTime: '2026-08-14T20:00:00Z',
    localTime: '2026-08-14T14:00:00-06:00',
    mixingHeightAglM,
    effectiveMixingHeightAglM: mixingHeightAglM,
    coupled: true,
    dryNearAdiabaticLayers: layers,
    transportWind: { speedMs: 5, dirDeg: 230 },
    ventilationM2s: 0,
    hdw: 0,
    cHaines: 0,
    pftGw: null,
    lclHeightAglM: 3000,
    plumeCloudPossible: false,
    mixedLayerMinRelativeHumidityPct: 30,
    hainesTotal: 4,
    hainesVariant: 'high',
    surfaceTemperatureC: 25,
    surfaceRelativeHumidityPct: 20,
  };
}

describe('coupling with a dry layer aloft', () => {
  it('a dry layer from the ground (the heated surface layer) is not one to reach', () => {
    const hours = [hour(1700, [layer(0, 1360), layer(2270, 3620)])];
    markCouplingAloft(hours);
    expect(hours[0]).toMatchObject({ coupled: false, dryLayerAloftBaseAglM: 2270, coupledLayer: null });
  });

  it('the mixed layer at or above the base of the layer aloft is coupled (DESIGN.md: at or above the base)', () => {
    const hours = [hour(2270, [layer(0, 1360), layer(2270, 3620)])];
    markCouplingAloft(hours);
    expect(hours[0].coupled).toBe(true);
    expect(hours[0].coupledLayer).toMatchObject({ baseAglM: 2270 });
  });

  it('once the mixed layer has taken the layer in, coupling lasts while the mixing does; with no dry layer at all it is forgotten', () => {
    const hours = [
      hour(4000, [layer(0, 2300), layer(2950, 3640)]),
      hour(4200, [layer(0, 2310)]),
      hour(0, []),
      hour(4200, [layer(0, 2310)]),
    ];
    markCouplingAloft(hours);
    expect(hours.map((h) => h.coupled)).toEqual([true, true, false, false]);
    expect(hours.map((h) => h.dryLayerAloftBaseAglM)).toEqual([2950, 2950, null, null]);
  });
});
