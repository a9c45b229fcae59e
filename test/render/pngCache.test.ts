import { describe, expect, it } from 'vitest';
import { PngCache } from '../../src/render/pngCache.ts';
import { rasterizeSvgToPng, type PngResult } from '../../src/render/rasterizePng.ts';
import { pngInfo } from './pngInfo.ts';

// Small invented SVGs, rasterised for real by resvg: the cache sits in front of the real rasteriser.
const square = (fill: string, label = 'A'): string =>
  `<svg xmlns="http://www.w3.org/2000/svg" width="40" height="30" viewBox="0 0 40 30"><rect x="4" y="4" width="20" height="20" fill="${fill}"/><text x="28" y="20" font-size="12">${label}</text></svg>`;

function bytesOf(result: PngResult): Uint8Array {
  if (!result.ok) throw new Error(result.reason);
  return result.png;
}

const roomy = { maxEntries: 8, maxBytes: 1024 * 1024 };

describe('the PNG cache in front of the rasteriser', () => {
  it('gives the same bytes for the same SVG, rasterising once, and those are the bytes a fresh rasterisation makes', () => {
    const cache = new PngCache(roomy);
    const first = bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache));
    const second = bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache));
    expect(cache.stats).toMatchObject({ misses: 1, hits: 1 });
    expect(second).toEqual(first);
    expect(bytesOf(rasterizeSvgToPng(square('#1F6F5C'), new PngCache(roomy)))).toEqual(first);
    expect(pngInfo(second)).toEqual({ signatureOk: true, widthPx: 40, heightPx: 30 });
  });

  it('gives a different PNG for a different SVG', () => {
    const cache = new PngCache(roomy);
    const green = bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache));
    const red = bytesOf(rasterizeSvgToPng(square('#B8432F'), cache));
    const otherText = bytesOf(rasterizeSvgToPng(square('#1F6F5C', 'B'), cache));
    expect(cache.stats.misses).toBe(3);
    expect(red).not.toEqual(green);
    expect(otherText).not.toEqual(green);
  });

  it('hands out copies: scribbling on one answer does not change the next', () => {
    const cache = new PngCache(roomy);
    const first = bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache));
    const pristine = first.slice();
    first.fill(0);
    const again = bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache));
    again.fill(7);
    expect(bytesOf(rasterizeSvgToPng(square('#1F6F5C'), cache))).toEqual(pristine);
  });

  it('keys on the render settings as well as the SVG', () => {
    expect(PngCache.keyOf('<svg/>', 'settings-a')).toBe(PngCache.keyOf('<svg/>', 'settings-a'));
    expect(PngCache.keyOf('<svg/>', 'settings-a')).not.toBe(PngCache.keyOf('<svg/>', 'settings-b'));
    expect(PngCache.keyOf('<svg/>', 'settings-a')).not.toBe(PngCache.keyOf('<svg />', 'settings-a'));
  });

  it('evicts the least recently used picture beyond its entry bound', () => {
    const cache = new PngCache({ maxEntries: 2, maxBytes: 1024 * 1024 });
    rasterizeSvgToPng(square('#111111'), cache);
    rasterizeSvgToPng(square('#222222'), cache);
    rasterizeSvgToPng(square('#111111'), cache); // used again: now the most recent
    rasterizeSvgToPng(square('#333333'), cache); // pushes out #222222
    expect(cache.size).toBe(2);
    expect(cache.stats).toMatchObject({ hits: 1, misses: 3, evictions: 1 });
    rasterizeSvgToPng(square('#111111'), cache);
    expect(cache.stats.hits).toBe(2);
    rasterizeSvgToPng(square('#222222'), cache);
    expect(cache.stats.misses).toBe(4);
  });

  it('evicts beyond its byte bound, and keeps nothing larger than the bound', () => {
    const picture = (size: number) => ({ png: new Uint8Array(size).fill(size % 251), widthPx: 1, heightPx: 1 });
    const cache = new PngCache({ maxEntries: 10, maxBytes: 100 });
    cache.set('a', picture(40));
    cache.set('b', picture(40));
    cache.set('c', picture(40));
    expect(cache.bytes).toBe(80);
    expect(cache.get('a')).toBeUndefined();
    expect(cache.get('c')?.png).toEqual(picture(40).png);
    cache.set('huge', picture(101));
    expect(cache.get('huge')).toBeUndefined();
    expect(cache.size).toBe(2);
  });

  it('refuses a bound below one', () => {
    expect(() => new PngCache({ maxEntries: 0, maxBytes: 10 })).toThrow(/at least 1/);
  });
});
