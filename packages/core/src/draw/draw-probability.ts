import type { CaseProbability } from '../probability/types';
import { fsText } from '../verdict';
import { chartDocument, chartFrame, legendRow } from './chart-frame';
import { ACCENT, BELOW_REQUIRED, INK, MUTED, WATER_LINE } from './palette';
import { pathData, svgElement, svgText } from './svg-element';

export interface DrawProbabilityOptions {
  title?: string;
  width?: number;
  height?: number;
  caution?: string;
}

const pct = (p: number) => `${(100 * p).toPrecision(3)} %`;

/**
 * The distribution of FS of one case of a probabilistic analysis as an SVG document: the
 * histogram of the realisations (bars, left axis: share of the realisations), the empirical
 * CDF (a line, right axis 0 to 1), FS = 1 and the required FS as vertical lines, the counted
 * P(FS < 1) and β in the subtitle, and the caution. Takes the result only.
 *
 * @example drawProbability(result.cases[0], { title: 'Wendle flood bank 0+520' })
 */
export function drawProbability(c: CaseProbability, options: DrawProbabilityOptions = {}): string {
  const width = options.width ?? 900;
  const height = options.height ?? 460;
  const bins = c.histogram;
  const total = Math.max(1, c.valid);
  const lo = Math.min(bins[0]?.from ?? 0.5, 1);
  const hi = Math.max(bins[bins.length - 1]?.to ?? 1.5, c.requiredFs ?? 1, 1);
  const share = Math.max(0.01, ...bins.map((b) => b.count / total));
  const f = chartFrame([lo, hi], [0, share], width, height);
  const parts: string[] = [];
  const y0 = f.top + f.height;
  for (const b of bins) {
    if (b.count === 0) continue;
    const x1 = f.x(b.from);
    const x2 = f.x(b.to);
    const y = f.y(b.count / total);
    parts.push(
      svgElement('rect', {
        x: x1,
        y,
        width: Math.max(0.5, x2 - x1 - 0.5),
        height: y0 - y,
        fill: b.to <= 1 ? BELOW_REQUIRED : WATER_LINE,
        'fill-opacity': 0.55,
        class: 'bar',
      }),
    );
  }
  // the CDF on its own axis (0 to 1) at the right
  const cy = (p: number) => f.top + f.height * (1 - p);
  if (c.cdf.length > 0) {
    const pts: [number, number][] = c.cdf.map(([x, p]) => [f.x(x), cy(p)]);
    parts.push(
      svgElement('path', {
        d: pathData(pts),
        fill: 'none',
        stroke: INK,
        'stroke-width': 1.6,
        class: 'cdf',
      }),
    );
  }
  const right = f.left + f.width;
  for (const p of [0, 0.25, 0.5, 0.75, 1]) {
    parts.push(
      svgElement('line', { x1: right, x2: right + 5, y1: cy(p), y2: cy(p), stroke: INK }),
      svgText(right + 8, cy(p) + 4, String(p), { fill: INK, 'font-size': 11 }),
    );
  }
  parts.push(
    svgElement('line', { x1: right, x2: right, y1: f.top, y2: y0, stroke: INK }),
    svgText(right + 40, f.top + f.height / 2, 'P(FS ≤ x)', {
      'text-anchor': 'middle',
      fill: MUTED,
      'font-size': 11,
      transform: `rotate(90 ${Math.round(right + 40)} ${Math.round(f.top + f.height / 2)})`,
    }),
  );
  const vline = (x: number, colour: string, dash: string, words: string) =>
    parts.push(
      svgElement('line', {
        x1: f.x(x),
        x2: f.x(x),
        y1: f.top,
        y2: y0,
        stroke: colour,
        'stroke-width': 1.5,
        'stroke-dasharray': dash,
      }),
      svgText(f.x(x) + 4, f.top + 12, words, { fill: colour, 'font-size': 11 }),
    );
  vline(1, BELOW_REQUIRED, '6 3', 'FS = 1');
  if (c.requiredFs !== null && c.requiredFs !== 1)
    vline(c.requiredFs, ACCENT, '2 3', `required ${fsText(c.requiredFs)}`);
  const legend = legendRow(
    [
      {
        swatch: (x, y) =>
          svgElement('rect', {
            x,
            y: y - 6,
            width: 18,
            height: 12,
            fill: WATER_LINE,
            'fill-opacity': 0.55,
          }),
        words: 'share of realisations',
      },
      {
        swatch: (x, y) =>
          svgElement('rect', {
            x,
            y: y - 6,
            width: 18,
            height: 12,
            fill: BELOW_REQUIRED,
            'fill-opacity': 0.55,
          }),
        words: 'bins below FS = 1',
      },
      {
        swatch: (x, y) =>
          svgElement('path', { d: `M${x} ${y}H${x + 18}`, stroke: INK, 'stroke-width': 1.6 }),
        words: 'cumulative (right axis)',
      },
    ],
    f.left,
    68,
  );
  parts.push(legend);
  const beta =
    c.betaNormal.beta !== null
      ? `, β ${c.betaNormal.beta.toFixed(2)} (normal), ${c.betaLognormal.beta?.toFixed(2) ?? '–'} (lognormal)`
      : '';
  const subtitle = `case ${c.case}: ${c.valid} of ${c.realisations} realisations, mean FS ${c.meanFs !== null ? fsText(c.meanFs) : '–'}, SD ${c.sdFs?.toFixed(3) ?? '–'}, P(FS < 1) ${pct(c.pFailure.p)} ± ${pct(c.pFailure.standardError)}${beta}`;
  const title = options.title ?? 'Distribution of the factor of safety';
  return chartDocument(
    f,
    width,
    title,
    subtitle,
    { x: 'factor of safety', y: 'share of realisations' },
    parts,
    options.caution,
  );
}
