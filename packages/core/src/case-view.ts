/**
 * One case of a station's result in the shape a single case is drawn, listed and exported in
 * (SectionResult): the drawing, the slice tables and the web's section page take this. Free
 * of imports but types, so that the web app can use it without bundling the solver.
 */
import type { CaseResult, SectionResult, StationResult } from './result';

/** The case of a station's result with that name, or the governing one (the first when none governs). */
export function caseOf(result: StationResult, name?: string): CaseResult {
  const wanted = name ?? result.governing?.case;
  return result.cases.find((c) => c.name === wanted) ?? result.cases[0];
}

/**
 * A case of a station's result as a section result: the station's identity, the case's
 * methods, search and warnings, and the case's own verdict.
 *
 * @example caseView(analyzeSection(section)).results[0].fs
 */
export function caseView(result: StationResult, name?: string): SectionResult {
  const c = caseOf(result, name);
  return {
    id: result.id,
    title: result.title,
    station: result.station,
    units: result.units,
    case: c.name,
    requiredFs: c.requiredFs,
    results: c.results,
    governing: c.governing,
    verdict: c.verdict,
    warnings: c.warnings,
    search: c.search,
    solverVersion: result.solverVersion,
    caution: result.caution,
  };
}
