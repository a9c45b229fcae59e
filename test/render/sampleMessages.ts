import type { Message } from '../../src/render/message.ts';
import { buildMessage } from '../../src/render/safetyFooter.ts';

/** A small, ordinary message built on invented data, for the encoder tests. */
export function sampleMessage(overrides: Partial<Parameters<typeof buildMessage>[0]> = {}, localLine?: string): Message {
  return buildMessage(
    {
      kind: 'lookup',
      title: 'Cinder Flats (invented): next 48 h',
      severity: 'warning',
      inventedData: true,
      sections: [
        {
          heading: 'Coupling',
          lines: ['Mixed layer reaches a dry near-dry-adiabatic layer at Fri 12:00 MDT.'],
          fields: [
            { label: 'Peak mixing height', value: '4,400 m AGL, Fri 12:00 MDT' },
            { label: 'Driest mixed layer', value: '9% RH, Fri 13:00 MDT' },
          ],
        },
      ],
      table: { columns: ['Base AGL', 'Top AGL', 'Lapse rate', 'Class'], rows: [['0 m', '2,290 m', '9.6 °C/km', 'near dry adiabatic']] },
      actions: [{ actionId: 'show-detail', label: 'Layers at Fri 12:00 MDT', value: '44.8123,-115.4321|2026-08-14T18:00:00Z' }],
      ...overrides,
    },
    localLine,
  );
}
