import { bishopIteration, bishopNormals } from '../methods/bishop';
import { type Statics, statics } from '../methods/statics';
import type { Point } from '../model/types';
import type { CircleEvaluator } from '../search/trials';
import { withBaseStrengths } from '../slices/base-strengths';
import { cutCircle, sliceWorkspace } from '../slices/cut-surface';
import type { SliceSet } from '../slices/slice-set';
import { WorkMeter } from '../work-limit';
import type { MaterialDrainage } from './drainage';
import type { DrawdownSections } from './drawdown-sections';
import {
  type StageScratch,
  drainedWhereLower,
  matchSlices,
  stageScratch,
  undrainedStage,
} from './stage-strengths';

/**
 * Bishop's base normal forces N at F on prepared statics (vertical equilibrium of each slice,
 * as in bishopIteration), into `out`; and, when `effective` is given, N′ = N − u·l and the
 * mobilised shear S = (C + N tan φ)/F there.
 */
function bishopForces(
  st: Statics,
  F: number,
  out: Float64Array,
  effective?: { normal: Float64Array; shear: Float64Array },
): void {
  bishopNormals(st, F, out, effective?.normal);
  if (!effective) return;
  const { n, C, t } = st;
  for (let i = 0; i < n; i++) effective.shear[i] = (C[i] + out[i] * t[i]) / F;
}

/**
 * The search's circle evaluator for a rapid drawdown: the three stages of Duncan, Wright &
 * Wong (1990) on each trial circle, with Bishop's simplified method at every stage (the
 * search's method), so that the critical circle is the one with the least three-stage F, not
 * the least F of one stage. The circle is cut into the same slices before and after drawdown
 * (drawdownSections), each into a workspace it keeps; stage 1 solves it with the water before
 * and gives each base its consolidation stresses; stage 2 gives the bases in slowly draining
 * soils their undrained strengths and solves it with the water after; stage 3, where a drained
 * strength is lower, takes it and solves it again. Returns the F of the last stage run (NaN
 * where the circle is not admissible or a stage finds no F). Both cuts are charged to `meter`.
 *
 * @example drawdownCircleEvaluator(drawdownSections(section, spec), drainage.byMaterial, 30)(25, 42, 24)
 */
export function drawdownCircleEvaluator(
  sections: DrawdownSections,
  drainage: readonly MaterialDrainage[],
  slices: number,
  meter: WorkMeter = new WorkMeter(),
): CircleEvaluator {
  const before = sliceWorkspace(sections.before);
  const after = sliceWorkspace(sections.after);
  const seismic = sections.before.section.seismic;
  const pivot: Point = [0, 0];
  let stBefore: Statics | undefined;
  let stAfter: Statics | undefined;
  let scratch: StageScratch | undefined;
  let view: SliceSet | undefined;
  let forces = { normal: new Float64Array(64), shear: new Float64Array(64) };
  let normal = new Float64Array(64);
  const guess = [1, 1, 1];
  const solve = (st: Statics, k: number) => {
    const f = bishopIteration(st, guess[k], 1e-7);
    if (f > 0) guess[k] = f;
    return f;
  };
  return (xc, yc, r) => {
    if (cutCircle(before, xc, yc, r, slices) !== null) {
      meter.charge(1);
      return NaN;
    }
    meter.charge(before.slices.n);
    if (cutCircle(after, xc, yc, r, slices) !== null) {
      meter.charge(1);
      return NaN;
    }
    meter.charge(after.slices.n);
    const sb = before.slices;
    const sa = after.slices;
    pivot[0] = before.mirrored ? -xc : xc;
    pivot[1] = yc;
    const n = Math.max(sb.n, sa.n);
    scratch = stageScratch(n, scratch);
    if (forces.normal.length < n) {
      forces = { normal: new Float64Array(2 * n), shear: new Float64Array(2 * n) };
      normal = new Float64Array(2 * n);
    }
    // stage 1: the water before drawdown, effective stresses; the consolidation stresses
    stBefore = statics(sb, seismic, pivot, stBefore);
    const f1 = solve(stBefore, 0);
    if (!(f1 > 0)) return NaN;
    bishopForces(stBefore, f1, normal, forces);
    for (let i = 0; i < sb.n; i++) {
      const l = stBefore.len[i];
      scratch.sigma[i] = forces.normal[i] / l;
      scratch.tau[i] = forces.shear[i] / l;
    }
    // stage 2: the water after drawdown, undrained strengths in slowly draining soils
    matchSlices(sb, sa, scratch);
    undrainedStage(sa, drainage, scratch);
    view = withBaseStrengths(sa, scratch.strengths, view);
    stAfter = statics(view, seismic, pivot, stAfter);
    const f2 = solve(stAfter, 1);
    if (!(f2 > 0)) return NaN;
    // stage 3: drained strengths where lower, with the normal forces of stage 2
    bishopForces(stAfter, f2, normal);
    if (drainedWhereLower(sa, drainage, normal, scratch) === 0) return f2;
    view = withBaseStrengths(sa, scratch.strengths, view);
    stAfter = statics(view, seismic, pivot, stAfter);
    return solve(stAfter, 2);
  };
}
