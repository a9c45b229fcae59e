import { describe, expect, it } from 'vitest';
import { parseMuteValue } from '../../src/render/actionValues.ts';
import { buildAlertDigestMessage, DIGEST_MAX_LINES } from '../../src/render/alertDigestMessage.ts';
import { groundMeaning, type AlertContent } from '../../src/render/alertMessage.ts';
import { encodeForDiscord } from '../../src/render/encodeDiscord.ts';
import { encodeForSlack } from '../../src/render/encodeSlack.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { discordProblems, slackProblems } from './platformLimits.ts';

/** Invented alerts for the invented Ashfall Ridge Fire, in forecast order. */
const base: Omit<AlertContent, 'ruleId' | 'ruleName' | 'severity' | 'validTime' | 'value' | 'valueKind' | 'threshold'> = {
  placeName: 'Ashfall Ridge Fire (invented)',
  latitude: 44.8123,
  longitude: -115.4321,
  timeZone: 'America/Boise',
  direction: 'rising',
  model: 'demo-scenario',
  runTime: '2026-08-14T00:00:00Z',
  sourceName: 'demo (invented data)',
  invented: true,
};
const dry: AlertContent = { ...base, ruleId: 'mixed-layer-rh-below', ruleName: 'Very dry mixed layer', severity: 'watch', validTime: '2026-08-14T19:00:00Z', value: 12, valueKind: 'relative-humidity', threshold: 15, direction: 'falling' };
const coupling: AlertContent = { ...base, ruleId: 'mixing-reaches-dry-layer', ruleName: 'Mixed layer reaches a dry layer aloft', severity: 'warning', validTime: '2026-08-14T21:00:00Z', value: 3800, valueKind: 'height', threshold: 2290 };
const wind: AlertContent = { ...base, ruleId: 'transport-wind-above', ruleName: 'Strong transport wind', severity: 'watch', validTime: '2026-08-14T21:00:00Z', value: 10, valueKind: 'wind-speed', threshold: 9 };

describe('buildAlertDigestMessage', () => {
  it('lists the alerts in the order given, with when, rule, value and threshold, and counts them', () => {
    const message = buildAlertDigestMessage([dry, coupling, wind], 'metric');
    expect(message.kind).toBe('summary');
    expect(message.title).toBe('Ashfall Ridge Fire (invented): 3 alerts stand in the forecast');
    // 19:00 UTC is 13:00 MDT (UTC−6 in August).
    expect(message.sections[0]!.lines).toEqual([
      'Fri 14 Aug 13:00 MDT · Very dry mixed layer: 12% (≤ 15%)',
      'Fri 14 Aug 15:00 MDT · Mixed layer reaches a dry layer aloft: 3,800 m AGL (≥ 2,290 m AGL)',
      expect.stringMatching(/^Fri 14 Aug 15:00 MDT · Strong transport wind: 36 km\/h \(≥ 32 km\/h\)$/),
    ]);
    expect(message.footer.startsWith(SAFETY_FOOTER)).toBe(true);
    expect(message.inventedData).toBe(true);
  });

  it('takes the most severe alert\'s severity and the headline rule\'s meaning, and offers its mute first', () => {
    const message = buildAlertDigestMessage([dry, coupling, wind], 'us');
    expect(message.severity).toBe('warning');
    expect(message.sections[1]!.lines[0]).toBe(groundMeaning(coupling));
    expect(message.actions).toHaveLength(2);
    expect(message.actions.map((action) => { const parsed = parseMuteValue(action.value); return parsed.ok ? parsed.value.ruleId : parsed.message; })).toEqual(['mixing-reaches-dry-layer', 'mixed-layer-rh-below']);
    expect(message.sections[0]!.lines[1]).toContain('12,470 ft AGL');
    // The rule without a button is named with the command that mutes it, at the digest's point.
    expect(message.sections[1]!.lines).toContain('Mute another rule here: `mute transport-wind-above 44.8123,-115.4321`.');
  });

  it('names every rule beyond the buttons, and says nothing of the kind when the buttons cover them', () => {
    const plume: AlertContent = { ...wind, ruleId: 'plume-cloud-possible', ruleName: 'Plume cloud possible' };
    const four = buildAlertDigestMessage([dry, coupling, wind, plume], 'metric');
    expect(four.sections[1]!.lines.filter((line) => line.startsWith('Mute another rule'))).toEqual(['Mute another rule here: `mute transport-wind-above 44.8123,-115.4321` (or plume-cloud-possible).']);
    const two = buildAlertDigestMessage([dry, coupling], 'metric');
    expect(two.sections[1]!.lines.some((line) => line.includes('`mute '))).toBe(false);
  });

  it('stays short: at most DIGEST_MAX_LINES alerts, then how many more', () => {
    const many = Array.from({ length: 13 }, (_, index) => ({ ...wind, validTime: new Date(Date.parse(wind.validTime) + index * 3_600_000).toISOString() }));
    const message = buildAlertDigestMessage(many, 'metric');
    expect(message.sections[0]!.lines).toHaveLength(DIGEST_MAX_LINES + 1);
    expect(message.sections[0]!.lines.at(-1)).toBe('…and 5 more; a lookup of the place shows the whole 48 hours.');
    expect(message.title).toContain('13 alerts');
    // One rule, one mute button.
    expect(message.actions).toHaveLength(1);
    expect(slackProblems(encodeForSlack(message))).toEqual([]);
    expect(discordProblems(encodeForDiscord(message))).toEqual([]);
  });

  it('refuses an empty list rather than post an empty alert', () => {
    expect(() => buildAlertDigestMessage([], 'metric')).toThrow(/at least one alert/);
  });
});
