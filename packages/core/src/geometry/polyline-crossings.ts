import type { Polyline } from '../model/types';
import { yAt } from './y-at';

/**
 * x values where two polylines cross or touch inside [from, to], sorted. The difference of
 * two polylines is linear between the union of their vertices, so each crossing is exact.
 *
 * @example polylineCrossings([[0, 0], [10, 10]], [[0, 5], [10, 5]], 0, 10) // → [5]
 */
export function polylineCrossings(a: Polyline, b: Polyline, from: number, to: number): number[] {
  const xs: number[] = [from, to];
  for (const p of a) if (p[0] > from && p[0] < to) xs.push(p[0]);
  for (const p of b) if (p[0] > from && p[0] < to) xs.push(p[0]);
  xs.sort((u, v) => u - v);
  const out: number[] = [];
  let x0 = xs[0];
  let d0 = yAt(a, x0) - yAt(b, x0);
  if (d0 === 0) out.push(x0);
  for (let i = 1; i < xs.length; i++) {
    const x1 = xs[i];
    if (x1 === x0) continue;
    const d1 = yAt(a, x1) - yAt(b, x1);
    if (d1 === 0) out.push(x1);
    else if ((d0 < 0 && d1 > 0) || (d0 > 0 && d1 < 0)) out.push(x0 + ((x1 - x0) * d0) / (d0 - d1));
    x0 = x1;
    d0 = d1;
  }
  return out;
}
