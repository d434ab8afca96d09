/** The words the batch pages use for the API's ids and states. */
import type { SectionListResult, UserRef } from './batch-types';

const METHODS: Record<string, string> = {
  ordinary: 'Ordinary (Fellenius)',
  bishop: 'Bishop simplified',
  janbu: 'Janbu simplified',
  spencer: 'Spencer',
  'morgenstern-price': 'Morgenstern–Price',
  'swedish-circle': 'φ = 0 circle',
  'log-spiral': 'Log spiral',
  'infinite-slope': 'Infinite slope',
};

/** A method of analysis by its authors' or its trade name. */
export function methodName(id: string | null | undefined): string {
  if (!id) return '—';
  return METHODS[id] ?? id;
}

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

/** A user by name, "(you)" after it for the signed-in user: "Evan Engineer (you)". */
export function userName(user: UserRef, me: number | null | undefined): string {
  return user.id === me ? `${user.name} (you)` : user.name;
}
