import { createHash } from 'node:crypto';
import type { DrawnPng } from './drawPng.ts';

export interface PngCacheLimits {
  /** Most pictures held. */
  maxEntries: number;
  /** Most PNG bytes held in all (a skew-T is about 200 kB, a 48-hour chart about 35 kB). */
  maxBytes: number;
}

export interface PngCacheStats {
  hits: number;
  misses: number;
  evictions: number;
}

/**
 * Finished PNGs by a key that determines them completely: a hash of the SVG text and of everything
 * else the rasteriser is given (options, fonts). The same chart for the same forecast run and units
 * is then rasterised once however many channels ask for it. Least recently used goes first once
 * either bound is passed.
 */
export class PngCache {
  readonly stats: PngCacheStats = { hits: 0, misses: 0, evictions: 0 };
  // A Map keeps insertion order: re-inserting on use makes its first key the least recently used.
  private readonly entries = new Map<string, DrawnPng>();
  private heldBytes = 0;

  constructor(private readonly limits: PngCacheLimits) {
    if (!(limits.maxEntries >= 1) || !(limits.maxBytes >= 1)) throw new Error(`PNG cache bounds must be at least 1, got ${JSON.stringify(limits)}`);
  }

  /** The key of an SVG rasterised with the given settings (anything that changes the pixels belongs in `renderSettings`). */
  static keyOf(svg: string, renderSettings: string): string {
    return createHash('sha256').update(renderSettings).update('\0').update(svg).digest('base64url');
  }

  /** The picture under `key`, as a copy (a caller that scribbles on its bytes cannot spoil the next answer). */
  get(key: string): DrawnPng | undefined {
    const entry = this.entries.get(key);
    if (!entry) {
      this.stats.misses += 1;
      return undefined;
    }
    this.stats.hits += 1;
    this.entries.delete(key);
    this.entries.set(key, entry);
    return { ...entry, png: entry.png.slice() };
  }

  /** Whether a picture is held under `key`, without copying it out (not counted as a hit or miss). */
  has(key: string): boolean {
    return this.entries.has(key);
  }

  /** Keeps a copy of the picture; one larger than the whole byte bound is not kept. */
  set(key: string, picture: DrawnPng): void {
    this.remove(key);
    if (picture.png.byteLength > this.limits.maxBytes) return;
    this.entries.set(key, { ...picture, png: picture.png.slice() });
    this.heldBytes += picture.png.byteLength;
    while (this.entries.size > this.limits.maxEntries || this.heldBytes > this.limits.maxBytes) {
      const oldest = this.entries.keys().next().value as string;
      this.remove(oldest);
      this.stats.evictions += 1;
    }
  }

  get size(): number {
    return this.entries.size;
  }

  get bytes(): number {
    return this.heldBytes;
  }

  clear(): void {
    this.entries.clear();
    this.heldBytes = 0;
  }

  private remove(key: string): void {
    const entry = this.entries.get(key);
    if (!entry) return;
    this.entries.delete(key);
    this.heldBytes -= entry.png.byteLength;
  }
}
