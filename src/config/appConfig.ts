import { readFileSync } from 'node:fs';
import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { openMeteoConfigSchema } from '../forecast/openMeteoConfig.ts';
import { localFooterLineSchema } from '../render/safetyFooter.ts';
import { packagePath } from '../packageRoot.ts';
import { DEFAULT_ANSWERS_AT_ONCE, MAX_ANSWERS_AT_ONCE } from './answersAtOnce.ts';

/** The repository's config folder, wherever the process was started from. */
export const CONFIG_DIR = `${packagePath('config')}/`;
export const DEFAULT_CONFIG_FILE = `${CONFIG_DIR}lapsewatch.yaml`;

const sourceSetting = z
  .string()
  .regex(/^(demo|http|files:.+)$/, 'must be "demo", "http" or "files:DIR" (e.g. files:./soundings)');

export const appConfigSchema = z.object({
  forecast: z
    .object({
      source: sourceSetting.default('demo'),
      hours: z.number().int().min(6).max(168).default(48),
      openMeteo: openMeteoConfigSchema.prefault({}),
    })
    .strict()
    .prefault({}),
  store: z
    .object({ url: z.string().regex(/^(sqlite:.+|postgres(ql)?:\/\/.+)$/, 'must be sqlite:PATH or postgres://...').default('sqlite:data/lapsewatch.db') })
    .strict()
    .prefault({}),
  channelDefaults: z
    .object({
      unitSystem: z.enum(['metric', 'us']).default('metric'),
      summaryLocalTime: z
        .string()
        .regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be HH:MM in 24-hour time, e.g. "06:30"')
        .nullable()
        .default('06:30'),
    })
    .strict()
    .prefault({}),
  schedule: z.object({ alertCheckEveryMinutes: z.number().int().min(5).max(360).default(30) }).strict().prefault({}),
  messages: z.object({ localFooterLine: localFooterLineSchema.optional() }).strict().prefault({}),
  http: z.object({ port: z.number().int().min(0).max(65535).default(3000) }).strict().prefault({}),
  chat: z.object({ answersAtOnce: z.number().int().min(1).max(MAX_ANSWERS_AT_ONCE).default(DEFAULT_ANSWERS_AT_ONCE) }).strict().prefault({}),
}).strict();

export type AppConfig = z.output<typeof appConfigSchema>;

export type AppConfigResult = { ok: true; config: AppConfig } | { ok: false; error: string };

/** Environment variables that override settings, by their usual names. */
export interface ConfigEnvironment {
  LAPSEWATCH_SOURCE?: string;
  LAPSEWATCH_STORE_URL?: string;
  LAPSEWATCH_HTTP_PORT?: string;
}

/**
 * Reads and checks the YAML config. A bad file stops start-up with the file, the key and the
 * reason; nothing is guessed.
 */
export function loadAppConfig(filePath: string = DEFAULT_CONFIG_FILE, environment: ConfigEnvironment = process.env): AppConfigResult {
  let text: string;
  try {
    text = readFileSync(filePath, 'utf8');
  } catch (error) {
    return { ok: false, error: `${filePath}: cannot read the config file (${(error as NodeJS.ErrnoException).code ?? (error as Error).message})` };
  }
  let raw: unknown;
  try {
    raw = parseYaml(text) ?? {};
  } catch (error) {
    return { ok: false, error: `${filePath}: not valid YAML (${(error as Error).message.split('\n')[0]})` };
  }
  return parseAppConfig(raw, filePath, environment);
}

export function parseAppConfig(raw: unknown, fileLabel: string, environment: ConfigEnvironment = {}): AppConfigResult {
  const withEnvironment = applyEnvironment(raw, environment);
  const parsed = appConfigSchema.safeParse(withEnvironment);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    const key = issue.path.map(String).join('.') || '(top level)';
    const reason = issue.code === 'unrecognized_keys' ? `unknown key(s) ${issue.keys.join(', ')}` : issue.message;
    return { ok: false, error: `${fileLabel}: key "${key}": ${reason}` };
  }
  return { ok: true, config: parsed.data };
}

function applyEnvironment(raw: unknown, environment: ConfigEnvironment): unknown {
  const base = (typeof raw === 'object' && raw !== null ? structuredClone(raw) : {}) as Record<string, Record<string, unknown>>;
  // A section whose keys are all commented out reads as null in YAML: it means "all defaults".
  for (const [key, value] of Object.entries(base)) if (value === null) base[key] = {};
  const section = (name: string) => (base[name] = typeof base[name] === 'object' && base[name] !== null ? base[name] : {});
  if (environment.LAPSEWATCH_SOURCE) section('forecast').source = environment.LAPSEWATCH_SOURCE;
  if (environment.LAPSEWATCH_STORE_URL) section('store').url = environment.LAPSEWATCH_STORE_URL;
  if (environment.LAPSEWATCH_HTTP_PORT) section('http').port = Number(environment.LAPSEWATCH_HTTP_PORT);
  return base;
}
