import type { RequiredReinforcementReport } from './reinforcement/types';
/**
 * A station's result from the results of its design cases: each case's governing FS over the
 * methods that govern it, its ratio to the required FS and its verdict; the governing case
 * (the lowest FS / required FS, or the largest displacement / allowable); the station's
 * verdict (it meets the requirement only when every case does); and the station that has no
 * significant slope said in words rather than as a meaningless large FS.
 */
import { CAUTION } from './caution';
import type { DesignCase, MethodId, Section } from './model/types';
import type {
  CaseResult,
  DrawdownReport,
  MethodReport,
  SectionResult,
  SeismicReport,
  StationResult,
  Warning,
} from './result';

/** What the analysis of one design case gives: its methods (analyzeCase), and the reports of its kind. */
export interface CaseAnalysis {
  spec: DesignCase;
  result: SectionResult;
  seismic?: SeismicReport;
  drawdown?: DrawdownReport;
  /** Warnings of the kind's own analysis (the yield coefficient's, the drawdown's). */
  warnings?: Warning[];
  /** The extra reinforcement at which the case meets its requirement, where asked and below it. */
  requiredReinforcement?: RequiredReinforcementReport;
}
import { type Verdict, verdictOf } from './verdict';

/**
 * Relief below which a section's ground has no significant slope (SI, m): half a metre over
 * the whole section, about a kerb's height — no slip surface there is a stability question
 * (common practice: a threshold of judgement, not of any code).
 */
export const MIN_RELIEF = 0.5;

/**
 * A governing FS above which the slope is reported as having no significant slope rather
 * than as a number, when every case of the station is above it: the search's least FS above 10
 * says the ground is too flat, or too strong, for any slip surface to matter (common practice).
 */
export const FS_CAP = 10;

/**
 * The lowest FS among the methods that converged (of those named, when `among` is given).
 *
 * @example lowestFs(result.results, ['spencer']) // → { method: 'spencer', fs: 1.42 }
 */
export function lowestFs(
  results: readonly MethodReport[],
  among: readonly MethodId[] | null = null,
): { method: MethodId; fs: number } | null {
  let best: { method: MethodId; fs: number } | null = null;
  for (const m of results) {
    if (among !== null && !among.includes(m.method)) continue;
    if (!m.converged || m.fs === null) continue;
    if (best === null || m.fs < best.fs) best = { method: m.method, fs: m.fs };
  }
  return best;
}

/**
 * The governing FS of a case over the methods that govern it (all methods asked when the case
 * does not say); the infinite slope that stands for circles in cohesionless soil always governs.
 */
export function governingOf(
  r: SectionResult,
  governs: MethodId[] | null,
): { method: MethodId; fs: number } | null {
  if (
    r.governing?.method === 'infinite-slope' &&
    r.warnings.some((w) => w.code === 'cohesionless-circle')
  )
    return r.governing;
  return governs === null ? r.governing : lowestFs(r.results, governs);
}

/** Verdicts a station can have, from the worst: one failing case makes the station fail. */
const STATION_ORDER: readonly Verdict[] = [
  'input-error',
  'below',
  'no-fs',
  'no-requirement',
  'meets',
  'no-slope',
];

/** The station's verdict from its cases' verdicts: the worst of them. */
export function stationVerdict(verdicts: readonly Verdict[]): Verdict {
  let worst: Verdict = 'no-slope';
  for (const v of verdicts) if (STATION_ORDER.indexOf(v) < STATION_ORDER.indexOf(worst)) worst = v;
  return verdicts.length === 0 ? 'no-fs' : worst;
}

/** Height of the ground's highest point above its lowest (SI). */
function relief(section: Section): number {
  const ys = section.ground.map((p) => p[1]);
  return Math.max(...ys) - Math.min(...ys);
}

/** One case's result from its analysis (analyzeCase and its kind's reports) and its settings. */
function caseResultOf(a: CaseAnalysis, flat: boolean, strong: boolean): CaseResult {
  const { spec, result: r } = a;
  const governing = governingOf(r, spec.governs);
  const warnings: Warning[] = [...r.warnings, ...(a.warnings ?? [])];
  let verdict = verdictOf(governing?.fs ?? null, spec.requiredFs);
  // a seismic case with an allowable displacement meets it only within it
  if (a.seismic?.within === false && verdict === 'meets') verdict = 'below';
  if (flat || strong) {
    verdict = 'no-slope';
    warnings.push({
      code: 'no-significant-slope',
      message: flat
        ? `no significant slope: the ground rises less than ${MIN_RELIEF} m (1.6 ft) across the section`
        : `no significant slope: the least factor of safety of every case is above ${FS_CAP}${governing ? ` (here ${governing.fs.toFixed(1)})` : ''}`,
    });
  }
  return {
    name: spec.name,
    kind: spec.kind,
    requiredFs: spec.requiredFs,
    governs: spec.governs ?? r.results.map((m) => m.method),
    results: r.results,
    governing,
    ratio:
      governing !== null && spec.requiredFs !== null && verdict !== 'no-slope'
        ? governing.fs / spec.requiredFs
        : null,
    verdict,
    warnings,
    search: r.search,
    ...(a.drawdown ? { drawdown: a.drawdown } : {}),
    ...(a.seismic ? { seismic: a.seismic } : {}),
    ...(a.requiredReinforcement ? { requiredReinforcement: a.requiredReinforcement } : {}),
  };
}

/**
 * The station's result from each case's analysis, in the order the cases are listed. The
 * governing case is the one with the lowest FS / required FS, or allowable / largest median
 * displacement where a seismic case's is lower (cases without a requirement compared by FS,
 * after those with one); its FS, method and ratio are the station's.
 *
 * @example stationResult(section, [{ spec, result }], '0.1.0').verdict // → 'meets'
 */
export function stationResult(
  section: Section,
  cases: readonly CaseAnalysis[],
  solverVersion: string,
): StationResult {
  const flat = relief(section) < MIN_RELIEF;
  // the ground decides, so every case says the same: no case may fail or govern on a slope that
  // another case (a seismic coefficient, a water level) shows to be a real one
  const fsOf = (a: CaseAnalysis) => governingOf(a.result, a.spec.governs)?.fs ?? null;
  const strong =
    cases.some((a) => fsOf(a) !== null) &&
    cases.every((a) => {
      const fs = fsOf(a);
      return fs === null || fs > FS_CAP;
    });
  const results = cases.map((a) => caseResultOf(a, flat, strong));
  // FS / required FS, or allowable / largest median displacement where that is lower
  const capacity = (c: CaseResult): number | null => {
    let x = c.ratio;
    const s = c.seismic;
    const d = s ? Math.max(0, ...s.displacements.map((e) => e.median)) : 0;
    if (s?.allowable && d > 0) x = Math.min(x ?? Infinity, s.allowable / d);
    return x;
  };
  const key = (c: CaseResult): [number, number] => {
    const x = capacity(c);
    return [x === null ? 1 : 0, x ?? c.governing!.fs];
  };
  let gov: CaseResult | null = null;
  for (const c of results) {
    if (c.governing === null || c.verdict === 'no-slope') continue;
    if (gov === null) gov = c;
    else {
      const [a, b] = [key(c), key(gov)];
      if (a[0] < b[0] || (a[0] === b[0] && a[1] < b[1])) gov = c;
    }
  }
  const first = cases[0]?.result;
  return {
    id: section.id,
    title: section.title,
    station: section.station,
    units: first?.units ?? section.units,
    cases: results,
    governing: gov
      ? {
          case: gov.name,
          method: gov.governing!.method,
          fs: gov.governing!.fs,
          requiredFs: gov.requiredFs,
          ratio: gov.ratio,
        }
      : null,
    verdict: stationVerdict(results.map((c) => c.verdict)),
    warnings: [],
    solverVersion,
    caution: CAUTION,
  };
}
