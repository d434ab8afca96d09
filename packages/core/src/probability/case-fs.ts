/**
 * The factor of safety of one design case as a function of its inputs: the case as a
 * section of its own (in SI), its deterministic critical surface, and the FS of a changed
 * section either on that surface (one method on one surface: the fast path of the sampling
 * loop) or with the critical surface searched again (a full analysis, bounded by the work
 * meter).
 */
import { analyzeSection } from '../analyze';
import { pivotOf, runOnPlane, runOnSurface } from '../method-report';
import { METHODS } from '../methods/registry';
import { caseSection, designCases } from '../model/design-cases';
import type {
  CircleSurface,
  DesignCaseKind,
  MethodId,
  PolylineSurface,
  Section,
} from '../model/types';
import type { ReportedSurface } from '../result';
import { type PreparedSection, prepareSection, stratumProperties } from '../slices/prepare-section';
import { cutSurface, sliceWorkspace } from '../slices/cut-surface';
import { slicedSurface } from '../slices/slice-surface';
import { strengthRules, touchesRules } from '../slices/stress-dependent';
import type { AnalyzeOptions } from '../work-limit';
import type { Target } from './target';

/** One design case as a section of its own, in SI (results of its analysis come back in SI). */
export interface CaseModel {
  name: string;
  kind: DesignCaseKind;
  requiredFs: number | null;
  section: Section;
}

/**
 * The design cases of a section, each as a section of its own (caseSection) with results in
 * SI; only `name` when given (none: every case).
 */
export function caseModels(section: Section, name?: string): CaseModel[] {
  const listed = (section.cases?.length ?? 0) > 0;
  return designCases(section)
    .filter((c) => name === undefined || c.name === name)
    .map((c) => {
      const cs = listed ? caseSection(section, c) : section;
      const own: Section = { ...cs, units: 'si', cases: listed ? [{ ...c }] : [] };
      return { name: c.name, kind: c.kind, requiredFs: c.requiredFs, section: own };
    });
}

/**
 * A case model as its critical FS needs it: its one case given the section's own settings
 * again (the targets change the section's settings; the case keeps its kind and drawdown),
 * without what only the station's report needs (a seismic case's yield coefficient and
 * displacements, the extra reinforcement a case below its requirement would need): the FS is
 * the same, without their further searches.
 */
function synced(s: Section): Section {
  const analysis = { ...s.analysis, requiredReinforcement: null };
  if (!s.cases || s.cases.length !== 1) return { ...s, analysis };
  const c = s.cases[0];
  const { water, materials, loads, reinforcement, seismic, crack } = s;
  const kind = c.kind === 'seismic' ? 'other' : c.kind;
  const one = {
    ...c,
    kind,
    earthquake: null,
    water,
    materials,
    loads,
    reinforcement,
    seismic,
    crack,
    analysis,
  };
  return { ...s, analysis, cases: [one] };
}

/** The critical FS of a case: the governing method, its FS and its surface (SI); FS null where none was found. */
export interface Critical {
  fs: number | null;
  method: MethodId | null;
  surface: ReportedSurface | null;
}

/**
 * A case's critical FS with its full analysis (the search where the case asks for one, every
 * method): the governing FS and the surface of the governing method.
 *
 * @example criticalOf(caseModels(section)[0].section).fs // → 1.215
 */
export function criticalOf(section: Section, options: AnalyzeOptions = {}): Critical {
  const r = analyzeSection(synced(section), options).cases[0];
  if (!r?.governing) return { fs: null, method: null, surface: null };
  const g = r.governing;
  const report = r.results.find((m) => m.method === g.method && m.converged);
  return { fs: g.fs, method: g.method, surface: report?.surface ?? null };
}

/** The FS of a case after some of its inputs changed: a function of the changed section. */
export type CaseFs = (section: Section) => number | null;

/**
 * The FS of the changed section on the case's deterministic critical surface with the
 * governing method. Where only materials and the seismic coefficients change (and there is no
 * reinforcement), the geometry prepared once is reused and only the materials' properties are
 * taken again. A case whose critical surface is no circle or polyline (an infinite slope, a
 * log spiral, a drawdown's stages) is analyzed in full with that method on that surface.
 */
export function fsOnSurface(base: Section, critical: Critical, targets: readonly Target[]): CaseFs {
  const method = critical.method;
  const sf = critical.surface;
  if (!method || !sf) return () => null;
  const isCase = (base.cases?.length ?? 0) > 0;
  const kind = isCase ? base.cases![0].kind : 'other';
  const onlyProperties =
    base.reinforcement.length === 0 &&
    targets.every((t) => t.kind === 'material' || t.kind === 'seismic');
  if (
    (sf.type === 'circle' || sf.type === 'polyline') &&
    kind !== 'rapid-drawdown' &&
    method !== 'log-spiral'
  ) {
    const surface: CircleSurface | PolylineSurface =
      sf.type === 'circle'
        ? { type: 'circle', center: sf.center, radius: sf.radius }
        : { type: 'polyline', points: sf.points };
    const slices = base.analysis.slices;
    const first = prepareSection(base);
    const names = Object.keys(base.materials);
    const prepare = (s: Section): PreparedSection => {
      if (!onlyProperties) return prepareSection(s);
      const materials = names.map((n) => s.materials[n]);
      return {
        ...first,
        section: s,
        materials,
        strata: stratumProperties(s, materials, first.normal.stratumMaterial),
        rules: strengthRules(materials),
      };
    };
    const entry = METHODS[method];
    // one workspace for every realisation: the slices are cut into its buffers, not copied out
    const ws = sliceWorkspace(first);
    return (s) => {
      const p = prepare(s);
      ws.prepared = p;
      if (cutSurface(ws, surface, slices) !== null) return null;
      const cut = slicedSurface(ws, false);
      // the method alone, without its report, where the strengths are fixed (as the report's own run)
      if ('run' in entry && !touchesRules(cut.slices, p.rules)) {
        const pivot = pivotOf(surface, cut.slices);
        const r = entry.run({ prepared: p, surface, cut, pivot }).result;
        return r.converged && Number.isFinite(r.fs) ? r.fs : null;
      }
      const rep = runOnSurface(method, p, surface, cut);
      return rep.converged && rep.fs !== null ? rep.fs : null;
    };
  }
  if (sf.type === 'plane' && method === 'infinite-slope') {
    return (s) => {
      const rep = runOnPlane(method, prepareSection(s));
      return rep.converged && rep.fs !== null ? rep.fs : null;
    };
  }
  // the rest: the full analysis of the governing method, on the critical circle where it is one
  return (s) => {
    const surface =
      sf.type === 'circle'
        ? { type: 'circle' as const, center: sf.center, radius: sf.radius }
        : s.analysis.surface;
    const analysis = { ...s.analysis, methods: [method], surface };
    const one: Section = { ...s, analysis, cases: isCase ? [{ ...s.cases![0], analysis }] : [] };
    return criticalOf(one).fs;
  };
}

/** The FS of the changed section with its critical surface searched again (every method; the least that governs). */
export function fsWithSearch(options: AnalyzeOptions = {}): CaseFs {
  return (s) => criticalOf(s, options).fs;
}
