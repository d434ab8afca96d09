import { pathData } from './svg-element';
import type { Frame } from './types';

/** A point in pixels. */
export type Px = [number, number];

/** A rectangle in pixels, from its least to its greatest x and y. */
export interface Rect {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/**
 * The plot area of a frame as a rectangle: what the drawing's geometry is cut to, in code, so
 * that every renderer (a browser, librsvg, ImageMagick, a PNG exporter) shows the same shapes
 * without relying on an SVG clip path.
 */
export const plotRect = (f: Frame): Rect => ({
  x0: f.left,
  y0: f.top,
  x1: f.left + f.width,
  y1: f.top + f.height,
});

/** Whether a point lies inside the rectangle (its edges included), `pad` pixels in from them. */
export const insideRect = (p: readonly [number, number], r: Rect, pad = 0): boolean =>
  p[0] >= r.x0 + pad && p[0] <= r.x1 - pad && p[1] >= r.y0 + pad && p[1] <= r.y1 - pad;

/** The four half-planes of a rectangle: is a point in, and where an edge a–b crosses the border. */
const EDGES: { inside: (p: Px, r: Rect) => boolean; cross: (a: Px, b: Px, r: Rect) => Px }[] = [
  {
    inside: (p, r) => p[0] >= r.x0,
    cross: (a, b, r) => [r.x0, a[1] + ((b[1] - a[1]) * (r.x0 - a[0])) / (b[0] - a[0])],
  },
  {
    inside: (p, r) => p[0] <= r.x1,
    cross: (a, b, r) => [r.x1, a[1] + ((b[1] - a[1]) * (r.x1 - a[0])) / (b[0] - a[0])],
  },
  {
    inside: (p, r) => p[1] >= r.y0,
    cross: (a, b, r) => [a[0] + ((b[0] - a[0]) * (r.y0 - a[1])) / (b[1] - a[1]), r.y0],
  },
  {
    inside: (p, r) => p[1] <= r.y1,
    cross: (a, b, r) => [a[0] + ((b[0] - a[0]) * (r.y1 - a[1])) / (b[1] - a[1]), r.y1],
  },
];

/**
 * A polygon cut to a rectangle (Sutherland and Hodgman, "Reentrant polygon clipping",
 * Communications of the ACM 17(1), 1974): the part of its area inside, as one ring. A concave
 * polygon that leaves and re-enters the rectangle keeps zero-width edges along the border,
 * which fill nothing. Empty when nothing is inside.
 *
 * @example clipPolygon([[-5, 5], [5, -5], [15, 5], [5, 15]], { x0: 0, y0: 0, x1: 10, y1: 10 })
 * // → an octagon inside the square
 */
export function clipPolygon(points: readonly (readonly [number, number])[], r: Rect): Px[] {
  let ring: Px[] = points.map((p) => [p[0], p[1]]);
  for (const edge of EDGES) {
    if (ring.length === 0) break;
    const input = ring;
    ring = [];
    let prev = input[input.length - 1];
    for (const cur of input) {
      const curIn = edge.inside(cur, r);
      const prevIn = edge.inside(prev, r);
      if (curIn) {
        if (!prevIn) ring.push(edge.cross(prev, cur, r));
        ring.push(cur);
      } else if (prevIn) ring.push(edge.cross(prev, cur, r));
      prev = cur;
    }
  }
  return ring.length >= 3 ? ring : [];
}

/**
 * The part of the segment a–b inside a rectangle (Liang and Barsky, "A new concept and method
 * for line clipping", ACM Transactions on Graphics 3(1), 1984), or null when none is.
 *
 * @example clipSegment([-5, 5], [5, 5], { x0: 0, y0: 0, x1: 10, y1: 10 }) // → [[0, 5], [5, 5]]
 */
export function clipSegment(
  a: readonly [number, number],
  b: readonly [number, number],
  r: Rect,
): [Px, Px] | null {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  let t0 = 0;
  let t1 = 1;
  const sides: [number, number][] = [
    [-dx, a[0] - r.x0],
    [dx, r.x1 - a[0]],
    [-dy, a[1] - r.y0],
    [dy, r.y1 - a[1]],
  ];
  for (const [p, q] of sides) {
    if (p === 0) {
      if (q < 0) return null;
      continue;
    }
    const t = q / p;
    if (p < 0) {
      if (t > t1) return null;
      t0 = Math.max(t0, t);
    } else {
      if (t < t0) return null;
      t1 = Math.min(t1, t);
    }
  }
  return [
    [a[0] + t0 * dx, a[1] + t0 * dy],
    [a[0] + t1 * dx, a[1] + t1 * dy],
  ];
}

/**
 * A polyline cut to a rectangle: the runs of it inside, each a polyline of its own (a line
 * that leaves and comes back gives two runs).
 *
 * @example clipPolyline([[-5, 5], [5, 5], [5, 20]], { x0: 0, y0: 0, x1: 10, y1: 10 })
 * // → [[[0, 5], [5, 5], [5, 10]]]
 */
export function clipPolyline(points: readonly (readonly [number, number])[], r: Rect): Px[][] {
  const runs: Px[][] = [];
  let run: Px[] = [];
  for (let i = 0; i + 1 < points.length; i++) {
    const seg = clipSegment(points[i], points[i + 1], r);
    if (!seg) continue;
    const last = run[run.length - 1];
    if (!last || last[0] !== seg[0][0] || last[1] !== seg[0][1]) {
      if (run.length > 1) runs.push(run);
      run = [seg[0]];
    }
    run.push(seg[1]);
    // the segment left the rectangle: the run ends here
    if (seg[1][0] !== points[i + 1][0] || seg[1][1] !== points[i + 1][1]) {
      runs.push(run);
      run = [];
    }
  }
  if (run.length > 1) runs.push(run);
  return runs;
}

/** A polyline cut to a rectangle as path data (one M…L… run for each part inside; '' for none). */
export const clippedLineData = (points: readonly (readonly [number, number])[], r: Rect): string =>
  clipPolyline(points, r)
    .map((run) => pathData(run))
    .join('');

/** A polygon cut to a rectangle as closed path data ('' when nothing is inside). */
export const clippedPolygonData = (
  points: readonly (readonly [number, number])[],
  r: Rect,
): string => pathData(clipPolygon(points, r), true);
