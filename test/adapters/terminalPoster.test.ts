// The terminal poster prints a key once, and forgets only the oldest keys past its bound.
import { PassThrough } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { createTerminalPoster } from '../../adapters/terminal/terminalPoster.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { fixedLookup } from './routerDouble.ts';

function capture(): { output: PassThrough; printed: () => number } {
  const output = new PassThrough();
  let text = '';
  output.on('data', (chunk) => (text += chunk));
  return { output, printed: () => text.split(SAFETY_FOOTER).length - 1 };
}

describe('terminal poster', () => {
  const target = { platform: 'terminal' as const, teamId: '', channelId: 'terminal' };

  it('prints each key once, with the footer', async () => {
    const { output, printed } = capture();
    const poster = createTerminalPoster(output);
    await poster.post(target, fixedLookup('alert', false), 'key-1');
    await poster.post(target, fixedLookup('alert', false), 'key-1');
    await poster.post(target, fixedLookup('alert', false), 'key-2');
    expect(printed()).toBe(2);
  });

  it('remembers only the most recent keys: the oldest past the bound would print again, the newer not', async () => {
    const { output, printed } = capture();
    const poster = createTerminalPoster(output, 2);
    for (const key of ['a', 'b', 'c']) await poster.post(target, fixedLookup('alert', false), key);
    await poster.post(target, fixedLookup('alert', false), 'c');
    await poster.post(target, fixedLookup('alert', false), 'b');
    expect(printed()).toBe(3);
    await poster.post(target, fixedLookup('alert', false), 'a');
    expect(printed()).toBe(4);
  });
});
