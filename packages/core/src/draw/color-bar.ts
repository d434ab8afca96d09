import { fsColor, INK } from './palette';
import { niceTicks } from './nice-ticks';
import { svgElement, svgText } from './svg-element';

/**
 * A vertical colour bar for the FS map: the sequential ramp from `domain[0]` (bottom) to
 * `domain[1]` (top), ticks with values, a title, and "≥" on the top value when the map goes
 * beyond it. `ids` names the gradient.
 *
 * @example colorBar(900, 300, 16, 160, [1.2, 2.4], 'FS', true, 'sl')
 */
export function colorBar(
  x: number,
  y: number,
  width: number,
  height: number,
  domain: readonly [number, number],
  title: string,
  clipped: boolean,
  ids: string,
): string {
  const stops: string[] = [];
  for (let k = 0; k <= 10; k++)
    stops.push(svgElement('stop', { offset: `${k * 10}%`, 'stop-color': fsColor(k / 10) }));
  const gradient = svgElement(
    'linearGradient',
    { id: `${ids}-fs-ramp`, x1: 0, y1: 1, x2: 0, y2: 0 },
    stops,
  );
  const [lo, hi] = domain;
  const at = (v: number) => y + height - ((v - lo) / (hi - lo)) * height;
  const parts = [
    svgElement('defs', {}, [gradient]),
    svgText(x, y - 10, title, { fill: INK, 'font-size': 11, 'font-weight': 600 }),
    svgElement('rect', {
      x,
      y,
      width,
      height,
      fill: `url(#${ids}-fs-ramp)`,
      stroke: INK,
      'stroke-width': 0.6,
    }),
  ];
  const ticks = [
    lo,
    ...niceTicks(lo, hi, 4).filter((t) => at(t) > y + 10 && at(t) < y + height - 10),
    hi,
  ];
  for (const t of ticks) {
    const ty = at(t);
    const text = `${t === hi && clipped ? '≥ ' : ''}${t.toFixed(2)}`;
    parts.push(
      svgElement('line', { x1: x + width, y1: ty, x2: x + width + 4, y2: ty, stroke: INK }),
    );
    parts.push(svgText(x + width + 7, ty + 4, text, { fill: INK, 'font-size': 10 }));
  }
  return svgElement('g', { class: 'color-bar' }, parts);
}
