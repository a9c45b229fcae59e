import { z } from 'zod';

/**
 * Pressure levels the /v1/forecast endpoint documents (open-meteo.com/en/docs, "Pressure Level
 * Variables"), from 1000 hPa up to 200 hPa, the part of the column this project reads.
 */
export const OPEN_METEO_LEVELS_1000_TO_200_HPA = [1000, 975, 950, 925, 900, 850, 800, 700, 600, 500, 400, 300, 250, 200] as const;

export const openMeteoConfigSchema = z.object({
  /** Any Open-Meteo compatible server, e.g. a self-hosted instance. No trailing path. */
  baseUrl: z.url().default('https://api.open-meteo.com'),
  /** The `models` parameter. gfs_seamless: GFS globally, blended with HRRR over the conterminous US. */
  model: z.string().regex(/^[a-z0-9_]+$/, 'a model name such as gfs_seamless').default('gfs_seamless'),
  pressureLevelsHpa: z
    .array(z.number().int().min(10).max(1000))
    .min(3)
    .default([...OPEN_METEO_LEVELS_1000_TO_200_HPA]),
  timeoutMs: z.number().int().positive().default(15_000),
  maxAttempts: z.number().int().min(1).max(10).default(4),
  backoffBaseMs: z.number().int().nonnegative().default(500),
  backoffMaxMs: z.number().int().nonnegative().default(8_000),
  maxRetryAfterMs: z.number().int().nonnegative().default(60_000),
  /** Coordinates per request in fetchMany; the API takes comma-separated lists. */
  maxLocationsPerRequest: z.number().int().min(1).max(1000).default(25),
  /**
   * Levels at lower pressure than this are "upper levels": one of them may be dropped, with a note,
   * when its values are missing. Any level at or below it (the mixed layer, the Haines levels) may not.
   */
  upperLevelBelowPressureHpa: z.number().positive().default(500),
  maxDroppedUpperLevels: z.number().int().min(0).default(1),
  runTime: z
    .object({
      /** Model name in the metadata API path /data/{name}/static/meta.json (GFS 0.11° for gfs_seamless). */
      metadataModel: z.string().regex(/^[a-z0-9_]+$/).default('ncep_gfs013'),
      /** Used only when the metadata API does not answer: the documented update cycle. */
      updateIntervalHours: z.number().positive().default(6),
      /** Hours from a run's initialisation until it is served, for the same fallback. */
      availabilityDelayHours: z.number().nonnegative().default(5),
      /** How long one metadata answer is reused, ms. */
      metadataReuseMs: z.number().int().nonnegative().default(600_000),
    })
    .prefault({}),
});

export type OpenMeteoConfigInput = z.input<typeof openMeteoConfigSchema>;
export type OpenMeteoConfig = z.output<typeof openMeteoConfigSchema>;

export type OpenMeteoConfigResult = { ok: true; config: OpenMeteoConfig } | { ok: false; error: string };

/** Config with defaults filled; a bad key is named with the reason and an example of a good value. */
export function parseOpenMeteoConfig(input: OpenMeteoConfigInput = {}): OpenMeteoConfigResult {
  const parsed = openMeteoConfigSchema.safeParse(input);
  if (parsed.success) return { ok: true, config: parsed.data };
  const reasons = parsed.error.issues.map((issue) => `${issue.path.join('.') || 'config'}: ${issue.message}`);
  return {
    ok: false,
    error: `Open-Meteo source config is not usable: ${reasons.join('; ')}. Example: { baseUrl: "https://api.open-meteo.com", model: "gfs_seamless", timeoutMs: 15000 }`,
  };
}
