import type { SensitivityCase } from '../probability/types';
import { fsText } from '../verdict';
import { chartDocument, chartFrame, legendRow } from './chart-frame';
import { ACCENT, INK, MUTED, WATER_LINE } from './palette';
import { pathData, svgElement, svgText } from './svg-element';

export interface DrawSensitivityOptions {
  title?: string;
  width?: number;
  height?: number;
  caution?: string;
  /** The required FS, drawn as a dashed line where given. */
  requiredFs?: number | null;
}

/** Line shapes of the series: each variable its own dash (never colour alone), in ink shades. */
const DASHES = ['', '8 4', '3 3', '10 3 2 3', '1 4', '14 4', '6 2 2 2 2 2'];
const SHADES = [INK, WATER_LINE, ACCENT, MUTED, '#2f6b3a', '#7a360a', '#5b3d8f'];

const short = (v: number) => String(Number(v.toPrecision(4)));

/**
 * One-at-a-time sensitivity of one case as an SVG document: the FS as each variable moves
 * through its range (its 1st to 99th percentile, or its bounds) with the others at their
 * means; the x axis is the position in each variable's own range (0 to 1: the variables have
 * different units), each line labelled with its range; the required FS dashed; the caution.
 * Takes the result only.
 *
 * @example drawSensitivity(result.cases[0], { requiredFs: 1.5 })
 */
export function drawSensitivity(c: SensitivityCase, options: DrawSensitivityOptions = {}): string {
  const width = options.width ?? 900;
  const height = options.height ?? 460;
  const fs = c.series.flatMap((s) =>
    s.points.map((p) => p[1]).filter((v): v is number => v !== null),
  );
  const req = options.requiredFs ?? null;
  const lo = Math.min(...fs, req ?? Infinity, 1);
  const hi = Math.max(...fs, req ?? -Infinity, 1);
  const f = chartFrame([0, 1], [lo, hi], width, height, {
    left: 76,
    right: 24,
    top: 84 + 16 * c.series.length,
    bottom: 56,
  });
  const parts: string[] = [];
  const hline = (y: number, colour: string, dash: string, words: string) =>
    parts.push(
      svgElement('line', {
        x1: f.left,
        x2: f.left + f.width,
        y1: f.y(y),
        y2: f.y(y),
        stroke: colour,
        'stroke-dasharray': dash,
      }),
      svgText(f.left + f.width - 4, f.y(y) - 4, words, {
        'text-anchor': 'end',
        fill: colour,
        'font-size': 11,
      }),
    );
  hline(1, MUTED, '6 3', 'FS = 1');
  if (req !== null && req !== 1) hline(req, ACCENT, '2 3', `required ${fsText(req)}`);
  const legend: { swatch: (x: number, y: number) => string; words: string }[] = [];
  c.series.forEach((s, k) => {
    const stroke = SHADES[k % SHADES.length];
    const dash = DASHES[k % DASHES.length];
    const span = s.to - s.from || 1;
    // a gap where a value gave no FS
    let run: [number, number][] = [];
    const flush = () => {
      if (run.length > 1)
        parts.push(
          svgElement('path', {
            d: pathData(run),
            fill: 'none',
            stroke,
            'stroke-width': 1.8,
            'stroke-dasharray': dash || null,
            class: 'series',
          }),
        );
      run = [];
    };
    for (const [x, v] of s.points) {
      if (v === null) flush();
      else run.push([f.x((x - s.from) / span), f.y(v)]);
    }
    flush();
    legend.push({
      swatch: (x, y) =>
        svgElement('path', {
          d: `M${x} ${y}H${x + 18}`,
          stroke,
          'stroke-width': 1.8,
          'stroke-dasharray': dash || null,
        }),
      words: `${s.variable}: ${short(s.from)} … ${short(s.to)}`,
    });
  });
  // one legend entry a row: the ranges are long
  legend.forEach((e, k) => parts.push(legendRow([e], f.left, 72 + 16 * k)));
  const title = options.title ?? 'Sensitivity of the factor of safety, one variable at a time';
  const subtitle = `case ${c.case}: FS at the means ${c.fsAtMeans !== null ? fsText(c.fsAtMeans) : '–'}; each variable over its range, the others at their means`;
  return chartDocument(
    f,
    width,
    title,
    subtitle,
    { x: 'position in the variable’s range (0 = low end, 1 = high end)', y: 'factor of safety' },
    parts,
    options.caution,
  );
}

/**
 * A tornado chart of one case as an SVG document: for each variable (widest first) a bar from
 * the least to the greatest FS over its range, the FS at the means as a vertical line, the
 * range's ends written at the bar; the required FS dashed; the caution. Takes the result only.
 *
 * @example drawTornado(result.cases[0])
 */
export function drawTornado(c: SensitivityCase, options: DrawSensitivityOptions = {}): string {
  const width = options.width ?? 900;
  const rowH = 30;
  const rows = c.series.length;
  const height = options.height ?? 84 + 56 + Math.max(3, rows) * rowH;
  const fs = c.series.flatMap((s) => [s.fsLow, s.fsHigh]).filter((v): v is number => v !== null);
  const req = options.requiredFs ?? null;
  const lo = Math.min(...fs, c.fsAtMeans ?? Infinity, req ?? Infinity, 1);
  const hi = Math.max(...fs, c.fsAtMeans ?? -Infinity, req ?? -Infinity, 1);
  const f = chartFrame([lo, hi], [0, rows || 1], width, height, {
    left: 220,
    right: 40,
    top: 84,
    bottom: 56,
  });
  const parts: string[] = [];
  const bottom = f.top + f.height;
  c.series.forEach((s, k) => {
    const y = f.top + (k + 0.5) * (f.height / Math.max(1, rows));
    parts.push(
      svgText(f.left - 10, y + 4, s.variable, { 'text-anchor': 'end', fill: INK, 'font-size': 11 }),
    );
    if (s.fsLow === null || s.fsHigh === null) {
      parts.push(
        svgText(f.left + 6, y + 4, 'no FS over this range', { fill: MUTED, 'font-size': 11 }),
      );
      return;
    }
    const x1 = f.x(s.fsLow);
    const x2 = f.x(s.fsHigh);
    parts.push(
      svgElement('rect', {
        x: x1,
        y: y - 9,
        width: Math.max(1, x2 - x1),
        height: 18,
        fill: WATER_LINE,
        'fill-opacity': 0.6,
        class: 'bar',
      }),
      svgText(x1 - 4, y + 4, fsText(s.fsLow), { 'text-anchor': 'end', fill: INK, 'font-size': 10 }),
      svgText(x2 + 4, y + 4, fsText(s.fsHigh), { fill: INK, 'font-size': 10 }),
    );
  });
  const vline = (x: number, colour: string, dash: string, words: string, end = false) =>
    parts.push(
      svgElement('line', {
        x1: f.x(x),
        x2: f.x(x),
        y1: f.top,
        y2: bottom,
        stroke: colour,
        'stroke-width': 1.5,
        'stroke-dasharray': dash || null,
      }),
      svgText(f.x(x) + (end ? -4 : 4), f.top - 6, words, {
        fill: colour,
        'font-size': 11,
        'text-anchor': end ? 'end' : 'start',
      }),
    );
  if (c.fsAtMeans !== null)
    vline(
      c.fsAtMeans,
      INK,
      '',
      `at the means ${fsText(c.fsAtMeans)}`,
      req !== null && req > c.fsAtMeans,
    );
  if (req !== null)
    vline(req, ACCENT, '2 3', `required ${fsText(req)}`, f.x(req) > f.left + f.width / 2);
  const title = options.title ?? 'Tornado: the range of the factor of safety by variable';
  const subtitle = `case ${c.case}: each bar the least and greatest FS as one variable moves over its range (1st to 99th percentile, or its bounds), the others at their means`;
  // the y axis holds the names, not numbers: draw the chart without its left ticks
  const doc = chartDocument(
    f,
    width,
    title,
    subtitle,
    { x: 'factor of safety', y: '' },
    parts,
    options.caution,
  );
  return doc.replace(/<g class="axis axis-y"[\s\S]*?<\/g>/, '');
}
