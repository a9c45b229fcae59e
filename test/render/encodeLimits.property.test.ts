import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { encodeForDiscord } from '../../src/render/encodeDiscord.ts';
import { encodeForSlack } from '../../src/render/encodeSlack.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import { INVENTED_DATA_NOTE } from '../../src/render/inventedDataNote.ts';
import { ACTION_IDS, type Message } from '../../src/render/message.ts';
import { buildMessage, SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { discordProblems, hasLoneSurrogate, slackProblems } from './platformLimits.ts';

/** Text of any length, with emoji (surrogate pairs) and the characters each platform treats specially. */
const SPECIAL = ['&', '<', '>', '`', '*', '🔥', 'é', '\n', 'x', ' ', '```', '@everyone'];
const anyText = (maxLength: number): fc.Arbitrary<string> =>
  fc.oneof(
    fc.string({ maxLength }),
    fc.string({ unit: 'grapheme', maxLength }),
    fc.array(fc.constantFrom(...SPECIAL), { maxLength, size: 'medium' }).map((parts) => parts.join('').slice(0, maxLength)),
    // Long runs of one awkward character, up to and past the limits that matter.
    fc.tuple(fc.constantFrom(...SPECIAL), fc.integer({ min: 0, max: maxLength })).map(([unit, count]) => unit.repeat(count).slice(0, maxLength)),
  );

const messageArbitrary: fc.Arbitrary<Message> = fc
  .record({
    title: anyText(400),
    inventedData: fc.boolean(),
    severity: fc.constantFrom('info' as const, 'watch' as const, 'warning' as const),
    sections: fc.array(
      fc.record({
        heading: fc.option(anyText(300), { nil: undefined }),
        lines: fc.array(anyText(5000), { maxLength: 6 }),
        fields: fc.option(fc.array(fc.record({ label: anyText(400), value: anyText(2500) }), { maxLength: 30, size: 'max' }), { nil: undefined }),
      }),
      { maxLength: 70, size: 'medium' },
    ),
    table: fc.option(
      fc.record({ columns: fc.array(anyText(30), { maxLength: 5 }), rows: fc.array(fc.array(anyText(60), { maxLength: 5 }), { maxLength: 200, size: 'max' }) }),
      { nil: undefined },
    ),
    actions: fc.array(
      fc.record({ actionId: fc.constantFrom(...ACTION_IDS), label: anyText(120), value: anyText(150) }),
      { maxLength: 40, size: 'max' },
    ),
    localLine: fc.option(anyText(600), { nil: undefined }),
  })
  .map(({ localLine, ...parts }) => buildMessage({ kind: 'lookup', ...parts }, localLine));

describe('every encoding stays inside its platform limits and keeps the footer', () => {
  it('Slack', () => {
    fc.assert(
      fc.property(messageArbitrary, (message) => {
        const encoded = encodeForSlack(message);
        expect(slackProblems(encoded)).toEqual([]);
        const last = encoded.blocks[encoded.blocks.length - 1] as { type: string; elements: Array<{ text: string }> };
        expect(last.type).toBe('context');
        expect(last.elements[0].text.startsWith(SAFETY_FOOTER)).toBe(true);
        expect(encoded.text).toContain(SAFETY_FOOTER);
        if (message.inventedData) expect(JSON.stringify(encoded.blocks)).toContain(INVENTED_DATA_NOTE);
        expect(hasLoneSurrogate(JSON.stringify(encoded.blocks) + encoded.text)).toBe(false);
      }),
      { numRuns: 80, endOnFailure: true },
    );
  });

  it('Discord', () => {
    fc.assert(
      fc.property(messageArbitrary, (message) => {
        const encoded = encodeForDiscord(message);
        expect(discordProblems(encoded)).toEqual([]);
        const embed = encoded.embeds[0] as { footer: { text: string }; description?: string };
        expect(embed.footer.text.startsWith(SAFETY_FOOTER)).toBe(true);
        expect(encoded.content).toContain(`-# ${SAFETY_FOOTER}`);
        if (message.inventedData) {
          expect(encoded.content).toContain(INVENTED_DATA_NOTE);
          expect(embed.description ?? '').toContain(INVENTED_DATA_NOTE);
        }
        expect(hasLoneSurrogate(JSON.stringify(encoded.embeds) + encoded.content)).toBe(false);
      }),
      { numRuns: 80, endOnFailure: true },
    );
  });

  it('terminal', () => {
    fc.assert(
      fc.property(messageArbitrary, (message) => {
        const text = encodeForTerminal(message, { color: false });
        expect(text.includes(`\n${SAFETY_FOOTER}`)).toBe(true);
        expect(text.trimEnd().endsWith(message.footer.split('\n').pop()!.replace(/[\u0000-\u0008\u000b-\u001f\u007f]/g, '').trimEnd())).toBe(true);
        if (message.inventedData) expect(text).toContain(INVENTED_DATA_NOTE);
      }),
      { numRuns: 40, endOnFailure: true },
    );
  });
});
