import type { SearchEvaluation } from '../search/search-evaluation';
import { WorkMeter } from '../work-limit';
import type { MaterialDrainage } from './drainage';
import { drawdownCircleEvaluator } from './drawdown-evaluator';
import type { DrawdownSections } from './drawdown-sections';
import { threeStages } from './three-stages';

/**
 * How the search judges trial surfaces in a rapid drawdown: by their three-stage F. Trial
 * circles with Bishop's method at every stage (drawdownCircleEvaluator), the critical circle
 * confirmed by the three stages with bishop() in full, noncircular trials by the three stages
 * with Spencer's method; the infinite slope of soils without cohesion does not stand in (the
 * undrained strengths of stage 2 are a cohesion).
 *
 * @example searchSection(sections.before, spec, meter, drawdownSearchEvaluation(sections, drainage, meter))
 */
export function drawdownSearchEvaluation(
  sections: DrawdownSections,
  drainage: readonly MaterialDrainage[],
  meter: WorkMeter = new WorkMeter(),
): SearchEvaluation {
  const slices = sections.before.section.analysis.slices;
  return {
    circle: drawdownCircleEvaluator(sections, drainage, slices, meter),
    exact: (circle) => threeStages('bishop', sections, drainage, circle, slices, false).fs,
    polyline: (points) => {
      const r = threeStages(
        'spencer',
        sections,
        drainage,
        { type: 'polyline', points },
        slices,
        false,
      );
      meter.charge(Math.max(1, r.sliced));
      return r.fs ?? NaN;
    },
    cohesionless: false,
  };
}
