import { bandColour, fsMapLevels } from './fs-map-shape';
import { INK } from './palette';
import { svgElement, svgText } from './svg-element';

/**
 * A vertical colour bar for the FS map, in the map's own bands (fsMapLevels): one box a band
 * from `domain[0]` (bottom) to `domain[1]` (top) in the band's colour, each level written
 * beside it, a title, and "≥" on the top value when the map goes beyond it.
 *
 * @example colorBar(900, 300, 16, 160, [1.2, 2.4], 'FS', true)
 */
export function colorBar(
  x: number,
  y: number,
  width: number,
  height: number,
  domain: readonly [number, number],
  title: string,
  clipped: boolean,
): string {
  const [lo, hi] = domain;
  const at = (v: number) => y + height - ((v - lo) / (hi - lo)) * height;
  const levels = fsMapLevels(domain);
  const parts = [svgText(x, y - 10, title, { fill: INK, 'font-size': 11, 'font-weight': 600 })];
  levels.forEach((v, k) => {
    const top = k + 1 < levels.length ? at(levels[k + 1]) : y;
    if (k + 1 === levels.length) return;
    parts.push(
      svgElement('rect', {
        x,
        y: top,
        width,
        height: at(v) - top,
        fill: bandColour(levels, k, domain),
      }),
    );
  });
  parts.push(
    svgElement('rect', { x, y, width, height, fill: 'none', stroke: INK, 'stroke-width': 0.6 }),
  );
  let last = -Infinity;
  for (const t of [...levels].reverse()) {
    const ty = at(t);
    // every level that has room for its words (the top and the least always)
    if (t !== lo && t !== hi && (ty - last < 12 || at(lo) - ty < 12)) continue;
    last = ty;
    const text = `${t === hi && clipped ? '≥ ' : ''}${t.toFixed(2)}`;
    parts.push(
      svgElement('line', { x1: x + width, y1: ty, x2: x + width + 4, y2: ty, stroke: INK }),
    );
    parts.push(svgText(x + width + 7, ty + 4, text, { fill: INK, 'font-size': 10 }));
  }
  return svgElement('g', { class: 'color-bar' }, parts);
}
