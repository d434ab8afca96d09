/** The words the batch pages use for the API's ids and states. */
import type { SectionListResult } from './batch-types';

/** true / false against the required FS; null when none is required or nothing was solved. */
export function passesOf(r: SectionListResult | null | undefined): boolean | null {
  if (!r) return null;
  if (r.passes !== undefined) return r.passes;
  return r.status === 'pass' ? true : r.status === 'fail' ? false : null;
}

/** Bytes as a reader wants them: 812 B, 14.2 kB, 3.1 MB. */
export function formatBytes(n: number): string {
  if (n < 1000) return `${n} B`;
  if (n < 1_000_000) return `${(n / 1000).toFixed(1)} kB`;
  return `${(n / 1_000_000).toFixed(1)} MB`;
}
