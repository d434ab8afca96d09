import { bishopIteration } from '../methods/bishop';
import { type Statics, statics } from '../methods/statics';
import type { Point } from '../model/types';
import { cutCircle, sliceWorkspace } from '../slices/cut-surface';
import type { PreparedSection } from '../slices/prepare-section';
import { WorkMeter } from '../work-limit';
import type { CircleEvaluator } from './trials';

/**
 * The search's circle evaluator: each trial circle cut into slices by the same code as every
 * other surface (cutCircle: boundaries and water at their true crossings, weights summed
 * exactly) into a workspace it keeps, then Bishop's simplified method (bishopIteration),
 * warm-started from the previous trial's F and settled to 1 part in 10⁷. So the F of a
 * circle here is the exact slicer's Bishop F of that circle; only the iteration's tolerance
 * differs. Each circle is charged to `meter`, which stops the search at its bound.
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
  const pivot: Point = [0, 0];
  let st: Statics | undefined;
  let guess = 1;
  return (xc, yc, r) => {
    if (cutCircle(ws, xc, yc, r, slices) !== null) {
      meter.charge(1);
      return NaN;
    }
    meter.charge(ws.slices.n);
    pivot[0] = ws.mirrored ? -xc : xc;
    pivot[1] = yc;
    st = statics(ws.slices, seismic, pivot, st);
    const f = bishopIteration(st, guess, 1e-7);
    if (f > 0) guess = f;
    return f;
  };
}
