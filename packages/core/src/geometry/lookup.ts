import type { Polyline } from '../model/types';

/**
 * A polyline prepared for evaluation in constant time: its vertices as typed arrays and a
 * table of buckets over x, each holding the index of the segment where the bucket starts.
 */
export interface Lookup {
  xs: Float64Array;
  ys: Float64Array;
  x0: number;
  inv: number;
  buckets: Int32Array;
  last: number;
  /** The segment of the last look-up: consecutive look-ups at increasing x mostly stay in it. */
  cursor: number;
  /** Slope of each segment (0 for a vertical step). */
  slopes: Float64Array;
}

/** Build a lookup with about four buckets per segment (at least 64). */
export function lookup(line: Polyline): Lookup {
  const n = line.length;
  const xs = new Float64Array(n);
  const ys = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    xs[i] = line[i][0];
    ys[i] = line[i][1];
  }
  const x0 = xs[0];
  const span = Math.max(xs[n - 1] - x0, 1e-12);
  const m = Math.max(64, 4 * n);
  const inv = m / span;
  const buckets = new Int32Array(m + 1);
  let seg = 0;
  for (let b = 0; b <= m; b++) {
    const x = x0 + b / inv;
    while (seg < n - 2 && xs[seg + 1] <= x) seg++;
    buckets[b] = seg;
  }
  const slopes = new Float64Array(Math.max(1, n - 1));
  for (let i = 0; i + 1 < n; i++)
    slopes[i] = xs[i + 1] > xs[i] ? (ys[i + 1] - ys[i]) / (xs[i + 1] - xs[i]) : 0;
  return { xs, ys, x0, inv, buckets, last: n - 1, cursor: 0, slopes };
}

/** Index of the segment holding x (clamped to the first and last segment). */
export function segmentAt(L: Lookup, x: number): number {
  if (L.last === 0) return 0;
  const xs = L.xs;
  const c = L.cursor;
  if (x >= xs[c] && x <= xs[c + 1]) return c;
  if (c + 2 <= L.last && x > xs[c + 1] && x <= xs[c + 2]) return (L.cursor = c + 1);
  let b = ((x - L.x0) * L.inv) | 0;
  if (b < 0) b = 0;
  else if (b >= L.buckets.length) b = L.buckets.length - 1;
  let i = L.buckets[b];
  while (i < L.last - 1 && xs[i + 1] < x) i++;
  while (i > 0 && xs[i] > x) i--;
  return (L.cursor = i);
}

/** Elevation at x, flat beyond the ends (as yAt). */
export function lookupY(L: Lookup, x: number): number {
  const xs = L.xs;
  if (x <= xs[0]) return L.ys[0];
  if (x >= xs[L.last]) return L.ys[L.last];
  const i = segmentAt(L, x);
  const dx = xs[i + 1] - xs[i];
  return dx > 0 ? L.ys[i] + ((L.ys[i + 1] - L.ys[i]) * (x - xs[i])) / dx : L.ys[i + 1];
}

/** Slope dy/dx at x (0 beyond the ends). */
export function lookupSlope(L: Lookup, x: number): number {
  const xs = L.xs;
  if (x <= xs[0] || x >= xs[L.last]) return 0;
  const i = segmentAt(L, x);
  const dx = xs[i + 1] - xs[i];
  return dx > 0 ? (L.ys[i + 1] - L.ys[i]) / dx : 0;
}

/**
 * Elevation at x for a caller walking to the right: from the cursor segment onward, with the
 * precomputed slope (no division). x must lie inside the polyline's x-range.
 */
export function walkY(L: Lookup, x: number): number {
  const xs = L.xs;
  let i = L.cursor;
  if (x < xs[i]) i = segmentAt(L, x);
  else while (i < L.last - 1 && xs[i + 1] < x) i++;
  L.cursor = i;
  return L.ys[i] + L.slopes[i] * (x - xs[i]);
}

/**
 * Elevations at many x in increasing order, written to out[offset + i] for i < count: the
 * same numbers as lookupY at each (the same segments, the cursor moved the same way), in one
 * call, so that a caller's loop boxes no numbers.
 */
export function lookupYs(
  L: Lookup,
  xsIn: Float64Array,
  count: number,
  out: Float64Array,
  offset: number,
): void {
  const xs = L.xs;
  const ys = L.ys;
  const last = L.last;
  const first = xs[0];
  const end = xs[last];
  for (let j = 0; j < count; j++) {
    const x = xsIn[j];
    if (x <= first) {
      out[offset + j] = ys[0];
      continue;
    }
    if (x >= end) {
      out[offset + j] = ys[last];
      continue;
    }
    // segmentAt, written out
    let i: number;
    const c = L.cursor;
    if (x >= xs[c] && x <= xs[c + 1]) i = c;
    else if (c + 2 <= last && x > xs[c + 1] && x <= xs[c + 2]) i = L.cursor = c + 1;
    else {
      let b = ((x - L.x0) * L.inv) | 0;
      if (b < 0) b = 0;
      else if (b >= L.buckets.length) b = L.buckets.length - 1;
      i = L.buckets[b];
      while (i < last - 1 && xs[i + 1] < x) i++;
      while (i > 0 && xs[i] > x) i--;
      L.cursor = i;
    }
    const dx = xs[i + 1] - xs[i];
    out[offset + j] = dx > 0 ? ys[i] + ((ys[i + 1] - ys[i]) * (x - xs[i])) / dx : ys[i + 1];
  }
}
