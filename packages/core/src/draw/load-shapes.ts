import { yAt } from '../geometry/y-at';
import { INK } from './palette';
import type { DrawingModel } from './section-in-units';
import { clippedLineData, insideRect, plotRect, type Rect } from './clip-rect';
import { svgElement, svgText } from './svg-element';
import type { Frame } from './types';

const ARROW = 34; // arrow length in pixels, whatever the magnitude: the label gives it
const fmt = (v: number) => String(Number(v.toPrecision(4)));

/** An arrow from (x1, y1) to its head at (x2, y2); none unless it lies, head and all, in the plot area. */
function arrow(x1: number, y1: number, x2: number, y2: number, r: Rect, ids: string): string {
  if (!insideRect([x1, y1], r) || !insideRect([x2, y2], r, 4)) return '';
  return svgElement('line', {
    x1,
    y1,
    x2,
    y2,
    stroke: INK,
    'stroke-width': 1.3,
    'marker-end': `url(#${ids}-arrow)`,
  });
}

/**
 * The loads as arrows on the ground: a strip surcharge as a row of downward arrows under a
 * bar, labelled with its pressure; a line load as one arrow at its inclination, labelled with
 * its force per unit run. Arrow heads use the marker `#<ids>-arrow`. What falls outside the
 * frame's plot area is cut (the bar) or left out (an arrow, a label).
 *
 * @example loadShapes(model, frame, 'sl')
 */
export function loadShapes(model: DrawingModel, s: Frame, ids: string): string {
  const parts: string[] = [];
  const r = plotRect(s);
  const label = (x: number, y: number, text: string) =>
    insideRect([x, y], r)
      ? svgText(x, y, text, { 'text-anchor': 'middle', 'font-size': 11, fill: INK })
      : '';
  const g = model.ground;
  for (const load of model.loads) {
    if (load.type === 'strip') {
      const px0 = s.x(load.from);
      const px1 = s.x(load.to);
      const n = Math.max(2, Math.round((px1 - px0) / 14) + 1);
      const tops: [number, number][] = [];
      for (let k = 0; k < n; k++) {
        const x = load.from + ((load.to - load.from) * k) / (n - 1);
        const px = s.x(x);
        const py = s.y(yAt(g, x));
        tops.push([px, py - ARROW]);
        parts.push(arrow(px, py - ARROW, px, py - 2, r, ids));
      }
      const bar = clippedLineData(tops, r);
      if (bar)
        parts.push(svgElement('path', { d: bar, fill: 'none', stroke: INK, 'stroke-width': 1.3 }));
      const top = Math.min(...tops.map((t) => t[1]));
      parts.push(label((px0 + px1) / 2, top - 5, `${fmt(load.pressure)} ${model.labels.pressure}`));
    } else {
      const px = s.x(load.x);
      const py = s.y(yAt(g, load.x));
      const a = (load.angle * Math.PI) / 180; // from the downward vertical, positive toward +x
      const sx = px - ARROW * 1.3 * Math.sin(a);
      const sy = py - ARROW * 1.3 * Math.cos(a);
      parts.push(arrow(sx, sy, px, py - 2, r, ids));
      parts.push(label(sx, sy - 5, `${fmt(load.force)} ${model.labels.forcePerLength}`));
    }
  }
  return parts.some(Boolean) ? svgElement('g', { class: 'loads' }, parts) : '';
}
