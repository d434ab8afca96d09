import type { Statics } from './statics';
import type { MethodWarning } from './types';

/**
 * The mα check of Whitman & Bailey (1967): mα = cos α + sin α·tan φ′/F below 0.2 makes the
 * base normal force of Bishop-type methods unreliable (typically a steep surface at the toe).
 */
export function mAlphaWarning(st: Statics, F: number): MethodWarning[] {
  let small = 0;
  for (let i = 0; i < st.n; i++) if (st.cos[i] + (st.sin[i] * st.t[i]) / F < 0.2) small++;
  if (small === 0) return [];
  return [
    {
      code: 'm-alpha-small',
      message: `mα = cos α + sin α·tan φ′/F is below 0.2 in ${small} slice${small > 1 ? 's' : ''} (Whitman & Bailey 1967): the base normal force there is unreliable; the surface is probably too steep near its toe`,
    },
  ];
}
