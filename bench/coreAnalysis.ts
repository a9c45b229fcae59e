import { analyzeProfile } from '../src/core/analyzeProfile.ts';
import { analyzeParcelsAndIndices } from '../src/core/parcelsAndIndices.ts';
import { prepareProfile } from '../src/core/prepareProfile.ts';
import type { PreparedProfile } from '../src/core/profile.ts';
import { mixingRatioKgKg } from '../src/core/thermo/vapour.ts';
import { convectiveColumnInput } from '../test/core/parcelsProfiles.ts';
import { nclAvailable, nclDoubles, nclValues, runNcl } from '../test/external/runNcl.ts';

/**
 * Speed of the core analysis (issue 2): the full analysis (`analyzeProfile`) of one 37-level profile,
 * median and p95 µs over many runs (goal: under 50 µs median), and of a 48-hour series of 37-level
 * profiles; then the same profiles through NCL's lclvl plus CAPE in one NCL process, timed inside NCL
 * with get_cpu_time around its loop, and the ratio. NCL's cape_thermo spins forever in this Debian
 * build, so NCL's CAPE is wrf_cape_3d on the single column (it lifts a parcel from every level, which
 * is more work than our two parcels: the ratio favours us by that much). Invented profiles
 * (test/core/parcelsProfiles.ts). Bounded: about 10–20 s.
 */
const HOURS = 48;
const WARMUP_RUNS = 2_000;
const SINGLE_RUNS = 20_000;
const SERIES_REPEATS = 200;
const NCL_REPEATS = 5;
const GOAL_MEDIAN_US = 50;

function seriesProfiles(): PreparedProfile[] {
  const profiles: PreparedProfile[] = [];
  for (let hour = 0; hour < HOURS; hour++) {
    // Invented diurnal cycle: 22 °C at dawn to 34 °C mid-afternoon.
    const surfaceTemperatureC = 28 - 6 * Math.cos((2 * Math.PI * (hour - 3)) / 24);
    const result = prepareProfile(convectiveColumnInput(surfaceTemperatureC, 16));
    if (!result.ok) throw new Error(result.errors.join('; '));
    profiles.push(result.profile);
  }
  return profiles;
}

function percentile(sorted: number[], fraction: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(fraction * sorted.length))];
}

function nclCpuSecondsPerProfile(profiles: PreparedProfile[]): number | null {
  if (!nclAvailable()) return null;
  const n = profiles[0].pressureHpa.length;
  const lines: string[] = [`H = ${profiles.length}`, `N = ${n}`, `R = ${NCL_REPEATS}`];
  const flat = (pick: (p: PreparedProfile) => number[]) => nclDoubles(profiles.flatMap(pick));
  lines.push(`P = reshape(${flat((p) => Array.from(p.pressureHpa))}, (/H,N,1,1/))`);
  lines.push(`T = reshape(${flat((p) => Array.from(p.temperatureC, (t) => t + 273.15))}, (/H,N,1,1/))`);
  lines.push(`TD = reshape(${flat((p) => Array.from(p.dewpointC, (t) => t + 273.15))}, (/H,N,1,1/))`);
  lines.push(`Q = reshape(${flat((p) => Array.from(p.pressureHpa, (pr, i) => mixingRatioKgKg(p.dewpointC[i], pr)))}, (/H,N,1,1/))`);
  lines.push(`Z = reshape(${flat((p) => Array.from(p.heightMslM))}, (/H,N,1,1/))`);
  lines.push('ter = new((/1,1/), double)', 'ps = new((/1,1/), double)', 'total = 0d');
  lines.push('t0 = get_cpu_time()');
  lines.push('do r = 0, R - 1');
  lines.push('  do h = 0, H - 1');
  lines.push('    lcl = lclvl(P(h,0,0,0), T(h,0,0,0), TD(h,0,0,0))');
  lines.push('    ter = Z(h,0,0,0)');
  lines.push('    ps = P(h,0,0,0) * 100d');
  lines.push('    c = wrf_cape_3d(P(h,:,:,:) * 100d, T(h,:,:,:), Q(h,:,:,:), Z(h,:,:,:), ter, ps, False)');
  lines.push('    total = total + c(0,0,0,0) + lcl');
  lines.push('  end do');
  lines.push('end do');
  lines.push('print("CPU " + sprintf("%.6f", get_cpu_time() - t0))');
  lines.push('print("CHECK " + sprintf("%.3f", total))');
  const output = runNcl(lines.join('\n'), 120_000);
  const cpuSeconds = nclValues(output, 'CPU')[0];
  return cpuSeconds / (NCL_REPEATS * profiles.length);
}

export async function runCoreAnalysisBench(): Promise<void> {
  const series = seriesProfiles();
  const single = series[15];
  let sink = 0;
  for (let i = 0; i < WARMUP_RUNS; i++) sink += analyzeProfile(single).parcels.surface.capeJkg;

  const singleUs: number[] = [];
  for (let i = 0; i < SINGLE_RUNS; i++) {
    const start = process.hrtime.bigint();
    sink += analyzeProfile(single).parcels.surface.capeJkg;
    singleUs.push(Number(process.hrtime.bigint() - start) / 1000);
  }
  singleUs.sort((a, b) => a - b);
  const medianUs = percentile(singleUs, 0.5);

  // The parcel and index part alone (analyzeParcelsAndIndices), the share that lifts parcels.
  const partUs: number[] = [];
  for (let i = 0; i < SINGLE_RUNS; i++) {
    const start = process.hrtime.bigint();
    sink += analyzeParcelsAndIndices(single, { virtualTemperature: true }).dcapeJkg;
    partUs.push(Number(process.hrtime.bigint() - start) / 1000);
  }
  partUs.sort((a, b) => a - b);

  const seriesUsPerProfile: number[] = [];
  for (let r = 0; r < SERIES_REPEATS; r++) {
    const start = process.hrtime.bigint();
    for (const profile of series) sink += analyzeProfile(profile).parcels.mixedLayer.capeJkg;
    seriesUsPerProfile.push(Number(process.hrtime.bigint() - start) / 1000 / series.length);
  }
  seriesUsPerProfile.sort((a, b) => a - b);

  console.log(`core analysis, one ${single.pressureHpa.length}-level profile: median ${medianUs.toFixed(1)} µs, p95 ${percentile(singleUs, 0.95).toFixed(1)} µs over ${SINGLE_RUNS} runs (goal < ${GOAL_MEDIAN_US} µs median: ${medianUs < GOAL_MEDIAN_US ? 'met' : 'NOT met'})`);
  console.log(`  of which parcels and indices: median ${percentile(partUs, 0.5).toFixed(1)} µs, p95 ${percentile(partUs, 0.95).toFixed(1)} µs`);
  console.log(`core analysis, ${HOURS}-hour series: median ${(percentile(seriesUsPerProfile, 0.5) * HOURS / 1000).toFixed(2)} ms per series, ${percentile(seriesUsPerProfile, 0.5).toFixed(1)} µs per profile (p95 ${percentile(seriesUsPerProfile, 0.95).toFixed(1)} µs)`);

  const nclSeconds = nclCpuSecondsPerProfile(series);
  if (nclSeconds === null) {
    console.log('NCL: not installed; no comparison (apt-get install -y ncl-ncarg)');
  } else {
    const nclUs = nclSeconds * 1e6;
    const oursUs = percentile(seriesUsPerProfile, 0.5);
    console.log(`NCL lclvl + wrf_cape_3d, same ${HOURS} profiles x ${NCL_REPEATS}, CPU time inside NCL: ${nclUs.toFixed(1)} µs per profile`);
    console.log(`ratio NCL / ours (full analysis): ${(nclUs / oursUs).toFixed(1)}x`);
  }
  if (!Number.isFinite(sink)) console.log('(checksum not finite)');
}

const isMain = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isMain) await runCoreAnalysisBench();
