import { describe, expect, it } from 'vitest';
import { discordCustomId, encodeForDiscord, parseDiscordCustomId } from '../../src/render/encodeDiscord.ts';
import { INVENTED_DATA_NOTE } from '../../src/render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { SEVERITY_COLOURS } from '../../src/render/severityPalette.ts';
import { discordProblems } from './platformLimits.ts';
import { sampleMessage } from './sampleMessages.ts';

type Json = Record<string, any>;

describe('encodeForDiscord', () => {
  it('builds one embed coloured by severity, with fields, the footer, and a button row', () => {
    const encoded = encodeForDiscord(sampleMessage());
    const embed = encoded.embeds[0] as Json;
    expect(embed.title).toBe('Cinder Flats (invented): next 48 h');
    expect(embed.color).toBe(SEVERITY_COLOURS.warning.rgb);
    expect(embed.description.startsWith(`**${INVENTED_DATA_NOTE}**`)).toBe(true);
    expect(embed.description).toContain('**Coupling**\nMixed layer reaches');
    expect(embed.description).toMatch(/```\nBase AGL[\s\S]*```$/);
    expect(embed.fields).toEqual([
      { name: 'Peak mixing height', value: '4,400 m AGL, Fri 12:00 MDT', inline: true },
      { name: 'Driest mixed layer', value: '9% RH, Fri 13:00 MDT', inline: true },
    ]);
    expect(embed.footer.text).toBe(SAFETY_FOOTER);
    expect(encoded.components).toEqual([
      { type: 1, components: [{ type: 2, style: 1, label: 'Layers at Fri 12:00 MDT', custom_id: 'show-detail:44.8123,-115.4321|2026-08-14T18:00:00Z' }] },
    ]);
    expect(encoded.allowed_mentions).toEqual({ parse: [] });
    expect(discordProblems(encoded)).toEqual([]);
  });

  it('keeps the footer in the plain content too, for readers who hide embeds', () => {
    const { content } = encodeForDiscord(sampleMessage({}, 'Dispatch: channel 4 (invented)'));
    expect(content).toBe(`**Cinder Flats (invented): next 48 h**\n**${INVENTED_DATA_NOTE}**\n-# ${SAFETY_FOOTER}\n-# Dispatch: channel 4 (invented)`);
  });

  it('round-trips a custom_id, whose value may itself hold colons', () => {
    const action = { actionId: 'show-detail' as const, value: '1,2|2026-08-14T18:00:00Z' };
    expect(parseDiscordCustomId(discordCustomId(action))).toEqual(action);
    expect(parseDiscordCustomId('delete-everything:x')).toBeNull();
    expect(parseDiscordCustomId('no-separator')).toBeNull();
  });

  it('attaches the first image to the embed by a safe file name', () => {
    const png = new Uint8Array([1]);
    const encoded = encodeForDiscord(sampleMessage({ images: [{ fileName: 'skew t/../x.png', altText: 'Diagram', png }] }));
    expect((encoded.embeds[0] as Json).image).toEqual({ url: 'attachment://skew-t-..-x.png' });
    expect(encoded.files[0].fileName).toBe('skew-t-..-x.png');
  });

  it('shortens an oversize message inside every limit, counts dropped figures, keeps the footer', () => {
    const fields = Array.from({ length: 40 }, (_, index) => ({ label: `Figure ${index} `.repeat(30), value: 'v'.repeat(1500) }));
    const encoded = encodeForDiscord(
      sampleMessage({ title: 'T'.repeat(300), sections: [{ heading: 'H', lines: ['x'.repeat(9000)], fields }] }),
    );
    const embed = encoded.embeds[0] as Json;
    expect(discordProblems(encoded)).toEqual([]);
    expect(embed.footer.text).toBe(SAFETY_FOOTER);
    expect(embed.description).toMatch(/more figures not shown/);
    expect(embed.description.startsWith(`**${INVENTED_DATA_NOTE}**`)).toBe(true);
    expect(encoded.content.endsWith(`-# ${SAFETY_FOOTER}`)).toBe(true);
  });

  it('drops buttons whose custom_id would pass 100 characters or repeat', () => {
    const encoded = encodeForDiscord(
      sampleMessage({
        actions: [
          { actionId: 'mute-rule', label: 'Mute', value: 'r|1,2' },
          { actionId: 'mute-rule', label: 'Mute again', value: 'r|1,2' },
          { actionId: 'mute-rule', label: 'Too long', value: 'x'.repeat(95) },
        ],
      }),
    );
    expect(encoded.components).toEqual([{ type: 1, components: [{ type: 2, style: 2, label: 'Mute', custom_id: 'mute-rule:r|1,2' }] }]);
  });

  it('never leaves a code fence open when the description is cut inside the table', () => {
    const rows = Array.from({ length: 400 }, (_, index) => [`${index} m`, 'x'.repeat(30)]);
    const fields = Array.from({ length: 5 }, () => ({ label: 'F', value: 'v'.repeat(1000) }));
    const encoded = encodeForDiscord(sampleMessage({ sections: [{ lines: ['y'.repeat(1200)], fields }], table: { columns: ['A', 'B'], rows } }));
    const description = (encoded.embeds[0] as Json).description as string;
    expect((description.match(/```/g) ?? []).length % 2).toBe(0);
    expect(discordProblems(encoded)).toEqual([]);
  });
});
