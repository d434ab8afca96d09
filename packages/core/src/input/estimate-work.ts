import type { DesignCaseKind } from '../model/types';
import { isRecord } from './guards';

const count = (v: unknown, fallback: number) =>
  typeof v === 'number' && Number.isFinite(v) && v >= 0 ? v : fallback;

/**
 * An estimate of the slice evaluations a section's analysis asks for (see WorkMeter), from
 * its settings as written: the grid's centres × (radii + one touching circle per stratum
 * boundary) × (moves + 1), the ground ranges' points² × radii, the polishes, the
 * noncircular restarts (a Spencer evaluation counted as ten), each circle of `slices` slices
 * and the cuts at boundaries. An estimate from above for the search's own stages; the check
 * of a section refuses one that is above the bound.
 *
 * @example estimateWork({ slices: 30, surface: { type: 'auto' } }, 2) // → 595 600
 */
export function estimateWork(analysis: unknown, strata: number): number {
  const a = isRecord(analysis) ? analysis : {};
  const slices = count(a.slices, 30);
  const s = isRecord(a.surface) ? a.surface : { type: 'auto' };
  const type = s.type;
  if (type === 'circle' || type === 'polyline') return slices + 20;
  const searched = type === 'grid' || type === 'auto' || type === undefined;
  const ranges = type === 'ground-ranges' || type === 'auto' || type === undefined;
  const c = isRecord(s.centers) ? s.centers : {};
  const radii = isRecord(s.radii) ? s.radii : isRecord(s.tangents) ? s.tangents : {};
  const grid = searched
    ? count(c.nx, 10) *
      count(c.ny, 10) *
      (count(radii.count, 12) + strata) *
      (count(s.moves, 6) + 1)
    : 0;
  const points = count(s.points, 8);
  const ground = ranges ? points * points * count(s.radiusCount, 8) : 0;
  const noncircular =
    type === 'noncircular' || ((type === 'auto' || type === undefined) && s.noncircular === true)
      ? (count(s.restarts, 4) + 1) * 600 * 10
      : 0;
  const methods = Array.isArray(a.methods) ? a.methods.length : 1;
  const eachMethod = a.searchEachMethod === true ? methods * 300 * 3 : 0;
  const polish = 3 * 300 + strata * 200 + 300;
  return (grid + ground + noncircular + eachMethod + polish) * (slices + 20);
}

/**
 * The searches a design case of each kind is counted as, where more than one: a rapid drawdown
 * searches for the three-stage surface (up to three stages on each trial surface) and for the
 * fully drained drawdown beside it; a seismic case repeats the search at each step of the root
 * finding for its yield coefficient ky (about ten steps for most slopes; seismic/
 * yield-coefficient.ts allows 40). An allowance for the check of a file's settings, not a
 * bound: the analysis itself counts every slice evaluation against its work bound.
 */
export const CASE_SEARCHES: Readonly<Partial<Record<DesignCaseKind, number>>> = {
  'rapid-drawdown': 4,
  seismic: 12,
};

/**
 * An estimate of the slice evaluations of one design case: estimateWork for its settings (the
 * section's with the case's merged in), times the searches its kind runs (CASE_SEARCHES).
 *
 * @example estimateCaseWork({ slices: 30, surface: { type: 'auto' } }, 2, 'seismic') // → 12 × 595 600
 */
export function estimateCaseWork(analysis: unknown, strata: number, kind: unknown): number {
  const searches = typeof kind === 'string' ? (CASE_SEARCHES[kind as DesignCaseKind] ?? 1) : 1;
  return estimateWork(analysis, strata) * searches * (1 + requiredSearches(analysis));
}

/**
 * The further analyses of a required reinforcement, where asked (each a full one, counted as
 * one search): a force is doubled then bisected to 0.5 % (about 16 analyses for most slopes),
 * a number of layers bisected (log₂ of the most layers, plus one). An allowance, as above.
 */
export function requiredSearches(analysis: unknown): number {
  const req = isRecord(analysis) ? analysis.requiredReinforcement : undefined;
  if (!isRecord(req)) return 0;
  if (!isRecord(req.product)) return 16;
  return Math.ceil(Math.log2(count(req.maxLayers, 20))) + 1;
}

/**
 * How the work of the cases is counted, in words, for the message of a section that asks for
 * too much.
 *
 * @example caseWorkWords(['long-term', 'seismic']) // → 'a seismic case counts as 12 searches'
 */
export function caseWorkWords(kinds: readonly unknown[]): string {
  const words = Object.entries(CASE_SEARCHES)
    .filter(([kind]) => kinds.includes(kind))
    .map(([kind, n]) => `a ${kind} case counts as ${n} searches`);
  return words.join(', ');
}
