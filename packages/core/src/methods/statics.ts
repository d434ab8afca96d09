import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';

/**
 * Per-slice quantities every method of slices needs, in the sliding orientation (mass
 * moving toward −x). With S = (C + N·t)/F the mobilised shear, the slice equilibrium is
 *   x: E₍ᵢ₋₁₎ − Eᵢ + S cos α − N sin α + Hx = 0
 *   y: X₍ᵢ₋₁₎ − Xᵢ + S sin α + N cos α + Hy = 0
 * where Hx = Qx − kh·W and Hy = Qy − (1 + kv)·W collect weight, seismic and surface loads.
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
  pivot: Point;
}

/**
 * Build the statics of a slice set about a pivot (the circle centre, or a point chosen above
 * a noncircular surface). Moments are counter-clockwise positive; a mass sliding toward −x
 * turns clockwise, so resisting moments are positive.
 */
export function statics(s: SliceSet, seismic: Seismic, pivot: Point): Statics {
  const n = s.n;
  // one backing buffer for all eleven arrays: typed-array allocation is costly, views are cheap
  const buffer = new Float64Array(11 * n);
  const view = (k: number) => buffer.subarray(k * n, (k + 1) * n);
  const st: Statics = {
    n,
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
    pivot,
  };
  const [xo, yo] = pivot;
  const kh = seismic.kh;
  const kv1 = 1 + seismic.kv;
  for (let i = 0; i < n; i++) {
    const b = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    const l = Math.sqrt(b * b + dy * dy);
    const sn = dy / l;
    const cs = b / l;
    st.sin[i] = sn;
    st.cos[i] = cs;
    st.len[i] = l;
    const U = s.porePressure[i] * l;
    st.U[i] = U;
    st.t[i] = s.tanPhi[i];
    st.C[i] = s.cohesion[i] * l - U * s.tanPhi[i];
    const W = s.weight[i];
    st.Hx[i] = s.qx[i] - kh * W;
    st.Hy[i] = s.qy[i] - kv1 * W;
    const xm = 0.5 * (s.xl[i] + s.xr[i]) - xo;
    const ym = 0.5 * (s.yBaseL[i] + s.yBaseR[i]) - yo;
    st.aN[i] = xm * cs + ym * sn;
    st.aS[i] = xm * sn - ym * cs;
    st.M0[i] =
      -(s.cx[i] - xo) * kv1 * W + (s.cy[i] - yo) * kh * W + (s.qm[i] - xo * s.qy[i] + yo * s.qx[i]);
  }
  return st;
}
