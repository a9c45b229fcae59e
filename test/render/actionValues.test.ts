import { describe, expect, it } from 'vitest';
import { encodeDetailValue, encodeMuteValue, parseDetailValue, parseMuteValue, placeKeyOf } from '../../src/render/actionValues.ts';

describe('button values', () => {
  it('round-trip the detail value and stay short enough for a Discord custom_id', () => {
    const value = encodeDetailValue(-33.86789, 151.20732, '2026-08-14T18:00:00Z');
    expect(value).toBe('-33.8679,151.2073|2026-08-14T18:00:00Z');
    expect(('show-detail:' + value).length).toBeLessThanOrEqual(100);
    expect(parseDetailValue(value)).toEqual({ ok: true, value: { latitude: -33.8679, longitude: 151.2073, validTime: '2026-08-14T18:00:00Z' } });
  });

  it('refuse a bad detail value with a message that shows the right form', () => {
    const bad = parseDetailValue('95,10|2026-08-14T18:00:00Z');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.message).toMatch(/show-detail/);
    const garbled = parseDetailValue('hello');
    expect(garbled.ok).toBe(false);
    if (!garbled.ok) expect(garbled.message).toMatch(/e\.g\. "44\.8123,-115\.4321\|2026-08-14T21:00:00Z"/);
    expect(parseDetailValue('1,2|yesterday').ok).toBe(false);
  });

  it('round-trip the mute value and refuse a malformed one', () => {
    expect(parseMuteValue(encodeMuteValue('hdw-above', placeKeyOf(44.81234, -115.43214)))).toEqual({
      ok: true,
      value: { ruleId: 'hdw-above', placeKey: '44.8123,-115.4321' },
    });
    expect(parseMuteValue('no separator').ok).toBe(false);
  });
});
