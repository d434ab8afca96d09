import { fsColor, INK } from './palette';
import { niceStep } from './nice-ticks';
import { clippedLineData, clippedPolygonData, plotRect, type Rect } from './clip-rect';
import { svgElement } from './svg-element';
import type { GridReport as SearchGrid, SearchReport } from '../result';
import type { Frame } from './types';

type Map = NonNullable<SearchReport['map']>;

/**
 * The FS range a map's colours span: the least FS (of the map, or `least` when lower: the
 * polished critical circle's) up to at most twice it (higher is clipped).
 */
export function fsMapDomain(map: Map, least = Infinity): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const row of map.fs)
    for (const v of row)
      if (v !== null && Number.isFinite(v)) {
        lo = Math.min(lo, v);
        hi = Math.max(hi, v);
      }
  if (!Number.isFinite(lo)) return null;
  if (least > 0 && least < lo) lo = least;
  return [lo, Math.max(Math.min(hi, 2 * lo), lo + 1e-6)];
}

/** Where a value falls in a domain, 0 to 1 (clipped). */
export const fraction = (v: number, [lo, hi]: readonly [number, number]): number =>
  Math.min(1, Math.max(0, (v - lo) / (hi - lo)));

/**
 * The contour levels of a map over its domain: round values a tenth of the domain or a little
 * more apart, from the least FS (the first level) to the top of the domain (the last).
 *
 * @example fsMapLevels([1.52, 3.04]) // → [1.52, 1.6, 1.8, …, 3, 3.04]
 */
export function fsMapLevels(domain: readonly [number, number]): number[] {
  const [lo, hi] = domain;
  const step = niceStep((hi - lo) / 10);
  const levels = [lo];
  for (let v = (Math.floor(lo / step + 1e-9) + 1) * step; v < hi - 1e-9; v += step)
    if (v - levels[levels.length - 1] > 0.25 * step) levels.push(Number(v.toPrecision(12)));
  levels.push(hi);
  return levels;
}

/** The colour of band k of the levels (from levels[k] up): the ramp at the band's middle, the lowest band the darkest. */
export function bandColour(
  levels: readonly number[],
  k: number,
  domain: readonly [number, number],
): string {
  if (k === 0) return fsColor(0);
  if (k + 2 >= levels.length) return fsColor(1);
  return fsColor(fraction((levels[k] + levels[k + 1]) / 2, domain));
}

type P = [number, number, number];

/** The part of a triangle (x, y, value at its corners) where lo ≤ value ≤ hi: a convex polygon. */
function clipTriangle(tri: readonly P[], lo: number, hi: number): P[] {
  const clip = (poly: P[], keep: (v: number) => boolean, level: number): P[] => {
    const out: P[] = [];
    for (let i = 0; i < poly.length; i++) {
      const a = poly[i];
      const b = poly[(i + 1) % poly.length];
      const ka = keep(a[2]);
      if (ka) out.push(a);
      if (ka !== keep(b[2])) {
        const t = (level - a[2]) / (b[2] - a[2]);
        out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), level]);
      }
    }
    return out;
  };
  let poly = clip([...tri], (v) => v >= lo, lo);
  if (poly.length >= 3 && Number.isFinite(hi)) poly = clip(poly, (v) => v <= hi, hi);
  let area = 0;
  for (let i = 0; i < poly.length; i++) {
    const [a, b] = [poly[i], poly[(i + 1) % poly.length]];
    area += a[0] * b[1] - b[0] * a[1];
  }
  // a sliver where the triangle only touches the band is left out
  return poly.length >= 3 && Math.abs(area) > 0.02 ? poly : [];
}

/**
 * The FS map of a grid search as filled contours: the least FS at each circle centre,
 * interpolated linearly over the two triangles of each cell of four centres (a triangle with a
 * centre without an admissible circle is left blank), filled band by band between the levels
 * (fsMapLevels) with the colour of the band's middle; the map's own extent outlined (it spans
 * exactly the centres searched), and the grids the search moved away from dotted.
 *
 * @example fsMapShape(result.search, scales, fsMapDomain(result.search.map))
 */
export function fsMapShape(
  search: SearchReport,
  s: Frame,
  domain: readonly [number, number],
): string {
  const parts: string[] = [];
  const r = plotRect(s);
  const map = search.map;
  for (const move of search.moves)
    parts.push(
      gridOutline(move.grid, s, r, {
        stroke: INK,
        'stroke-opacity': 0.5,
        'stroke-dasharray': '1 3',
      }),
    );
  if (map && map.xs.length > 1 && map.ys.length > 1) {
    const levels = fsMapLevels(domain);
    // a band from each level to the next; the top band takes everything above the domain too
    const bands = levels.slice(0, -1).map((lo, k) => ({
      lo,
      hi: k + 2 < levels.length ? levels[k + 1] : Infinity,
      d: '',
    }));
    const at = (i: number, j: number): P | null => {
      const v = map.fs[j]?.[i];
      return v === null || v === undefined || !Number.isFinite(v)
        ? null
        : [s.x(map.xs[i]), s.y(map.ys[j]), v];
    };
    for (let j = 0; j + 1 < map.ys.length; j++)
      for (let i = 0; i + 1 < map.xs.length; i++) {
        const [a, b, c, d] = [at(i, j), at(i + 1, j), at(i + 1, j + 1), at(i, j + 1)];
        // the diagonal that keeps a triangle when one corner has no value
        const tris: (P | null)[][] =
          !a || !c
            ? [
                [a, b, d],
                [b, c, d],
              ]
            : [
                [a, b, c],
                [a, c, d],
              ];
        for (const tri of tris) {
          if (tri.some((p) => p === null)) continue;
          for (const band of bands) {
            const poly = clipTriangle(tri as P[], band.lo, band.hi);
            if (poly.length)
              band.d += clippedPolygonData(
                poly.map((p) => [p[0], p[1]] as [number, number]),
                r,
              );
          }
        }
      }
    bands.forEach((band, k) => {
      if (!band.d) return;
      const colour = bandColour(levels, k, domain);
      // a hairline of the same colour closes the seams between the triangles
      parts.push(
        svgElement('path', {
          d: band.d,
          fill: colour,
          stroke: colour,
          'stroke-width': 0.6,
          'stroke-linejoin': 'round',
        }),
      );
    });
    const [x0, x1] = [s.x(map.xs[0]), s.x(map.xs[map.xs.length - 1])];
    const [y0, y1] = [s.y(map.ys[map.ys.length - 1]), s.y(map.ys[0])];
    parts.push(
      outline(x0, y0, x1, y1, r, {
        stroke: INK,
        'stroke-width': 0.8,
        class: 'fs-map-extent',
      }),
    );
  }
  // the group's opacity, not each path's: the seams' hairlines do not show through
  return svgElement('g', { class: 'fs-map', opacity: 0.9 }, parts);
}

/** The outline of a rectangle in pixels, its sides cut to the plot area ('' where none is in it). */
function outline(
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  r: Rect,
  attrs: Record<string, string | number>,
): string {
  const d = clippedLineData(
    [
      [x0, y0],
      [x1, y0],
      [x1, y1],
      [x0, y1],
      [x0, y0],
    ],
    r,
  );
  return d ? svgElement('path', { d, fill: 'none', ...attrs }) : '';
}

function gridOutline(
  g: SearchGrid,
  s: Frame,
  r: Rect,
  attrs: Record<string, string | number>,
): string {
  return outline(s.x(g.x[0]), s.y(g.y[1]), s.x(g.x[1]), s.y(g.y[0]), r, attrs);
}
