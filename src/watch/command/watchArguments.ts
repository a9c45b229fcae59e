import { parseArgs } from 'node:util';
import { z } from 'zod';
import { DEMO_PLACES, findDemoPlace } from '../../forecast/demoPlaces.ts';
import { MAX_WINDOW_HOURS } from '../../forecast/forecastRequestSchema.ts';
import type { ForecastLocation } from '../../forecast/forecastSource.ts';

export type WatchSourceChoice = { kind: 'demo' } | { kind: 'http' } | { kind: 'files'; directory: string };

export interface WatchArguments {
  location: ForecastLocation;
  source: WatchSourceChoice;
  json: boolean;
  hours: number;
  /** ISO instant of the first hour; null: the current hour. */
  startTime: string | null;
  /** Rules file; null: the shipped config/rules.yaml. */
  rulesPath: string | null;
  help: boolean;
}

export type WatchArgumentsResult = { ok: true; arguments: WatchArguments } | { ok: false; message: string };

const PLACE_EXAMPLE = `e.g. --place 43.62,-115.48 or --place "${DEMO_PLACES[0].name}"`;
const COORDINATES = /^\s*([+-]?\d+(?:\.\d+)?)\s*,\s*([+-]?\d+(?:\.\d+)?)\s*$/;

/** --place NAME|LAT,LON: coordinates in decimal degrees, or the name of one of the demo's invented places. */
export function parsePlace(text: string): { ok: true; location: ForecastLocation } | { ok: false; message: string } {
  const match = COORDINATES.exec(text);
  if (match) {
    const latitude = Number(match[1]);
    const longitude = Number(match[2]);
    if (latitude < -90 || latitude > 90) return { ok: false, message: `--place "${text}": latitude ${latitude} is outside -90..90; ${PLACE_EXAMPLE}` };
    if (longitude < -180 || longitude > 180) return { ok: false, message: `--place "${text}": longitude ${longitude} is outside -180..180; ${PLACE_EXAMPLE}` };
    return { ok: true, location: { latitude, longitude } };
  }
  const place = findDemoPlace(text);
  if (place) return { ok: true, location: { latitude: place.latitude, longitude: place.longitude, elevationM: place.elevationM, name: place.name } };
  const known = DEMO_PLACES.map((candidate) => `"${candidate.name}"`).join(', ');
  return { ok: false, message: `--place "${text}": not coordinates (LAT,LON in decimal degrees) and not a known place (${known}); ${PLACE_EXAMPLE}` };
}

function parseSource(text: string): WatchSourceChoice | null {
  if (text === 'demo') return { kind: 'demo' };
  if (text === 'http') return { kind: 'http' };
  if (text.startsWith('files:') && text.length > 'files:'.length) return { kind: 'files', directory: text.slice('files:'.length) };
  return null;
}

const hoursSchema = z.coerce.number().int().min(1).max(MAX_WINDOW_HOURS);
const startSchema = z.iso.datetime({ offset: true });

/**
 * `watch` options. Every problem is one line saying what is wrong and showing a correct example;
 * nothing is fetched or printed to stdout until the arguments are right.
 */
export function parseWatchArguments(args: string[]): WatchArgumentsResult {
  let values: Record<string, string | boolean | undefined>;
  try {
    ({ values } = parseArgs({
      args,
      strict: true,
      allowPositionals: false,
      options: {
        place: { type: 'string' },
        source: { type: 'string' },
        json: { type: 'boolean' },
        hours: { type: 'string' },
        start: { type: 'string' },
        rules: { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
    }));
  } catch (error) {
    return { ok: false, message: `${(error as Error).message.split('\n')[0]}; e.g. lapsewatch watch --place 43.62,-115.48 --source demo --hours 48` };
  }
  if (values.help === true) {
    return { ok: true, arguments: { location: { latitude: 0, longitude: 0 }, source: { kind: 'demo' }, json: false, hours: 48, startTime: null, rulesPath: null, help: true } };
  }
  if (typeof values.place !== 'string' || values.place.trim() === '') return { ok: false, message: `--place is required; ${PLACE_EXAMPLE}` };
  const place = parsePlace(values.place);
  if (!place.ok) return place;
  const source = parseSource(typeof values.source === 'string' ? values.source : 'demo');
  if (!source) return { ok: false, message: `--source "${String(values.source)}": use demo, http or files:DIR, e.g. --source files:./profiles` };
  const hours = hoursSchema.safeParse(values.hours ?? '48');
  if (!hours.success) return { ok: false, message: `--hours "${String(values.hours)}": give a whole number of hours from 1 to ${MAX_WINDOW_HOURS}, e.g. --hours 48` };
  let startTime: string | null = null;
  if (values.start !== undefined) {
    if (!startSchema.safeParse(values.start).success) return { ok: false, message: `--start "${String(values.start)}": give an ISO 8601 instant, e.g. --start 2026-08-14T06:00:00Z` };
    startTime = String(values.start);
  }
  return {
    ok: true,
    arguments: {
      location: place.location,
      source,
      json: values.json === true,
      hours: hours.data,
      startTime,
      rulesPath: typeof values.rules === 'string' ? values.rules : null,
      help: false,
    },
  };
}

export const WATCH_USAGE = [
  'Usage: lapsewatch watch --place NAME|LAT,LON [--source demo|http|files:DIR] [--json] [--hours N] [--start ISO] [--rules FILE]',
  '',
  '  --place   decimal degrees "43.62,-115.48", or a demo place: ' + DEMO_PLACES.map((place) => `"${place.name}"`).join(', ') + ' (invented)',
  '  --source  demo (default, invented data, no network), http (Open-Meteo), files:DIR (one profile file per valid hour)',
  '  --hours   forecast hours to assess, 1..' + MAX_WINDOW_HOURS + ' (default 48)',
  '  --start   first valid hour, ISO 8601 (default: the current hour; give it for files:DIR)',
  '  --rules   rules file (default config/rules.yaml)',
  '  --json    one JSON object instead of text',
  '',
].join('\n');
