import { afterAll, describe, expect, it } from 'vitest';
import { rasterizeOnPictureThread, stopPictureThread } from '../../src/render/rasterThread.ts';
import { pngInfo } from './pngInfo.ts';

// Small invented SVG; resvg draws it for real on the picture thread.
const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="48" height="20" viewBox="0 0 48 20"><rect x="2" y="2" width="30" height="10" fill="#7A3E9D"/></svg>`;
const options = { background: '#ffffff' };

afterAll(() => stopPictureThread());

describe('the picture thread', () => {
  it('hands back a PNG of the SVG\'s size, and answers many requests in one thread', async () => {
    const outcomes = await Promise.all(Array.from({ length: 6 }, () => rasterizeOnPictureThread(svg, options)));
    for (const outcome of outcomes) {
      expect(outcome.ok).toBe(true);
      if (outcome.ok) expect(pngInfo(outcome.png)).toEqual({ signatureOk: true, widthPx: 48, heightPx: 20 });
    }
  });

  it('reports an SVG it cannot draw as a reason, not a rejection', async () => {
    const outcome = await rasterizeOnPictureThread('<svg', options);
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.reason.length).toBeGreaterThan(0);
  });

  it('settles what it owed when the thread ends, and the next request starts a new thread', async () => {
    const owed = rasterizeOnPictureThread(svg, options);
    await stopPictureThread();
    expect(await owed).toEqual({ ok: false, reason: expect.stringMatching(/picture thread ended/) });
    const next = await rasterizeOnPictureThread(svg, options);
    expect(next.ok).toBe(true);
  });
});
