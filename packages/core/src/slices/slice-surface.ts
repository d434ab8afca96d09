import type { CircleSurface, Point, Polyline, PolylineSurface } from '../model/types';
import { yAt } from '../geometry/y-at';
import { polylineCrossings } from '../geometry/polyline-crossings';
import {
  type BasePiece,
  curvePolylineMeets,
  curveY,
  pieceIndexAt,
  pieceIntegrals,
  pieceY,
} from './base-curve';
import type { Geometry, PreparedSection } from './prepare-section';

/**
 * The slices of one slip surface, as parallel typed arrays (index i = slice i, ordered by
 * x). Coordinates are those of the sliding orientation: the mass moves toward −x, so the
 * upper (crest) end is on the right and the base inclination α = atan2(Δy_base, b) is
 * positive where the base rises to the right. When `mirrored` is true these are the
 * section's coordinates with x → −x. Forces in kN per m run, x right and y up.
 */
export interface SliceSet {
  n: number;
  mirrored: boolean;
  /** Left and right edges. */
  xl: Float64Array;
  xr: Float64Array;
  /** Ground at the edges. */
  yTopL: Float64Array;
  yTopR: Float64Array;
  /** Slip surface at the edges (the base is the chord between them). */
  yBaseL: Float64Array;
  yBaseR: Float64Array;
  /** Soil area (m²) and soil weight W (kN/m), summed exactly by stratum, and its centroid. */
  area: Float64Array;
  weight: Float64Array;
  cx: Float64Array;
  cy: Float64Array;
  /** Pore pressure u at the middle of the base (kPa). */
  porePressure: Float64Array;
  /** Strength at the middle of the base: c′ or Su (kPa), and tan φ′ (0 for undrained). */
  cohesion: Float64Array;
  tanPhi: Float64Array;
  /** Base material, an index into PreparedSection.materials. */
  material: Int32Array;
  /**
   * Resultant of the forces on the slice's top and sides other than interslice forces:
   * ponded water, surcharges, line loads and the water in a tension crack. qm is their
   * moment about the origin, counter-clockwise positive (Σ x·Fy − y·Fx).
   */
  qx: Float64Array;
  qy: Float64Array;
  qm: Float64Array;
}

export interface CrackInfo {
  /** x of the crack in the section's coordinates. */
  x: number;
  depth: number;
  waterDepth: number;
  /** Horizontal force of the water in the crack, ½·γw·hw² (kN/m). */
  waterForce: number;
}

export interface SlicedSurface {
  ok: true;
  slices: SliceSet;
  /** Where the slide starts (crest side; the top of the crack if there is one) and where it comes out, in the section's coordinates. */
  upperEnd: Point;
  lowerEnd: Point;
  crack: CrackInfo | null;
  /** The slip surface actually used (after following a rigid base and cutting at a crack), at slice edges, in the section's coordinates, left to right. */
  base: Polyline;
  /** The surface in sliding orientation, for exact integrals. */
  pieces: BasePiece[];
}

export interface RejectedSurface {
  ok: false;
  code:
    | 'misses-ground'
    | 'leaves-section'
    | 'reemerges'
    | 'not-admissible'
    | 'crack-too-deep'
    | 'no-soil';
  reason: string;
}

export type SliceOutcome = SlicedSurface | RejectedSurface;

const fmt = (v: number) => (Math.abs(v) < 1e-9 ? '0' : v.toFixed(2));

function reject(code: RejectedSurface['code'], reason: string): RejectedSurface {
  return { ok: false, code, reason };
}

function piecesOf(surface: CircleSurface | PolylineSurface, mirror: boolean): BasePiece[] {
  const s = mirror ? -1 : 1;
  if (surface.type === 'circle') {
    const xc = s * surface.center[0];
    const r = surface.radius;
    return [{ arc: true, x0: xc - r, x1: xc + r, xc, yc: surface.center[1], r }];
  }
  const pts = mirror ? [...surface.points].reverse().map((p) => [-p[0], p[1]]) : surface.points;
  const pieces: BasePiece[] = [];
  for (let i = 0; i + 1 < pts.length; i++) {
    pieces.push({ arc: false, x0: pts[i][0], x1: pts[i + 1][0], y0: pts[i][1], y1: pts[i + 1][1] });
  }
  return pieces;
}

/** Sorted, with points closer than tol merged. */
function uniqueSorted(xs: number[], tol: number): number[] {
  xs.sort((a, b) => a - b);
  const out: number[] = [];
  for (const x of xs) if (out.length === 0 || x - out[out.length - 1] > tol) out.push(x);
  return out;
}

/** Ends of the sliding mass: one run of soil above the surface between two ground meets. */
function findEnds(
  pieces: BasePiece[],
  g: Geometry,
  tol: number,
): { xa: number; xb: number } | RejectedSurface {
  const lo = Math.max(pieces[0].x0, g.xMin);
  const hi = Math.min(pieces[pieces.length - 1].x1, g.xMax);
  if (hi - lo <= tol)
    return reject('misses-ground', 'the slip surface does not lie under the ground');
  const depth = (x: number) => yAt(g.ground, x) - curveY(pieces, x);
  const meets = curvePolylineMeets(pieces, g.ground, lo, hi);
  if (Math.abs(depth(lo)) <= 10 * tol) meets.push(lo);
  if (Math.abs(depth(hi)) <= 10 * tol) meets.push(hi);
  const pts = uniqueSorted([lo, hi, ...meets], tol);
  const isMeet = (x: number) => meets.some((m) => Math.abs(m - x) <= tol);
  const runs: [number, number][] = [];
  for (let i = 0; i + 1 < pts.length; i++) {
    const a = pts[i];
    const b = pts[i + 1];
    if (depth((a + b) / 2) <= tol) continue;
    const last = runs[runs.length - 1];
    if (last && last[1] === a) last[1] = b;
    else runs.push([a, b]);
  }
  if (runs.length === 0) return reject('misses-ground', 'the slip surface does not cut the ground');
  if (runs.length > 1) {
    return reject(
      'reemerges',
      `the slip surface comes out of the ground between x = ${fmt(runs[0][1])} and x = ${fmt(runs[1][0])}`,
    );
  }
  const [xa, xb] = runs[0];
  for (const x of [xa, xb]) {
    if (!isMeet(x)) {
      const side = x === xa ? 'left' : 'right';
      const atEdge = x === g.xMin || x === g.xMax;
      return reject(
        'leaves-section',
        atEdge
          ? `the slip surface leaves the section through its ${side} side below the ground`
          : `the slip surface ends below the ground on the ${side} (it must reach the ground at both ends)`,
      );
    }
  }
  return { xa, xb };
}

/** Restrict the pieces to [xa, xb], following the rigid top wherever the surface dips below it. */
function clipPieces(
  pieces: BasePiece[],
  xa: number,
  xb: number,
  g: Geometry,
  tol: number,
): BasePiece[] {
  const restrict = (p: BasePiece, a: number, b: number): BasePiece =>
    p.arc
      ? { ...p, x0: a, x1: b }
      : { arc: false, x0: a, x1: b, y0: pieceY(p, a), y1: pieceY(p, b) };
  const within: BasePiece[] = [];
  for (const p of pieces) {
    const a = Math.max(p.x0, xa);
    const b = Math.min(p.x1, xb);
    if (b - a > tol) within.push(restrict(p, a, b));
  }
  const rigid = g.rigidTop;
  if (!rigid) return within;
  const cuts = uniqueSorted([xa, xb, ...curvePolylineMeets(within, rigid, xa, xb)], tol);
  const out: BasePiece[] = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const a = cuts[i];
    const b = cuts[i + 1];
    const m = (a + b) / 2;
    if (curveY(within, m) >= yAt(rigid, m) - tol) {
      for (const p of within) {
        const pa = Math.max(p.x0, a);
        const pb = Math.min(p.x1, b);
        if (pb - pa > tol) out.push(restrict(p, pa, pb));
      }
    } else {
      const xs = uniqueSorted(
        [a, b, ...rigid.filter((q) => q[0] > a && q[0] < b).map((q) => q[0])],
        tol,
      );
      for (let k = 0; k + 1 < xs.length; k++) {
        out.push({
          arc: false,
          x0: xs[k],
          x1: xs[k + 1],
          y0: yAt(rigid, xs[k]),
          y1: yAt(rigid, xs[k + 1]),
        });
      }
    }
  }
  return out;
}

/** Rankine depth of a tension crack in the material at the top of the crest. */
function autoCrackDepth(prepared: PreparedSection, g: Geometry, x: number): number {
  for (let i = 0; i < g.soilStrata; i++) {
    const below = i + 1 < g.tops.length ? yAt(g.tops[i + 1], x) : -Infinity;
    if (yAt(g.tops[i], x) - below > prepared.tol) {
      const mat = prepared.materials[g.stratumMaterial[i]];
      const st = mat.strength;
      if (mat.unitWeight <= 0) return 0;
      if (st.model === 'undrained') return (2 * st.su) / mat.unitWeight;
      if (st.model === 'mohr-coulomb') {
        return (
          (2 * st.cohesion * Math.tan(((45 + st.frictionAngle / 2) * Math.PI) / 180)) /
          mat.unitWeight
        );
      }
      return 0;
    }
  }
  return 0;
}

/** x of the crack: the point nearest the upper end where the surface lies `depth` below the ground. */
function crackX(
  pieces: BasePiece[],
  g: Geometry,
  xa: number,
  xb: number,
  depth: number,
  tol: number,
): number | null {
  const f = (x: number) => yAt(g.ground, x) - curveY(pieces, x) - depth;
  const cands = uniqueSorted(
    [xa, xb, ...g.ground.map((p) => p[0]), ...pieces.map((p) => p.x0)].filter(
      (x) => x >= xa && x <= xb,
    ),
    tol,
  );
  // also sample inside each interval: arcs are not linear
  const xs: number[] = [];
  for (let i = 0; i + 1 < cands.length; i++) {
    for (let k = 0; k < 8; k++) xs.push(cands[i] + ((cands[i + 1] - cands[i]) * k) / 8);
  }
  xs.push(xb);
  for (let i = xs.length - 1; i > 0; i--) {
    if (f(xs[i - 1]) >= 0) {
      let a = xs[i - 1];
      let b = xs[i];
      for (let it = 0; it < 200 && b - a > 1e-6 * tol; it++) {
        const m = (a + b) / 2;
        if (f(m) >= 0) a = m;
        else b = m;
      }
      return a;
    }
  }
  return null;
}

function vertexXs(line: Polyline | null, a: number, b: number, out: number[]): void {
  if (!line) return;
  for (const p of line) if (p[0] > a && p[0] < b) out.push(p[0]);
}

/**
 * Cut the sliding mass above a slip surface into slices.
 *
 * The surface is a circle (its lower arc) or a polyline. Its ends are where it meets the
 * ground; where it dips below the top of a rigid stratum it follows that top between the
 * two crossings (common practice); a tension crack cuts it off at the upper end. Slice edges
 * fall at every vertex of the ground, strata tops, piezometric line, at load edges, where
 * the surface crosses a boundary or the piezometric line, and where the piezometric line
 * crosses the ground or a boundary; between those, about `count` slices are spread evenly.
 * So every slice has one base material and linear boundaries, and its weight is summed
 * exactly, stratum by stratum (trapezoids, and circular segments under an arc).
 *
 * @example sliceSurface(prepareSection(section), { type: 'circle', center: [25, 42], radius: 24 }, 40)
 */
export function sliceSurface(
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  count: number,
): SliceOutcome {
  const tol = prepared.tol;
  if (surface.type === 'circle' && !(surface.radius > 0)) {
    return reject('not-admissible', 'the circle radius must be positive');
  }
  if (surface.type === 'polyline') {
    const p = surface.points;
    if (p.length < 2)
      return reject('not-admissible', 'a polyline surface needs at least two points');
    for (let i = 1; i < p.length; i++) {
      if (!(p[i][0] > p[i - 1][0])) {
        return reject(
          'not-admissible',
          `the polyline surface turns back at point ${i + 1} (x must increase)`,
        );
      }
    }
  }
  // 1. ends and orientation, in the section's own coordinates
  const ends0 = findEnds(piecesOf(surface, false), prepared.normal, tol);
  if ('ok' in ends0) return ends0;
  const yLeft = yAt(prepared.normal.ground, ends0.xa);
  const yRight = yAt(prepared.normal.ground, ends0.xb);
  const mirrored = yLeft > yRight;
  const g = mirrored ? prepared.mirrored : prepared.normal;
  const xa = mirrored ? -ends0.xb : ends0.xa;
  let xb = mirrored ? -ends0.xa : ends0.xb;
  let pieces = clipPieces(piecesOf(surface, mirrored), xa, xb, g, tol);

  // 2. tension crack at the upper (right) end
  let crack: CrackInfo | null = null;
  const spec = prepared.section.crack;
  if (spec) {
    const depth = spec.depth === 'auto' ? autoCrackDepth(prepared, g, xb) : spec.depth;
    if (depth > tol) {
      const xc = crackX(pieces, g, xa, xb, depth, tol);
      if (xc === null || xc - xa <= tol) {
        return reject(
          'crack-too-deep',
          `the tension crack (${fmt(depth)} m deep) is deeper than the sliding mass`,
        );
      }
      const hw = Math.min(spec.waterDepth, depth);
      const gw = prepared.section.water.unitWeight;
      crack = { x: mirrored ? -xc : xc, depth, waterDepth: hw, waterForce: 0.5 * gw * hw * hw };
      xb = xc;
      pieces = clipPieces(pieces, xa, xb, { ...g, rigidTop: null }, tol);
    }
  }

  // 3. slice edges
  const soil = g.soilStrata;
  const edgesIn: number[] = [xa, xb];
  vertexXs(g.ground, xa, xb, edgesIn);
  for (let i = 1; i <= Math.min(soil, g.tops.length - 1); i++) vertexXs(g.tops[i], xa, xb, edgesIn);
  vertexXs(g.piezometric, xa, xb, edgesIn);
  for (const p of pieces) if (p.x0 > xa && p.x0 < xb) edgesIn.push(p.x0);
  for (let i = 1; i < Math.min(soil, g.tops.length); i++)
    edgesIn.push(...curvePolylineMeets(pieces, g.tops[i], xa, xb));
  if (g.piezometric) {
    const pz = g.piezometric;
    edgesIn.push(...curvePolylineMeets(pieces, pz, xa, xb));
    for (let i = 0; i < Math.min(soil, g.tops.length); i++)
      edgesIn.push(...polylineCrossings(pz, g.tops[i], xa, xb));
  }
  for (const s of g.strips) edgesIn.push(s.from, s.to);
  for (const l of g.lineLoads) edgesIn.push(l.x);
  const edges = uniqueSorted(
    edgesIn.filter((x) => x >= xa && x <= xb),
    Math.max(tol, 1e-9 * (xb - xa)),
  );
  if (edges[edges.length - 1] < xb) edges.push(xb);

  const target = Math.max(1, Math.floor(count));
  const w = (xb - xa) / target;
  let n = 0;
  const parts: number[] = [];
  for (let i = 0; i + 1 < edges.length; i++) {
    const k = Math.max(1, Math.round((edges[i + 1] - edges[i]) / w));
    parts.push(k);
    n += k;
  }

  const S: SliceSet = {
    n,
    mirrored,
    xl: new Float64Array(n),
    xr: new Float64Array(n),
    yTopL: new Float64Array(n),
    yTopR: new Float64Array(n),
    yBaseL: new Float64Array(n),
    yBaseR: new Float64Array(n),
    area: new Float64Array(n),
    weight: new Float64Array(n),
    cx: new Float64Array(n),
    cy: new Float64Array(n),
    porePressure: new Float64Array(n),
    cohesion: new Float64Array(n),
    tanPhi: new Float64Array(n),
    material: new Int32Array(n),
    qx: new Float64Array(n),
    qy: new Float64Array(n),
    qm: new Float64Array(n),
  };
  let s = 0;
  for (let i = 0; i + 1 < edges.length; i++) {
    const a = edges[i];
    const d = (edges[i + 1] - a) / parts[i];
    for (let k = 0; k < parts[i]; k++, s++) {
      S.xl[s] = a + k * d;
      S.xr[s] = k + 1 === parts[i] ? edges[i + 1] : a + (k + 1) * d;
    }
  }

  const water = prepared.section.water;
  const gw = water.unitWeight;
  const mats = prepared.materials;
  const pz = g.piezometric;
  let totalWeight = 0;
  for (let i = 0; i < n; i++) {
    const x0 = S.xl[i];
    const x1 = S.xr[i];
    const xm = 0.5 * (x0 + x1);
    const b = x1 - x0;
    const p = pieces[pieceIndexAt(pieces, xm)];
    const yb0 = pieceY(p, x0);
    const yb1 = pieceY(p, x1);
    const ybm = pieceY(p, xm);
    const g0 = yAt(g.ground, x0);
    const g1 = yAt(g.ground, x1);
    S.yTopL[i] = g0;
    S.yTopR[i] = g1;
    S.yBaseL[i] = yb0;
    S.yBaseR[i] = yb1;
    const p0 = pz ? yAt(pz, x0) : 0;
    const p1 = pz ? yAt(pz, x1) : 0;
    const pm = 0.5 * (p0 + p1);
    const h6 = b / 6;

    // weight, stratum by stratum
    let A = 0;
    let W = 0;
    let WX = 0;
    let WY = 0;
    let baseMat = g.stratumMaterial[0];
    const base = pieceIntegrals(p, x0, x1);
    // integrals of a linear function given by its end values: [∫y, ∫xy, ∫y²]
    const lin = (y0: number, y1: number): [number, number, number] => {
      const ym = 0.5 * (y0 + y1);
      return [
        h6 * (y0 + 4 * ym + y1),
        h6 * (x0 * y0 + 4 * xm * ym + x1 * y1),
        h6 * (y0 * y0 + 4 * ym * ym + y1 * y1),
      ];
    };
    const add = (up: [number, number, number], low: [number, number, number], gamma: number) => {
      const a = up[0] - low[0];
      A += a;
      W += gamma * a;
      WX += gamma * (up[1] - low[1]);
      WY += gamma * 0.5 * (up[2] - low[2]);
    };
    for (let k = 0; k < soil; k++) {
      const t0 = yAt(g.tops[k], x0);
      const t1 = yAt(g.tops[k], x1);
      const tm = 0.5 * (t0 + t1);
      if (tm <= ybm + tol) break;
      const hasNext = k + 1 < g.tops.length;
      const b0 = hasNext ? yAt(g.tops[k + 1], x0) : -Infinity;
      const b1 = hasNext ? yAt(g.tops[k + 1], x1) : -Infinity;
      const bm = 0.5 * (b0 + b1);
      const full = bm > ybm + tol;
      const lower = full ? lin(b0, b1) : base;
      const lowerMid = full ? bm : ybm;
      if (!full) baseMat = g.stratumMaterial[k];
      const mat = mats[g.stratumMaterial[k]];
      const upper = lin(t0, t1);
      if (pz && mat.saturatedUnitWeight !== mat.unitWeight && pm > lowerMid && pm < tm) {
        const line = lin(p0, p1);
        add(upper, line, mat.unitWeight);
        add(line, lower, mat.saturatedUnitWeight);
      } else {
        add(upper, lower, pz && pm >= tm ? mat.saturatedUnitWeight : mat.unitWeight);
      }
      if (!full) break;
    }
    S.area[i] = A;
    S.weight[i] = W;
    S.cx[i] = W > 0 ? WX / W : xm;
    S.cy[i] = W > 0 ? WY / W : 0.5 * (ybm + 0.5 * (g0 + g1));
    totalWeight += W;

    // pore pressure and strength at the middle of the base
    S.porePressure[i] =
      water.kind === 'piezometric'
        ? gw * Math.max(0, pm - ybm)
        : water.kind === 'ru'
          ? (water.ru * W) / b
          : 0;
    S.material[i] = baseMat;
    const st = mats[baseMat].strength;
    if (st.model === 'mohr-coulomb') {
      S.cohesion[i] = st.cohesion;
      S.tanPhi[i] = Math.tan((st.frictionAngle * Math.PI) / 180);
    } else if (st.model === 'undrained') {
      S.cohesion[i] = st.su + (st.suDatum !== null ? st.suRate * Math.max(0, st.suDatum - ybm) : 0);
      S.tanPhi[i] = 0;
    }

    // forces on the top: ponded water, strip surcharges, line loads
    let qx = 0;
    let qy = 0;
    let qm = 0;
    if (pz) {
      const h0 = Math.max(0, p0 - g0);
      const h1 = Math.max(0, p1 - g1);
      const hm = pm - 0.5 * (g0 + g1);
      if (hm > 0) {
        const slope = (g1 - g0) / b;
        const gm = 0.5 * (g0 + g1);
        // per unit x: fy = −γw h, fx = γw h g′; moment x·fy − g·fx (Simpson, exact: degree 2)
        const fy = -gw * h6 * (h0 + 4 * hm + h1);
        qy += fy;
        qx += -slope * fy;
        qm +=
          -gw * h6 * ((x0 + g0 * slope) * h0 + 4 * (xm + gm * slope) * hm + (x1 + g1 * slope) * h1);
      }
    }
    for (const st2 of g.strips) {
      const a = Math.max(st2.from, x0);
      const c = Math.min(st2.to, x1);
      if (c > a) {
        const f = -st2.pressure * (c - a);
        const xq = 0.5 * (a + c);
        qy += f;
        qm += xq * f;
      }
    }
    for (const l of g.lineLoads) {
      if ((l.x >= x0 && l.x < x1) || (i === n - 1 && l.x === x1)) {
        const yq = yAt(g.ground, l.x);
        qx += l.fx;
        qy += l.fy;
        qm += l.x * l.fy - yq * l.fx;
      }
    }
    S.qx[i] = qx;
    S.qy[i] = qy;
    S.qm[i] = qm;
  }
  if (crack && crack.waterForce > 0) {
    // pushes the mass toward −x, acting hw/3 above the bottom of the crack
    const yq = S.yBaseR[n - 1] + crack.waterDepth / 3;
    S.qx[n - 1] -= crack.waterForce;
    S.qm[n - 1] += yq * crack.waterForce;
  }
  if (!(totalWeight > 0)) return reject('no-soil', 'there is no soil above the slip surface');

  const sx = mirrored ? -1 : 1;
  const basePts: Polyline = [];
  for (let i = 0; i < n; i++) basePts.push([sx * S.xl[i], S.yBaseL[i]]);
  basePts.push([sx * S.xr[n - 1], S.yBaseR[n - 1]]);
  if (mirrored) basePts.reverse();
  const lowerEnd: Point = [sx * xa, yAt(g.ground, xa)];
  const upperEnd: Point = [sx * xb, yAt(g.ground, xb)];
  return { ok: true, slices: S, upperEnd, lowerEnd, crack, base: basePts, pieces };
}
