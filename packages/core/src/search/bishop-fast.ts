import type { Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';

let cap = 0;
let sin = new Float64Array(0);
let cos = new Float64Array(0);
let C = new Float64Array(0);
let T = new Float64Array(0);
let Wv = new Float64Array(0);
let aN = new Float64Array(0);
let aS = new Float64Array(0);
let M0 = new Float64Array(0);

function grow(n: number): void {
  if (n <= cap) return;
  cap = n;
  sin = new Float64Array(n);
  cos = new Float64Array(n);
  C = new Float64Array(n);
  T = new Float64Array(n);
  Wv = new Float64Array(n);
  aN = new Float64Array(n);
  aS = new Float64Array(n);
  M0 = new Float64Array(n);
}

/**
 * Bishop's simplified method (Bishop 1955) for the search: the same equations as
 * methods/bishop.ts (vertical equilibrium of each slice, moments about the circle centre with
 * every load), in one allocation-free loop and to a search tolerance (relative 1e-7),
 * started from `guess` (the neighbouring trial's F). Returns NaN where mα turns negative or
 * the iteration does not settle.
 *
 * @example bishopFast(slices, [25, 42], { kh: 0, kv: 0 }, 1.3)
 */
export function bishopFast(
  s: SliceSet,
  xo: number,
  yo: number,
  seismic: Seismic,
  guess: number,
): number {
  const n = s.n;
  grow(n);
  const kh = seismic.kh;
  const kv1 = 1 + seismic.kv;
  for (let i = 0; i < n; i++) {
    const b = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    const l = Math.sqrt(b * b + dy * dy);
    const sn = dy / l;
    const cs = b / l;
    sin[i] = sn;
    cos[i] = cs;
    const tp = s.tanPhi[i];
    T[i] = tp;
    C[i] = (s.cohesion[i] - s.porePressure[i] * tp) * l;
    const W = s.weight[i];
    Wv[i] = kv1 * W - s.qy[i]; // −Hy
    const xm = 0.5 * (s.xl[i] + s.xr[i]) - xo;
    const ym = 0.5 * (s.yBaseL[i] + s.yBaseR[i]) - yo;
    aN[i] = xm * cs + ym * sn;
    aS[i] = xm * sn - ym * cs;
    M0[i] =
      -(s.cx[i] - xo) * kv1 * W + (s.cy[i] - yo) * kh * W + (s.qm[i] - xo * s.qy[i] + yo * s.qx[i]);
  }
  let F = guess > 0 ? guess : 1;
  for (let it = 0; it < 60; it++) {
    const iF = 1 / F;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < n; i++) {
      const ti = T[i] * iF;
      const den = ti * sin[i] + cos[i];
      if (den <= 1e-9) return NaN;
      const N = (Wv[i] - C[i] * iF * sin[i]) / den;
      resist += (C[i] + N * T[i]) * aS[i];
      drive -= N * aN[i] + M0[i];
    }
    const next = resist / drive;
    if (!(next > 0) || !(next < 1e6)) return NaN;
    if (Math.abs(next - F) <= 1e-7 * next) return next;
    F = next;
  }
  return NaN;
}
