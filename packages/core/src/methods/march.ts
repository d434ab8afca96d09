import type { Statics } from './statics';

/** Residuals of one pass across the slices for a trial (F, λ). */
export interface MarchResult {
  /** Interslice normal force left over at the upper end (zero at force equilibrium). */
  En: number;
  /** Sum of moments about the pivot (zero at moment equilibrium). */
  M: number;
}

/**
 * One pass from the toe to the crest for a trial factor of safety F and interslice ratio λ,
 * with X = λ·f·E (Morgenstern & Price 1965; the closed form for each slice as in the
 * generalised framework of Zhu, Lee, Chen & Jiang 2005). For each slice the two force
 * equations give N and Eᵢ from Eᵢ₋₁:
 *   N  = [λfᵢ(Eᵢ₋₁ + C cos α/F + Hx) − λfᵢ₋₁Eᵢ₋₁ − C sin α/F − Hy] / [t sin α/F + cos α − λfᵢ(t cos α/F − sin α)]
 *   Eᵢ = Eᵢ₋₁ + C cos α/F + Hx + N (t cos α/F − sin α)
 * With λ = 0 this is the normal force of Bishop's simplified method and of Janbu's.
 * `f` has n + 1 values, at the slice edges. Returns NaN residuals where a denominator is not
 * positive (the mobilised base force would turn over: no physical solution at this F).
 *
 * @example march(st, 1.4, 0, ones, N, E).M
 */
export function march(
  st: Statics,
  F: number,
  lambda: number,
  f: Float64Array | null,
  N: Float64Array,
  E: Float64Array,
): MarchResult {
  const n = st.n;
  const { sin, cos, C, t, Hx, Hy, aN, aS, M0, Rx, Ry, Rm } = st;
  const iF = 1 / F;
  // reinforcement divided by F (statics.ts)
  const rf = st.factored ? iF : 0;
  let Eprev = 0;
  let M = 0;
  let fPrev = f ? f[0] : 1;
  for (let i = 0; i < n; i++) {
    const fi = f ? f[i + 1] : 1;
    const si = sin[i];
    const ci = cos[i];
    const ti = t[i] * iF;
    const Ci = C[i] * iF;
    const k = ti * ci - si;
    const lf = lambda * fi;
    const den = ti * si + ci - lf * k;
    if (!(den > 1e-9)) return { En: NaN, M: NaN };
    const hx = rf === 0 ? Hx[i] : Hx[i] + Rx[i] * rf;
    const hy = rf === 0 ? Hy[i] : Hy[i] + Ry[i] * rf;
    const Ni = (lf * (Eprev + Ci * ci + hx) - lambda * fPrev * Eprev - Ci * si - hy) / den;
    const Ei = Eprev + Ci * ci + hx + Ni * k;
    N[i] = Ni;
    E[i] = Ei;
    M += Ni * aN[i] + (Ci + Ni * ti) * aS[i] + (rf === 0 ? M0[i] : M0[i] + Rm[i] * rf);
    Eprev = Ei;
    fPrev = fi;
  }
  return { En: Eprev, M };
}
