import { describe, expect, it } from 'vitest';
import { fitWithTail, truncateText, truncateTransformed } from '../../src/render/textFit.ts';

describe('text fitting', () => {
  it('keeps text that fits and cuts the rest with an ellipsis', () => {
    expect(truncateText('abc', 3)).toBe('abc');
    expect(truncateText('abcdef', 4)).toBe('abc…');
    expect(truncateText('abc', 0)).toBe('');
  });

  it('never splits an emoji into half a surrogate pair', () => {
    const cut = truncateText('ab🔥🔥🔥', 4); // "ab" + high surrogate would be 3 units
    expect(cut).toBe('ab…');
    expect(cut.length).toBeLessThanOrEqual(4);
  });

  it('fits text that grows when escaped', () => {
    const escape = (text: string): string => text.replace(/&/g, '&amp;');
    const fitted = truncateTransformed('&&&&&&&&&&', 12, escape);
    expect(fitted.length).toBeLessThanOrEqual(12);
    expect(fitted).toBe('&amp;&amp;…');
  });

  it('keeps the tail whole and shortens the body first', () => {
    expect(fitWithTail('x'.repeat(50), 'FOOTER', 20)).toBe(`${'x'.repeat(12)}…\nFOOTER`);
    expect(fitWithTail('', 'FOOTER', 20)).toBe('FOOTER');
  });
});
