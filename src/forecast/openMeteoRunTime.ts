import { z } from 'zod';
import { isoHour } from './forecastRequestSchema.ts';
import { httpGetText } from './httpGetText.ts';
import type { OpenMeteoConfig } from './openMeteoConfig.ts';

/**
 * The model run behind a forecast. The forecast answer itself does not carry it; Open-Meteo's
 * metadata API does (open-meteo.com/en/docs/model-updates: GET /data/{model}/static/meta.json with
 * last_run_initialisation_time in unix seconds). When that does not answer, the run is derived from
 * the model's documented update cycle (GFS: every 6 hours, served some hours after initialisation)
 * and the series says so in a note.
 */
export interface RunTime {
  runTime: string;
  /** Set when the run time was derived from the update cycle instead of read from the provider. */
  note?: string;
}

const metaSchema = z.object({
  last_run_initialisation_time: z.number().int().positive(),
  update_interval_seconds: z.number().positive().optional(),
});

export class OpenMeteoRunTimeLookup {
  private cached: { value: RunTime; untilMs: number } | null = null;
  private inFlight: Promise<RunTime> | null = null;

  constructor(
    private readonly config: OpenMeteoConfig,
    private readonly nowMs: () => number = Date.now,
  ) {}

  /** One metadata request serves every concurrent caller and is reused for a while. */
  current(): Promise<RunTime> {
    const now = this.nowMs();
    if (this.cached && now < this.cached.untilMs) return Promise.resolve(this.cached.value);
    if (!this.inFlight) {
      this.inFlight = this.lookUp().finally(() => {
        this.inFlight = null;
      });
    }
    return this.inFlight;
  }

  private async lookUp(): Promise<RunTime> {
    const { runTime: settings } = this.config;
    const url = new URL(`/data/${settings.metadataModel}/static/meta.json`, this.config.baseUrl).toString();
    const answer = await httpGetText(url, {
      // One short try: the run time is a label, not worth delaying the forecast for.
      policy: { timeoutMs: Math.min(this.config.timeoutMs, 5_000), maxAttempts: 1, backoffBaseMs: 0, backoffMaxMs: 0, maxRetryAfterMs: 0 },
    });
    let value: RunTime;
    let why: string;
    if (answer.ok) {
      const parsed = safeJson(answer.bodyText);
      const meta = metaSchema.safeParse(parsed);
      if (meta.success) {
        value = { runTime: isoHour(meta.data.last_run_initialisation_time * 1000) };
        this.cached = { value, untilMs: this.nowMs() + settings.metadataReuseMs };
        return value;
      }
      why = 'its answer lacked last_run_initialisation_time';
    } else {
      why = answer.cause;
    }
    value = derivedRunTime(this.nowMs(), settings.updateIntervalHours, settings.availabilityDelayHours, `the model-run metadata (${settings.metadataModel}) was not available: ${why}`);
    // A derived value is only a guess; ask again soon rather than keep it for the full reuse period.
    this.cached = { value, untilMs: this.nowMs() + Math.min(settings.metadataReuseMs, 60_000) };
    return value;
  }
}

/** The latest run, on the model's cycle, that would be served by now. */
export function derivedRunTime(nowMs: number, updateIntervalHours: number, availabilityDelayHours: number, why: string): RunTime {
  const cycleMs = updateIntervalHours * 3_600_000;
  const runMs = Math.floor((nowMs - availabilityDelayHours * 3_600_000) / cycleMs) * cycleMs;
  return {
    runTime: isoHour(runMs),
    note: `run time ${isoHour(runMs)} derived from the model's update cycle (every ${updateIntervalHours} h, served about ${availabilityDelayHours} h after the run) because ${why}`,
  };
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return null;
  }
}
