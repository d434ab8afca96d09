import { CAUTION } from '../caution';
import type { UnitSystem } from '../model/types';
import { VERDICT_WORDS } from '../verdict';
import {
  CHAINAGE_STYLE,
  chainageLayout,
  chainageMarker,
  clippedMarker,
  type ChainageMark,
  type ChainagePoint,
} from './chainage-layout';
import { INK } from './palette';
import { svgElement, svgText } from './svg-element';
import { cautionBlock, cautionLines, svgDocument } from './svg-document';

export type { ChainagePoint } from './chainage-layout';

export interface DrawChainageOptions {
  title?: string;
  units?: UnitSystem;
  width?: number;
  height?: number;
  caution?: string;
}

/** What each mark stands for, in the legend and on the web page. */
export const CHAINAGE_MARK_WORDS: Record<ChainageMark, string> = {
  meets: VERDICT_WORDS.meets,
  below: VERDICT_WORDS.below,
  'no-requirement': VERDICT_WORDS['no-requirement'],
  'no-fs': VERDICT_WORDS['no-fs'],
};

/**
 * The governing FS along the chainage as an SVG document, laid out by chainageLayout (the same
 * chart the web page draws): the stations' marks, the FS line, the required FS as a dashed step
 * line, chainage labels, the stations below their requirement labelled, a legend with the count
 * of each mark, the title and the caution.
 *
 * @example drawChainage([{ station: 1000, fs: 1.62, requiredFs: 1.5 }, …], { units: 'si' })
 */
export function drawChainage(
  points: readonly ChainagePoint[],
  options: DrawChainageOptions = {},
): string {
  const width = options.width ?? 1100;
  const plotH = options.height ?? 360;
  const units = options.units ?? 'si';
  const top = 96;
  const l = chainageLayout(points, {
    width,
    height: top + plotH + 46,
    units,
    margin: { left: 70, right: 40, top, bottom: 46 },
  });
  const { plot } = l;
  const parts: string[] = [];
  for (const t of l.yTicks) {
    parts.push(
      svgElement('line', {
        x1: plot.left,
        x2: plot.right,
        y1: t.y,
        y2: t.y,
        ...CHAINAGE_STYLE.grid,
      }),
      svgElement('line', {
        x1: plot.left - 5,
        x2: plot.left,
        y1: t.y,
        y2: t.y,
        ...CHAINAGE_STYLE.axis,
      }),
      svgText(plot.left - 8, t.y + 4, t.text, { 'text-anchor': 'end', ...CHAINAGE_STYLE.tick }),
    );
  }
  for (const t of l.xTicks) {
    parts.push(
      svgElement('line', {
        x1: t.x,
        x2: t.x,
        y1: plot.bottom,
        y2: plot.bottom + 5,
        ...CHAINAGE_STYLE.axis,
      }),
      svgText(t.x, plot.bottom + 18, t.text, { 'text-anchor': 'middle', ...CHAINAGE_STYLE.tick }),
    );
  }
  const L = units === 'us' ? 'ft' : 'm';
  parts.push(
    svgElement('line', {
      x1: plot.left,
      x2: plot.right,
      y1: plot.bottom,
      y2: plot.bottom,
      ...CHAINAGE_STYLE.axis,
    }),
    svgElement('line', {
      x1: plot.left,
      x2: plot.left,
      y1: plot.top,
      y2: plot.bottom,
      ...CHAINAGE_STYLE.axis,
    }),
    svgText((plot.left + plot.right) / 2, plot.bottom + 36, `chainage (${L})`, {
      'text-anchor': 'middle',
      ...CHAINAGE_STYLE.title,
    }),
    svgText(plot.left - 40, (plot.top + plot.bottom) / 2, 'factor of safety', {
      'text-anchor': 'middle',
      ...CHAINAGE_STYLE.title,
      transform: `rotate(-90 ${Math.round(plot.left - 40)} ${Math.round((plot.top + plot.bottom) / 2)})`,
    }),
  );
  if (l.requiredPath)
    parts.push(
      svgElement('path', { d: l.requiredPath, ...CHAINAGE_STYLE.required, class: 'required' }),
    );
  if (l.fsPath)
    parts.push(svgElement('path', { d: l.fsPath, ...CHAINAGE_STYLE.fsLine, class: 'fs-line' }));
  const counts: Record<ChainageMark, number> = {
    meets: 0,
    below: 0,
    'no-requirement': 0,
    'no-fs': 0,
  };
  let above = 0;
  for (const s of l.stations) {
    counts[s.mark]++;
    parts.push(
      svgElement('path', {
        d: chainageMarker(s.mark, s.x, s.y),
        ...CHAINAGE_STYLE[s.mark],
        class: s.mark,
      }),
    );
    if (s.clipped) {
      above++;
      parts.push(
        svgElement('path', {
          d: clippedMarker(s.x, s.y),
          ...CHAINAGE_STYLE.clipped,
          class: 'above',
        }),
      );
    }
    if (s.labelY !== null)
      parts.push(
        svgText(s.x, s.labelY, s.label, {
          'text-anchor': 'middle',
          ...CHAINAGE_STYLE.label,
          stroke: '#ffffff',
          'stroke-width': 3,
          'paint-order': 'stroke',
        }),
      );
  }
  // the legend: one row above the plot, a mark (with its count) or a line each
  const legend: string[] = [];
  let lx = plot.left;
  const ly = top - 22;
  const entry = (swatch: string, words: string) => {
    legend.push(swatch, svgText(lx + 24, ly + 4, words, { fill: INK, 'font-size': 11 }));
    lx += 24 + words.length * 6.1 + 22;
  };
  entry(
    svgElement('path', { d: `M${lx} ${ly}H${lx + 18}`, ...CHAINAGE_STYLE.required }),
    'required FS',
  );
  entry(
    svgElement('path', { d: `M${lx} ${ly}H${lx + 18}`, ...CHAINAGE_STYLE.fsLine }),
    'governing FS',
  );
  for (const mark of ['meets', 'below', 'no-requirement', 'no-fs'] as const) {
    if (mark !== 'meets' && mark !== 'below' && counts[mark] === 0) continue;
    entry(
      svgElement('path', { d: chainageMarker(mark, lx + 9, ly), ...CHAINAGE_STYLE[mark] }),
      `${CHAINAGE_MARK_WORDS[mark]} (${counts[mark]})`,
    );
  }
  if (above)
    entry(
      svgElement('path', { d: clippedMarker(lx + 9, ly + 9), ...CHAINAGE_STYLE.clipped }),
      `above ${l.yMax}, at the top edge (${above})`,
    );
  const title = options.title ?? 'Factor of safety along the chainage';
  const cautionTop = plot.bottom + 62;
  const caution = cautionLines(options.caution ?? CAUTION, width);
  const height = cautionTop + caution.length * 14 + 14;
  const body = [
    svgElement('rect', { width, height, fill: '#ffffff' }),
    svgText(24, 28, title, { 'font-size': 15, 'font-weight': 700, fill: INK }),
    svgElement('g', { class: 'legend' }, legend),
    ...parts,
    cautionBlock(caution, cautionTop),
  ];
  return svgDocument(width, height, title, body);
}
