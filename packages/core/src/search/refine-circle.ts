import { nelderMead } from '../numeric/nelder-mead';
import type { CircleSurface } from '../model/types';
import { type Boundary, touchRadius } from './boundaries';
import { type CircleEvaluator, type CircleTrial, Trials } from './trials';

/** One polish: where it started, where it ended, and how many circles it tried. */
export interface Polish {
  from: CircleTrial;
  to: CircleTrial;
  /** The boundary the circle was kept touching (index into the boundaries), or −1 when free. */
  boundary: number;
  evaluations: number;
}

/**
 * Polish a circle by a Nelder–Mead search on (xc, yc, R), the first simplex `step` wide.
 * Every evaluation is a recorded trial (stage 'polish').
 */
export function refineCircle(
  start: CircleTrial,
  step: number,
  evaluate: CircleEvaluator,
  trials: Trials,
): Polish {
  const before = trials.count;
  const r = nelderMead(
    ([x, y, rad]) => {
      const f = trials.try(evaluate, x, y, rad);
      return f > 0 ? f : Infinity;
    },
    [start.center[0], start.center[1], start.radius],
    [step, step, step],
    1e-6,
    300,
  );
  const to: CircleTrial =
    r.fx < start.fs
      ? { center: [r.x[0], r.x[1]], radius: r.x[2], fs: r.fx, stage: 'polish', boundary: -1 }
      : start;
  return { from: start, to, boundary: -1, evaluations: trials.count - before };
}

/**
 * Polish a circle that touches a stratum boundary, keeping it touching: a Nelder–Mead search
 * on the centre (xc, yc) alone, the radius always the distance to the boundary. F rises
 * steeply as a circle dips below the bottom of a weak layer, so the minimum sits on this
 * ridge, where a free search on (xc, yc, R) crawls; along it the search is smooth.
 */
export function refineTouching(
  start: CircleTrial,
  b: Boundary,
  index: number,
  step: number,
  evaluate: CircleEvaluator,
  trials: Trials,
): Polish {
  const before = trials.count;
  const r = nelderMead(
    ([x, y]) => {
      const rad = touchRadius(b, x, y);
      if (!(rad > 0)) return Infinity;
      const f = trials.try(evaluate, x, y, rad, index);
      return f > 0 ? f : Infinity;
    },
    [start.center[0], start.center[1]],
    [step, step],
    1e-6,
    200,
  );
  const rad = touchRadius(b, r.x[0], r.x[1]);
  const to: CircleTrial =
    r.fx < start.fs
      ? { center: [r.x[0], r.x[1]], radius: rad, fs: r.fx, stage: 'polish', boundary: index }
      : start;
  return { from: start, to, boundary: index, evaluations: trials.count - before };
}

/**
 * A circle polished by `evaluate` alone (a method's own F): a simplex a twentieth of its radius
 * wide from `start`, which comes back as it was when `evaluate` gives it no F.
 *
 * @example polishFrom(searchedCircle, (xc, yc, r) => spencerF(xc, yc, r))
 */
export function polishFrom(start: CircleSurface, evaluate: CircleEvaluator): CircleSurface {
  const f0 = evaluate(start.center[0], start.center[1], start.radius);
  if (!(f0 > 0)) return start;
  const best = refineCircle(
    { center: start.center, radius: start.radius, fs: f0, stage: 'polish', boundary: -1 },
    start.radius / 20,
    evaluate,
    new Trials(),
  ).to;
  return { type: 'circle', center: best.center, radius: best.radius };
}
