import { describe, expect, it } from 'vitest';
import { encodeForSlack, escapeSlackText } from '../../src/render/encodeSlack.ts';
import { INVENTED_DATA_NOTE } from '../../src/render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { slackProblems } from './platformLimits.ts';
import { sampleMessage } from './sampleMessages.ts';

type Json = Record<string, any>;

describe('encodeForSlack', () => {
  it('lays a message out as header, notice, sections, table, buttons and the footer last', () => {
    const encoded = encodeForSlack(sampleMessage());
    const blocks = encoded.blocks as Json[];
    expect(blocks.map((block) => block.type)).toEqual(['header', 'context', 'section', 'section', 'actions', 'context']);
    expect(blocks[0].text.text).toBe('Cinder Flats (invented): next 48 h');
    expect(blocks[1].elements[0].text).toContain(INVENTED_DATA_NOTE);
    expect(blocks[2].text.text).toBe('*Coupling*\nMixed layer reaches a dry near-dry-adiabatic layer at Fri 12:00 MDT.');
    expect(blocks[2].fields.map((field: Json) => field.text)).toEqual([
      '*Peak mixing height*\n4,400 m AGL, Fri 12:00 MDT',
      '*Driest mixed layer*\n9% RH, Fri 13:00 MDT',
    ]);
    expect(blocks[3].text.text.startsWith('```\nBase AGL')).toBe(true);
    expect(blocks[4].elements[0]).toMatchObject({
      type: 'button',
      action_id: 'show-detail',
      value: '44.8123,-115.4321|2026-08-14T18:00:00Z',
      text: { type: 'plain_text', text: 'Layers at Fri 12:00 MDT' },
    });
    expect(blocks[5].elements[0].text).toBe(SAFETY_FOOTER);
    expect(slackProblems(encoded)).toEqual([]);
  });

  it('gives a plain-text fallback that says the data are invented and ends with the footer', () => {
    const { text } = encodeForSlack(sampleMessage({}, 'Dispatch: channel 4 (invented)'));
    expect(text.startsWith('Cinder Flats (invented): next 48 h\n' + INVENTED_DATA_NOTE)).toBe(true);
    expect(text).toContain('Peak mixing height: 4,400 m AGL');
    expect(text.endsWith(`${SAFETY_FOOTER}\nDispatch: channel 4 (invented)`)).toBe(true);
  });

  it('leaves the invented-data notice out for real data', () => {
    const encoded = encodeForSlack(sampleMessage({ inventedData: false }));
    expect(JSON.stringify(encoded)).not.toContain(INVENTED_DATA_NOTE);
  });

  it('escapes the three characters Slack mrkdwn reserves, so a place name cannot ping or link', () => {
    expect(escapeSlackText('<!channel> & <http://x|y>')).toBe('&lt;!channel&gt; &amp; &lt;http://x|y&gt;');
    const encoded = encodeForSlack(sampleMessage({ sections: [{ lines: ['Ridge <!here> & co'] }] }));
    expect(JSON.stringify(encoded.blocks)).toContain('Ridge &lt;!here&gt; &amp; co');
    expect(encoded.text).toContain('Ridge &lt;!here&gt; &amp; co');
  });

  it('splits more than ten fields across section blocks', () => {
    const fields = Array.from({ length: 23 }, (_, index) => ({ label: `F${index}`, value: `${index} m` }));
    const encoded = encodeForSlack(sampleMessage({ sections: [{ lines: ['x'], fields }] }));
    const fieldCounts = (encoded.blocks as Json[]).filter((block) => block.fields).map((block) => block.fields.length);
    expect(fieldCounts).toEqual([10, 10, 3]);
    expect(slackProblems(encoded)).toEqual([]);
  });

  it('puts buttons with the same action id in separate blocks and drops exact repeats', () => {
    const actions = [
      { actionId: 'mute-rule' as const, label: 'Mute A', value: 'rule-a|1,2' },
      { actionId: 'mute-rule' as const, label: 'Mute B', value: 'rule-b|1,2' },
      { actionId: 'mute-rule' as const, label: 'Mute A again', value: 'rule-a|1,2' },
      { actionId: 'show-detail' as const, label: 'Detail', value: '1,2|2026-08-14T18:00:00Z' },
    ];
    const encoded = encodeForSlack(sampleMessage({ actions }));
    const actionBlocks = (encoded.blocks as Json[]).filter((block) => block.type === 'actions');
    expect(actionBlocks.map((block) => block.elements.map((element: Json) => element.text.text))).toEqual([
      ['Mute A', 'Detail'],
      ['Mute B'],
    ]);
    expect(slackProblems(encoded)).toEqual([]);
  });

  it('drops a button whose value Slack would refuse rather than cut it into nonsense', () => {
    const encoded = encodeForSlack(sampleMessage({ actions: [{ actionId: 'show-detail', label: 'Detail', value: 'v'.repeat(2001) }] }));
    expect((encoded.blocks as Json[]).some((block) => block.type === 'actions')).toBe(false);
  });

  it('shortens a huge message to 50 blocks, says so, and keeps the footer last', () => {
    const sections = Array.from({ length: 80 }, (_, index) => ({ heading: `Part ${index}`, lines: ['y'.repeat(4000)] }));
    const encoded = encodeForSlack(sampleMessage({ title: 'T'.repeat(400), sections }));
    const blocks = encoded.blocks as Json[];
    expect(blocks.length).toBe(50);
    expect(blocks[0].text.text.length).toBe(150);
    expect(blocks[blocks.length - 1].elements[0].text).toBe(SAFETY_FOOTER);
    expect(JSON.stringify(blocks)).toMatch(/shortened: \d+ more parts not shown/);
    expect(encoded.text.endsWith(SAFETY_FOOTER)).toBe(true);
    expect(slackProblems(encoded)).toEqual([]);
  });

  it('hands the adapter the images to upload', () => {
    const png = new Uint8Array([137, 80, 78, 71]);
    const encoded = encodeForSlack(sampleMessage({ images: [{ fileName: 'mixing-48h.png', altText: 'Mixing chart', png }] }));
    expect(encoded.files).toEqual([{ fileName: 'mixing-48h.png', title: 'Mixing chart', altText: 'Mixing chart', png }]);
  });
});
