import { GRID_LINE, INK, MUTED } from './palette';
import { svgElement, svgText } from './svg-element';
import type { Frame } from './types';

const label = (v: number): string => String(Number(v.toFixed(6)));

/**
 * The bottom axis of a frame: a line, ticks with values, light vertical grid lines across
 * the frame and the axis title (e.g. "x (m)"). `format` writes a tick value.
 *
 * @example axisBottom(frame, 'x (m)')
 */
export function axisBottom(
  f: Frame,
  title: string,
  format: (v: number) => string = label,
  count = Math.max(2, Math.round(f.width / 80)),
): string {
  const y0 = f.top + f.height;
  const parts: string[] = [];
  for (const t of f.x.ticks(count)) {
    const x = f.x(t);
    parts.push(svgElement('line', { x1: x, y1: f.top, x2: x, y2: y0, stroke: GRID_LINE }));
    parts.push(svgElement('line', { x1: x, y1: y0, x2: x, y2: y0 + 5, stroke: INK }));
    parts.push(svgText(x, y0 + 18, format(t), { 'text-anchor': 'middle', fill: INK }));
  }
  parts.push(svgElement('line', { x1: f.left, y1: y0, x2: f.left + f.width, y2: y0, stroke: INK }));
  parts.push(
    svgText(f.left + f.width / 2, y0 + 36, title, { 'text-anchor': 'middle', fill: MUTED }),
  );
  return svgElement('g', { class: 'axis axis-x', 'font-size': 11 }, parts);
}

/**
 * The left axis of a frame: ticks with values, light horizontal grid lines and the title
 * written upward (e.g. "elevation (m)").
 *
 * @example axisLeft(frame, 'elevation (m)')
 */
export function axisLeft(
  f: Frame,
  title: string,
  format: (v: number) => string = label,
  count = Math.max(2, Math.round(f.height / 60)),
): string {
  const parts: string[] = [];
  for (const t of f.y.ticks(count)) {
    const y = f.y(t);
    parts.push(
      svgElement('line', { x1: f.left, y1: y, x2: f.left + f.width, y2: y, stroke: GRID_LINE }),
    );
    parts.push(svgElement('line', { x1: f.left - 5, y1: y, x2: f.left, y2: y, stroke: INK }));
    parts.push(svgText(f.left - 8, y + 4, format(t), { 'text-anchor': 'end', fill: INK }));
  }
  parts.push(
    svgElement('line', { x1: f.left, y1: f.top, x2: f.left, y2: f.top + f.height, stroke: INK }),
  );
  const cx = f.left - 46;
  const cy = f.top + f.height / 2;
  parts.push(
    svgText(cx, cy, title, {
      'text-anchor': 'middle',
      fill: MUTED,
      transform: `rotate(-90 ${Math.round(cx)} ${Math.round(cy)})`,
    }),
  );
  return svgElement('g', { class: 'axis axis-y', 'font-size': 11 }, parts);
}
