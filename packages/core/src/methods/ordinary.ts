import type { Point, Seismic } from '../model/types';
import type { SliceSet } from '../slices/slice-surface';
import { failed } from './failed';
import { statics } from './statics';
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
  const st = statics(s, options.seismic, options.pivot);
  const n = s.n;
  let resist = 0;
  let drive = 0;
  const N = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    N[i] = st.Hx[i] * st.sin[i] - st.Hy[i] * st.cos[i];
    resist += (st.C[i] + N[i] * st.t[i]) * st.aS[i];
    drive -= N[i] * st.aN[i] + st.M0[i];
  }
  const F = resist / drive;
  if (!(F > 0) || !Number.isFinite(F)) {
    return failed(n, 1, 'ordinary method: the slip surface has no driving moment', options.pivot);
  }
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
