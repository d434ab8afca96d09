import { niceTicks } from './nice-ticks';

/** A linear map from a data domain to a pixel range, with its inverse and tick values. */
export interface LinearScale {
  (value: number): number;
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  invert(pixel: number): number;
  /** About `count` round tick values inside the domain (1, 2 or 5 times a power of ten apart). */
  ticks(count?: number): number[];
}

/**
 * A linear scale: `scaleLinear([0, 50], [60, 860])(25)` → 460. A zero-width domain maps
 * everything to the middle of the range.
 *
 * @example scaleLinear([0, 10], [100, 0])(2.5) // → 75 (a y axis: up is smaller pixels)
 */
export function scaleLinear(domain: [number, number], range: [number, number]): LinearScale {
  const [d0, d1] = domain;
  const [r0, r1] = range;
  const span = d1 - d0;
  const map = (v: number): number =>
    span === 0 ? (r0 + r1) / 2 : r0 + ((v - d0) / span) * (r1 - r0);
  const scale = map as LinearScale;
  Object.assign(scale, {
    domain: [d0, d1] as const,
    range: [r0, r1] as const,
    invert: (p: number) => (r1 === r0 ? d0 : d0 + ((p - r0) / (r1 - r0)) * span),
    ticks: (count = 8) => niceTicks(Math.min(d0, d1), Math.max(d0, d1), count),
  });
  return scale;
}
