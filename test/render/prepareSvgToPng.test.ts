import { describe, expect, it } from 'vitest';
import { PngCache } from '../../src/render/pngCache.ts';
import { prepareSvgToPng, rasterizeSvgToPng } from '../../src/render/rasterizePng.ts';

// Small invented SVG, rasterised for real by resvg on the thread pool and on the event loop.
const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="40" height="30" viewBox="0 0 40 30"><rect x="4" y="4" width="20" height="20" fill="#1F6F5C"/><text x="28" y="20" font-size="12">A</text></svg>`;

describe('rasterising ahead, off the event loop', () => {
  it('leaves in the cache the very bytes the synchronous rasteriser makes, so the builder does not rasterise again', async () => {
    const cache = new PngCache({ maxEntries: 8, maxBytes: 1024 * 1024 });
    await Promise.all([prepareSvgToPng(svg, cache), prepareSvgToPng(svg, cache)]);
    expect(cache.size).toBe(1);
    const ready = rasterizeSvgToPng(svg, cache);
    expect(cache.stats.hits).toBe(1);
    const fresh = rasterizeSvgToPng(svg, new PngCache({ maxEntries: 8, maxBytes: 1024 * 1024 }));
    expect(ready.ok && fresh.ok && Buffer.from(ready.png).equals(Buffer.from(fresh.png))).toBe(true);
  });

  it('does not reject on an SVG it cannot draw; the synchronous call reports the failure', async () => {
    const cache = new PngCache({ maxEntries: 8, maxBytes: 1024 * 1024 });
    await expect(prepareSvgToPng('<not-svg', cache)).resolves.toBeUndefined();
    expect(cache.size).toBe(0);
    expect(rasterizeSvgToPng('<not-svg', cache).ok).toBe(false);
  });
});
