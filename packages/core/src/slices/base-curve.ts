import { NumberList } from '../geometry/number-list';
import type { Polyline } from '../model/types';

/**
 * A slip surface between its two ends as a run of pieces, each a straight segment or an arc
 * of the lower half of a circle; pieces are contiguous and ordered by x.
 */
export type BasePiece =
  | { arc: false; x0: number; x1: number; y0: number; y1: number }
  | { arc: true; x0: number; x1: number; xc: number; yc: number; r: number };

/**
 * A straight piece. Every piece is made by linePiece or arcPiece, with the same fields in the
 * same order (a line's xc, yc, r and an arc's y0, y1 are NaN), so that the slicer's loops see
 * one shape of object and the compiler optimises them once.
 */
export function linePiece(x0: number, x1: number, y0: number, y1: number): BasePiece {
  const p = { arc: false, x0, x1, y0, y1, xc: NaN, yc: NaN, r: NaN };
  return p;
}

/** An arc of the lower half of the circle (xc, yc, r) from x0 to x1 (see linePiece). */
export function arcPiece(
  x0: number,
  x1: number,
  xc: number,
  yc: number,
  r: number,
): BasePiece & { arc: true } {
  const p = { arc: true, x0, x1, y0: NaN, y1: NaN, xc, yc, r };
  return p as BasePiece & { arc: true };
}

/** Elevation of one piece at x (x inside the piece). */
export function pieceY(p: BasePiece, x: number): number {
  if (p.arc) return p.yc - arcS(x - p.xc, p.r);
  const dx = p.x1 - p.x0;
  return dx > 0 ? p.y0 + ((p.y1 - p.y0) * (x - p.x0)) / dx : p.y0;
}

/** Index of the piece that holds x (the last piece for x at or past the end). */
export function pieceIndexAt(pieces: readonly BasePiece[], x: number): number {
  let lo = 0;
  let hi = pieces.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (pieces[mid].x0 <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/** Elevation of the surface at x. */
export function curveY(pieces: readonly BasePiece[], x: number): number {
  return pieceY(pieces[pieceIndexAt(pieces, x)], x);
}

/**
 * x values in [from, to] where a piece meets segment i of a polyline (line[i]–line[i + 1]),
 * added to `out`. For an arc only points on its lower half count. It takes the polyline and
 * the index, not the segment's numbers, so that a call boxes no numbers (the slicer calls it
 * for every segment of every boundary it crosses, thousands of times a search).
 */
function pieceSegmentMeets(
  p: BasePiece,
  line: Polyline,
  i: number,
  from: number,
  to: number,
  out: NumberList,
): void {
  const x0 = line[i][0];
  const y0 = line[i][1];
  const x1 = line[i + 1][0];
  const y1 = line[i + 1][1];
  const lo = Math.max(x0, p.x0, from);
  const hi = Math.min(x1, p.x1, to);
  if (hi < lo) return;
  const m = x1 > x0 ? (y1 - y0) / (x1 - x0) : 0;
  if (!p.arc) {
    const mp = p.x1 > p.x0 ? (p.y1 - p.y0) / (p.x1 - p.x0) : 0;
    // d(x) = (y0 + m (x − x0)) − (p.y0 + mp (x − p.x0))
    const dLo = y0 + m * (lo - x0) - (p.y0 + mp * (lo - p.x0));
    const dHi = y0 + m * (hi - x0) - (p.y0 + mp * (hi - p.x0));
    if (dLo === 0) out.push(lo);
    if (dHi === 0) out.push(hi);
    if ((dLo < 0 && dHi > 0) || (dLo > 0 && dHi < 0))
      out.push(lo + ((hi - lo) * dLo) / (dLo - dHi));
    return;
  }
  // (x − xc)² + (y0 + m (x − x0) − yc)² = r², y ≤ yc
  const k = y0 - m * x0 - p.yc; // y − yc = m x + k
  const a = 1 + m * m;
  const b = -2 * p.xc + 2 * m * k;
  const c = p.xc * p.xc + k * k - p.r * p.r;
  const disc = b * b - 4 * a * c;
  if (disc < 0) return;
  const s = Math.sqrt(disc);
  const q = b >= 0 ? -(b + s) / 2 : -(b - s) / 2;
  const r1 = q !== 0 ? q / a : 0;
  if (r1 >= lo && r1 <= hi && m * r1 + k <= 1e-12 * p.r) out.push(r1);
  if (q === 0) return;
  const r2 = c / q;
  if (r2 >= lo && r2 <= hi && m * r2 + k <= 1e-12 * p.r) out.push(r2);
}

/**
 * Every x in [from, to] where the surface meets a polyline (crossings and touches), added to
 * `out`, not sorted, not deduplicated.
 */
export function meetsInto(
  pieces: readonly BasePiece[],
  line: Polyline,
  from: number,
  to: number,
  out: NumberList,
): void {
  for (let i = 0; i + 1 < line.length; i++) {
    const x0 = line[i][0];
    const x1 = line[i + 1][0];
    if (x1 <= x0 || x1 < from || x0 > to) continue;
    for (let j = 0; j < pieces.length; j++) {
      const p = pieces[j];
      if (p.x1 < x0 || p.x0 > x1) continue;
      pieceSegmentMeets(p, line, i, from, to, out);
    }
  }
}

/** Every x in [from, to] where the surface meets a polyline (crossings and touches), sorted, not deduplicated. */
export function curvePolylineMeets(
  pieces: readonly BasePiece[],
  line: Polyline,
  from: number,
  to: number,
): number[] {
  const out = new NumberList();
  meetsInto(pieces, line, from, to, out);
  out.sort();
  return out.toArray();
}

/**
 * ∫ y dx, ∫ x·y dx and ∫ y² dx of a straight line from (a, ya) to (b, yb), written into
 * out[k], out[k + 1], out[k + 2] (Simpson's rule, exact for these polynomials of degree ≤ 2).
 */
export function lineIntegrals(
  a: number,
  b: number,
  ya: number,
  yb: number,
  out: Float64Array,
  k: number,
): void {
  const xm = 0.5 * (a + b);
  const ym = 0.5 * (ya + yb);
  const w = (b - a) / 6;
  out[k] = (b - a) * ym;
  out[k + 1] = w * (a * ya + 4 * xm * ym + b * yb);
  out[k + 2] = w * (ya * ya + 4 * ym * ym + yb * yb);
}

/**
 * lineIntegrals of a slice: from xl[i] to xr[i], the line from ya[ia] to yb[ib]. It takes
 * arrays and indices, not numbers, so that a call the compiler does not inline boxes nothing.
 */
export function lineIntegralsAt(
  xl: Float64Array,
  xr: Float64Array,
  i: number,
  ya: Float64Array,
  ia: number,
  yb: Float64Array,
  ib: number,
  out: Float64Array,
  k: number,
): void {
  lineIntegrals(xl[i], xr[i], ya[ia], yb[ib], out, k);
}

/** u = x − xc clamped to the circle [−r, r]. */
export function arcU(u: number, r: number): number {
  return u < -r ? -r : u > r ? r : u;
}

/** s = √(r² − u²): the depth of the lower arc below the centre at u (0 beyond the circle). */
export function arcS(u: number, r: number): number {
  const q = r * r - u * u;
  return q > 0 ? Math.sqrt(q) : 0;
}

/**
 * The angle the lower arc turns through between two of its points (ua, sa) and (ub, sb),
 * asin(ub/r) − asin(ua/r), without an arcsine where it is small: from its sine
 * (ub·sa − ua·sb)/r² by the series of asin to x⁹ (error below 10⁻¹¹ relative where used).
 */
export function arcAngle(ua: number, sa: number, ub: number, sb: number, r: number): number {
  const r2 = r * r;
  const x = (ub * sa - ua * sb) / r2;
  if (x >= 0 && x < 0.15 && ua * ub + sa * sb > 0) {
    const x2 = x * x;
    return x * (1 + x2 * (1 / 6 + x2 * (3 / 40 + x2 * (5 / 112 + x2 * (35 / 1152)))));
  }
  return Math.asin(ub / r) - Math.asin(ua / r);
}

/**
 * ∫ y dx, ∫ x·y dx and ∫ y² dx under the lower half of a circle between two of its points
 * (at a: ua = arcU(a − xc), sa = arcS(ua); the same at b), into out[k…k + 2].
 */
export function arcIntegrals(
  xc: number,
  yc: number,
  r: number,
  ua: number,
  sa: number,
  ub: number,
  sb: number,
  out: Float64Array,
  k: number,
): void {
  const r2 = r * r;
  const du = ub - ua;
  const iS = 0.5 * (ub * sb - ua * sa + r2 * arcAngle(ua, sa, ub, sb, r)); // ∫ s du
  const iUS = -(sb * sb * sb - sa * sa * sa) / 3; // ∫ u s du
  const iU = (ub * ub - ua * ua) / 2; // ∫ u du
  out[k] = yc * du - iS;
  out[k + 1] = yc * (iU + xc * du) - iUS - xc * iS;
  out[k + 2] = yc * yc * du - 2 * yc * iS + (r2 * du - (ub * ub * ub - ua * ua * ua) / 3);
}

/** ∫ y dx, ∫ x·y dx and ∫ y² dx of one piece over [a, b] (a, b inside the piece), into out[k…k + 2]. */
export function pieceIntegrals(
  p: BasePiece,
  a: number,
  b: number,
  out: Float64Array = new Float64Array(3),
  k = 0,
): Float64Array {
  if (!p.arc) {
    lineIntegrals(a, b, pieceY(p, a), pieceY(p, b), out, k);
    return out;
  }
  // y = yc − s(u), s = √(r² − u²), u = x − xc
  const ua = arcU(a - p.xc, p.r);
  const ub = arcU(b - p.xc, p.r);
  const sa = arcS(ua, p.r);
  const sb = arcS(ub, p.r);
  arcIntegrals(p.xc, p.yc, p.r, ua, sa, ub, sb, out, k);
  return out;
}
