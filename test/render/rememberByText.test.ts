import { describe, expect, it } from 'vitest';
import { formatLocalHour } from '../../src/render/localTime.ts';
import { rememberByText } from '../../src/render/rememberByText.ts';

describe('remembered text results', () => {
  it('computes each pair of inputs once, keeps pairs apart, and starts again when full', () => {
    const calls: string[] = [];
    const joined = rememberByText((a, b) => {
      calls.push(`${a}|${b}`);
      return `${a}-${b}`;
    }, 2);
    expect([joined('a', 'b'), joined('a', 'b'), joined('ab', ''), joined('a', 'b')]).toEqual(['a-b', 'a-b', 'ab-', 'a-b']);
    expect(calls).toEqual(['a|b', 'ab|']);
    joined('c', 'd'); // third pair: the memory is cleared first
    joined('a', 'b');
    expect(calls).toEqual(['a|b', 'ab|', 'c|d', 'a|b']);
  });

  it('gives the same local hours as before, the zone abbreviation included (IANA zone rules, from the runtime)', () => {
    // 20:00 UTC on 14 Aug 2026 is 14:00 MDT (UTC-6 in summer, common knowledge of US time zones).
    expect(formatLocalHour('2026-08-14T20:00:00Z', 'America/Denver')).toBe('Fri 14:00 MDT');
    expect(formatLocalHour('2026-08-14T20:00:00Z', 'America/Denver')).toBe('Fri 14:00 MDT');
    expect(formatLocalHour('2026-12-14T20:00:00Z', 'America/Denver')).toBe('Mon 13:00 MST');
    expect(formatLocalHour('2026-08-14T20:00:00Z', 'Not/AZone')).toBe('Fri 20:00 UTC');
  });
});
