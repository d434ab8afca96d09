import { convergenceWarnings, notRun } from '../method-report';
import { METHODS } from '../methods/registry';
import type {
  CircleSurface,
  DrawdownSpec,
  MethodId,
  PolylineSurface,
  Section,
} from '../model/types';
import type { DrawdownReport, MethodReport, Warning } from '../result';
import { polishFrom } from '../search/refine-circle';
import { type SearchOutcome, searchSection } from '../search/search-section';
import { searchWarnings } from '../search/search-warnings';
import { sliceSurface } from '../slices/slice-surface';
import { STRENGTH_WORDS, variesWithStress } from '../strength/registry';
import type { WorkMeter } from '../work-limit';
import { type MaterialDrainage, resolveDrainage } from './drainage';
import { drawdownSearchEvaluation } from './drawdown-evaluation';
import { type DrawdownSections, drawdownSections } from './drawdown-sections';
import { NOT_SLICES, type ThreeStages, threeStages } from './three-stages';

/** What a rapid-drawdown case gives, in SI: what its CaseResult needs. */
export interface DrawdownAnalysis {
  /** Each method of the case's analysis on its critical surface, with the three-stage strengths (the last stage's report). */
  results: MethodReport[];
  /** The search (three-stage F of every trial, Bishop's method), when the surface was searched for. */
  search: SearchOutcome | null;
  warnings: Warning[];
  /** The stages, the drained drawdown and the slice table of the governing method. */
  drawdown: DrawdownReport;
  /** The same for every method that ran. */
  byMethod: Partial<Record<MethodId, DrawdownReport>>;
}

/** The drawdown report of one method's three stages. */
function reportOf(t: ThreeStages | null): DrawdownReport {
  return {
    stages: [1, 2, 3].map((stage, k) => ({
      stage: stage as 1 | 2 | 3,
      fs: t ? t.stages[k] : null,
    })),
    drainedFs: t ? t.drainedFs : null,
    slices: t ? t.slices : [],
  };
}

/** The critical circle of one method by its own three stages: the search's best circle polished with it. */
function ownCircle(
  method: MethodId,
  sections: DrawdownSections,
  drainage: readonly MaterialDrainage[],
  start: CircleSurface,
  meter: WorkMeter,
): CircleSurface {
  const count = sections.before.section.analysis.slices;
  const evaluate = (xc: number, yc: number, r: number) => {
    const c: CircleSurface = { type: 'circle', center: [xc, yc], radius: r };
    const t = threeStages(method, sections, drainage, c, count, false);
    meter.charge(Math.max(1, t.sliced));
    return t.fs ?? NaN;
  };
  return polishFrom(start, evaluate);
}

/**
 * A rapid-drawdown case: the three-stage procedure of Duncan, Wright & Wong (1990) (EM
 * 1110-2-1902, 2003, App. G) for each method of the case's analysis, on the given slip surface
 * or on the critical one of a search that judges every trial by its three-stage F (Bishop's
 * method; drawdown-evaluation.ts). `section` is the case's section (caseSection): its water is
 * the water before drawdown; `spec` gives the water after and how each material drains.
 *
 * Methods that are not methods of slices (the φ = 0 circle, the log spiral, the infinite slope)
 * are reported as not run: the stages give each slice base a strength of its own. Each report
 * is the method's last stage, its slices with the strengths they took (u = 0 and the total
 * normal force on an undrained base); `drawdown` gives, for the governing method (the lowest
 * three-stage F among `governs`, every method when null), the F of each stage, the drained
 * drawdown F on the same surface, and each slice's strength and the stage that set it. Every
 * number is in SI, section coordinates; the search is the search's outcome (searchReport turns
 * it into the result's search report).
 *
 * @example analyzeDrawdown(caseSection(section, c), c.drawdown!, new WorkMeter()).drawdown.stages
 */
export function analyzeDrawdown(
  section: Section,
  spec: DrawdownSpec,
  meter: WorkMeter,
  governs: readonly MethodId[] | null = null,
): DrawdownAnalysis {
  const varying = Object.values(section.materials).filter((m) => variesWithStress(m.strength));
  if (varying.length > 0) {
    // the stages take each base's drained strength as one line c′, φ′: not written for these yet
    const names = varying.map((m) => `"${m.name}" (${STRENGTH_WORDS[m.strength.model]})`);
    const reason = `rapid drawdown: not available where a strength varies from base to base with the stress on it, as that of ${names.join(', ')} does`;
    return {
      results: section.analysis.methods.map((method) => notRun(method, reason)),
      search: null,
      warnings: [{ code: 'not-applicable', message: reason }],
      drawdown: reportOf(null),
      byMethod: {},
    };
  }
  const sections = drawdownSections(section, spec);
  const { byMaterial: drainage, warnings: drainageWarnings } = resolveDrainage(
    sections.before.materials,
    spec,
  );
  const analysis = section.analysis;
  const surface = analysis.surface;
  const count = analysis.slices;
  const warnings: Warning[] = [...drainageWarnings];
  let circle: CircleSurface | null = null;
  let polyline: PolylineSurface | null = null;
  let found: SearchOutcome | null = null;
  if (surface && surface.type === 'circle') circle = surface;
  else if (surface && surface.type === 'polyline') polyline = surface;
  else if (surface) {
    const evaluation = drawdownSearchEvaluation(sections, drainage, meter);
    found = searchSection(sections.before, surface, meter, evaluation);
    if (found.circle)
      circle = { type: 'circle', center: found.circle.center, radius: found.circle.radius };
    if (found.polyline) polyline = { type: 'polyline', points: found.polyline.points };
    warnings.push(...searchWarnings(found));
  }
  for (const sf of [circle, polyline]) {
    if (sf && !found) {
      for (const prepared of [sections.before, sections.after]) {
        const c = sliceSurface(prepared, sf, count);
        if (!c.ok) {
          warnings.push({
            code: 'surface-rejected',
            message: `the slip surface was rejected: ${c.reason}`,
          });
          break;
        }
      }
    }
  }
  const outcomes = new Map<MethodId, ThreeStages>();
  const results = analysis.methods.map((method): MethodReport => {
    if (!METHODS[method].slices) return notRun(method, `${method}: ${NOT_SLICES}`);
    if (!surface)
      return notRun(method, `${method}: the section gives no slip surface (analysis.surface)`);
    let own = circle;
    if (own && found && analysis.searchEachMethod)
      own = ownCircle(method, sections, drainage, own, meter);
    const onCircle = own ? threeStages(method, sections, drainage, own, count, true) : null;
    let chosen = onCircle;
    if ((METHODS[method].surfaces as readonly string[]).includes('polyline') && polyline) {
      const onPolyline = threeStages(method, sections, drainage, polyline, count, true);
      // the critical surface of this method: the lower three-stage F of the circle and the polyline
      if (!onCircle || onCircle.fs === null) chosen = onPolyline;
      else if (onPolyline.fs !== null && onPolyline.fs < onCircle.fs) chosen = onPolyline;
    }
    if (!chosen?.report) return notRun(method, `${method}: no admissible slip surface was found`);
    outcomes.set(method, chosen);
    return chosen.report;
  });
  warnings.push(...convergenceWarnings(results));
  let governing: ThreeStages | null = null;
  const byMethod: Partial<Record<MethodId, DrawdownReport>> = {};
  for (const [method, t] of outcomes) {
    byMethod[method] = reportOf(t);
    if (t.fs === null || (governs && !governs.includes(method))) continue;
    if (!governing || t.fs < (governing.fs as number)) governing = t;
  }
  return { results, search: found, warnings, drawdown: reportOf(governing), byMethod };
}
