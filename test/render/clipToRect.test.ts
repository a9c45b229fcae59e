import { describe, expect, it } from 'vitest';
import { clipPolyline } from '../../src/render/clipToRect.ts';

const rect = { left: 0, top: 0, right: 10, bottom: 10 };

describe('clipPolyline', () => {
  it('keeps a polyline that lies inside', () => {
    expect(clipPolyline([[1, 1], [5, 5], [9, 1]], rect)).toEqual([[[1, 1], [5, 5], [9, 1]]]);
  });

  it('cuts a line at the edges it crosses', () => {
    expect(clipPolyline([[-5, 5], [15, 5]], rect)).toEqual([[[0, 5], [10, 5]]]);
  });

  it('splits into runs where the line leaves and comes back, and drops what lies outside', () => {
    const runs = clipPolyline([[2, 2], [2, 20], [8, 20], [8, 2]], rect);
    expect(runs).toEqual([[[2, 2], [2, 10]], [[8, 10], [8, 2]]]);
    expect(clipPolyline([[20, 20], [30, 30]], rect)).toEqual([]);
  });

  it('breaks the line at a missing point instead of drawing through it', () => {
    expect(clipPolyline([[1, 1], [2, 2], [Number.NaN, 3], [4, 4], [5, 5]], rect)).toEqual([[[1, 1], [2, 2]], [[4, 4], [5, 5]]]);
  });
});
