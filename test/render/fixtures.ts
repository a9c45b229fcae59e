/**
 * Hand-built, INVENTED inputs for the render tests. "Cinder Flats" and the "Ashfall Ridge Fire"
 * are invented; no number here is a real observation or forecast. The profiles are generated from a
 * few invented parameters (a hot, dry afternoon with a residual dry near-dry-adiabatic layer aloft)
 * so that the figures look like a plausible mountain-west August afternoon.
 */
import type {
  AnalysisResult,
  DryNearAdiabaticLayer,
  LayerClass,
  LayerReport,
  LevelReport,
} from '../../src/core/analysisResult.ts';
import type { DaySummary, HourAssessment, SeriesAssessment } from '../../src/watch/seriesAssessment.ts';

export const PLACE = { name: 'Cinder Flats (invented)', latitude: 44.8123, longitude: -115.4321, elevationM: 1200 };
export const TIME_ZONE = 'America/Boise';

/** 37 pressure levels, surface first, as a model's full column would give them. */
const PRESSURES_HPA = [
  880, 875, 850, 825, 800, 775, 750, 725, 700, 675, 650, 625, 600, 575, 550, 525, 500, 475, 450, 425, 400, 375, 350, 325,
  300, 275, 250, 225, 200, 175, 150, 125, 100, 70, 50, 30, 20,
];

const G = 9.80665;
const RD = 287.04;

/** Magnus form (Bolton 1980) saturation vapour pressure, hPa; used only to make plausible fixtures. */
function saturationVapourPressureHpa(temperatureC: number): number {
  return 6.112 * Math.exp((17.67 * temperatureC) / (temperatureC + 243.5));
}

function dewpointFromRh(temperatureC: number, relativeHumidityPct: number): number {
  const e = (saturationVapourPressureHpa(temperatureC) * relativeHumidityPct) / 100;
  const ln = Math.log(e / 6.112);
  return (243.5 * ln) / (17.67 - ln);
}

interface InventedColumn {
  surfaceTemperatureC: number;
  mixedTopAglM: number;
  dryLayerBaseAglM: number;
  dryLayerTopAglM: number;
}

/** Temperature (°C) and relative humidity (%) at a height above ground for the invented column. */
function columnAt(heightAglM: number, column: InventedColumn): { temperatureC: number; relativeHumidityPct: number } {
  const z = heightAglM / 1000;
  const mixedTopKm = column.mixedTopAglM / 1000;
  const baseKm = column.dryLayerBaseAglM / 1000;
  const topKm = column.dryLayerTopAglM / 1000;
  let t = column.surfaceTemperatureC;
  const pieces: Array<[number, number, number]> = [
    [0, mixedTopKm, 9.6],
    [mixedTopKm, baseKm, 4.0],
    [baseKm, topKm, 9.4],
    [topKm, 11.0, 6.8],
    [11.0, 30, 0],
  ];
  for (const [from, to, rate] of pieces) {
    if (z <= from) break;
    t -= (Math.min(z, to) - from) * rate;
  }
  const rh = z < mixedTopKm ? 12 + 4 * z : z < topKm ? 18 : 45;
  return { temperatureC: t, relativeHumidityPct: rh };
}

/** One invented analysis of 37 levels. */
export function makeAnalysis(overrides: Partial<InventedColumn> & { validTime?: string; coupled?: boolean } = {}): AnalysisResult {
  const column: InventedColumn = {
    surfaceTemperatureC: 33,
    mixedTopAglM: 2450,
    dryLayerBaseAglM: 2600,
    dryLayerTopAglM: 4400,
    ...overrides,
  };
  // Integrate the hypsometric equation upward to find each pressure level's height.
  const heightsAglM: number[] = [];
  let pressureHpa = PRESSURES_HPA[0];
  let heightAglM = 0;
  let levelIndex = 0;
  while (levelIndex < PRESSURES_HPA.length) {
    const target = PRESSURES_HPA[levelIndex];
    if (pressureHpa <= target) {
      heightsAglM.push(heightAglM);
      levelIndex += 1;
      continue;
    }
    const temperatureK = columnAt(heightAglM, column).temperatureC + 273.15;
    pressureHpa *= Math.exp((-G * 10) / (RD * temperatureK));
    heightAglM += 10;
  }

  const levels: LevelReport[] = PRESSURES_HPA.map((p, index) => {
    const h = heightsAglM[index];
    const { temperatureC, relativeHumidityPct } = columnAt(h, column);
    return {
      pressureHpa: p,
      heightAglM: h,
      heightMslM: h + PLACE.elevationM,
      temperatureC,
      dewpointC: dewpointFromRh(temperatureC, relativeHumidityPct),
      relativeHumidityPct,
      thetaK: (temperatureC + 273.15) * (1000 / p) ** 0.2857,
      windDirDeg: 230 + index * 2,
      windSpeedMs: 4 + Math.min(index, 20) * 1.1,
    };
  });

  const classify = (lapse: number): LayerClass =>
    lapse < 0 ? 'inversion' : lapse < 0.5 ? 'isothermal' : lapse < 6 ? 'stable' : lapse < 9 ? 'conditionally-unstable' : lapse <= 9.8 ? 'near-dry-adiabatic' : 'absolutely-unstable';
  const layers: LayerReport[] = levels.slice(1).map((top, index) => {
    const base = levels[index];
    const lapse = (-(top.temperatureC - base.temperatureC) / (top.heightAglM - base.heightAglM)) * 1000;
    return {
      basePressureHpa: base.pressureHpa,
      topPressureHpa: top.pressureHpa,
      baseAglM: base.heightAglM,
      topAglM: top.heightAglM,
      lapseRateCPerKm: lapse,
      moistLapseRateCPerKm: 6,
      ratioToDryAdiabat: lapse / 9.8,
      class: classify(lapse),
    };
  });

  const pressureAt = (h: number): number => {
    for (let i = 1; i < levels.length; i += 1) {
      if (levels[i].heightAglM >= h) {
        const a = levels[i - 1];
        const b = levels[i];
        const f = (h - a.heightAglM) / (b.heightAglM - a.heightAglM);
        return Math.exp(Math.log(a.pressureHpa) + f * (Math.log(b.pressureHpa) - Math.log(a.pressureHpa)));
      }
    }
    return levels[levels.length - 1].pressureHpa;
  };

  const dryLayer: DryNearAdiabaticLayer = {
    baseAglM: column.dryLayerBaseAglM,
    topAglM: column.dryLayerTopAglM,
    basePressureHpa: pressureAt(column.dryLayerBaseAglM),
    topPressureHpa: pressureAt(column.dryLayerTopAglM),
    meanLapseRateCPerKm: 9.4,
    maxRelativeHumidityPct: 18,
    triggerTemperatureC: 34.5,
  };
  const coupled = overrides.coupled ?? true;
  const mixingAglM = coupled ? column.dryLayerBaseAglM + 40 : column.mixedTopAglM;
  const surface = levels[0];
  const lclAglM = 125 * (surface.temperatureC - surface.dewpointC);

  return {
    name: PLACE.name,
    validTime: overrides.validTime ?? '2026-08-14T21:00:00Z',
    latitude: PLACE.latitude,
    longitude: PLACE.longitude,
    elevationM: PLACE.elevationM,
    options: { surfaceTemperatureC: null, virtualTemperature: true },
    levels,
    lcl: { pressureHpa: pressureAt(lclAglM), temperatureC: surface.dewpointC - 0.2 * (surface.temperatureC - surface.dewpointC) - 1, heightAglM: lclAglM },
    layers,
    standardLayers: [],
    dryNearAdiabaticLayers: [dryLayer],
    mixingHeight: {
      aglM: mixingAglM,
      mslM: mixingAglM + PLACE.elevationM,
      pressureHpa: pressureAt(mixingAglM),
      surfaceTemperatureC: column.surfaceTemperatureC,
      effectiveAglM: coupled ? column.dryLayerTopAglM : mixingAglM,
      coupledLayerIndex: coupled ? 0 : null,
    },
    transportWind: { speedMs: 7.8, dirDeg: 235 },
    ventilationM2s: mixingAglM * 7.8,
    mixedLayerMinRelativeHumidityPct: 12,
    plumeCloudPossible: mixingAglM >= lclAglM,
    haines: {
      variant: 'high',
      variantNote: null,
      low: null,
      mid: { a: 3, b: 3, total: 6, lapseDifferenceC: 13, dewpointDepressionC: 22, layerClass: 'near-dry-adiabatic' },
      high: { a: 2, b: 3, total: 5, lapseDifferenceC: 21, dewpointDepressionC: 20, layerClass: 'near-dry-adiabatic' },
      label: 'dryness-and-lapse-rate index (not a stability measure)',
      stableLayerNote: null,
    },
    cHaines: { ca: 6.5, cb: 5, total: 11.5 },
    hdw: 310,
    hdwInputs: { maxVapourPressureDeficitHpa: 44, maxWindSpeedMs: 7 },
    parcels: {
      surface: { startPressureHpa: 880, startTemperatureC: 33, startDewpointC: surface.dewpointC, capeJkg: 120, cinJkg: -40, lclPressureHpa: pressureAt(lclAglM), lclHeightAglM: lclAglM, lfcPressureHpa: 560, elPressureHpa: 420 },
      mixedLayer: { startPressureHpa: 830, startTemperatureC: 28, startDewpointC: -2, capeJkg: 60, cinJkg: -80, lclPressureHpa: 600, lclHeightAglM: 3900, lfcPressureHpa: null, elPressureHpa: null },
    },
    dcapeJkg: 1400,
    precipitableWaterMm: 11,
    pft: { gw: 2.1, freeConvectionHeightAglM: 4300, freeConvectionPressureHpa: 560, thetaExcessK: 1.2, meanWindMs: 8, mixedLayerThetaK: 318, mixedLayerMixingRatioGkg: 4.2 },
  };
}

/** Local hour (MDT, UTC−6 in August) of an hour index counted from 00:00 local on 14 Aug. */
function localHourOf(index: number): number {
  return index % 24;
}

function isoLocal(index: number): { validTime: string; localTime: string } {
  const utc = new Date(Date.UTC(2026, 7, 14, 6 + index));
  const local = new Date(utc.getTime() - 6 * 3600_000);
  const pad = (n: number): string => String(n).padStart(2, '0');
  return {
    validTime: utc.toISOString().replace('.000Z', 'Z'),
    localTime: `${local.getUTCFullYear()}-${pad(local.getUTCMonth() + 1)}-${pad(local.getUTCDate())}T${pad(local.getUTCHours())}:00:00-06:00`,
  };
}

export interface SeriesOptions {
  /** When false the afternoon mixing stays under the dry layer on both days. */
  coupling?: boolean;
  invented?: boolean;
}

/**
 * 48 invented hours from 00:00 MDT on Fri 14 Aug 2026 (index 0 = 06:00 UTC). Day one: mixing
 * climbs to the dry layer base (2,600 m AGL) at 12:00 local (index 12, 18:00 UTC) and stays
 * coupled until 15:00; day two peaks at 2,300 m, under the layer (base 2,800 m).
 */
export function makeSeries(options: SeriesOptions = {}): SeriesAssessment {
  const coupling = options.coupling ?? true;
  const hours: HourAssessment[] = [];
  for (let index = 0; index < 48; index += 1) {
    const localHour = localHourOf(index);
    const day = index < 24 ? 0 : 1;
    const daylight = Math.max(0, Math.sin(((localHour - 7) / 13) * Math.PI));
    const peak = day === 0 && coupling ? 2900 : 2300;
    const mixingHeightAglM = Math.round(150 + (peak - 150) * daylight ** 1.3);
    const base = day === 0 ? 2600 : 2800;
    const top = day === 0 ? 4400 : 4300;
    const coupled = mixingHeightAglM >= base;
    const temperatureC = 16 + 17 * daylight;
    const rh = 55 - 43 * daylight;
    const windMs = 3 + 6 * daylight;
    hours.push({
      ...isoLocal(index),
      mixingHeightAglM,
      effectiveMixingHeightAglM: coupled ? top : mixingHeightAglM,
      coupled,
      dryNearAdiabaticLayers: [
        { baseAglM: base, topAglM: top, basePressureHpa: 620, topPressureHpa: 480, meanLapseRateCPerKm: 9.4, maxRelativeHumidityPct: 20, triggerTemperatureC: 32 },
      ],
      transportWind: { speedMs: windMs, dirDeg: 225 + 10 * daylight },
      ventilationM2s: mixingHeightAglM * windMs,
      hdw: Math.round(40 + 280 * daylight),
      cHaines: 4 + 7 * daylight,
      pftGw: daylight > 0.5 ? 6 - 4.5 * daylight : null,
      lclHeightAglM: 3300 - 300 * daylight + 1000 * (1 - daylight),
      plumeCloudPossible: (coupled ? top : mixingHeightAglM) >= 3300 - 300 * daylight + 1000 * (1 - daylight),
      mixedLayerMinRelativeHumidityPct: Math.round(rh - 3),
      hainesTotal: daylight > 0.6 ? 6 : daylight > 0.2 ? 5 : 4,
      hainesVariant: 'high',
      surfaceTemperatureC: temperatureC,
      surfaceRelativeHumidityPct: rh,
    });
  }
  const days: DaySummary[] = [0, 1].map((day) => {
    const slice = hours.slice(day * 24, day * 24 + 24);
    const by = (score: (h: HourAssessment) => number): HourAssessment => slice.reduce((a, b) => (score(b) > score(a) ? b : a));
    const peak = by((h) => h.effectiveMixingHeightAglM);
    const driest = by((h) => -h.mixedLayerMinRelativeHumidityPct);
    const windiest = by((h) => h.transportWind.speedMs);
    const hdw = by((h) => h.hdw);
    const withPft = slice.filter((h) => h.pftGw !== null);
    const minPft = withPft.length > 0 ? withPft.reduce((a, b) => ((b.pftGw ?? 0) < (a.pftGw ?? 0) ? b : a)) : null;
    const firstCoupled = slice.find((h) => h.coupled) ?? null;
    return {
      localDate: slice[0].localTime.slice(0, 10),
      peakMixingHeightAglM: peak.effectiveMixingHeightAglM,
      peakMixingHour: peak.localTime,
      couplingHour: firstCoupled ? firstCoupled.localTime : null,
      driestHour: driest.localTime,
      minMixedLayerRelativeHumidityPct: driest.mixedLayerMinRelativeHumidityPct,
      windiestHour: windiest.localTime,
      maxTransportWindMs: windiest.transportWind.speedMs,
      maxHdw: hdw.hdw,
      maxHdwHour: hdw.localTime,
      minPftGw: minPft ? minPft.pftGw : null,
      minPftHour: minPft ? minPft.localTime : null,
    };
  });
  return {
    location: { latitude: PLACE.latitude, longitude: PLACE.longitude, elevationM: PLACE.elevationM, name: PLACE.name },
    timeZone: TIME_ZONE,
    sourceName: 'demo (invented data)',
    model: 'demo-scenario',
    runTime: '2026-08-14T00:00:00Z',
    invented: options.invented ?? true,
    hours,
    days,
  };
}
