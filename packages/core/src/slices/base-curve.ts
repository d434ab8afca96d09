import type { Polyline } from '../model/types';

/**
 * A slip surface between its two ends as a run of pieces, each a straight segment or an arc
 * of the lower half of a circle; pieces are contiguous and ordered by x.
 */
export type BasePiece =
  | { arc: false; x0: number; x1: number; y0: number; y1: number }
  | { arc: true; x0: number; x1: number; xc: number; yc: number; r: number };

/** Elevation of one piece at x (x inside the piece). */
export function pieceY(p: BasePiece, x: number): number {
  if (p.arc) {
    const u = x - p.xc;
    const s = p.r * p.r - u * u;
    return p.yc - (s > 0 ? Math.sqrt(s) : 0);
  }
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
 * x values in [lo, hi] where a piece meets a straight segment (x0, y0)–(x1, y1). For an arc
 * only points on its lower half count.
 */
function pieceSegmentMeets(
  p: BasePiece,
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  lo: number,
  hi: number,
  out: number[],
): void {
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
  const roots = q !== 0 ? [q / a, c / q] : [0];
  for (const x of roots) {
    if (x >= lo && x <= hi && m * x + k <= 1e-12 * p.r) out.push(x);
  }
}

/**
 * Every x in [from, to] where the surface meets a polyline (crossings and touches),
 * sorted, not deduplicated.
 */
export function curvePolylineMeets(
  pieces: readonly BasePiece[],
  line: Polyline,
  from: number,
  to: number,
): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < line.length; i++) {
    const [x0, y0] = line[i];
    const [x1, y1] = line[i + 1];
    if (x1 <= x0 || x1 < from || x0 > to) continue;
    for (const p of pieces) {
      const lo = Math.max(x0, p.x0, from);
      const hi = Math.min(x1, p.x1, to);
      if (hi < lo) continue;
      pieceSegmentMeets(p, x0, y0, x1, y1, lo, hi, out);
    }
  }
  return out.sort((a, b) => a - b);
}

/** ∫ y dx, ∫ x·y dx and ∫ y² dx of one piece over [a, b] (a, b inside the piece). */
export function pieceIntegrals(p: BasePiece, a: number, b: number): [number, number, number] {
  if (!p.arc) {
    // Simpson's rule is exact for these polynomials of degree ≤ 2
    const ya = pieceY(p, a);
    const yb = pieceY(p, b);
    const xm = (a + b) / 2;
    const ym = (ya + yb) / 2;
    const w = (b - a) / 6;
    return [
      w * (ya + 4 * ym + yb),
      w * (a * ya + 4 * xm * ym + b * yb),
      w * (ya * ya + 4 * ym * ym + yb * yb),
    ];
  }
  // y = yc − s(u), s = √(r² − u²), u = x − xc
  const { xc, yc, r } = p;
  const r2 = r * r;
  const clamp = (u: number) => (u < -r ? -r : u > r ? r : u);
  const ua = clamp(a - xc);
  const ub = clamp(b - xc);
  const sa = Math.sqrt(Math.max(0, r2 - ua * ua));
  const sb = Math.sqrt(Math.max(0, r2 - ub * ub));
  const du = ub - ua;
  const iS = 0.5 * (ub * sb - ua * sa + r2 * (Math.asin(ub / r) - Math.asin(ua / r))); // ∫ s du
  const iUS = -(sb * sb * sb - sa * sa * sa) / 3; // ∫ u s du
  const iU = (ub * ub - ua * ua) / 2; // ∫ u du
  const iY = yc * du - iS;
  const iXY = yc * (iU + xc * du) - iUS - xc * iS;
  const iY2 = yc * yc * du - 2 * yc * iS + (r2 * du - (ub * ub * ub - ua * ua * ua) / 3);
  return [iY, iXY, iY2];
}
