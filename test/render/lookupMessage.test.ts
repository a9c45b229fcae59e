import { describe, expect, it } from 'vitest';
import { parseDetailValue } from '../../src/render/actionValues.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import { buildLookupMessage } from '../../src/render/lookupMessage.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { makeSeries } from './fixtures.ts';

const allText = (message: ReturnType<typeof buildLookupMessage>): string =>
  message.sections.flatMap((section) => [...section.lines, ...(section.fields ?? []).map((field) => `${field.label}: ${field.value}`)]).join('\n');

describe('buildLookupMessage (invented fixture series)', () => {
  it('names the local hour and day the mixed layer reaches the dry layer', () => {
    const message = buildLookupMessage(makeSeries(), 'metric', { images: false });
    expect(message.kind).toBe('lookup');
    expect(message.severity).toBe('warning');
    expect(message.title).toBe('Cinder Flats (invented): next 48 h');
    // Fixture: first coupled hour is index 12 = 18:00 UTC = 12:00 MDT on Friday 14 Aug 2026.
    expect(message.sections[0].lines[0]).toBe(
      'Mixed layer reaches a dry near-dry-adiabatic layer at Fri 12:00 MDT (layer 2,600 m AGL to 4,400 m AGL); mixing then runs to 4,400 m AGL.',
    );
    expect(message.footer).toBe(SAFETY_FOOTER);
  });

  it('says plainly when the mixed layer never reaches it', () => {
    const message = buildLookupMessage(makeSeries({ coupling: false }), 'metric', { images: false });
    expect(message.sections[0].lines[0]).toBe('Mixed layer stays below the dry near-dry-adiabatic layer aloft through Sat 23:00 MDT.'); // last fixture hour, index 47
    expect(message.severity).toBe('info');
  });

  it('gives every figure the issue asks for, each with its unit', () => {
    const text = allText(buildLookupMessage(makeSeries(), 'metric', { images: false }));
    expect(text).toMatch(/Peak mixing height: 4,400 m AGL \(into the dry layer\), Fri 12:00 MDT/);
    expect(text).toMatch(/Transport wind, ventilation \(at peak\): [NESW]{1,3} \d+ km\/h · [\d,]+ m²\/s/);
    expect(text).toMatch(/Driest mixed layer: 9% RH, Fri 13:00 MDT/);
    expect(text).toMatch(/Hot-Dry-Windy Index \(max\): \d+, Fri/);
    expect(text).toMatch(/Plume cloud: possible from Fri \d\d:00 MDT: mixing [\d,]+ m AGL reaches the LCL [\d,]+ m AGL/);
    expect(text).toMatch(/PyroCb Firepower Threshold \(lowest\): \d+\.\d GW/);
    expect(text).toMatch(/Haines Index \(max\): 6 \(high variant; a dryness-and-lapse-rate index, not a stability measure\)/);
    expect(text).toContain('Model demo-scenario, run 00Z 14 Aug 2026 · source: demo (invented data)');
  });

  it('converts to US customary units for a channel that asks', () => {
    const text = allText(buildLookupMessage(makeSeries(), 'us', { images: false }));
    expect(text).toContain('Peak mixing height: 14,440 ft AGL'); // 4,400 m / 0.3048 = 14,436 ft
    expect(text).toMatch(/\d+ mph · [\d,]+ kt-ft/);
    expect(text).not.toMatch(/\d m\b/);
  });

  it('offers the detail view of the coupling hour with a value the router parses back', () => {
    const message = buildLookupMessage(makeSeries(), 'metric', { images: false });
    expect(message.actions).toHaveLength(1);
    expect(message.actions[0].actionId).toBe('show-detail');
    expect(parseDetailValue(message.actions[0].value)).toEqual({
      ok: true,
      value: { latitude: 44.8123, longitude: -115.4321, validTime: '2026-08-14T18:00:00Z' },
    });
  });

  it('fits one phone screen in the terminal: at most 22 lines including the footer', () => {
    const text = encodeForTerminal(buildLookupMessage(makeSeries(), 'metric', { images: false }), { color: false });
    expect(text.split('\n').length).toBeLessThanOrEqual(22);
  });

  it('carries the 48-hour chart as a PNG', () => {
    const message = buildLookupMessage(makeSeries(), 'metric');
    expect(message.images).toHaveLength(1);
    expect(message.images[0].fileName).toBe('mixing-48h.png');
    expect(Array.from(message.images[0].png.slice(0, 8))).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
    expect(message.images[0].altText).toMatch(/invented/);
  });

  it('answers an empty series with a notice, not a crash', () => {
    const message = buildLookupMessage({ ...makeSeries(), hours: [], days: [] }, 'metric');
    expect(message.kind).toBe('notice');
    expect(message.sections[0].lines[0]).toMatch(/no forecast hours/);
    expect(message.footer).toBe(SAFETY_FOOTER);
  });

  it('marks invented data, and does not for real data', () => {
    expect(buildLookupMessage(makeSeries(), 'metric', { images: false }).inventedData).toBe(true);
    const real = buildLookupMessage({ ...makeSeries({ invented: false }), sourceName: 'open-meteo (gfs_seamless)' }, 'metric', { images: false });
    expect(real.inventedData).toBe(false);
    expect(allText(real)).toContain('source: open-meteo (gfs_seamless)');
  });
});
