import { Resvg } from '@resvg/resvg-js';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { encodePng } from '../../src/render/encodePng.ts';

// Decoded by pngjs (a general-purpose PNG library from npm, not ours) and compared with what
// resvg's own PNG encoder makes of the same picture: same size, same pixels.
const decode = (png: Uint8Array) => PNG.sync.read(Buffer.from(png));

// Small invented picture with flat colour, a diagonal and text, on the opaque background our charts use.
const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="37" height="23" viewBox="0 0 37 23"><rect x="3" y="2" width="17" height="12" fill="#1F6F5C"/><path d="M0 23 L37 0" stroke="#C0392B" stroke-width="2"/><circle cx="28" cy="15" r="5" fill="#F2C14E" fill-opacity="0.6"/></svg>`;

describe('PNG encoder', () => {
  const rendered = new Resvg(svg, { background: '#ffffff' }).render();
  const image = { pixels: rendered.pixels, widthPx: rendered.width, heightPx: rendered.height };

  it('writes a PNG that an independent decoder reads back to the rasteriser\'s own pixels', async () => {
    const ours = decode(encodePng(image));
    const theirs = decode(rendered.asPng());
    expect([ours.width, ours.height]).toEqual([37, 23]);
    expect([theirs.width, theirs.height]).toEqual([37, 23]);
    expect(Buffer.from(ours.data).equals(Buffer.from(theirs.data))).toBe(true);
    // The picture is not blank: the comparison would mean little on a white page.
    expect(new Set(ours.data).size).toBeGreaterThan(4);
  });

  it('refuses pixels that do not fit the stated size', () => {
    expect(() => encodePng({ ...image, widthPx: image.widthPx + 1 })).toThrow(/do not make a 38x23 RGBA image/);
    expect(() => encodePng({ pixels: new Uint8Array(0), widthPx: 0, heightPx: 0 })).toThrow(/RGBA image/);
  });
});
