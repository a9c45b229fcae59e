import { describe, expect, it } from 'vitest';
import { parseMuteValue } from '../../src/render/actionValues.ts';
import { buildAlertMessage, groundMeaning, type AlertContent } from '../../src/render/alertMessage.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';

/** An invented alert for the invented Ashfall Ridge Fire. */
const headline: AlertContent = {
  ruleId: 'mixing-reaches-dry-layer',
  ruleName: 'Mixing reaches the dry layer aloft',
  severity: 'warning',
  placeName: 'Ashfall Ridge Fire (invented)',
  latitude: 44.8123,
  longitude: -115.4321,
  timeZone: 'America/Boise',
  validTime: '2026-08-14T20:00:00Z',
  value: 2680,
  valueKind: 'height',
  threshold: 2600,
  direction: 'rising',
  model: 'demo-scenario',
  runTime: '2026-08-14T00:00:00Z',
  sourceName: 'demo (invented data)',
  invented: true,
};

describe('buildAlertMessage', () => {
  it('names the rule, the place, the local forecast hour, value and threshold, meaning and run', () => {
    const message = buildAlertMessage(headline, 'metric');
    expect(message.kind).toBe('alert');
    expect(message.severity).toBe('warning');
    // 20:00 UTC is 14:00 MDT (UTC−6 in August).
    expect(message.title).toBe('Mixing reaches the dry layer aloft: Ashfall Ridge Fire (invented), Fri 14 Aug 14:00 MDT');
    expect(message.sections).toHaveLength(1);
    const [first, meaning, run] = message.sections[0].lines;
    expect(first).toBe('Mixing height 2,680 m AGL at Fri 14 Aug 14:00 MDT, at or above the threshold of 2,600 m AGL.');
    expect(meaning).toMatch(/dry air and stronger winds aloft down to the fire/);
    expect(meaning).toMatch(/erratic fire behaviour/);
    expect(meaning).toMatch(/taller smoke column/);
    expect(run).toBe('Model demo-scenario, run 00Z 14 Aug 2026 · source: demo (invented data)');
    expect(message.inventedData).toBe(true);
    expect(message.footer).toBe(SAFETY_FOOTER);
  });

  it('is a headline, at most four lines and the footer', () => {
    const message = buildAlertMessage(headline, 'us');
    expect(message.sections.flatMap((section) => section.lines).length).toBeLessThanOrEqual(4);
    expect(message.sections[0].lines[0]).toBe('Mixing height 8,790 ft AGL at Fri 14 Aug 14:00 MDT, at or above the threshold of 8,530 ft AGL.');
    const text = encodeForTerminal(message, { color: false });
    expect(text.endsWith(SAFETY_FOOTER)).toBe(true);
  });

  it('offers a mute button whose value the router parses back into rule and place', () => {
    const [action] = buildAlertMessage(headline, 'metric').actions;
    expect(action.actionId).toBe('mute-rule');
    expect(parseMuteValue(action.value)).toEqual({ ok: true, value: { ruleId: 'mixing-reaches-dry-layer', placeKey: '44.8123,-115.4321' } });
    const custom = buildAlertMessage({ ...headline, muteValue: 'mixing-reaches-dry-layer|ashfall' }, 'metric');
    expect(custom.actions[0].value).toBe('mixing-reaches-dry-layer|ashfall');
  });

  it('words falling rules and their units by kind', () => {
    const pft = buildAlertMessage(
      { ...headline, ruleId: 'pft-below', ruleName: 'PyroCb firepower threshold low', valueKind: 'pft', value: 1.4, threshold: 2, direction: 'falling', severity: 'watch' },
      'metric',
    );
    expect(pft.sections[0].lines[0]).toBe('PyroCb Firepower Threshold 1.4 GW at Fri 14 Aug 14:00 MDT, at or below the threshold of 2.0 GW.');
    expect(pft.sections[0].lines[1]).toMatch(/pyrocumulonimbus/);
    const rh = buildAlertMessage({ ...headline, ruleId: 'dry-mixed-layer', ruleName: 'Very dry mixed layer', valueKind: 'relative-humidity', value: 8, threshold: 10, direction: 'falling' }, 'metric');
    expect(rh.sections[0].lines[0]).toMatch(/8% .* at or below the threshold of 10%/);
    const wind = buildAlertMessage({ ...headline, ruleId: 'transport-wind', ruleName: 'Strong transport wind', valueKind: 'wind-speed', value: 10, threshold: 8.9408 }, 'us');
    expect(wind.sections[0].lines[0]).toMatch(/22 mph .* threshold of 20 mph/);
  });

  it('has a meaning for every kind in both directions', () => {
    const kinds = ['height', 'wind-speed', 'ventilation', 'relative-humidity', 'hdw', 'c-haines', 'pft', 'haines'] as const;
    for (const valueKind of kinds) {
      for (const direction of ['rising', 'falling'] as const) {
        expect(groundMeaning({ ruleId: 'x', valueKind, direction }).length).toBeGreaterThan(10);
      }
    }
    expect(groundMeaning({ ruleId: 'plume-cloud-possible', valueKind: 'height', direction: 'rising' })).toMatch(/cloud/);
  });

  it('falls back to UTC, labelled, for an unknown time zone instead of failing', () => {
    const message = buildAlertMessage({ ...headline, timeZone: 'Mars/Olympus' }, 'metric');
    expect(message.title).toMatch(/Fri 14 Aug 20:00 UTC$/);
  });
});
