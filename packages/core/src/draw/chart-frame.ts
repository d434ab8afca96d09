import { CAUTION } from '../caution';
import { axisBottom, axisLeft } from './axis';
import { niceTicks } from './nice-ticks';
import { INK } from './palette';
import { scaleLinear } from './scale-linear';
import { svgElement, svgText } from './svg-element';
import { cautionBlock, cautionLines, svgDocument } from './svg-document';
import type { Frame } from './types';

/** A plain chart's frame: its data ranges widened to round ticks, in a plot of the given size. */
export function chartFrame(
  x: [number, number],
  y: [number, number],
  width: number,
  height: number,
  margin = { left: 76, right: 60, top: 84, bottom: 56 },
): Frame {
  const round = ([lo, hi]: [number, number]): [number, number] => {
    if (!(hi > lo)) return [lo - 0.5, hi + 0.5];
    const t = niceTicks(lo, hi, 6);
    const step = t.length > 1 ? t[1] - t[0] : hi - lo;
    return [Math.floor(lo / step) * step, Math.ceil(hi / step) * step];
  };
  const [x0, x1] = round(x);
  const [y0, y1] = round(y);
  const w = width - margin.left - margin.right;
  const h = height - margin.top - margin.bottom;
  return {
    left: margin.left,
    top: margin.top,
    width: w,
    height: h,
    x: scaleLinear([x0, x1], [margin.left, margin.left + w]),
    y: scaleLinear([y0, y1], [margin.top + h, margin.top]),
  };
}

/** A legend row above the plot: each entry a swatch and its words. */
export function legendRow(
  entries: readonly { swatch: (x: number, y: number) => string; words: string }[],
  left: number,
  y: number,
): string {
  const parts: string[] = [];
  let x = left;
  for (const e of entries) {
    parts.push(e.swatch(x, y), svgText(x + 24, y + 4, e.words, { fill: INK, 'font-size': 11 }));
    x += 24 + e.words.length * 6.1 + 22;
  }
  return svgElement('g', { class: 'legend' }, parts);
}

/** A chart as an SVG document: white ground, title, subtitle, axes, the parts, and the caution below. */
export function chartDocument(
  f: Frame,
  width: number,
  title: string,
  subtitle: string,
  axes: { x: string; y: string },
  parts: readonly string[],
  caution = CAUTION,
): string {
  const cautionTop = f.top + f.height + 62;
  const lines = cautionLines(caution, width);
  const height = cautionTop + lines.length * 14 + 14;
  return svgDocument(width, height, title, [
    svgElement('rect', { width, height, fill: '#ffffff' }),
    svgText(24, 28, title, { 'font-size': 15, 'font-weight': 700, fill: INK }),
    svgText(24, 48, subtitle, { 'font-size': 12, fill: INK }),
    axisLeft(f, axes.y),
    axisBottom(f, axes.x),
    ...parts,
    cautionBlock(lines, cautionTop),
  ]);
}
