// Morning summaries on daylight-saving change days, America/Denver (2031: spring forward Sunday
// 9 March at 02:00, fall back Sunday 2 November at 02:00; US rule: second Sunday of March, first
// Sunday of November). A tick every minute over each local day must find the summary due once.
import { describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import { dueSummaryDate, summaryInstantMs } from '../../src/schedule/summaryOccurrence.ts';

const ZONE = 'America/Denver';

/** Ticks each minute through one local day; records the dates found due, "sending" each at once. */
function runsOverDay(localDate: string, localTime: string): Array<{ date: string; atLocal: string }> {
  const start = DateTime.fromISO(`${localDate}T00:00`, { zone: ZONE });
  const end = start.plus({ days: 1 });
  let last: string | null = null;
  const runs: Array<{ date: string; atLocal: string }> = [];
  for (let t = start.toMillis(); t < end.toMillis(); t += 60_000) {
    const due = dueSummaryDate({ nowMs: t, localTime, timeZone: ZONE, lastSummaryLocalDate: last });
    if (due !== null) {
      runs.push({ date: due, atLocal: DateTime.fromMillis(t, { zone: ZONE }).toFormat('HH:mm ZZ') });
      last = due;
    }
  }
  return runs;
}

describe('summary time on daylight-saving change days', () => {
  it('06:30 runs once on spring-forward day, at 06:30 MDT', () => {
    expect(runsOverDay('2031-03-09', '06:30')).toEqual([{ date: '2031-03-09', atLocal: '06:30 -06:00' }]);
  });

  it('06:30 runs once on fall-back day, at 06:30 MST', () => {
    expect(runsOverDay('2031-11-02', '06:30')).toEqual([{ date: '2031-11-02', atLocal: '06:30 -07:00' }]);
  });

  it('02:30 does not exist on spring-forward day: runs once, at 03:30 MDT', () => {
    expect(runsOverDay('2031-03-09', '02:30')).toEqual([{ date: '2031-03-09', atLocal: '03:30 -06:00' }]);
  });

  it('01:30 exists twice on fall-back day: runs once, at the first (MDT)', () => {
    expect(runsOverDay('2031-11-02', '01:30')).toEqual([{ date: '2031-11-02', atLocal: '01:30 -06:00' }]);
  });

  it('runs once a day on the days around each change', () => {
    for (const date of ['2031-03-08', '2031-03-10', '2031-11-01', '2031-11-03']) {
      expect(runsOverDay(date, '06:30')).toHaveLength(1);
    }
  });

  it('a summary missed while the bot was down goes out late within the catch-up window, not after', () => {
    const dueAt = summaryInstantMs('2031-07-14', '06:30', ZONE);
    expect(dueSummaryDate({ nowMs: dueAt + 40 * 60_000, localTime: '06:30', timeZone: ZONE, lastSummaryLocalDate: '2031-07-13' })).toBe('2031-07-14');
    expect(dueSummaryDate({ nowMs: dueAt + 4 * 3600_000, localTime: '06:30', timeZone: ZONE, lastSummaryLocalDate: '2031-07-13' })).toBeNull();
    expect(dueSummaryDate({ nowMs: dueAt - 60_000, localTime: '06:30', timeZone: ZONE, lastSummaryLocalDate: '2031-07-13' })).toBeNull();
  });

  it('refuses a malformed time with a message that shows the right form', () => {
    expect(() => summaryInstantMs('2031-07-14', '6:30', ZONE)).toThrow(/HH:MM/);
  });
});
