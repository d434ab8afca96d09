import type { SliceSet } from '../slices/slice-surface';
import { march } from './march';
import { type Statics, forcesAt } from './statics';
import type { MethodWarning, SliceMethodResult } from './types';

/**
 * Slice forces at a solution (F, λ, f): N, N′, S, E, X and the line of thrust, with the
 * warnings an engineer needs (negative effective base normal, counted only on bases whose
 * strength depends on it, φ′ > 0: on a φ = 0 base in total stress N′ means nothing; line of
 * thrust outside the slice, for rigorous methods). The line of thrust comes from each slice's moment
 * equilibrium about the middle of its base, marched from the toe; it is judged only where
 * the interslice force is at least 5 % of its largest value, since near the ends of the
 * surface, where E tends to zero, its height is indeterminate (common practice).
 */
export function sliceForces(
  s: SliceSet,
  factored: Statics,
  F: number,
  lambda: number,
  f: Float64Array | null,
  rigorous: boolean,
): Pick<SliceMethodResult, 'normalTotal' | 'normal' | 'shear' | 'E' | 'X' | 'thrust' | 'warnings'> {
  const n = s.n;
  const buffer = new Float64Array(6 * n);
  const [N, E, normal, shear, X, thrust] = [0, 1, 2, 3, 4, 5].map((k) =>
    buffer.subarray(k * n, (k + 1) * n),
  );
  thrust.fill(NaN);
  // the reinforcement divided by F, at this F, for the moments below (march takes it itself)
  const st = forcesAt(factored, F);
  march(st, F, lambda, f, N, E);
  let negative = 0;
  for (let i = 0; i < n; i++) {
    normal[i] = N[i] - st.U[i];
    shear[i] = (st.C[i] + N[i] * st.t[i]) / F;
    X[i] = lambda * (f ? f[i + 1] : 1) * E[i];
    if (st.t[i] > 0 && normal[i] < -1e-9 * Math.max(1, s.weight[i])) negative++;
  }
  const warnings: MethodWarning[] = [];
  if (negative > 0) {
    warnings.push({
      code: 'negative-normal',
      message: `the effective normal force on the base is negative in ${negative} slice${negative > 1 ? 's' : ''} whose strength depends on it (φ′ > 0): the soil there would be in tension; check the pore pressures, the crack and the surface near its ends`,
    });
  }
  if (rigorous) {
    let eMax = 0;
    for (let i = 0; i < n; i++) eMax = Math.max(eMax, Math.abs(E[i]));
    let yPrev = s.yBaseL[0];
    let outside = 0;
    const [xo, yo] = st.pivot;
    for (let i = 0; i < n; i++) {
      const xm = 0.5 * (s.xl[i] + s.xr[i]);
      const ym = 0.5 * (s.yBaseL[i] + s.yBaseR[i]);
      const Eprev = i > 0 ? E[i - 1] : 0;
      const Xprev = i > 0 ? X[i - 1] : 0;
      // moment of weight, seismic force and loads about the base middle, from that about the pivot
      const Mbq = st.M0[i] + (xo - xm) * st.Hy[i] - (yo - ym) * st.Hx[i];
      const Mleft = (s.xl[i] - xm) * Xprev - (yPrev - ym) * Eprev;
      const rest = Mleft - (s.xr[i] - xm) * X[i] + Mbq;
      if (Math.abs(E[i]) > 1e-6 * eMax && i < n - 1) {
        const yt = ym - rest / E[i];
        thrust[i] = yt;
        yPrev = yt;
        const h = s.yTopR[i] - s.yBaseR[i];
        const r = (yt - s.yBaseR[i]) / h;
        if (h > 0 && Math.abs(E[i]) >= 0.05 * eMax && (r < 0 || r > 1)) outside++;
      } else {
        yPrev = s.yBaseR[i];
      }
    }
    if (outside > 0) {
      warnings.push({
        code: 'thrust-outside',
        message: `the line of thrust passes outside the slice at ${outside} interslice boundar${outside > 1 ? 'ies' : 'y'}: interslice forces there are not physically acceptable`,
      });
    }
  }
  return { normalTotal: N, normal, shear, E, X, thrust, warnings };
}
