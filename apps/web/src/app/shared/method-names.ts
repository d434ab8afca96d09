import type { MethodId } from '@scarpline/core/model';

/** The methods by the names of the papers they come from. */
export const METHOD_NAMES: Record<MethodId, string> = {
  ordinary: 'Ordinary method of slices',
  bishop: "Bishop's simplified",
  janbu: "Janbu's simplified",
  spencer: "Spencer's method",
  'morgenstern-price': 'Morgenstern–Price',
  'phi-zero-circle': 'φ = 0 circle',
  'log-spiral': 'Log spiral',
  'infinite-slope': 'Infinite slope',
};

/** A method of analysis by its name; an unknown id as it is, a dash for none. */
export function methodName(id: string | null | undefined): string {
  if (!id) return '—';
  return METHOD_NAMES[id as MethodId] ?? id;
}
