import type { Seismic } from '../model/types';
import { type Statics, statics } from '../methods/statics';
import type { SliceSet } from '../slices/slice-surface';

let work: Statics | undefined;

/**
 * Bishop's simplified method (Bishop 1955) for the search: the same equations as
 * methods/bishop.ts (vertical equilibrium of each slice, moments about the circle centre
 * with every load), on reused buffers and to a search tolerance (relative 1e-7), started
 * from `guess` (the neighbouring trial's F). Returns NaN where mα turns negative or the
 * iteration does not settle.
 *
 * @example bishopFast(slices, 25, 42, { kh: 0, kv: 0 }, 1.3)
 */
export function bishopFast(
  s: SliceSet,
  xo: number,
  yo: number,
  seismic: Seismic,
  guess: number,
): number {
  if (!work || work.sin.length < s.n) {
    const cap = Math.max(s.n, 64);
    const f = () => new Float64Array(cap);
    work = {
      n: 0,
      sin: f(),
      cos: f(),
      len: f(),
      C: f(),
      t: f(),
      U: f(),
      Hx: f(),
      Hy: f(),
      aN: f(),
      aS: f(),
      M0: f(),
      pivot: [0, 0],
    };
  }
  const st = statics(s, seismic, [xo, yo], work);
  const { n, sin, cos, C, t: T, Hy, aN, aS, M0 } = st;
  let F = guess > 0 ? guess : 1;
  for (let it = 0; it < 60; it++) {
    const iF = 1 / F;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < n; i++) {
      const den = T[i] * iF * sin[i] + cos[i];
      if (den <= 1e-9) return NaN;
      const N = (-Hy[i] - C[i] * iF * sin[i]) / den;
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
