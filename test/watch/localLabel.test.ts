import { describe, expect, it } from 'vitest';
import { formatLocalDateHour, formatRunTime } from '../../src/render/localTime.ts';
import { formatLocalDateHourFast, formatRunTimeFast } from '../../src/watch/time/localLabel.ts';

describe('fast local labels read the same as the render layer\u2019s', () => {
  it.each([
    ['2026-08-14T21:00:00Z', 'America/Boise'],
    ['2026-03-08T09:00:00Z', 'America/Denver'],
    ['2026-01-10T15:00:00Z', 'Australia/Sydney'],
    ['2026-08-14T21:00:00Z', 'UTC'],
  ])('%s in %s', (instant, zone) => {
    expect(formatLocalDateHourFast(instant, zone)).toBe(formatLocalDateHour(instant, zone));
  });

  it('run times', () => {
    expect(formatRunTimeFast('2026-08-14T06:00:00Z')).toBe('06Z 14 Aug 2026');
    expect(formatRunTimeFast('2026-08-14T06:00:00Z')).toBe(formatRunTime('2026-08-14T06:00:00Z'));
  });

  it('an unknown zone reads as UTC', () => {
    expect(formatLocalDateHourFast('2026-08-14T21:00:00Z', 'Nowhere/Invented')).toBe('Fri 14 Aug 21:00 UTC');
  });
});
