/** Small helpers for the words the batch pages show. */
import type { SectionListItem, Verdict } from './batch-types';

/**
 * The verdict of a listed section: its current result's, `no-fs` when its job failed without
 * one, null while it has none yet.
 */
export function verdictOfItem(s: Pick<SectionListItem, 'status' | 'result'>): Verdict | null {
  if (s.result) return s.result.verdict;
  return s.status === 'failed' ? 'no-fs' : null;
}

/** Bytes as a reader wants them: 812 B, 14.2 kB, 3.1 MB. */
export function formatBytes(n: number): string {
  if (n < 1000) return `${n} B`;
  if (n < 1_000_000) return `${(n / 1000).toFixed(1)} kB`;
  return `${(n / 1_000_000).toFixed(1)} MB`;
}
