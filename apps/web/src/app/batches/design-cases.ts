/**
 * The design cases of a batch as its pages show them: which cases there are, and each
 * station's verdict in one case.
 */
import type { Batch, CaseKind, SectionListCase, SectionListItem, Verdict } from './batch-types';
import { verdictOfItem } from './words';

/** A case of the batch: its name, its kind (as its first station gives it). */
export interface BatchCase {
  name: string;
  kind: CaseKind | null;
}

/**
 * Every case of a batch, in the order the API lists them (Batch.cases), else in the order the
 * stations first name them. One case (or none) means the batch is shown as a single case is.
 */
export function batchCases(
  batch: Pick<Batch, 'cases'> | null,
  items: readonly SectionListItem[],
): BatchCase[] {
  const kinds = new Map<string, CaseKind>();
  const seen: string[] = [];
  for (const s of items) {
    for (const c of s.result?.cases ?? []) {
      if (!kinds.has(c.name)) {
        kinds.set(c.name, c.kind);
        seen.push(c.name);
      }
    }
  }
  const names = batch?.cases && batch.cases.length > 0 ? batch.cases : seen;
  return names.map((name) => ({ name, kind: kinds.get(name) ?? null }));
}

/** The case of that name of a listed section's result, or null. */
export function caseOfItem(
  s: Pick<SectionListItem, 'result'>,
  name: string,
): SectionListCase | null {
  return s.result?.cases?.find((c) => c.name === name) ?? null;
}

/** The sections with a verdict in the case of that name (the station's verdict when null). */
export function hasVerdict(
  s: Pick<SectionListItem, 'status' | 'result'>,
  verdict: Verdict,
  caseName: string | null,
): boolean {
  if (caseName === null) return verdictOfItem(s) === verdict;
  return caseOfItem(s, caseName)?.verdict === verdict;
}
