import { bishopIteration, bishopNormals } from '../methods/bishop';
import { type Statics, statics } from '../methods/statics';
import type { Point } from '../model/types';
import { withBaseStrengths } from '../slices/base-strengths';
import type { PreparedSection } from '../slices/prepare-section';
import { cutCircle, sliceWorkspace } from '../slices/cut-surface';
import type { SliceSet } from '../slices/slice-set';
import { solveWithStresses, stressScratch, touchesRules } from '../slices/stress-dependent';
import { WorkMeter } from '../work-limit';
import type { CircleEvaluator } from './trials';

/**
 * The search's circle evaluator: each trial circle cut into slices by the same code as every
 * other surface (cutCircle: boundaries and water at their true crossings, weights summed
 * exactly) into a workspace it keeps, then Bishop's simplified method (bishopIteration),
 * warm-started from the previous trial's F and settled to 1 part in 10⁷. So the F of a
 * circle here is the exact slicer's Bishop F of that circle; only the iteration's tolerance
 * differs. Where a base's strength varies with stress (prepared.rules), the circle is solved
 * with those strengths as every method is (solveWithStresses), each further solution charged
 * to the meter too. Each circle is charged to `meter`, which stops the search at its bound.
 *
 * @example bishopCircleEvaluator(prepareSection(section), 30)(25, 42, 24) // → 1.42
 */
export function bishopCircleEvaluator(
  prepared: PreparedSection,
  slices: number,
  meter: WorkMeter = new WorkMeter(),
): CircleEvaluator {
  const ws = sliceWorkspace(prepared);
  const seismic = prepared.section.seismic;
  const rules = prepared.rules;
  const gw = prepared.section.water.unitWeight;
  const pivot: Point = [0, 0];
  let st: Statics | undefined;
  let view: SliceSet | undefined;
  let total = new Float64Array(64);
  let normal = new Float64Array(64);
  const scratch = stressScratch(64);
  let guess = 1;
  return (xc, yc, r) => {
    if (cutCircle(ws, xc, yc, r, slices) !== null) {
      meter.charge(1);
      return NaN;
    }
    const s = ws.slices;
    meter.charge(s.n);
    pivot[0] = ws.mirrored ? -xc : xc;
    pivot[1] = yc;
    if (!touchesRules(s, rules)) {
      st = statics(s, seismic, pivot, st);
      const f = bishopIteration(st, guess, 1e-7);
      if (f > 0) guess = f;
      return f;
    }
    if (total.length < s.n) {
      total = new Float64Array(2 * s.n);
      normal = new Float64Array(2 * s.n);
    }
    let solutions = 0;
    const solved = solveWithStresses(
      s,
      rules!,
      gw,
      (b) => {
        if (solutions++ > 0) meter.charge(s.n);
        view = withBaseStrengths(s, b, view);
        st = statics(view, seismic, pivot, st);
        const f = bishopIteration(st, guess, 1e-7);
        if (f > 0) bishopNormals(st, f, total, normal);
        return { fs: f, converged: f > 0, normal };
      },
      scratch,
    );
    const f = solved.result.fs;
    if (f > 0) guess = f;
    return solved.result.converged ? f : NaN;
  };
}
