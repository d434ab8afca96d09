import type { Point } from '../model/types';

/**
 * Signed area of a closed polygon by the shoelace formula (positive when the vertices run
 * counter-clockwise). The closing edge from the last vertex to the first is implied.
 *
 * @example polygonArea([[0, 0], [2, 0], [2, 1], [0, 1]]) // → 2
 */
export function polygonArea(polygon: readonly Point[]): number {
  let twice = 0;
  const n = polygon.length;
  for (let i = 0; i < n; i++) {
    const [x0, y0] = polygon[i];
    const [x1, y1] = polygon[(i + 1) % n];
    twice += x0 * y1 - x1 * y0;
  }
  return twice / 2;
}
