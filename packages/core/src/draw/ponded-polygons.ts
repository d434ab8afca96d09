import { yAt } from '../geometry/y-at';
import type { Point, Polyline } from '../model/types';

/**
 * The areas where a piezometric line stands above the ground (ponded water), as closed
 * polygons (water surface left to right, then the ground back), in section coordinates.
 *
 * @example pondedPolygons([[0, 0], [10, 0], [20, 5]], [[0, 2], [20, 2]]) // → one polygon from x = 0 to 14
 */
export function pondedPolygons(ground: Polyline, water: Polyline): Point[][] {
  const xs = [...new Set([...ground.map((p) => p[0]), ...water.map((p) => p[0])])]
    .filter((x) => x >= ground[0][0] && x <= ground[ground.length - 1][0])
    .sort((a, b) => a - b);
  const depth = (x: number) => yAt(water, x) - yAt(ground, x);
  // breakpoints with the crossings added
  const pts: number[] = [];
  for (let i = 0; i < xs.length; i++) {
    if (i > 0) {
      const a = depth(xs[i - 1]);
      const b = depth(xs[i]);
      if ((a > 0 && b < 0) || (a < 0 && b > 0))
        pts.push(xs[i - 1] + ((xs[i] - xs[i - 1]) * a) / (a - b));
    }
    pts.push(xs[i]);
  }
  const polygons: Point[][] = [];
  let run: number[] = [];
  const flush = () => {
    if (run.length >= 2) {
      const top = run.map((x): Point => [x, yAt(water, x)]);
      const bottom = run.map((x): Point => [x, yAt(ground, x)]).reverse();
      polygons.push([...top, ...bottom]);
    }
    run = [];
  };
  for (let i = 0; i < pts.length; i++) {
    const x = pts[i];
    const d = depth(x);
    if (d > 1e-9) run.push(x);
    else {
      // a crossing (or a touch) closes one run and may open the next
      if (run.length > 0) {
        run.push(x);
        flush();
      }
      const next = pts[i + 1];
      if (next !== undefined && depth(next) > 1e-9) run.push(x);
    }
  }
  flush();
  return polygons;
}
