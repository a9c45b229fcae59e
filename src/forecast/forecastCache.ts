import { z } from 'zod';
import { describeLocation } from './describeLocation.ts';
import { forecastFailure } from './forecastFailure.ts';
import type { ForecastLocation, ForecastResult, ForecastSeries, ForecastSource, ForecastWindow } from './forecastSource.ts';
import { packSeries, unpackSeries, type PackedSeries } from './packedSeries.ts';
import { keepRecent } from '../keepRecent.ts';

const modelCycleSchema = z.object({
  /** A new run every this many hours (GFS: 6). */
  intervalHours: z.number().positive(),
  /** Hours from a run's initialisation until the provider serves it. */
  availabilityDelayHours: z.number().nonnegative(),
});

export const forecastCacheConfigSchema = z.object({
  /** The model the wrapped source serves: it picks the update cycle and is part of every key. */
  model: z.string().min(1),
  /** Locations are rounded to this grid, degrees, so that neighbours share one entry (the model's grid). */
  gridDeg: z.number().positive().max(5).default(0.1),
  updateCycles: z.record(z.string(), modelCycleSchema).default({
    gfs_seamless: { intervalHours: 6, availabilityDelayHours: 5 },
    'demo-scenario': { intervalHours: 12, availabilityDelayHours: 0 },
  }),
  defaultCycle: modelCycleSchema.default({ intervalHours: 6, availabilityDelayHours: 5 }),
  maxEntries: z.number().int().positive().default(5000),
  /**
   * The most recently used series are also kept as objects, so a place asked about again gets the
   * very same series (the router assesses a series once, by identity); the rest are held packed.
   */
  maxUnpacked: z.number().int().nonnegative().default(16),
});

export type ForecastCacheConfigInput = z.input<typeof forecastCacheConfigSchema>;

export interface ForecastCacheStats {
  /** Answered from a stored entry. */
  hits: number;
  /** Sent upstream. */
  misses: number;
  /** Waited for a request already on its way upstream. */
  joined: number;
}

interface Entry {
  /** Held packed: one place's series is ~0.3 MB of objects, ~75 kB packed. */
  packed: PackedSeries;
  expiresMs: number;
  /**
   * The newest run this entry answers for, epoch ms: its series' run, or the newest run the provider
   * had announced when it was fetched, if later (a provider that still served the older run is then
   * asked again only when it announces a newer one, not on every request).
   */
  coversRunMs: number;
}

/**
 * An in-process cache in front of any source. A key is the location rounded to the model grid, the
 * model, the model run expected to be current (from its update cycle) and the window, so an entry
 * lives until the next run is due. Requests for a key already on its way upstream wait for that one
 * answer (single flight): fifty channels watching one fire make one request. Failures are shared
 * with the requests that waited for them but never stored.
 */
export class ForecastCache implements ForecastSource {
  readonly name: string;
  readonly stats: ForecastCacheStats = { hits: 0, misses: 0, joined: 0 };
  private readonly config: z.output<typeof forecastCacheConfigSchema>;
  private readonly entries = new Map<string, Entry>();
  /** Series as objects for the most recently used keys, oldest first. */
  private readonly unpacked = new Map<string, ForecastSeries>();
  private readonly inFlight = new Map<string, Promise<ForecastResult>>();
  /** The newest run the provider has said it serves (latestRunTime), epoch ms; null until it says. */
  private latestKnownRunMs: number | null = null;

  constructor(
    private readonly inner: ForecastSource,
    configInput: ForecastCacheConfigInput,
    private readonly nowMs: () => number = Date.now,
  ) {
    const parsed = forecastCacheConfigSchema.safeParse(configInput);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      throw new Error(`forecast cache config is not usable: ${issue.path.join('.') || 'config'}: ${issue.message}. Example: { model: "gfs_seamless", gridDeg: 0.1 }`);
    }
    this.config = parsed.data;
    this.name = inner.name;
  }

  async fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult> {
    const [result] = await this.fetchMany([location], window);
    return result;
  }

  async fetchMany(locations: ForecastLocation[], window: ForecastWindow): Promise<ForecastResult[]> {
    const now = this.nowMs();
    const run = this.currentRun(now);
    const knownRunMs = this.latestKnownRunMs ?? Number.NEGATIVE_INFINITY;
    const results: ForecastResult[] = new Array(locations.length);
    const waits: Promise<void>[] = [];
    const upstream: { key: string; location: ForecastLocation; settle: (result: ForecastResult) => void }[] = [];

    locations.forEach((location, index) => {
      const key = this.keyFor(location, window, run.slotMs);
      if (key === null) {
        // Not keyable (a bad window or location): the wrapped source gives the proper error.
        waits.push(this.inner.fetchSeries(location, window).then((result) => void (results[index] = result)));
        return;
      }
      const entry = this.entries.get(key);
      if (entry && entry.expiresMs > now && entry.coversRunMs >= knownRunMs) {
        this.stats.hits++;
        results[index] = relabel({ ok: true, series: this.seriesOf(key, entry) }, location);
        return;
      }
      let flight = this.inFlight.get(key);
      if (flight) {
        this.stats.joined++;
      } else {
        this.stats.misses++;
        let settle!: (result: ForecastResult) => void;
        flight = new Promise<ForecastResult>((resolve) => (settle = resolve));
        this.inFlight.set(key, flight);
        upstream.push({ key, location, settle });
      }
      waits.push(flight.then((result) => void (results[index] = relabel(result, location))));
    });

    if (upstream.length > 0) {
      const settleAll = (answers: ForecastResult[]) => {
        upstream.forEach((request, position) => {
          const answer = answers[position];
          if (answer.ok) {
            this.store(request.key, { packed: packSeries(answer.series), expiresMs: run.expiresMs, coversRunMs: Math.max(Date.parse(answer.series.runTime) || Number.NEGATIVE_INFINITY, knownRunMs) });
            this.keepUnpacked(request.key, answer.series);
          }
          this.inFlight.delete(request.key);
          request.settle(answer);
        });
      };
      this.inner.fetchMany(upstream.map((request) => request.location), window).then(
        (answers) => settleAll(answers.length === upstream.length ? answers : upstream.map((request) => forecastFailure('bad-response', this.name, request.location, `the source returned ${answers.length} answers for ${upstream.length} locations`))),
        (error: unknown) => settleAll(upstream.map((request) => forecastFailure('network', this.name, request.location, `the source failed unexpectedly (${error instanceof Error ? error.message : String(error)})`))),
      );
    }
    await Promise.all(waits);
    return results;
  }

  /**
   * Asks the wrapped source for the newest run it serves and remembers it: entries of an older run
   * are then fetched again, rather than kept until the update cycle says a run is due (a run served
   * early, or one served late that the cycle's expiry already passed, would otherwise wait hours).
   */
  async latestRunTime(): Promise<string | null> {
    const latest = (await this.inner.latestRunTime?.()) ?? null;
    const latestMs = latest === null ? Number.NaN : Date.parse(latest);
    if (Number.isFinite(latestMs)) this.latestKnownRunMs = Math.max(this.latestKnownRunMs ?? latestMs, latestMs);
    return latest;
  }

  /** Entries currently held (expired ones included until they are replaced or pruned). */
  get size(): number {
    return this.entries.size;
  }

  private currentRun(nowMs: number): { slotMs: number; expiresMs: number } {
    const cycle = this.config.updateCycles[this.config.model] ?? this.config.defaultCycle;
    const intervalMs = cycle.intervalHours * 3_600_000;
    const delayMs = cycle.availabilityDelayHours * 3_600_000;
    // The run being served now started `delay` before its availability; the next one is one interval later.
    const slotMs = Math.floor((nowMs - delayMs) / intervalMs) * intervalMs;
    return { slotMs, expiresMs: slotMs + delayMs + intervalMs };
  }

  private keyFor(location: ForecastLocation, window: ForecastWindow, runSlotMs: number): string | null {
    const startMs = Date.parse(window.startTime);
    if (!Number.isFinite(startMs) || !Number.isFinite(location.latitude) || !Number.isFinite(location.longitude)) return null;
    const grid = this.config.gridDeg;
    const latitude = (Math.round(location.latitude / grid) * grid).toFixed(4);
    const longitude = (Math.round(location.longitude / grid) * grid).toFixed(4);
    // A given terrain height changes the provider's downscaling, so it is part of the key (to 10 m).
    const elevation = location.elevationM === undefined ? '-' : String(Math.round(location.elevationM / 10) * 10);
    const startHourMs = Math.floor(startMs / 3_600_000) * 3_600_000;
    return `${this.config.model}|${runSlotMs}|${latitude}|${longitude}|${elevation}|${startHourMs}|${window.hours}`;
  }

  private seriesOf(key: string, entry: Entry): ForecastSeries {
    const known = this.unpacked.get(key);
    const series = known ?? unpackSeries(entry.packed);
    this.keepUnpacked(key, series);
    return series;
  }

  private keepUnpacked(key: string, series: ForecastSeries): void {
    keepRecent(this.unpacked, key, series, this.config.maxUnpacked);
  }

  private store(key: string, entry: Entry): void {
    this.entries.delete(key);
    this.entries.set(key, entry);
    if (this.entries.size <= this.config.maxEntries) return;
    const now = this.nowMs();
    for (const [oldKey, oldEntry] of this.entries) {
      if (oldEntry.expiresMs <= now) {
        this.entries.delete(oldKey);
        this.unpacked.delete(oldKey);
      }
    }
    // Still full: drop the oldest stored.
    while (this.entries.size > this.config.maxEntries) {
      const oldest = this.entries.keys().next().value as string;
      this.entries.delete(oldest);
      this.unpacked.delete(oldest);
    }
  }
}

/** A shared answer carries the asking location's own coordinates and name. */
function relabel(result: ForecastResult, location: ForecastLocation): ForecastResult {
  if (!result.ok) {
    const message = result.error.message.replace(describeLocation(result.error.location), describeLocation(location));
    return { ok: false, error: { ...result.error, location, message } };
  }
  const series = result.series;
  if (series.location.latitude === location.latitude && series.location.longitude === location.longitude && series.location.name === location.name) {
    return result;
  }
  return {
    ok: true,
    series: {
      ...series,
      location: { ...series.location, ...location, elevationM: location.elevationM ?? series.location.elevationM },
      profiles: series.profiles.map((profile) => ({
        ...profile,
        name: location.name ?? profile.name,
        latitude: location.latitude,
        longitude: location.longitude,
      })),
    },
  };
}
