import type { Crossing } from '../reinforcement/types';
import type { Point, Polyline, Seismic } from '../model/types';
import { findRoot } from '../numeric/find-root';
import type { PreparedSection } from '../slices/prepare-section';
import { linearStrength } from '../strength/registry';
import { type SliceSet, sliceSurface } from '../slices/slice-surface';
import { failed } from './failed';
import { FS_GRID } from './solve-fs';
import { statics } from './statics';
import type { SliceMethodResult } from './types';

/** The spiral found, in the section's coordinates. */
export interface SpiralGeometry {
  pole: Point;
  /** Radius at the toe end and at the crest end (m). */
  r0: number;
  r1: number;
  /** Angle swept between the ends (degrees) and the mobilised φ_d (degrees). */
  sweep: number;
  phiMobilised: number;
  points: Polyline;
}

export interface LogSpiralResult extends SliceMethodResult {
  spiral: SpiralGeometry | null;
  /** The slices of the spiral's sliding mass (for reporting). */
  spiralSlices: SliceSet | null;
  /** The spiral's crossings with the reinforcement (sliding orientation). */
  spiralCrossings?: Crossing[];
}

/**
 * The log-spiral mechanism in a homogeneous c′-φ′ soil (Rendulic 1935; Taylor 1937; as in
 * Chen 1975, "Limit Analysis and Soil Plasticity"): r = r₀·exp(−θ·tan φ_d) about a pole, so
 * that the resultant of the normal and frictional base forces passes through the pole and
 * only cohesion resists about it:
 *   M_c = c_d·(r₀² − r₁²) / (2 tan φ_d),   c_d = c′/F,  tan φ_d = tan φ′/F.
 * F makes M_c equal the moment of weight, seismic force, loads and pore-water forces about
 * the pole. The spiral passes through the ends of the given circle and sweeps the same angle
 * between them, so at φ = 0 it is that circle; since the spiral depends on F through φ_d, F
 * is found by a bracketing root search, each trial re-building the spiral and its mass
 * (sliced exactly, the spiral drawn with many vertices).
 *
 * @example logSpiral(prepared, slicedCircle.slices, [25, 42], seismic, 40).spiral?.pole
 */
export function logSpiral(
  prepared: PreparedSection,
  circleSlices: SliceSet,
  center: Point,
  seismic: Seismic,
  count: number,
): LogSpiralResult {
  const s = circleSlices;
  const n = s.n;
  const nothing = { spiral: null, spiralSlices: null };
  const fail = (
    reason: string,
    it = 0,
    code: 'no-convergence' | 'not-applicable' = 'not-applicable',
  ): LogSpiralResult => ({
    ...failed(n, it, reason, undefined, code),
    ...nothing,
  });
  if (prepared.section.crack)
    return fail('log spiral: not available with a tension crack; use a method of slices');
  const mat = s.material[0];
  for (let i = 0; i < n; i++)
    if (s.material[i] !== mat)
      return fail('log spiral: needs one homogeneous soil along the surface');
  const strength = linearStrength(prepared.materials[mat].strength);
  if (strength && strength.rate !== 0) {
    return fail('log spiral: needs a constant strength; here it grows with depth');
  }
  const c = strength ? strength.c : 0;
  const tanPhi = strength ? strength.tanPhi : 0;
  if (!(c > 0)) return fail('log spiral: needs c′ > 0 (with c′ = 0 the infinite slope governs)');

  const xc = s.mirrored ? -center[0] : center[0];
  const yc = center[1];
  const A: Point = [s.xl[0], s.yBaseL[0]];
  const B: Point = [s.xr[n - 1], s.yBaseR[n - 1]];
  if (
    Math.hypot(A[0] - xc, A[1] - yc) - Math.hypot(B[0] - xc, B[1] - yc) >
    1e-6 * Math.hypot(B[0] - A[0], B[1] - A[1])
  ) {
    return fail('log spiral: the given circle meets the rigid base; use a method of slices');
  }
  let sweep = Math.atan2(B[1] - yc, B[0] - xc) - Math.atan2(A[1] - yc, A[0] - xc);
  if (sweep <= 0) sweep += 2 * Math.PI;
  const chord = Math.hypot(B[0] - A[0], B[1] - A[1]);
  const vertices = Math.max(80, 4 * count);

  const build = (F: number) => {
    const t = tanPhi / F;
    const rho = Math.exp(-sweep * t);
    const r0 = chord / Math.sqrt(1 + rho * rho - 2 * rho * Math.cos(sweep));
    const r1 = rho * r0;
    const th0 =
      Math.atan2(B[1] - A[1], B[0] - A[0]) -
      Math.atan2(r1 * Math.sin(sweep), r1 * Math.cos(sweep) - r0);
    const pole: Point = [A[0] - r0 * Math.cos(th0), A[1] - r0 * Math.sin(th0)];
    const pts: Polyline = [];
    for (let k = 0; k <= vertices; k++) {
      const th = th0 + (sweep * k) / vertices;
      const r = r0 * Math.exp(-(th - th0) * t);
      pts.push([pole[0] + r * Math.cos(th), pole[1] + r * Math.sin(th)]);
    }
    pts[0] = [A[0], A[1]];
    pts[vertices] = [B[0], B[1]];
    const cohesionMoment =
      t > 1e-12 ? ((c / F) * (r0 * r0 - r1 * r1)) / (2 * t) : (c / F) * r0 * r0 * sweep;
    return { t, r0, r1, pole, pts, cohesionMoment };
  };
  const toSection = (pts: Polyline): Polyline =>
    s.mirrored ? pts.map((p) => [-p[0], p[1]] as Point).reverse() : pts;
  const solve = (F: number) => {
    const sp = build(F);
    const cut = sliceSurface(prepared, { type: 'polyline', points: toSection(sp.pts) }, count);
    if (!cut.ok || cut.slices.mirrored !== s.mirrored) return null;
    const st = statics(cut.slices, seismic, sp.pole);
    let M = sp.cohesionMoment;
    // reinforcement divided by F (statics.ts): its moment at this F
    const rf = st.factored ? 1 / F : 0;
    for (let i = 0; i < st.n; i++) M += st.M0[i] + st.Rm[i] * rf + st.U[i] * st.aN[i];
    return { sp, cut, st, M };
  };
  const root = findRoot((F) => solve(F)?.M ?? NaN, FS_GRID, 1, 1e-10);
  if (!root.converged)
    return fail(
      'log spiral: no factor of safety balances the moments about the pole',
      root.evaluations,
      'no-convergence',
    );
  const F = root.x;
  const final = solve(F);
  if (!final)
    return fail('log spiral: the spiral leaves the ground', root.evaluations, 'no-convergence');
  // the mechanism fixes only the moment balance about the pole: no slice-by-slice base forces
  const m = final.cut.slices.n;
  const zero = new Float64Array(m);
  const forces = {
    normalTotal: zero,
    normal: zero,
    shear: zero,
    E: zero,
    X: zero,
    thrust: new Float64Array(m).fill(NaN),
    warnings: [],
  };
  const sx = s.mirrored ? -1 : 1;
  return {
    fs: F,
    converged: true,
    iterations: root.evaluations,
    ...forces,
    pivot: final.sp.pole,
    warnings: forces.warnings,
    spiral: {
      pole: [sx * final.sp.pole[0], final.sp.pole[1]],
      r0: final.sp.r0,
      r1: final.sp.r1,
      sweep: (sweep * 180) / Math.PI,
      phiMobilised: (Math.atan(final.sp.t) * 180) / Math.PI,
      points: toSection(final.sp.pts),
    },
    spiralSlices: final.cut.slices,
    spiralCrossings: final.cut.crossings,
  };
}
