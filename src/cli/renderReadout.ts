import type { AnalysisResult, HainesScore, LayerReport } from '../core/analysisResult.ts';
import { DRY_ADIABATIC_LAPSE_RATE_C_PER_KM } from '../core/constants.ts';
import { INVENTED_DATA_NOTE } from '../render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../render/safetyFooter.ts';

export interface ReadoutOptions {
  /** The profile is invented demo data: say so near the top. */
  inventedData: boolean;
}

const fixed = (value: number | null, digits = 0): string => (value === null || !Number.isFinite(value) ? 'n/a' : noNegativeZero(value.toFixed(digits)));
const noNegativeZero = (text: string): string => (/^-0(\.0+)?$/.test(text) ? text.slice(1) : text);
const metres = (value: number): string => `${fixed(value)} m`;

/**
 * The short human-readable readout of `lapsewatch analyze FILE` (metric, plain text). Level pairs of
 * the same class are shown as one run so the column stays short; the JSON has every pair.
 */
export function renderReadout(result: AnalysisResult, options: ReadoutOptions): string {
  const lines: string[] = [];
  const surface = result.levels[0];
  lines.push(`${result.name} · valid ${result.validTime}`);
  if (options.inventedData) lines.push(INVENTED_DATA_NOTE);
  lines.push(
    `Ground ${metres(result.elevationM)} MSL, ${fixed(surface.pressureHpa)} hPa: ${fixed(surface.temperatureC, 1)} °C, dew point ${fixed(surface.dewpointC, 1)} °C, RH ${fixed(surface.relativeHumidityPct)} %` +
      (result.options.surfaceTemperatureC === null
        ? ''
        : `\nAfternoon analysis: the surface parcel and the mixed layer start from a surface temperature of ${fixed(result.options.surfaceTemperatureC, 1)} °C; the layers are the profile's own`),
  );
  lines.push('');

  const mixing = result.mixingHeight;
  lines.push(
    `Mixing height ${metres(mixing.aglM)} AGL (${fixed(mixing.pressureHpa)} hPa) for a surface temperature of ${fixed(mixing.surfaceTemperatureC, 1)} °C` +
      (mixing.reachesProfileTop ? ' (reaches the top of the profile: at least this deep)' : ''),
  );
  lines.push(
    `  transport wind ${fixed(result.transportWind.dirDeg)}° ${fixed(result.transportWind.speedMs, 1)} m/s · ventilation ${fixed(result.ventilationM2s)} m²/s · lowest RH in the mixed layer ${fixed(result.mixedLayerMinRelativeHumidityPct)} %`,
  );
  lines.push(
    result.plumeCloudPossible
      ? `  plume cloud possible: the mixed layer reaches the surface parcel's condensation level (${metres(result.parcels.surface.lclHeightAglM)} AGL)`
      : `  plume cloud unlikely: the surface parcel condenses at ${metres(result.parcels.surface.lclHeightAglM)} AGL, above the mixed layer`,
  );
  if (mixing.coupledLayerIndex !== null && mixing.effectiveAglM > mixing.aglM) {
    lines.push(`  COUPLED: the mixed layer reaches a dry near-dry-adiabatic layer; effective mixing height ${metres(mixing.effectiveAglM)} AGL`);
  }
  lines.push('');

  lines.push('Dry near-dry-adiabatic layers (Γ ≥ 9.0 °C/km, RH ≤ 40 %, at least 500 m deep)');
  if (result.dryNearAdiabaticLayers.length === 0) lines.push('  none');
  result.dryNearAdiabaticLayers.forEach((layer, index) => {
    const reached = mixing.coupledLayerIndex !== null && index <= mixing.coupledLayerIndex;
    const trigger =
      layer.baseAglM === 0
        ? 'starts at the ground: part of the mixed layer'
        : reached
          ? 'reached by the mixed layer now'
          : layer.triggerTemperatureC === null
            ? 'not reachable by surface heating'
            : `reached when the surface warms to ${fixed(layer.triggerTemperatureC, 1)} °C; the mixed layer then deepens to ${metres(layer.topAglM)} AGL or more`;
    lines.push(
      `  ${fixed(layer.baseAglM)}–${metres(layer.topAglM)} AGL (${fixed(layer.basePressureHpa)}–${fixed(layer.topPressureHpa)} hPa), ${fixed(layer.meanLapseRateCPerKm, 1)} °C/km, RH at most ${fixed(layer.maxRelativeHumidityPct)} %: ${trigger}`,
    );
  });
  lines.push('');

  lines.push('Standard layers (lapse rate, ratio to the dry adiabat 9.8 °C/km, class)');
  for (const layer of result.standardLayers) lines.push(`  ${layer.name.padEnd(11)} ${layerColumns(layer)}`);
  lines.push('Layers from the ground up (adjacent levels of one class shown together)');
  for (const run of layerRuns(result.layers)) {
    lines.push(`  ${`${fixed(run.basePressureHpa)}–${fixed(run.topPressureHpa)} hPa`.padEnd(14)} ${`${fixed(run.baseAglM)}–${fixed(run.topAglM)} m`.padEnd(13)} ${layerColumns(run)}`);
  }
  lines.push('');

  const { surface: surfaceParcel, mixedLayer } = result.parcels;
  lines.push(
    `Surface parcel: CAPE ${fixed(surfaceParcel.capeJkg)} J/kg, CIN ${fixed(surfaceParcel.cinJkg)} J/kg, LCL ${fixed(surfaceParcel.lclPressureHpa)} hPa, LFC ${pressureOrNone(surfaceParcel.lfcPressureHpa)}, EL ${pressureOrNone(surfaceParcel.elPressureHpa)}`,
  );
  lines.push(
    `Mixed-layer parcel: CAPE ${fixed(mixedLayer.capeJkg)} J/kg, CIN ${fixed(mixedLayer.cinJkg)} J/kg, LCL ${fixed(mixedLayer.lclPressureHpa)} hPa, LFC ${pressureOrNone(mixedLayer.lfcPressureHpa)}, EL ${pressureOrNone(mixedLayer.elPressureHpa)}`,
  );
  lines.push(`  downdraft CAPE ${fixed(result.dcapeJkg)} J/kg · precipitable water ${fixed(result.precipitableWaterMm, 1)} mm · parcels ${result.options.virtualTemperature ? 'with' : 'without'} the virtual temperature correction`);
  lines.push('');

  const haines = result.haines;
  const chosen = haines[haines.variant];
  lines.push(`Haines Index, ${haines.variant} variant: ${chosen === null ? 'n/a' : String(chosen.total)} (${haines.label})`);
  if (chosen !== null) lines.push(`  ${hainesTerms(chosen)}`);
  if (haines.variantNote) lines.push(`  ${haines.variantNote}`);
  if (haines.stableLayerNote) lines.push(`  ${haines.stableLayerNote}`);
  const cHaines = result.cHaines;
  lines.push(
    cHaines === null
      ? 'Continuous Haines: n/a (850 hPa is under the ground here)'
      : `Continuous Haines ${fixed(cHaines.total, 1)} (stability term ${fixed(cHaines.ca, 1)}, moisture term ${fixed(cHaines.cb, 1)})`,
  );
  lines.push(
    `Hot-Dry-Windy Index ${fixed(result.hdw)} (largest VPD ${fixed(result.hdwInputs.maxVapourPressureDeficitHpa, 1)} hPa × largest wind ${fixed(result.hdwInputs.maxWindSpeedMs, 1)} m/s, lowest 500 m)`,
  );
  lines.push(
    result.pft.gw === null
      ? 'PyroCb Firepower Threshold: none within the profile'
      : `PyroCb Firepower Threshold ${fixed(result.pft.gw, 1)} GW (free convection at ${result.pft.freeConvectionHeightAglM === null ? 'n/a' : metres(result.pft.freeConvectionHeightAglM)} AGL)`,
  );
  lines.push('');
  lines.push(SAFETY_FOOTER);
  return `${lines.join('\n')}\n`;
}

function layerColumns(layer: Pick<LayerReport, 'lapseRateCPerKm' | 'ratioToDryAdiabat' | 'class'>): string {
  return `${fixed(layer.lapseRateCPerKm, 1).padStart(5)} °C/km  ${fixed(layer.ratioToDryAdiabat, 2).padStart(5)}  ${layer.class}`;
}

function pressureOrNone(pressureHpa: number | null): string {
  return pressureHpa === null ? 'none' : `${fixed(pressureHpa)} hPa`;
}

function hainesTerms(score: HainesScore): string {
  return `lapse term ${score.a} (ΔT ${score.lapseDifferenceC} °C across a ${score.layerClass} layer), moisture term ${score.b} (dew point depression ${score.dewpointDepressionC} °C)`;
}

interface LayerRun {
  basePressureHpa: number;
  topPressureHpa: number;
  baseAglM: number;
  topAglM: number;
  lapseRateCPerKm: number;
  ratioToDryAdiabat: number;
  class: LayerReport['class'];
}

/** Adjacent level pairs of one class merged; the run's lapse rate is depth-weighted (end to end). */
function layerRuns(layers: readonly LayerReport[]): LayerRun[] {
  const runs: LayerRun[] = [];
  let coolingC = 0;
  for (const layer of layers) {
    const last = runs[runs.length - 1];
    const layerCoolingC = (layer.lapseRateCPerKm * (layer.topAglM - layer.baseAglM)) / 1000;
    if (last && last.class === layer.class) {
      coolingC += layerCoolingC;
      last.topPressureHpa = layer.topPressureHpa;
      last.topAglM = layer.topAglM;
      last.lapseRateCPerKm = (1000 * coolingC) / (last.topAglM - last.baseAglM);
      last.ratioToDryAdiabat = last.lapseRateCPerKm / DRY_ADIABATIC_LAPSE_RATE_C_PER_KM;
    } else {
      coolingC = layerCoolingC;
      runs.push({ ...layer });
    }
  }
  return runs;
}
