import { type Lookup, lookupY, lookupYs } from '../geometry/lookup';
import { NumberList } from '../geometry/number-list';
import type { CircleSurface, PolylineSurface } from '../model/types';
import {
  type BasePiece,
  arcIntegrals,
  arcPiece,
  arcS,
  arcU,
  curveY,
  lineIntegralsAt,
  linePiece,
  meetsInto,
  pieceY,
} from './base-curve';
import { reinforceSlices } from '../reinforcement/crossings';
import type { Crossing } from '../reinforcement/types';
import type { Geometry, PreparedSection } from './prepare-section';
import { type SliceSet, sliceSet } from './slice-set';
import { crackDepth, crackX } from './tension-crack';

/** Why a slip surface cannot be sliced. */
export type RejectCode =
  | 'misses-ground'
  | 'leaves-section'
  | 'reemerges'
  | 'not-admissible'
  | 'crack-too-deep'
  | 'no-soil';

/**
 * Everything one cut of a slip surface produces, kept from cut to cut so that the search can
 * slice thousands of surfaces without allocating: the slices (in a buffer that grows), the
 * orientation, the ends, the surface as pieces, the crack, and scratch space. Not shared
 * between threads or calls in flight: each caller makes its own (`sliceWorkspace`).
 */
export interface SliceWorkspace {
  prepared: PreparedSection;
  slices: SliceSet;
  /** The orientation used: the section's geometry, mirrored when the mass moves toward +x. */
  g: Geometry;
  mirrored: boolean;
  /** Ends of the mass in sliding orientation (xb at the crack when there is one). */
  xa: number;
  xb: number;
  /** The slip surface between the ends, in sliding orientation. */
  pieces: BasePiece[];
  /** The crack at the upper end: its depth and the depth of water in it (0 when none). */
  crackDepth: number;
  crackWater: number;
  /** Where the surface crosses the reinforcement, and the forces there (reinforcement/crossings.ts). */
  crossings: Crossing[];
  /** Numbers for the words of a rejection (x values in the section's coordinates, a side). */
  detail: {
    a: number;
    b: number;
    side: 'left' | 'right';
    atEdge: boolean;
    depth: number;
    /** misses-ground: the surface does not even lie under the ground's x-range. */
    outside: boolean;
  };
  // scratch, reused
  arc: BasePiece & { arc: true };
  arcMirrored: BasePiece & { arc: true };
  one: BasePiece[];
  oneMirrored: BasePiece[];
  xs: NumberList;
  meets: NumberList;
  edges: NumberList;
  /** The boundaries and the piezometric line at the slice edges (fillSlices' passes). */
  edgeTops: Float64Array;
  edgePz: Float64Array;
  /** Each slice's base: the piece it lies on, the surface at its middle, u and s at its ends on an arc. */
  base: {
    piece: Int32Array;
    mid: Float64Array;
    uL: Float64Array;
    sL: Float64Array;
    uR: Float64Array;
    sR: Float64Array;
  };
  integrals: Float64Array;
}

function baseScratch(capacity: number): SliceWorkspace['base'] {
  const f = () => new Float64Array(capacity);
  return { piece: new Int32Array(capacity), mid: f(), uL: f(), sL: f(), uR: f(), sR: f() };
}

/** A workspace for slicing surfaces of one prepared section. */
export function sliceWorkspace(prepared: PreparedSection, capacity = 64): SliceWorkspace {
  const tops = prepared.normal.tops.length + 1;
  const arc = () => arcPiece(0, 0, 0, 0, 1);
  return {
    prepared,
    slices: sliceSet(capacity),
    g: prepared.normal,
    mirrored: false,
    xa: 0,
    xb: 0,
    pieces: [],
    crackDepth: 0,
    crackWater: 0,
    crossings: [],
    detail: { a: 0, b: 0, side: 'left', atEdge: false, depth: 0, outside: false },
    arc: arc(),
    arcMirrored: arc(),
    one: [],
    oneMirrored: [],
    xs: new NumberList(),
    meets: new NumberList(),
    edges: new NumberList(),
    edgeTops: new Float64Array(tops * (capacity + 1)),
    edgePz: new Float64Array(capacity + 1),
    base: baseScratch(capacity),
    integrals: new Float64Array(9),
  };
}

/** How far the ground lies above the surface at x. */
function depthBelow(ground: Lookup, pieces: readonly BasePiece[], x: number): number {
  return lookupY(ground, x) - curveY(pieces, x);
}

/** Whether x is one of the meets (within tol). */
function isMeet(meets: NumberList, x: number, tol: number): boolean {
  for (let i = 0; i < meets.length; i++) if (Math.abs(meets.values[i] - x) <= tol) return true;
  return false;
}

/** Ends of the sliding mass in the section's coordinates: one run of soil above the surface between two ground meets. */
function findEnds(
  ws: SliceWorkspace,
  pieces: readonly BasePiece[],
  tol: number,
): RejectCode | null {
  const g = ws.prepared.normal;
  const ground = g.at.ground;
  const lo = Math.max(pieces[0].x0, g.xMin);
  const hi = Math.min(pieces[pieces.length - 1].x1, g.xMax);
  const d = ws.detail;
  d.outside = hi - lo <= tol;
  if (d.outside) return 'misses-ground';
  const meets = ws.meets;
  meets.clear();
  meetsInto(pieces, g.ground, lo, hi, meets);
  if (Math.abs(depthBelow(ground, pieces, lo)) <= 10 * tol) meets.push(lo);
  if (Math.abs(depthBelow(ground, pieces, hi)) <= 10 * tol) meets.push(hi);
  const pts = ws.xs;
  pts.clear();
  pts.push(lo);
  pts.push(hi);
  for (let i = 0; i < meets.length; i++) pts.push(meets.values[i]);
  pts.sortUnique(tol);
  const v = pts.values;
  let runs = 0;
  let xa = NaN;
  let xb = NaN;
  for (let i = 0; i + 1 < pts.length; i++) {
    const a = v[i];
    const b = v[i + 1];
    if (depthBelow(ground, pieces, (a + b) / 2) <= tol) continue;
    if (runs > 0 && xb === a) {
      xb = b;
      continue;
    }
    if (++runs > 1) {
      d.a = xb;
      d.b = a;
      return 'reemerges';
    }
    xa = a;
    xb = b;
  }
  if (runs === 0) return 'misses-ground';
  const bad = !isMeet(meets, xa, tol) ? xa : !isMeet(meets, xb, tol) ? xb : NaN;
  if (!Number.isNaN(bad)) {
    d.side = bad === xa ? 'left' : 'right';
    d.atEdge = bad === g.xMin || bad === g.xMax;
    return 'leaves-section';
  }
  ws.xa = xa;
  ws.xb = xb;
  return null;
}

/** A piece restricted to [a, b]. */
function restrict(p: BasePiece, a: number, b: number): BasePiece {
  return p.arc ? arcPiece(a, b, p.xc, p.yc, p.r) : linePiece(a, b, pieceY(p, a), pieceY(p, b));
}

/** Lowest elevation of the pieces. */
function lowest(pieces: readonly BasePiece[]): number {
  let y = Infinity;
  for (const p of pieces) {
    if (p.arc) {
      const x = p.xc < p.x0 ? p.x0 : p.xc > p.x1 ? p.x1 : p.xc;
      y = Math.min(y, pieceY(p, x));
    } else y = Math.min(y, p.y0, p.y1);
  }
  return y;
}

/** Restrict the pieces to [xa, xb], following the rigid top wherever the surface dips below it. */
function clipPieces(
  ws: SliceWorkspace,
  pieces: readonly BasePiece[],
  xa: number,
  xb: number,
  followRigid: boolean,
  tol: number,
): BasePiece[] {
  // the common case, a circle above any rigid base: one arc, no allocation
  if (pieces.length === 1 && pieces[0].arc) {
    const p = pieces[0];
    p.x0 = Math.max(p.x0, xa);
    p.x1 = Math.min(p.x1, xb);
    const g = ws.g;
    const rigid = g.rigidTop;
    if (!followRigid || !rigid || lowest(pieces) >= g.topMax[g.soilStrata]) {
      ws.one[0] = p;
      return ws.one;
    }
  }
  const within: BasePiece[] = [];
  for (const p of pieces) {
    const a = Math.max(p.x0, xa);
    const b = Math.min(p.x1, xb);
    if (b - a > tol) within.push(restrict(p, a, b));
  }
  const rigid = ws.g.rigidTop;
  if (!followRigid || !rigid) return within;
  const rigidAt = ws.g.at.rigid!;
  const cuts = new NumberList();
  meetsInto(within, rigid, xa, xb, cuts);
  cuts.push(xa);
  cuts.push(xb);
  cuts.sortUnique(tol);
  const out: BasePiece[] = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const a = cuts.values[i];
    const b = cuts.values[i + 1];
    const m = (a + b) / 2;
    if (curveY(within, m) >= lookupY(rigidAt, m) - tol) {
      for (const p of within) {
        const pa = Math.max(p.x0, a);
        const pb = Math.min(p.x1, b);
        if (pb - pa > tol) out.push(restrict(p, pa, pb));
      }
    } else {
      const xs = new NumberList();
      xs.push(a);
      xs.push(b);
      for (const q of rigid) if (q[0] > a && q[0] < b) xs.push(q[0]);
      xs.sortUnique(tol);
      for (let k = 0; k + 1 < xs.length; k++) {
        const u = xs.values[k];
        const w = xs.values[k + 1];
        out.push(linePiece(u, w, lookupY(rigidAt, u), lookupY(rigidAt, w)));
      }
    }
  }
  return out;
}

/** The pieces of a polyline surface, in the orientation asked for. */
export function polylinePieces(surface: PolylineSurface, mirror: boolean): BasePiece[] {
  const pts = mirror ? [...surface.points].reverse().map((p) => [-p[0], p[1]]) : surface.points;
  const pieces: BasePiece[] = [];
  for (let i = 0; i + 1 < pts.length; i++) {
    pieces.push(linePiece(pts[i][0], pts[i + 1][0], pts[i][1], pts[i + 1][1]));
  }
  return pieces;
}

/**
 * Slice edges between xa and xb: `count` slices of equal width, each cut again at every
 * break inside it — the surface's joints, the fixed edges of the geometry (vertices,
 * piezometric crossings, load edges), where the surface crosses a stratum top, the
 * piezometric line or a cut line (Geometry.cutLines). As a surface moves, a break crosses an equal edge through a slice of
 * zero width, so the factor of safety changes continuously with the surface.
 */
function sliceEdges(ws: SliceWorkspace, count: number, tol: number): void {
  const g = ws.g;
  const { xa, xb, pieces } = ws;
  const e = ws.edges;
  e.clear();
  e.push(xa);
  e.push(xb);
  const fixed = g.fixedEdges;
  let lo = 0;
  let hi = fixed.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (fixed[mid] < xa) lo = mid + 1;
    else hi = mid;
  }
  for (let i = lo; i < fixed.length && fixed[i] <= xb; i++) e.push(fixed[i]);
  for (let i = 1; i < pieces.length; i++)
    if (pieces[i].x0 > xa && pieces[i].x0 < xb) e.push(pieces[i].x0);
  const bottom = lowest(pieces);
  const soilTops = Math.min(g.soilStrata, g.tops.length);
  for (let i = 1; i < soilTops; i++) {
    if (g.topMax[i] >= bottom) meetsInto(pieces, g.tops[i], xa, xb, e);
  }
  if (g.piezometric) meetsInto(pieces, g.piezometric, xa, xb, e);
  const lines = g.cutLines;
  for (let i = 0; i < lines.length; i++) meetsInto(pieces, lines[i], xa, xb, e);
  const target = Math.max(1, Math.floor(count));
  for (let k = 1; k < target; k++) e.push(xa + ((xb - xa) * k) / target);
  e.sortUnique(Math.max(tol, 1e-9 * (xb - xa)));
  // the last edge is xb (a point just below it was kept in its place)
  e.values[e.length - 1] = xb;
}

/**
 * The boundaries and the piezometric line at every slice edge, into the workspace's scratch:
 * edgeTops[k·(n + 1) + i] is the top of stratum k (0: the ground) at edge i, for the `nt`
 * tops that can reach the surface; edgePz[i] the piezometric line (0 without one). One pass
 * of look-ups walking right, apart from the arithmetic, so that each stays small.
 */
function edgeValues(ws: SliceWorkspace, n: number, nt: number): void {
  const edges = ws.edges.values;
  const m = n + 1;
  if (ws.edgeTops.length < nt * m) ws.edgeTops = new Float64Array(2 * nt * m);
  if (ws.edgePz.length < m) ws.edgePz = new Float64Array(2 * m);
  const T = ws.edgeTops;
  const tops = ws.g.at.tops;
  for (let k = 0; k < nt; k++) lookupYs(tops[k], edges, m, T, k * m);
  const pz = ws.g.at.piezometric;
  if (pz) lookupYs(pz, edges, m, ws.edgePz, 0);
}

/**
 * Each slice's base: its ends on the surface (yBaseL, yBaseR), the surface at its middle, and
 * for a base on an arc u = x − xc and s = √(r² − u²) at both ends (the arc integrals' input).
 */
function baseSlices(ws: SliceWorkspace, n: number): void {
  const pieces = ws.pieces;
  const S = ws.slices;
  const { xl, xr, yBaseL, yBaseR } = S;
  const B = ws.base;
  const mid = B.mid;
  const uLs = B.uL;
  const sLs = B.sL;
  const uRs = B.uR;
  const sRs = B.sR;
  const onPiece = B.piece;
  if (pieces.length === 1 && pieces[0].arc) {
    // one arc, the search's case: its numbers read once. The general loop below gives the same
    // numbers, but compiled it sometimes boxes them (measured: half the runs allocated 6× more)
    const { xc, yc, r } = pieces[0];
    let uL = arcU(xl[0] - xc, r);
    let sL = arcS(uL, r);
    for (let i = 0; i < n; i++) {
      const uR = arcU(xr[i] - xc, r);
      const sR = arcS(uR, r);
      onPiece[i] = 0;
      uLs[i] = uL;
      sLs[i] = sL;
      uRs[i] = uR;
      sRs[i] = sR;
      yBaseL[i] = yc - sL;
      yBaseR[i] = yc - sR;
      mid[i] = yc - arcS(arcU(0.5 * (xl[i] + xr[i]) - xc, r), r);
      uL = uR;
      sL = sR;
    }
    return;
  }
  let piece = 0;
  let arcAt = -1;
  let uL = 0;
  let sL = 0;
  for (let i = 0; i < n; i++) {
    const x0 = xl[i];
    const x1 = xr[i];
    const xm = 0.5 * (x0 + x1);
    while (piece + 1 < pieces.length && pieces[piece + 1].x0 <= xm) piece++;
    const p = pieces[piece];
    onPiece[i] = piece;
    if (p.arc) {
      const r = p.r;
      if (arcAt !== piece) {
        uL = arcU(x0 - p.xc, r);
        sL = arcS(uL, r);
        arcAt = piece;
      }
      const uR = arcU(x1 - p.xc, r);
      const sR = arcS(uR, r);
      uLs[i] = uL;
      sLs[i] = sL;
      uRs[i] = uR;
      sRs[i] = sR;
      yBaseL[i] = p.yc - sL;
      yBaseR[i] = p.yc - sR;
      mid[i] = p.yc - arcS(arcU(xm - p.xc, r), r);
      uL = uR;
      sL = sR;
    } else {
      // pieceY, written out
      const dx = p.x1 - p.x0;
      const yb0 = dx > 0 ? p.y0 + ((p.y1 - p.y0) * (x0 - p.x0)) / dx : p.y0;
      const yb1 = dx > 0 ? p.y0 + ((p.y1 - p.y0) * (x1 - p.x0)) / dx : p.y0;
      yBaseL[i] = yb0;
      yBaseR[i] = yb1;
      mid[i] = 0.5 * (yb0 + yb1);
    }
  }
}

/** arcIntegrals under slice i's base on the arc p, from the base pass's u and s (no numbers passed). */
function arcIntegralsAt(
  p: BasePiece & { arc: true },
  B: SliceWorkspace['base'],
  i: number,
  out: Float64Array,
  k: number,
): void {
  arcIntegrals(p.xc, p.yc, p.r, B.uL[i], B.sL[i], B.uR[i], B.sR[i], out, k);
}

/**
 * Each slice's weight (stratum by stratum, between the linear boundaries and the base, summed
 * exactly), centroid, pore pressure and base strength, from the edge values and the base.
 * Returns the total weight.
 */
function weighSlices(ws: SliceWorkspace, n: number, nt: number): number {
  const { prepared, g, pieces } = ws;
  const tol = prepared.tol;
  const { gamma, gammaSat, c: cohesion, tanPhi, suRate, suDatum } = prepared.strata;
  const stratumMaterial = g.stratumMaterial;
  const water = prepared.section.water;
  const gw = water.unitWeight;
  const ru = water.kind === 'ru' ? water.ru : 0;
  const S = ws.slices;
  const { xl, xr, yTopL, yTopR, yBaseL, yBaseR, area, weight, cx, cy, porePressure } = S;
  const outC = S.cohesion;
  const outT = S.tanPhi;
  const outM = S.material;
  const soil = g.soilStrata;
  const pz = g.at.piezometric !== null;
  const T = ws.edgeTops;
  const P = ws.edgePz;
  const B = ws.base;
  const m = n + 1;
  // I[0..2]: the boundary above, I[3..5]: the one below, I[6..8]: the piezometric line
  const I = ws.integrals;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const x0 = xl[i];
    const x1 = xr[i];
    const b = x1 - x0;
    const p = pieces[B.piece[i]];
    const ybm = B.mid[i];
    const g0 = T[i];
    const g1 = T[i + 1];
    yTopL[i] = g0;
    yTopR[i] = g1;
    const pL = pz ? P[i] : 0;
    const pR = pz ? P[i + 1] : 0;
    const pm = 0.5 * (pL + pR);

    let A = 0;
    let W = 0;
    let WX = 0;
    let WY = 0;
    let base = 0;
    lineIntegralsAt(xl, xr, i, T, i, T, i + 1, I, 0);
    for (let k = 0; k < soil; k++) {
      const tm = 0.5 * (T[k * m + i] + T[k * m + i + 1]);
      if (tm <= ybm + tol) break;
      const below = k + 1 < nt;
      const b0 = below ? T[(k + 1) * m + i] : -Infinity;
      const b1 = below ? T[(k + 1) * m + i + 1] : -Infinity;
      const bm = 0.5 * (b0 + b1);
      const full = bm > ybm + tol;
      if (full) lineIntegralsAt(xl, xr, i, T, (k + 1) * m + i, T, (k + 1) * m + i + 1, I, 3);
      else if (p.arc) arcIntegralsAt(p, B, i, I, 3);
      else lineIntegralsAt(xl, xr, i, yBaseL, i, yBaseR, i, I, 3);
      const lowerMid = full ? bm : ybm;
      base = k;
      const gk = gamma[k];
      const gs = gammaSat[k];
      if (pz && gs !== gk && pm > lowerMid && pm < tm) {
        // the part below the piezometric line is saturated
        lineIntegralsAt(xl, xr, i, P, i, P, i + 1, I, 6);
        const a1 = I[0] - I[6];
        const a2 = I[6] - I[3];
        A += a1 + a2;
        W += gk * a1 + gs * a2;
        WX += gk * (I[1] - I[7]) + gs * (I[7] - I[4]);
        WY += 0.5 * (gk * (I[2] - I[8]) + gs * (I[8] - I[5]));
      } else {
        const gu = pz && pm >= tm ? gs : gk;
        const a = I[0] - I[3];
        A += a;
        W += gu * a;
        WX += gu * (I[1] - I[4]);
        WY += gu * 0.5 * (I[2] - I[5]);
      }
      if (!full) break;
      I[0] = I[3];
      I[1] = I[4];
      I[2] = I[5];
    }
    area[i] = A;
    weight[i] = W;
    cx[i] = W > 0 ? WX / W : 0.5 * (x0 + x1);
    cy[i] = W > 0 ? WY / W : 0.5 * (ybm + 0.5 * (g0 + g1));
    total += W;

    // pore pressure and strength at the middle of the base
    porePressure[i] = pz ? (pm > ybm ? gw * (pm - ybm) : 0) : ru > 0 ? (ru * W) / b : 0;
    outM[i] = stratumMaterial[base];
    const datum = suDatum[base];
    outC[i] = cohesion[base] + (datum > ybm ? suRate[base] * (datum - ybm) : 0);
    outT[i] = tanPhi[base];
  }
  return total;
}

/**
 * The forces on each slice's top: ponded water above the ground (from the edge values of the
 * piezometric line), strip surcharges and line loads; zero where there are none.
 */
function loadSlices(ws: SliceWorkspace, n: number): void {
  const g = ws.g;
  const S = ws.slices;
  const { xl, xr, yTopL, yTopR, qx: outQx, qy: outQy, qm: outQm } = S;
  outQx.fill(0, 0, n);
  outQy.fill(0, 0, n);
  outQm.fill(0, 0, n);
  if (g.at.piezometric) {
    const gw = ws.prepared.section.water.unitWeight;
    const P = ws.edgePz;
    for (let i = 0; i < n; i++) {
      const x0 = xl[i];
      const x1 = xr[i];
      const g0 = yTopL[i];
      const g1 = yTopR[i];
      const pL = P[i];
      const pR = P[i + 1];
      const hm = 0.5 * (pL + pR) - 0.5 * (g0 + g1);
      if (!(hm > 0)) continue;
      const b = x1 - x0;
      const xm = 0.5 * (x0 + x1);
      const h0 = pL > g0 ? pL - g0 : 0;
      const h1 = pR > g1 ? pR - g1 : 0;
      const slope = (g1 - g0) / b;
      const gm = 0.5 * (g0 + g1);
      const h6 = b / 6;
      // per unit x: fy = −γw h, fx = γw h g′; moment x·fy − g·fx (Simpson, exact: degree 2)
      const fy = -gw * h6 * (h0 + 4 * hm + h1);
      outQy[i] += fy;
      outQx[i] += -slope * fy;
      outQm[i] +=
        -gw * h6 * ((x0 + g0 * slope) * h0 + 4 * (xm + gm * slope) * hm + (x1 + g1 * slope) * h1);
    }
  }
  const strips = g.strips;
  for (let k = 0; k < strips.length; k++) {
    const st = strips[k];
    for (let i = 0; i < n; i++) {
      const a = st.from > xl[i] ? st.from : xl[i];
      const c = st.to < xr[i] ? st.to : xr[i];
      if (c > a) {
        const f = -st.pressure * (c - a);
        outQy[i] += f;
        outQm[i] += 0.5 * (a + c) * f;
      }
    }
  }
  const lineLoads = g.lineLoads;
  for (let k = 0; k < lineLoads.length; k++) {
    const l = lineLoads[k];
    for (let i = 0; i < n; i++) {
      if ((l.x >= xl[i] && l.x < xr[i]) || (i === n - 1 && l.x === xr[i])) {
        const yq = lookupY(g.at.ground, l.x);
        outQx[i] += l.fx;
        outQy[i] += l.fy;
        outQm[i] += l.x * l.fy - yq * l.fx;
      }
    }
  }
}

/**
 * Cut the mass above the surface into slices, given the ends and pieces in `ws`: every
 * per-slice quantity — weight by stratum, base strength, pore pressure, surface loads, crack
 * water, reinforcement forces — is computed here (in the passes above) and only here. Returns false when there is
 * no soil above it.
 */
function fillSlices(ws: SliceWorkspace): boolean {
  const g = ws.g;
  const edges = ws.edges.values;
  const n = ws.edges.length - 1;
  if (ws.slices.xl.length < n) ws.slices = sliceSet(Math.max(n, 2 * ws.slices.xl.length));
  if (ws.base.mid.length < n) ws.base = baseScratch(ws.slices.xl.length);
  const S = ws.slices;
  S.n = n;
  S.mirrored = ws.mirrored;
  const { xl, xr } = S;
  for (let i = 0; i < n; i++) {
    xl[i] = edges[i];
    xr[i] = edges[i + 1];
  }
  // strata tops that can reach the surface (tops are ordered: none below them can)
  const bottom = lowest(ws.pieces);
  let nt = 1;
  while (nt < g.tops.length && g.topMax[nt] >= bottom) nt++;
  edgeValues(ws, n, nt);
  baseSlices(ws, n);
  const total = weighSlices(ws, n, nt);
  loadSlices(ws, n);
  if (g.reinforcement.length > 0) reinforceSlices(g.reinforcement, ws.pieces, S, ws.crossings);
  if (ws.crackWater > 0) {
    // pushes the mass toward −x, acting hw/3 above the bottom of the crack
    const gw = ws.prepared.section.water.unitWeight;
    const Pw = 0.5 * gw * ws.crackWater * ws.crackWater;
    S.qx[n - 1] -= Pw;
    S.qm[n - 1] += (S.yBaseR[n - 1] + ws.crackWater / 3) * Pw;
  }
  return total > 0;
}

/**
 * Slice the surface given as pieces in the section's coordinates (and the same pieces
 * mirrored): ends, orientation, the rigid base followed, the crack, the slices.
 */
function cutPieces(
  ws: SliceWorkspace,
  normal: readonly BasePiece[],
  mirrored: readonly BasePiece[] | (() => BasePiece[]),
  count: number,
): RejectCode | null {
  const prepared = ws.prepared;
  const tol = prepared.tol;
  const ends = findEnds(ws, normal, tol);
  if (ends) return ends;
  const gN = prepared.normal.at.ground;
  const flip = lookupY(gN, ws.xa) > lookupY(gN, ws.xb);
  ws.mirrored = flip;
  ws.g = flip ? prepared.mirrored : prepared.normal;
  if (flip) {
    const xa = ws.xa;
    ws.xa = -ws.xb;
    ws.xb = -xa;
  }
  const oriented = !flip ? normal : typeof mirrored === 'function' ? mirrored() : mirrored;
  let pieces = clipPieces(ws, oriented, ws.xa, ws.xb, true, tol);
  ws.crackDepth = 0;
  ws.crackWater = 0;
  const spec = prepared.section.crack;
  if (spec) {
    const depth = crackDepth(prepared, ws.g, ws.xb);
    if (depth > tol) {
      const xc = crackX(ws.g, pieces, ws.xa, ws.xb, depth, tol, ws.xs);
      if (!(xc - ws.xa > tol)) {
        ws.detail.depth = depth;
        return 'crack-too-deep';
      }
      ws.crackDepth = depth;
      ws.crackWater = Math.min(spec.waterDepth, depth);
      ws.xb = xc;
      pieces = clipPieces(ws, pieces, ws.xa, ws.xb, false, tol);
    }
  }
  ws.pieces = pieces;
  sliceEdges(ws, count, tol);
  return fillSlices(ws) ? null : 'no-soil';
}

/**
 * Slice the mass above a circle (its lower arc) into about `count` slices, into the
 * workspace: null when done, or why the circle is not admissible. Allocates nothing in the
 * common case (a circle above any rigid base), so the search can call it millions of times.
 *
 * @example cutCircle(sliceWorkspace(prepared), 25, 42, 24, 30) // → null; ws.slices holds them
 */
export function cutCircle(
  ws: SliceWorkspace,
  xc: number,
  yc: number,
  r: number,
  count: number,
): RejectCode | null {
  if (!(r > 0)) return 'not-admissible';
  const a = ws.arc;
  a.x0 = xc - r;
  a.x1 = xc + r;
  a.xc = xc;
  a.yc = yc;
  a.r = r;
  const m = ws.arcMirrored;
  m.x0 = -xc - r;
  m.x1 = -xc + r;
  m.xc = -xc;
  m.yc = yc;
  m.r = r;
  ws.one[0] = a;
  ws.oneMirrored[0] = m;
  return cutPieces(ws, ws.one, ws.oneMirrored, count);
}

/**
 * Slice the mass above a circle or a polyline (checked to be one: x increasing) into the
 * workspace: null when done, or why the surface is not admissible.
 */
export function cutSurface(
  ws: SliceWorkspace,
  surface: CircleSurface | PolylineSurface,
  count: number,
): RejectCode | null {
  if (surface.type === 'circle')
    return cutCircle(ws, surface.center[0], surface.center[1], surface.radius, count);
  return cutPieces(ws, polylinePieces(surface, false), () => polylinePieces(surface, true), count);
}
