/** Probabilities and reliability indices in words and figures, for the studies and the batch page. */
import type { CountedProbability } from '@scarpline/core/result';
import type { ProbabilitySummary } from './study-types';

/** A probability to three significant figures (0 as 0), a dash when there is none. */
export function probabilityText(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '—';
  return p === 0 ? '0' : p.toPrecision(3);
}

/** A counted probability with its standard error, e.g. 0.0125 ± 0.00248. */
export function pText(c: CountedProbability | null | undefined): string {
  if (!c) return '—';
  return `${probabilityText(c.p)} ± ${probabilityText(c.standardError)}`;
}

/** β to two decimals, a dash when there is none. */
export function betaText(b: number | null | undefined): string {
  if (b === null || b === undefined || !Number.isFinite(b)) return '—';
  const s = b.toFixed(2);
  return s.startsWith('-') ? `−${s.slice(1)}` : s;
}

/** The case of a station with the greatest P(FS < 1) (the first of equals); null without any. */
export function worstCase(
  summaries: readonly ProbabilitySummary[] | null | undefined,
): ProbabilitySummary | null {
  let worst: ProbabilitySummary | null = null;
  for (const s of summaries ?? []) if (!worst || s.pFailure.p > worst.pFailure.p) worst = s;
  return worst;
}
