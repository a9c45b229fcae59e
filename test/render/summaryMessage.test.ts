import { describe, expect, it } from 'vitest';
import { buildMorningSummary } from '../../src/render/summaryMessage.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { makeSeries } from './fixtures.ts';

describe('buildMorningSummary (invented fixture series)', () => {
  it('summarises the first local day from its DaySummary', () => {
    const message = buildMorningSummary(makeSeries(), 'metric', { images: false });
    expect(message.kind).toBe('summary');
    expect(message.title).toBe('Morning summary: Cinder Flats (invented), Fri 14 Aug');
    expect(message.sections[0].lines[0]).toMatch(/^Mixed layer reaches a dry near-dry-adiabatic layer at Fri 12:00 MDT/);
    const fields = Object.fromEntries((message.sections[0].fields ?? []).map((field) => [field.label, field.value]));
    expect(fields['Peak mixing height']).toBe('4,400 m AGL, Fri 12:00 MDT');
    expect(fields['Strongest transport wind']).toMatch(/^\d+ km\/h, Fri 1\d:00 MDT$/);
    expect(fields['Haines Index (max)']).toMatch(/dryness-and-lapse-rate index, not a stability measure/);
    expect(message.footer).toBe(SAFETY_FOOTER);
  });

  it('summarises a chosen day, and says the mixed layer stays below the layer that day', () => {
    const message = buildMorningSummary(makeSeries(), 'us', { images: false, localDate: '2026-08-15' });
    expect(message.title).toBe('Morning summary: Cinder Flats (invented), Sat 15 Aug');
    expect(message.sections[0].lines[0]).toBe('Mixed layer stays below the dry near-dry-adiabatic layer aloft today.');
    expect(message.severity).toBe('info');
  });

  it('answers a day the series lacks with a notice', () => {
    const message = buildMorningSummary(makeSeries(), 'metric', { localDate: '2026-09-01' });
    expect(message.kind).toBe('notice');
    expect(message.title).toMatch(/no forecast for 2026-09-01/);
  });
});
