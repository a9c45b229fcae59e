import { DateTime } from 'luxon';
import { rememberByText } from './rememberByText.ts';

/**
 * Times in messages are the place's local wall-clock time, 24-hour clock (incident operations
 * use it; common practice), with the zone's abbreviation so nobody has to guess.
 */
function inZone(isoInstant: string, timeZone: string): DateTime {
  const instant = DateTime.fromISO(isoInstant, { setZone: true });
  const local = instant.setZone(timeZone);
  // An unknown zone name must not break a message: fall back to UTC, which the label says.
  return local.isValid ? local : instant.toUTC();
}

/** Formatters for zone abbreviations, by locale and zone; bounded, since zone names come from input. */
const abbreviationFormats = new Map<string, Intl.DateTimeFormat>();
const MAX_ABBREVIATION_FORMATS = 64;

/**
 * The zone's short name at that instant ("MDT"), exactly as luxon's "ZZZZ" token writes it: the
 * same Intl options and locale, but one formatter per zone kept for reuse, where luxon builds a
 * new one on every call (most of the cost of a formatted hour).
 */
function zoneAbbreviation(local: DateTime): string {
  if (local.zone.type !== 'iana') return local.toFormat('ZZZZ');
  const key = `${local.locale}\u0000${local.zone.name}`;
  let format = abbreviationFormats.get(key);
  if (!format) {
    if (abbreviationFormats.size >= MAX_ABBREVIATION_FORMATS) abbreviationFormats.clear();
    format = new Intl.DateTimeFormat(local.locale ?? undefined, {
      timeZoneName: 'short',
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      timeZone: local.zone.name,
    });
    abbreviationFormats.set(key, format);
  }
  const part = format.formatToParts(new Date(local.toMillis())).find((candidate) => candidate.type.toLowerCase() === 'timezonename');
  // luxon writes a missing name as "null"; so do we, to stay byte-identical.
  return `${part ? part.value : null}`;
}

/** "Thu 14:00 MDT". */
export const formatLocalHour = rememberByText((isoInstant: string, timeZone: string): string => {
  const local = inZone(isoInstant, timeZone);
  return local.isValid ? `${local.toFormat('ccc HH:mm')} ${zoneAbbreviation(local)}` : isoInstant;
});

/** "Thu 14 Aug 14:00 MDT", for alerts where the date matters. */
export const formatLocalDateHour = rememberByText((isoInstant: string, timeZone: string): string => {
  const local = inZone(isoInstant, timeZone);
  return local.isValid ? `${local.toFormat('ccc d LLL HH:mm')} ${zoneAbbreviation(local)}` : isoInstant;
});

/** "14:00", for compact places (chart axes, ranges). */
export const formatLocalClock = rememberByText((isoInstant: string, timeZone: string): string => {
  const local = inZone(isoInstant, timeZone);
  return local.isValid ? local.toFormat('HH:mm') : isoInstant;
});

/** "Thu 14 Aug" for a local date "2026-08-14". */
export function formatLocalDate(localDate: string): string {
  const day = DateTime.fromISO(localDate, { zone: 'UTC' });
  return day.isValid ? day.toFormat('ccc d LLL') : localDate;
}

/** Local hour of day 0..23 and the local date, for chart axes. */
export const localParts = rememberByText((isoInstant: string, timeZone: string): Readonly<{ hour: number; minute: number; weekday: string; dayLabel: string }> | null => {
  const local = inZone(isoInstant, timeZone);
  if (!local.isValid) return null;
  return Object.freeze({ hour: local.hour, minute: local.minute, weekday: local.toFormat('ccc'), dayLabel: local.toFormat('ccc d LLL') });
});

/** Model run time as forecasters write it: "12Z 14 Aug 2026". */
export function formatRunTime(isoInstant: string): string {
  const run = DateTime.fromISO(isoInstant, { setZone: true }).toUTC();
  return run.isValid ? `${run.toFormat('HH')}Z ${run.toFormat('d LLL yyyy')}` : isoInstant;
}
