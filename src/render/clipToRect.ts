/**
 * Clips polylines to a rectangle in our own code: an SVG clip-path makes the rasteriser draw each
 * clipped group on a layer of its own, which is several times slower for the same picture.
 */
export interface Rect {
  left: number;
  top: number;
  right: number;
  bottom: number;
}

type Point = [number, number];

/** Liang–Barsky clip of one segment; null when it lies wholly outside. */
function clipSegment(a: Point, b: Point, rect: Rect): [Point, Point] | null {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  let t0 = 0;
  let t1 = 1;
  const edges: Array<[number, number]> = [
    [-dx, a[0] - rect.left],
    [dx, rect.right - a[0]],
    [-dy, a[1] - rect.top],
    [dy, rect.bottom - a[1]],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const t = q / p;
    if (p < 0) {
      if (t > t1) return null;
      if (t > t0) t0 = t;
    } else {
      if (t < t0) return null;
      if (t < t1) t1 = t;
    }
  }
  return [
    [a[0] + t0 * dx, a[1] + t0 * dy],
    [a[0] + t1 * dx, a[1] + t1 * dy],
  ];
}

/** The parts of a polyline inside the rectangle, as separate runs of points. Non-finite points break a run. */
export function clipPolyline(points: Point[], rect: Rect): Point[][] {
  const runs: Point[][] = [];
  let run: Point[] = [];
  const close = (): void => {
    if (run.length > 1) runs.push(run);
    run = [];
  };
  for (let index = 1; index < points.length; index += 1) {
    const a = points[index - 1];
    const b = points[index];
    if (![a[0], a[1], b[0], b[1]].every(Number.isFinite)) {
      close();
      continue;
    }
    const clipped = clipSegment(a, b, rect);
    if (!clipped) {
      close();
      continue;
    }
    const [start, end] = clipped;
    const last = run[run.length - 1];
    if (!last || Math.abs(last[0] - start[0]) > 1e-6 || Math.abs(last[1] - start[1]) > 1e-6) {
      close();
      run.push(start);
    }
    run.push(end);
    if (end[0] !== b[0] || end[1] !== b[1]) close();
  }
  close();
  return runs;
}
