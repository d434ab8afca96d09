import { fsColor, INK } from './palette';
import { svgElement } from './svg-element';
import type { GridReport as SearchGrid, SearchReport } from '../result';
import type { Scales } from './types';

/** The FS range a map's colours span: the least FS up to at most twice it (higher is clipped). */
export function fsMapDomain(map: NonNullable<SearchReport['map']>): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const row of map.fs)
    for (const v of row)
      if (v !== null && Number.isFinite(v)) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
  if (!Number.isFinite(lo)) return null;
  return [lo, Math.max(Math.min(hi, 2 * lo), lo + 1e-6)];
}

/** Where a value falls in a domain, 0 to 1 (clipped). */
export const fraction = (v: number, [lo, hi]: readonly [number, number]): number =>
  Math.min(1, Math.max(0, (v - lo) / (hi - lo)));

const half = (v: readonly number[], i: number): [number, number] => {
  const prev = i > 0 ? (v[i] - v[i - 1]) / 2 : i + 1 < v.length ? (v[i + 1] - v[i]) / 2 : 0.5;
  const next = i + 1 < v.length ? (v[i + 1] - v[i]) / 2 : prev;
  return [v[i] - prev, v[i] + next];
};

function gridOutline(g: SearchGrid, s: Scales, attrs: Record<string, string | number>): string {
  const [x0, x1] = [s.x(g.x[0]), s.x(g.x[1])];
  const [y0, y1] = [s.y(g.y[1]), s.y(g.y[0])];
  return svgElement('rect', {
    x: x0,
    y: y0,
    width: x1 - x0,
    height: y1 - y0,
    fill: 'none',
    ...attrs,
  });
}

/**
 * The FS map of a grid search: a cell around each circle centre coloured by the least FS
 * found there (the sequential ramp over `domain`; cells with no admissible circle left
 * blank), the final grid outlined, and the grids the search moved away from dotted.
 *
 * @example fsMapShape(result.search, scales, fsMapDomain(result.search.map))
 */
export function fsMapShape(
  search: SearchReport,
  s: Scales,
  domain: readonly [number, number],
): string {
  const parts: string[] = [];
  const map = search.map;
  if (map) {
    map.ys.forEach((_, j) => {
      const [ya, yb] = half(map.ys, j);
      map.xs.forEach((_, i) => {
        const v = map.fs[j]?.[i];
        if (v === null || v === undefined || !Number.isFinite(v)) return;
        const [xa, xb] = half(map.xs, i);
        parts.push(
          svgElement('rect', {
            x: s.x(xa),
            y: s.y(yb),
            width: s.x(xb) - s.x(xa),
            height: s.y(ya) - s.y(yb),
            fill: fsColor(fraction(v, domain)),
          }),
        );
      });
    });
  }
  for (const move of search.moves)
    parts.push(
      gridOutline(move.grid, s, { stroke: INK, 'stroke-opacity': 0.5, 'stroke-dasharray': '1 3' }),
    );
  if (search.grid) parts.push(gridOutline(search.grid, s, { stroke: INK, 'stroke-width': 0.8 }));
  return svgElement('g', { class: 'fs-map', 'fill-opacity': 0.85 }, parts);
}
