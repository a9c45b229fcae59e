import { describe, expect, it } from 'vitest';
import {
  SAFETY_FOOTER,
  SAFETY_FOOTER_SHORT,
  buildMessage,
  composeFooter,
  footerOf,
  localFooterLineSchema,
  LOCAL_FOOTER_LINE_MAX_CHARS,
} from '../../src/render/safetyFooter.ts';

describe('safety footer', () => {
  it('says the three things the project requires (project rule, DESIGN.md)', () => {
    expect(SAFETY_FOOTER).toMatch(/not an official forecast/i);
    expect(SAFETY_FOOTER).toMatch(/incident meteorologist/i);
    expect(SAFETY_FOOTER).toMatch(/local forecast office/i);
    expect(SAFETY_FOOTER).toMatch(/fireline safety rules/i);
    expect(SAFETY_FOOTER).toMatch(/local practice/i);
    expect(SAFETY_FOOTER.startsWith(SAFETY_FOOTER_SHORT)).toBe(true);
  });

  it('is filled in by buildMessage with defaults for the optional parts', () => {
    const message = buildMessage({ kind: 'notice', title: 'Hello' });
    expect(message.footer).toBe(SAFETY_FOOTER);
    expect(message.sections).toEqual([]);
    expect(message.actions).toEqual([]);
    expect(message.images).toEqual([]);
    expect(message.severity).toBe('info');
    expect(message.inventedData).toBe(false);
  });

  it('cannot be replaced by a caller: a footer in the parts is ignored', () => {
    const parts = { kind: 'notice', title: 'x', footer: 'nothing to see' } as unknown as Parameters<typeof buildMessage>[0];
    expect(buildMessage(parts).footer).toBe(SAFETY_FOOTER);
  });

  it('takes one local line after the standard text, never instead of it', () => {
    const message = buildMessage({ kind: 'notice', title: 'x' }, 'Dispatch: Ridgeview ECC (invented)');
    expect(message.footer).toBe(`${SAFETY_FOOTER}\nDispatch: Ridgeview ECC (invented)`);
  });

  it('squeezes a multi-line or overlong local line to one capped line', () => {
    const footer = composeFooter(`a\nb\r\n${'c'.repeat(1000)}`);
    const [standard, local, extra] = footer.split('\n');
    expect(standard).toBe(SAFETY_FOOTER);
    expect(local.length).toBe(LOCAL_FOOTER_LINE_MAX_CHARS);
    expect(local.startsWith('a b c')).toBe(true);
    expect(extra).toBeUndefined();
    expect(composeFooter('   ')).toBe(SAFETY_FOOTER);
  });

  it('is restored by footerOf when a hand-made message dropped or altered it', () => {
    const base = buildMessage({ kind: 'notice', title: 'x' }, 'Local line');
    expect(footerOf({ ...base, footer: '' })).toBe(SAFETY_FOOTER);
    expect(footerOf({ ...base, footer: 'Trust me.' })).toBe(SAFETY_FOOTER);
    expect(footerOf(base)).toBe(`${SAFETY_FOOTER}\nLocal line`);
    expect(footerOf({ ...base, footer: `${SAFETY_FOOTER}\n${'z'.repeat(5000)}` }).length).toBe(SAFETY_FOOTER.length + 1 + LOCAL_FOOTER_LINE_MAX_CHARS);
  });

  it('validates the config line with a message that shows a correct example', () => {
    expect(localFooterLineSchema.safeParse('Dispatch: channel 4').success).toBe(true);
    const bad = localFooterLineSchema.safeParse('two\nlines');
    expect(bad.success).toBe(false);
    if (!bad.success) expect(bad.error.issues[0].message).toMatch(/one line, e\.g\./);
    expect(localFooterLineSchema.safeParse('x'.repeat(LOCAL_FOOTER_LINE_MAX_CHARS + 1)).success).toBe(false);
  });
});
