import type { LayerClass, LayerReport } from '../core/analysisResult.ts';
import type { MessageTable } from './message.ts';
import { formatHeight, formatLapseRate, type UnitSystem } from './units.ts';

/** Layers above this pressure are left out of the table: the fire lives in the lower troposphere. */
const TABLE_TOP_PRESSURE_HPA = 300;

const CLASS_WORDS: Record<LayerClass, string> = {
  inversion: 'inversion',
  isothermal: 'isothermal',
  stable: 'stable',
  'conditionally-unstable': 'conditionally unstable',
  'near-dry-adiabatic': 'near dry adiabatic',
  'absolutely-unstable': 'absolutely unstable',
};

export interface MergedLayer {
  baseAglM: number;
  topAglM: number;
  lapseRateCPerKm: number;
  class: LayerClass;
}

/**
 * Adjacent layers of the same class merged into one, with the depth-weighted lapse rate, so a
 * 37-level profile reads as a handful of rows.
 */
export function mergeLayersByClass(layers: LayerReport[]): MergedLayer[] {
  const merged: MergedLayer[] = [];
  for (const layer of layers) {
    if (layer.basePressureHpa <= TABLE_TOP_PRESSURE_HPA) break;
    const previous = merged[merged.length - 1];
    if (previous && previous.class === layer.class && Math.abs(previous.topAglM - layer.baseAglM) < 1) {
      const previousDepth = previous.topAglM - previous.baseAglM;
      const depth = layer.topAglM - layer.baseAglM;
      const total = previousDepth + depth;
      previous.lapseRateCPerKm = total > 0 ? (previous.lapseRateCPerKm * previousDepth + layer.lapseRateCPerKm * depth) / total : layer.lapseRateCPerKm;
      previous.topAglM = layer.topAglM;
    } else {
      merged.push({ baseAglM: layer.baseAglM, topAglM: layer.topAglM, lapseRateCPerKm: layer.lapseRateCPerKm, class: layer.class });
    }
  }
  return merged;
}

/** The layer table of the detail view: base, top, lapse rate, class, every figure with its unit. */
export function layerTable(layers: LayerReport[], units: UnitSystem): MessageTable {
  return {
    columns: ['Base AGL', 'Top AGL', 'Lapse rate', 'Class'],
    rows: mergeLayersByClass(layers).map((layer) => [
      formatHeight(layer.baseAglM, units),
      formatHeight(layer.topAglM, units),
      formatLapseRate(layer.lapseRateCPerKm),
      CLASS_WORDS[layer.class] ?? layer.class,
    ]),
  };
}
