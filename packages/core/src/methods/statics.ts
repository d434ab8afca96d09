import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';

/**
 * Per-slice quantities every method of slices needs, in the sliding orientation (mass
 * moving toward −x). With S = (C + N·t)/F the mobilised shear, the slice equilibrium is
 *   x: E₍ᵢ₋₁₎ − Eᵢ + S cos α − N sin α + Hx = 0
 *   y: X₍ᵢ₋₁₎ − Xᵢ + S sin α + N cos α + Hy = 0
 * where Hx = Qx − kh·W and Hy = Qy − (1 + kv)·W collect weight, seismic and surface loads.
 * Reinforcement forces divided by F (SliceSet rx, ry, rm) are kept apart in Rx, Ry and Rm:
 * at a trial F every method takes Hx + Rx/F, Hy + Ry/F and M0 + Rm/F (forcesAt).
 */
export interface Statics {
  n: number;
  sin: Float64Array;
  cos: Float64Array;
  /** Base length l (chord). */
  len: Float64Array;
  /** C = c′l − u·l·tan φ′ (kN/m) and t = tan φ′. */
  C: Float64Array;
  t: Float64Array;
  /** u·l: pore-water force on the base (kN/m). */
  U: Float64Array;
  Hx: Float64Array;
  Hy: Float64Array;
  /** Moment arms about the pivot: of N (aN), of S (aS), and the moment of W, kh·W and loads (M0). */
  aN: Float64Array;
  aS: Float64Array;
  M0: Float64Array;
  /** Reinforcement forces divided by F, and their moment about the pivot (all zero when `factored` is false). */
  Rx: Float64Array;
  Ry: Float64Array;
  Rm: Float64Array;
  factored: boolean;
  pivot: Point;
}

/** Statics with room for `capacity` slices (arrays may be longer than n: only n are used). */
function staticsBuffer(capacity: number, pivot: Point): Statics {
  // one backing buffer for all fourteen arrays: typed-array allocation is costly, views are cheap
  const buffer = new Float64Array(14 * capacity);
  const view = (k: number) => buffer.subarray(k * capacity, (k + 1) * capacity);
  return {
    n: 0,
    sin: view(0),
    cos: view(1),
    len: view(2),
    C: view(3),
    t: view(4),
    U: view(5),
    Hx: view(6),
    Hy: view(7),
    aN: view(8),
    aS: view(9),
    M0: view(10),
    Rx: view(11),
    Ry: view(12),
    Rm: view(13),
    factored: false,
    pivot,
  };
}

/**
 * Build the statics of a slice set about a pivot (the circle centre, or a point chosen above
 * a noncircular surface). Moments are counter-clockwise positive; a mass sliding toward −x
 * turns clockwise, so resisting moments are positive. With `into` (a previous result with
 * room enough) its arrays are filled again instead of new ones made.
 */
export function statics(s: SliceSet, seismic: Seismic, pivot: Point, into?: Statics): Statics {
  const n = s.n;
  const st = into && into.sin.length >= n ? into : staticsBuffer(n, pivot);
  st.n = n;
  st.pivot = pivot;
  const xo = pivot[0];
  const yo = pivot[1];
  const kh = seismic.kh;
  const kv1 = 1 + seismic.kv;
  // local handles: the loop then reads no properties
  const { xl, xr, yBaseL, yBaseR, porePressure, tanPhi, cohesion, weight, qx, qy, qm, cx, cy } = s;
  const { sin, cos, len, U: Ua, t, C, Hx, Hy, aN, aS, M0 } = st;
  for (let i = 0; i < n; i++) {
    const b = xr[i] - xl[i];
    const dy = yBaseR[i] - yBaseL[i];
    const l = Math.sqrt(b * b + dy * dy);
    const sn = dy / l;
    const cs = b / l;
    sin[i] = sn;
    cos[i] = cs;
    len[i] = l;
    const U = porePressure[i] * l;
    const tp = tanPhi[i];
    Ua[i] = U;
    t[i] = tp;
    C[i] = cohesion[i] * l - U * tp;
    const W = weight[i];
    const Qx = qx[i];
    const Qy = qy[i];
    Hx[i] = Qx - kh * W;
    Hy[i] = Qy - kv1 * W;
    const xm = 0.5 * (xl[i] + xr[i]) - xo;
    const ym = 0.5 * (yBaseL[i] + yBaseR[i]) - yo;
    aN[i] = xm * cs + ym * sn;
    aS[i] = xm * sn - ym * cs;
    M0[i] = -(cx[i] - xo) * kv1 * W + (cy[i] - yo) * kh * W + (qm[i] - xo * Qy + yo * Qx);
  }
  factoredForces(s, st, xo, yo);
  return st;
}

/** The reinforcement forces divided by F into the statics (Rx, Ry and their moment about the pivot). */
function factoredForces(s: SliceSet, st: Statics, xo: number, yo: number): void {
  const n = s.n;
  const { rx, ry, rm } = s;
  let any = false;
  for (let i = 0; i < n; i++) {
    if (rx[i] !== 0 || ry[i] !== 0) {
      any = true;
      break;
    }
  }
  st.factored = any;
  if (!any) return;
  const { Rx, Ry, Rm } = st;
  for (let i = 0; i < n; i++) {
    Rx[i] = rx[i];
    Ry[i] = ry[i];
    Rm[i] = rm[i] - xo * ry[i] + yo * rx[i];
  }
}

/**
 * The statics at a trial F: a copy of `st` (into `into` when given) whose Hx, Hy and M0 hold
 * the reinforcement forces divided by F; `st` itself when it has none. For the methods that
 * take the slice forces at their solution (slice-forces.ts) and those solved in closed form.
 */
export function forcesAt(st: Statics, F: number, into?: Statics): Statics {
  if (!st.factored) return st;
  const n = st.n;
  const out = into && into.sin.length >= n ? into : staticsBuffer(n, st.pivot);
  out.n = n;
  out.pivot = st.pivot;
  out.factored = false;
  const iF = 1 / F;
  for (let i = 0; i < n; i++) {
    out.sin[i] = st.sin[i];
    out.cos[i] = st.cos[i];
    out.len[i] = st.len[i];
    out.C[i] = st.C[i];
    out.t[i] = st.t[i];
    out.U[i] = st.U[i];
    out.aN[i] = st.aN[i];
    out.aS[i] = st.aS[i];
    out.Hx[i] = st.Hx[i] + st.Rx[i] * iF;
    out.Hy[i] = st.Hy[i] + st.Ry[i] * iF;
    out.M0[i] = st.M0[i] + st.Rm[i] * iF;
  }
  return out;
}
