import { CAUTION } from './caution';
import { METHODS } from './methods/registry';
import type { MethodWarning } from './methods/types';
import { notRun, runOnPlane, runOnSurface } from './method-report';
import type { CircleSurface, DesignCase, MethodId, PolylineSurface, Section } from './model/types';
import { caseSection, designCases } from './model/design-cases';
import { type CaseAnalysis, governingOf, lowestFs, stationResult } from './station-result';
import { seismicReport } from './seismic/seismic-report';
import type { MethodReport, SectionResult, StationResult, Warning } from './result';
import { drawdownInUnits, requiredInUnits, resultInUnits, seismicInUnits } from './result-units';
import { requiredReinforcement } from './reinforcement/required-reinforcement';
import type { RequiredReinforcementReport } from './reinforcement/types';
import { analyzeDrawdown } from './drawdown/analyze-drawdown';
import { polishFrom } from './search/refine-circle';
import { searchReport } from './search/search-report';
import { type SearchOutcome, searchSection } from './search/search-section';
import { type PreparedSection, prepareSection } from './slices/prepare-section';
import { type SliceOutcome, sliceSurface } from './slices/slice-surface';
import { verdictOf } from './verdict';
import { type AnalyzeOptions, WorkMeter } from './work-limit';

export { CAUTION };

/** The version of the solver, stored with every result. */
export const SOLVER_VERSION = '0.1.0';

/** The critical circle of one method: the search's best circle polished with that method on the exact slicing. */
function ownCircle(
  method: MethodId,
  prepared: PreparedSection,
  start: CircleSurface,
  meter: WorkMeter,
): CircleSurface {
  const evaluate = (xc: number, yc: number, r: number) => {
    const c: CircleSurface = { type: 'circle', center: [xc, yc], radius: r };
    const cut = sliceSurface(prepared, c, prepared.section.analysis.slices);
    meter.charge(cut.ok ? cut.slices.n : 1);
    const rep = runOnSurface(method, prepared, c, cut);
    return rep.converged && rep.fs !== null ? rep.fs : NaN;
  };
  return polishFrom(start, evaluate);
}

/**
 * One design case: each requested method on the given slip surface (a circle or a polyline)
 * or, for the infinite slope, on analysis.infiniteSlope. Methods are dispatched through the
 * registry (methods/registry.ts); the result is built in SI and converted once
 * (resultInUnits). It is plain JSON in the section's own units, with the governing (lowest
 * converged) factor of safety, its verdict against the required FS, the warnings and the
 * caution: the shape a single case is drawn and listed in (caseView gives it for a station).
 */
function analyzeCase(section: Section, meter: WorkMeter): SectionResult {
  const prepared = prepareSection(section);
  const analysis = section.analysis;
  const surface = analysis.surface;
  const warnings: Warning[] = [];
  const cuts = new Map<CircleSurface | PolylineSurface, SliceOutcome>();
  const cutOf = (sf: CircleSurface | PolylineSurface) => {
    let c = cuts.get(sf);
    if (!c) {
      c = sliceSurface(prepared, sf, analysis.slices);
      cuts.set(sf, c);
    }
    return c;
  };
  let circle: CircleSurface | null = null;
  let polyline: PolylineSurface | null = null;
  let found: SearchOutcome | null = null;
  if (surface && surface.type === 'circle') circle = surface;
  else if (surface && surface.type === 'polyline') polyline = surface;
  else if (surface) {
    found = searchSection(prepared, surface, meter);
    if (found.circle)
      circle = { type: 'circle', center: found.circle.center, radius: found.circle.radius };
    if (found.polyline) polyline = { type: 'polyline', points: found.polyline.points };
    if (!found.circle) {
      warnings.push({
        code: 'no-surface',
        message:
          'the search found no admissible slip surface: check the grid, the radii and the ground ranges',
      });
    }
    if (found.onEdge) {
      warnings.push({
        code: 'minimum-on-edge',
        message: `the lowest factor of safety is still on the edge of the search grid after ${found.grid?.moves.length ?? 0} moves: the true minimum may lie outside it; widen the grid`,
      });
    }
  }
  for (const sf of [circle, polyline]) {
    if (sf && !found) {
      const c = cutOf(sf);
      if (!c.ok)
        warnings.push({
          code: 'surface-rejected',
          message: `the slip surface was rejected: ${c.reason}`,
        });
    }
  }
  const results: MethodReport[] = analysis.methods.map((method) => {
    if (METHODS[method].surfaces.length === 0) return runOnPlane(method, prepared);
    if (!surface)
      return notRun(method, `${method}: the section gives no slip surface (analysis.surface)`);
    let own = circle;
    if (own && found && analysis.searchEachMethod) own = ownCircle(method, prepared, own, meter);
    const onCircle = own ? runOnSurface(method, prepared, own, cutOf(own)) : null;
    if (!(METHODS[method].surfaces as readonly string[]).includes('polyline') || !polyline) {
      return onCircle ?? notRun(method, `${method}: no admissible slip surface was found`);
    }
    const onPolyline = runOnSurface(method, prepared, polyline, cutOf(polyline));
    // the critical surface of this method: the lower of the best circle and the noncircular surface
    if (!onCircle || !onCircle.converged) return onPolyline;
    return onPolyline.converged && onPolyline.fs! < onCircle.fs! ? onPolyline : onCircle;
  });
  if (found?.cohesionless && !analysis.methods.includes('infinite-slope')) {
    const cl = found.cohesionless;
    const message = `no soil on this slope has cohesion (c′ = 0): circles drift toward an infinite radius, so the infinite slope on the steepest ground (β = ${cl.angle.toFixed(1)}°) governs with F = ${cl.fs.toFixed(3)}`;
    warnings.push({ code: 'cohesionless-circle', message });
    results.push({
      method: 'infinite-slope',
      fs: cl.fs,
      converged: true,
      iterations: 0,
      surface: { type: 'plane', angle: cl.angle, depth: 0 },
      slices: [],
      warnings: [{ code: 'cohesionless-circle', message }],
    });
  }
  let governing = lowestFs(results);
  // without cohesion the infinite slope is the limit the circles tend to: it governs
  if (found?.cohesionless) governing = { method: 'infinite-slope', fs: found.cohesionless.fs };
  for (const r of results) {
    const applies = !r.warnings.some((w) => w.code === 'not-applicable');
    if (!r.converged && applies) {
      warnings.push({
        code: 'no-convergence',
        message: `${r.method}: ${r.reason ?? 'no solution'}`,
      });
    }
  }
  const required = analysis.requiredFs;
  const inSi: SectionResult = {
    id: section.id,
    title: section.title,
    station: section.station,
    units: 'si',
    case: analysis.case,
    requiredFs: required,
    results,
    governing,
    verdict: verdictOf(governing?.fs ?? null, required),
    warnings,
    search: found ? searchReport(found) : null,
    solverVersion: SOLVER_VERSION,
    caution: CAUTION,
  };
  // the one conversion of the result to the file's units; the station is the file's own label
  return { ...resultInUnits(inSi, section.units), station: section.station };
}

/** Warnings of a method result, for callers that only need the codes. */
export type { MethodWarning };

/**
 * Analyse one validated, normalised section under each of its design cases (designCases: the
 * cases its file lists, or its own settings as its one case) and give the station's result:
 * every case as analyzeCase gives it, the governing case and the station's verdict
 * (station-result.ts). The work is bounded over all the cases together (options.workLimit,
 * default WORK_LIMIT slice evaluations) and may be stopped by the caller
 * (options.shouldStop): either throws AnalysisStopped, whose message says what to change.
 *
 * @example analyzeSection(parseSections(text, 'cut.yaml').sections[0]).governing
 */
export function analyzeSection(section: Section, options: AnalyzeOptions = {}): StationResult {
  const meter = new WorkMeter(options);
  const listed = (section.cases?.length ?? 0) > 0;
  const cases = designCases(section).map((c): CaseAnalysis => {
    // a file without cases is analysed exactly as it always was
    const cs = listed ? caseSection(section, c) : section;
    if (c.kind === 'rapid-drawdown' && c.drawdown) return drawdownCaseOf(cs, c, meter);
    const result = analyzeCase(cs, meter);
    const required = requiredOf(cs, c, result, meter);
    const own = required ? { requiredReinforcement: required } : {};
    if (c.kind !== 'seismic') return { spec: c, result, ...own };
    return { spec: c, result, ...own, ...earthquakeOf(cs, c, meter) };
  });
  return stationResult(section, cases, SOLVER_VERSION);
}

/**
 * The extra reinforcement a case needs (reinforcement/required-reinforcement.ts), where its
 * analysis asks for it and its governing FS is below its requirement: each trial a full
 * analysis of the case in SI, the least FS over the methods that govern it; in the section's
 * units. Null where not asked or not needed.
 */
function requiredOf(
  cs: Section,
  c: DesignCase,
  result: SectionResult,
  meter: WorkMeter,
): RequiredReinforcementReport | null {
  const spec = cs.analysis.requiredReinforcement;
  const required = c.requiredFs;
  const g = governingOf(result, c.governs);
  if (!spec || required === null || !g || g.fs >= required) return null;
  const report = requiredReinforcement({ ...cs, units: 'si' }, spec, required, (s) => {
    const r = analyzeCase(s, meter);
    const best = governingOf(r, c.governs);
    const m = best ? r.results.find((x) => x.method === best.method) : undefined;
    return { fs: best?.fs ?? null, method: best?.method ?? null, surface: m?.surface ?? null };
  });
  return requiredInUnits(report, 'si', cs.units);
}

/**
 * The earthquake part of a seismic case (seismic/seismic-report.ts): the yield coefficient of
 * the case's whole analysis — each step a full search at that kh, the case's kv as given, the
 * least FS over the methods that govern the case — and the displacement estimates, in the
 * section's units.
 */
function earthquakeOf(
  cs: Section,
  c: DesignCase,
  meter: WorkMeter,
): Pick<CaseAnalysis, 'seismic' | 'warnings'> {
  const fsAt = (kh: number) => {
    // in SI: the surface is the search's own
    const r = analyzeCase({ ...cs, units: 'si', seismic: { ...cs.seismic, kh } }, meter);
    const g = governingOf(r, c.governs);
    const m = g ? r.results.find((x) => x.method === g.method) : undefined;
    return { fs: g?.fs ?? null, surface: m?.surface ?? null };
  };
  const out = seismicReport(fsAt, c.earthquake);
  return { seismic: seismicInUnits(out.seismic, 'built', cs.units), warnings: out.warnings };
}

/**
 * A rapid-drawdown case (drawdown/analyze-drawdown.ts): the search and every method by the
 * three stages of Duncan, Wright & Wong (1990) with the case's water before and its drawdown's
 * water after, the drained drawdown beside them; in the section's units.
 */
function drawdownCaseOf(cs: Section, c: DesignCase, meter: WorkMeter): CaseAnalysis {
  const dd = analyzeDrawdown(cs, c.drawdown!, meter, c.governs);
  const governing = lowestFs(dd.results);
  const inSi: SectionResult = {
    id: cs.id,
    title: cs.title,
    station: cs.station,
    units: 'si',
    case: c.name,
    requiredFs: c.requiredFs,
    results: dd.results,
    governing,
    verdict: verdictOf(governing?.fs ?? null, c.requiredFs),
    warnings: dd.warnings,
    search: dd.search ? searchReport(dd.search) : null,
    solverVersion: SOLVER_VERSION,
    caution: CAUTION,
  };
  return {
    spec: c,
    result: { ...resultInUnits(inSi, cs.units), station: cs.station },
    drawdown: drawdownInUnits(dd.drawdown, 'si', cs.units),
  };
}
