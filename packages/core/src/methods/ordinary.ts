import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { failed } from './failed';
import { forcesAt, statics } from './statics';
import type { MethodWarning, SliceMethodResult } from './types';

/**
 * The ordinary method of slices (Fellenius 1936): interslice forces neglected, the base
 * normal force from resolving the other forces normal to the base,
 *   N = (W(1 + kv) − Qy) cos α + (Qx − kh·W) sin α,
 * and F from moment equilibrium about the circle centre,
 *   F = Σ [c′l + (N − u l) tan φ′] aS / Σ driving moments,
 * which without loads is F = Σ[c′l + (W cos α − u l) tan φ′] / Σ W sin α. No iteration.
 *
 * @example ordinary(sliced.slices, { seismic: { kh: 0, kv: 0 }, pivot: [25, 42] }).fs
 */
export function ordinary(
  s: SliceSet,
  options: { seismic: Seismic; pivot: Point },
): SliceMethodResult {
  const st0 = statics(s, options.seismic, options.pivot);
  const n = s.n;
  // with reinforcement divided by F, N = N0 + N1/F: resist = R0 + R1/F, drive = D0 + D1/F, and
  // F·drive = resist is the quadratic D0·F² + (D1 − R0)·F − R1 = 0 (its positive root)
  let [R0, R1, D0, D1] = [0, 0, 0, 0];
  for (let i = 0; i < n; i++) {
    const N0 = st0.Hx[i] * st0.sin[i] - st0.Hy[i] * st0.cos[i];
    const N1 = st0.factored ? st0.Rx[i] * st0.sin[i] - st0.Ry[i] * st0.cos[i] : 0;
    R0 += (st0.C[i] + N0 * st0.t[i]) * st0.aS[i];
    R1 += N1 * st0.t[i] * st0.aS[i];
    D0 -= N0 * st0.aN[i] + st0.M0[i];
    D1 -= st0.factored ? N1 * st0.aN[i] + st0.Rm[i] : 0;
  }
  const F =
    R1 === 0 && D1 === 0
      ? R0 / D0
      : (R0 - D1 + Math.sqrt((D1 - R0) * (D1 - R0) + 4 * D0 * R1)) / (2 * D0);
  if (!(F > 0) || !Number.isFinite(F)) {
    return failed(n, 1, 'ordinary method: the slip surface has no driving moment', options.pivot);
  }
  const st = forcesAt(st0, F);
  const N = new Float64Array(n);
  for (let i = 0; i < n; i++) N[i] = st.Hx[i] * st.sin[i] - st.Hy[i] * st.cos[i];
  const normal = new Float64Array(n);
  const shear = new Float64Array(n);
  let negative = 0;
  for (let i = 0; i < n; i++) {
    normal[i] = N[i] - st.U[i];
    shear[i] = (st.C[i] + N[i] * st.t[i]) / F;
    if (normal[i] < -1e-9 * Math.max(1, s.weight[i])) negative++;
  }
  const warnings: MethodWarning[] = [];
  if (negative > 0) {
    warnings.push({
      code: 'negative-normal',
      message: `the effective normal force on the base (W cos α − u l) is negative in ${negative} slice${negative > 1 ? 's' : ''}: the ordinary method is unreliable with these pore pressures`,
    });
  }
  const zero = new Float64Array(n);
  return {
    fs: F,
    converged: true,
    iterations: 1,
    normalTotal: N,
    normal,
    shear,
    E: zero,
    X: zero,
    thrust: new Float64Array(n).fill(NaN),
    pivot: options.pivot,
    warnings,
  };
}
