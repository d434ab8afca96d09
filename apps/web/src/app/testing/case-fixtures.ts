/**
 * For specs only: listed sections of a batch with design cases, shaped as the API lists them
 * (SectionListItem.result with governingCase, ratio and cases), and the cases of a batch.
 */
import type { Batch, CaseKind, SectionListCase, SectionListItem } from '../batches/batch-types';
import { verdictOf } from '@scarpline/core/verdict';

/** A case with its governing FS against its required FS (no-slope when `flat`). */
export function aCase(
  name: string,
  kind: CaseKind,
  fs: number | null,
  requiredFs: number | null,
  flat = false,
): SectionListCase {
  return {
    name,
    kind,
    verdict: flat ? 'no-slope' : verdictOf(fs, requiredFs),
    governingMethod: fs === null ? null : 'spencer',
    governingFs: fs,
    requiredFs,
    ratio: flat || fs === null || requiredFs === null ? null : fs / requiredFs,
  };
}

/** The station's summary of its cases as the API gives it: the lowest FS / required governs. */
export function stationOf(
  id: number,
  station: number,
  cases: SectionListCase[],
  label = `1+${String(station - 1000).padStart(3, '0')}`,
): SectionListItem {
  const order = ['input-error', 'below', 'no-fs', 'no-requirement', 'meets', 'no-slope'];
  const worst = cases.reduce<SectionListCase['verdict']>(
    (w, c) => (order.indexOf(c.verdict) < order.indexOf(w) ? c.verdict : w),
    'no-slope',
  );
  const gov = cases
    .filter((c) => c.ratio !== null)
    .reduce<SectionListCase | null>((g, c) => (g === null || c.ratio! < g.ratio! ? c : g), null);
  // With no case to govern (no significant slope anywhere), the service sums the station up
  // by its first case.
  const summary = gov ?? cases[0] ?? null;
  return {
    id,
    key: `wcb-main@${station}`,
    station,
    stationLabel: label,
    title: `Main line, station ${station}`,
    units: 'si',
    status: 'done',
    run: 1,
    failReason: null,
    reviewState: 'pending',
    geometry: null,
    result: {
      verdict: worst,
      governingMethod: summary?.governingMethod ?? null,
      governingFs: summary?.governingFs ?? null,
      requiredFs: summary?.requiredFs ?? null,
      warnings: [],
      governingCase: gov?.name ?? null,
      ratio: gov?.ratio ?? null,
      cases,
    },
  };
}

export const CASE_NAMES = ['end of construction', 'long term', 'earthquake'];

/**
 * Four stations of the invented Wendlecombe corridor under three cases: 1+020 is below in
 * the end-of-construction case, 1+040 below in the long-term and the earthquake cases, 1+060
 * has no significant slope, 1+000 meets in every case.
 */
export const CASE_STATIONS: SectionListItem[] = [
  stationOf(1, 1000, [
    aCase('end of construction', 'end-of-construction', 1.52, 1.3),
    aCase('long term', 'long-term', 1.71, 1.5),
    aCase('earthquake', 'seismic', 1.18, 1.1),
  ]),
  stationOf(2, 1020, [
    aCase('end of construction', 'end-of-construction', 1.21, 1.3),
    aCase('long term', 'long-term', 1.62, 1.5),
    aCase('earthquake', 'seismic', 1.14, 1.1),
  ]),
  stationOf(3, 1040, [
    aCase('end of construction', 'end-of-construction', 1.4, 1.3),
    aCase('long term', 'long-term', 1.38, 1.5),
    aCase('earthquake', 'seismic', 1.02, 1.1),
  ]),
  stationOf(4, 1060, [
    aCase('end of construction', 'end-of-construction', 14.2, 1.3, true),
    aCase('long term', 'long-term', 15.9, 1.5, true),
    aCase('earthquake', 'seismic', 12.1, 1.1, true),
  ]),
];

/** Batch.cases and Batch.caseCounts of CASE_STATIONS. */
export function caseFields(): Pick<Batch, 'cases' | 'caseCounts'> {
  const caseCounts: NonNullable<Batch['caseCounts']> = {};
  for (const s of CASE_STATIONS) {
    for (const c of s.result?.cases ?? []) {
      const counts = (caseCounts[c.name] ??= {});
      counts[c.verdict] = (counts[c.verdict] ?? 0) + 1;
    }
  }
  return { cases: [...CASE_NAMES], caseCounts };
}
