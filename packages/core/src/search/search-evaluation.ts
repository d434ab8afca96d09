import { bishop } from '../methods/bishop';
import { defaultPivot } from '../methods/pivot';
import { spencer } from '../methods/spencer';
import type { CircleSurface, Polyline } from '../model/types';
import type { PreparedSection } from '../slices/prepare-section';
import { sliceSurface } from '../slices/slice-surface';
import { solveSlices } from '../slices/stress-dependent';
import { WorkMeter } from '../work-limit';
import { bishopCircleEvaluator } from './circle-evaluator';
import type { CircleEvaluator } from './trials';

/**
 * How the search judges its trial surfaces: the factor of safety of each trial circle (the
 * search's hot path), of the critical circle solved again in full (the confirmation), of each
 * noncircular trial, and whether the infinite slope stands in for circles in soils without
 * cohesion. searchSection takes Bishop's method on the section as it is
 * (bishopSearchEvaluation) unless it is given another: a rapid drawdown judges each trial by
 * its three stages (drawdown/drawdown-evaluation.ts).
 */
export interface SearchEvaluation {
  /** F of a trial circle (the search's method, Bishop's); NaN when it is not admissible. */
  circle: CircleEvaluator;
  /** The critical circle cut afresh and solved by Bishop's method in full; null when that fails. */
  exact: (circle: CircleSurface) => number | null;
  /** F of a noncircular trial (Spencer's method); NaN when it is not admissible. */
  polyline: (points: Polyline) => number;
  /** Whether the infinite slope governs when no soil has cohesion (searchSection's cohesionlessSlope). */
  cohesionless: boolean;
}

/**
 * The search's own evaluation: Bishop's method on each trial circle (bishopCircleEvaluator),
 * bishop() in full on the critical circle, Spencer's method on noncircular trials, each trial
 * charged to `meter`; each with the strengths of the bases that vary with stress where there
 * are (slices/stress-dependent.ts).
 *
 * @example searchSection(prepared, spec, meter, bishopSearchEvaluation(prepared, meter))
 */
export function bishopSearchEvaluation(
  prepared: PreparedSection,
  meter: WorkMeter = new WorkMeter(),
): SearchEvaluation {
  const section = prepared.section;
  const slices = section.analysis.slices;
  const gw = section.water.unitWeight;
  return {
    circle: bishopCircleEvaluator(prepared, slices, meter),
    exact: (circle) => {
      const cut = sliceSurface(prepared, circle, slices);
      const exact = cut.ok
        ? solveSlices(cut.slices, prepared.rules, gw, (s) =>
            bishop(s, {
              seismic: section.seismic,
              pivot: [(cut.slices.mirrored ? -1 : 1) * circle.center[0], circle.center[1]],
            }),
          )
        : null;
      return exact?.converged ? exact.fs : null;
    },
    polyline: (points) => {
      const s = sliceSurface(prepared, { type: 'polyline', points }, slices);
      meter.charge(s.ok ? s.slices.n : 1);
      if (!s.ok) return NaN;
      const pivot = defaultPivot(s.slices);
      const r = solveSlices(s.slices, prepared.rules, gw, (sl) =>
        spencer(sl, { seismic: section.seismic, pivot }),
      );
      return r.converged ? r.fs : NaN;
    },
    cohesionless: true,
  };
}
