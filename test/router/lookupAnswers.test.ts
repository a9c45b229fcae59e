import { describe, expect, it } from 'vitest';
import { buildLookupMessage } from '../../src/render/lookupMessage.ts';
import { lookupAnswer } from '../../src/router/lookupAnswers.ts';
import { makeSeries } from '../render/fixtures.ts';

describe('lookup answers shared between channels', () => {
  it('are built once per assessment, units and options, and say what a fresh build says', async () => {
    const series = makeSeries();
    const first = await lookupAnswer(series, 'metric', { footerLocalLine: 'Invented desk line' });
    const again = await lookupAnswer(series, 'metric', { footerLocalLine: 'Invented desk line' });
    expect(again).toBe(first);
    expect(first).toEqual(buildLookupMessage(series, 'metric', { footerLocalLine: 'Invented desk line' }));
    expect(first.images).toHaveLength(1);
    // Other units or another footer line are other answers.
    expect(await lookupAnswer(series, 'us', { footerLocalLine: 'Invented desk line' })).not.toBe(first);
    expect(await lookupAnswer(series, 'metric', {})).not.toBe(first);
    // Another forecast run is another assessment object: a new answer.
    expect(await lookupAnswer(makeSeries(), 'metric', { footerLocalLine: 'Invented desk line' })).not.toBe(first);
  });

  it('are frozen, so no adapter can change what the next channel receives', async () => {
    const answer = await lookupAnswer(makeSeries(), 'metric', {});
    expect(Object.isFrozen(answer)).toBe(true);
    expect(Object.isFrozen(answer.actions)).toBe(true);
    expect(() => {
      (answer as { title: string }).title = 'changed';
    }).toThrow(TypeError);
  });
});
