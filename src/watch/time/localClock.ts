const MINUTE_MS = 60_000;
/** Per zone, at most this many instants are remembered (a few weeks of hours for many series). */
const MAX_REMEMBERED_PER_ZONE = 4096;

/** Turns a UTC instant into the wall-clock time of one zone, ISO 8601 with the offset. */
export type LocalClock = (isoInstant: string) => string;

const offsetFormatters = new Map<string, Intl.DateTimeFormat | null>();
const remembered = new Map<string, Map<number, string>>();

function pad2(value: number): string {
  return value < 10 ? `0${value}` : String(value);
}

/** An Intl formatter giving the zone's wall clock; null for a zone Intl does not know. */
function offsetFormatter(timeZone: string): Intl.DateTimeFormat | null {
  if (!offsetFormatters.has(timeZone)) {
    let formatter: Intl.DateTimeFormat | null = null;
    try {
      formatter = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: 'numeric',
        day: 'numeric',
        hour: 'numeric',
        minute: 'numeric',
        second: 'numeric',
      });
    } catch {
      formatter = null;
    }
    offsetFormatters.set(timeZone, formatter);
  }
  return offsetFormatters.get(timeZone) ?? null;
}

/** The zone's offset from UTC at an instant, minutes: its wall clock read as UTC, less the instant. */
function offsetMinutes(formatter: Intl.DateTimeFormat | null, instantMs: number): number {
  if (!formatter) return 0;
  const parts: Record<string, number> = {};
  for (const part of formatter.formatToParts(instantMs)) if (part.type !== 'literal') parts[part.type] = Number(part.value);
  const wallAsUtcMs = Date.UTC(parts.year, parts.month - 1, parts.day, parts.hour, parts.minute, parts.second);
  return Math.round((wallAsUtcMs - Math.floor(instantMs / 1000) * 1000) / MINUTE_MS);
}

/**
 * A clock for one time zone (IANA name, offline: the zone rules come with the runtime's Intl).
 * Formatters and results are kept per zone: a fleet of series over the same hours asks the same
 * question many times, and building a date object per hour was the slow part of a series. An
 * unknown zone name falls back to UTC (the offset says so).
 */
export function localClock(timeZone: string): LocalClock {
  const formatter = offsetFormatter(timeZone);
  let memory = remembered.get(timeZone);
  if (!memory) {
    memory = new Map();
    remembered.set(timeZone, memory);
  }
  const cache = memory;
  return (isoInstant: string): string => {
    const instantMs = Date.parse(isoInstant);
    if (!Number.isFinite(instantMs)) return isoInstant;
    const known = cache.get(instantMs);
    if (known !== undefined) return known;
    const offset = offsetMinutes(formatter, instantMs);
    const wall = new Date(instantMs + offset * MINUTE_MS);
    const absolute = Math.abs(offset);
    const text =
      `${wall.getUTCFullYear()}-${pad2(wall.getUTCMonth() + 1)}-${pad2(wall.getUTCDate())}` +
      `T${pad2(wall.getUTCHours())}:${pad2(wall.getUTCMinutes())}:${pad2(wall.getUTCSeconds())}` +
      `${offset < 0 ? '-' : '+'}${pad2(Math.floor(absolute / 60))}:${pad2(absolute % 60)}`;
    if (cache.size >= MAX_REMEMBERED_PER_ZONE) cache.clear();
    cache.set(instantMs, text);
    return text;
  };
}

/** The local date, YYYY-MM-DD, of a local ISO time made by a LocalClock. */
export function localDateOf(localIsoTime: string): string {
  return localIsoTime.slice(0, 10);
}
