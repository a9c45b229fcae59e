import fc from 'fast-check';
import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import { localClock, localDateOf } from '../../src/watch/time/localClock.ts';
import { timeZoneAt } from '../../src/geo/timeZoneAt.ts';

describe('local time at a point', () => {
  it('finds the zone offline from latitude and longitude', () => {
    expect(timeZoneAt(44.12, -114.93)).toBe('America/Boise');
    expect(timeZoneAt(-33.87, 151.21)).toBe('Australia/Sydney');
    expect(timeZoneAt(39.74, -104.99)).toBe('America/Denver');
  });

  it('follows daylight saving: the same zone has two offsets across the March change', () => {
    const toDenver = localClock('America/Denver');
    // US daylight saving starts 2026-03-08 at 02:00 local (second Sunday of March; common knowledge).
    expect(toDenver('2026-03-08T08:00:00Z')).toBe('2026-03-08T01:00:00-07:00');
    expect(toDenver('2026-03-08T09:00:00Z')).toBe('2026-03-08T03:00:00-06:00');
  });

  it('puts an hour on its local date, east of Greenwich too', () => {
    const toSydney = localClock('Australia/Sydney');
    const local = toSydney('2026-01-10T15:00:00Z');
    expect(local).toBe('2026-01-11T02:00:00+11:00');
    expect(localDateOf(local)).toBe('2026-01-11');
  });

  it('an unknown zone name falls back to UTC and says so in the offset', () => {
    expect(localClock('Nowhere/Invented')('2026-08-14T21:00:00Z')).toBe('2026-08-14T21:00:00+00:00');
  });
});

describe('the local clock agrees with luxon', () => {
  it('for any whole-second instant from 2020 to 2030 in zones on both sides of Greenwich, with and without daylight saving', () => {
    const zones = ['America/Boise', 'America/Phoenix', 'America/St_Johns', 'Europe/Lisbon', 'Australia/Adelaide', 'Asia/Kathmandu', 'Pacific/Chatham'];
    fc.assert(
      fc.property(fc.integer({ min: 1_577_836_800, max: 1_893_456_000 }), fc.constantFrom(...zones), (seconds, zone) => {
        const iso = new Date(seconds * 1000).toISOString();
        const expected = DateTime.fromMillis(seconds * 1000, { zone }).toISO({ suppressMilliseconds: true });
        return localClock(zone)(iso) === expected;
      }),
      { numRuns: 500 },
    );
  });
});
