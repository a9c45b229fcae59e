import { describe, expect, it } from 'vitest';
import type { DryNearAdiabaticLayer } from '../../src/core/analysisResult.ts';
import { couplingLine } from '../../src/render/lookupMessage.ts';
import { makeSeries, TIME_ZONE } from './fixtures.ts';

// Invented fixtures: an afternoon whose mixed layer is itself dry and near-dry-adiabatic (a layer from
// the ground up) while it reaches the dry layer aloft.
const layer = (baseAglM: number, topAglM: number): DryNearAdiabaticLayer => ({
  baseAglM,
  topAglM,
  basePressureHpa: 800,
  topPressureHpa: 600,
  meanLapseRateCPerKm: 9.5,
  maxRelativeHumidityPct: 20,
  triggerTemperatureC: 33,
});

describe('the coupling sentence', () => {
  it('names the dry layer aloft the mixed layer reaches, never the ground-based one', () => {
    const series = makeSeries();
    const first = series.hours.find((hour) => hour.coupled)!;
    first.dryNearAdiabaticLayers = [layer(0, 2300), layer(2600, 4400)];
    first.coupledLayer = null;
    const line = couplingLine(series.hours, TIME_ZONE, 'metric', 'through Sat');
    expect(line).toContain('(layer 2,600 m AGL to 4,400 m AGL)');
    expect(line).not.toContain('0 m AGL to 2,300');
  });

  it('uses the layer the series assessment says was reached when it has one', () => {
    const series = makeSeries();
    const first = series.hours.find((hour) => hour.coupled)!;
    first.coupledLayer = layer(2500, 3900);
    expect(couplingLine(series.hours, TIME_ZONE, 'metric', 'through Sat')).toContain('(layer 2,500 m AGL to 3,900 m AGL)');
  });

  it('does not count a ground-based dry layer as air aloft when nothing couples', () => {
    const series = makeSeries({ coupling: false });
    for (const hour of series.hours) hour.dryNearAdiabaticLayers = [layer(0, 1800)];
    expect(couplingLine(series.hours, TIME_ZONE, 'metric', 'through Sat')).toBe('No dry near-dry-adiabatic layer aloft through Sat.');
  });
});
