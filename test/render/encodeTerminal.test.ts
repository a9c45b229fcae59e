import { describe, expect, it } from 'vitest';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import { INVENTED_DATA_NOTE } from '../../src/render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { sampleMessage } from './sampleMessages.ts';

describe('encodeForTerminal', () => {
  it('prints title, invented notice, aligned figures and table, buttons, and the footer last', () => {
    const text = encodeForTerminal(sampleMessage({}, 'Dispatch: channel 4 (invented)'), { color: false });
    const lines = text.split('\n');
    expect(lines[0]).toBe('[WARNING] Cinder Flats (invented): next 48 h');
    expect(lines[1]).toBe(`! ${INVENTED_DATA_NOTE}`);
    expect(text).toContain('  Peak mixing height  4,400 m AGL, Fri 12:00 MDT\n  Driest mixed layer  9% RH, Fri 13:00 MDT');
    expect(text).toContain('  Base AGL  Top AGL  Lapse rate  Class\n  --------  -------  ----------  ------------------\n       0 m  2,290 m   9.6 °C/km  near dry adiabatic');
    expect(text).toContain('[show-detail 44.8123,-115.4321|2026-08-14T18:00:00Z] Layers at Fri 12:00 MDT');
    expect(lines.slice(-2)).toEqual([SAFETY_FOOTER, 'Dispatch: channel 4 (invented)']);
  });

  it('uses colour codes only when asked, and never inside the footer', () => {
    const plain = encodeForTerminal(sampleMessage(), { color: false });
    const coloured = encodeForTerminal(sampleMessage(), { color: true });
    expect(plain).not.toContain('\u001b[');
    expect(coloured).toContain('\u001b[1m\u001b[31m[WARNING]');
    expect(coloured.endsWith(`\n${SAFETY_FOOTER}`)).toBe(true);
  });

  it('strips control characters that user text could carry in', () => {
    const text = encodeForTerminal(sampleMessage({ title: 'Ridge\u001b[2J\u0007 Fire' }), { color: false });
    expect(text.split('\n')[0]).toBe('[WARNING] Ridge[2J Fire');
  });
});
