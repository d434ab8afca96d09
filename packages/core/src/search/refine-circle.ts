import { nelderMead } from '../numeric/nelder-mead';
import type { CircleTrial, CircleEvaluator, Trials } from './trials';

/**
 * Polish the best circle found so far by a Nelder–Mead search on (xc, yc, R), the first
 * simplex a grid spacing wide. Every evaluation is a recorded trial.
 */
export function refineCircle(
  start: CircleTrial,
  step: number,
  evaluate: CircleEvaluator,
  trials: Trials,
): CircleTrial {
  const r = nelderMead(
    ([x, y, rad]) => {
      const f = trials.try(evaluate, x, y, rad);
      return f > 0 ? f : Infinity;
    },
    [start.center[0], start.center[1], start.radius],
    [step, step, step],
    1e-7,
    300,
  );
  return r.fx < start.fs ? { center: [r.x[0], r.x[1]], radius: r.x[2], fs: r.fx } : start;
}
