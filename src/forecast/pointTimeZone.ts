import { DateTime } from 'luxon';

export { timeZoneAt } from '../geo/timeZoneAt.ts';

export interface LocalClock {
  /** Local calendar date, YYYY-MM-DD. */
  localDate: string;
  /** Local hour of day with minutes as a fraction, 0 ≤ h < 24. */
  localHour: number;
}

export function localClock(epochMs: number, timeZone: string): LocalClock {
  const local = DateTime.fromMillis(epochMs, { zone: timeZone });
  return { localDate: local.toISODate() ?? '', localHour: local.hour + local.minute / 60 };
}

/** Whole local calendar days from date `fromDate` to date `toDate` (both YYYY-MM-DD). */
export function calendarDaysBetween(fromDate: string, toDate: string): number {
  return Math.round((Date.parse(`${toDate}T00:00:00Z`) - Date.parse(`${fromDate}T00:00:00Z`)) / 86_400_000);
}

/** The local date after `date` (YYYY-MM-DD). */
export function nextCalendarDate(date: string): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
}
