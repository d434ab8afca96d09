import { INK } from './palette';
import { svgElement, svgText, type Attributes } from './svg-element';
import { wrapText } from './wrap-text';

/** One legend entry: a swatch (a filled box, a line, a point mark or none) and its words. */
export interface LegendItem {
  swatch: 'box' | 'line' | 'mark' | 'none';
  style: Attributes;
  label: string;
  /** Smaller words under the label (e.g. a material's strength). */
  detail?: string;
}

const LABEL_CHARS = 36;
const DETAIL_CHARS = 42;

const rows = (item: LegendItem) => ({
  label: wrapText(item.label, LABEL_CHARS),
  detail: item.detail ? wrapText(item.detail, DETAIL_CHARS) : [],
});

/** The height a legend of these items takes, in pixels. */
export const legendHeight = (items: readonly LegendItem[]): number =>
  items.reduce((h, i) => {
    const r = rows(i);
    return h + 14 * r.label.length + 12 * r.detail.length + 5;
  }, 0);

/**
 * A legend: one entry per item, swatch then words (wrapped to the legend's width), from
 * (x, y) downward.
 *
 * @example legend([{ swatch: 'line', style: { stroke: '#d6246e' }, label: 'critical surface' }], 860, 80)
 */
export function legend(items: readonly LegendItem[], x: number, y: number): string {
  const parts: string[] = [];
  let row = y;
  for (const item of items) {
    const cy = row + 6;
    if (item.swatch === 'box')
      parts.push(
        svgElement('rect', {
          x,
          y: row,
          width: 18,
          height: 12,
          stroke: INK,
          'stroke-width': 0.5,
          ...item.style,
        }),
      );
    else if (item.swatch === 'line')
      parts.push(
        svgElement('line', { x1: x, y1: cy, x2: x + 18, y2: cy, fill: 'none', ...item.style }),
      );
    else if (item.swatch === 'mark')
      parts.push(
        svgElement('path', {
          d: `M${x + 4} ${cy}L${x + 14} ${cy}M${x + 9} ${cy - 5}L${x + 9} ${cy + 5}`,
          ...item.style,
        }),
      );
    const r = rows(item);
    let ty = cy + 4;
    for (const line of r.label) {
      parts.push(svgText(x + 26, ty, line, { fill: INK, 'font-size': 11 }));
      ty += 14;
    }
    ty -= 2;
    for (const line of r.detail) {
      parts.push(svgText(x + 26, ty, line, { fill: INK, 'font-size': 10, 'fill-opacity': 0.75 }));
      ty += 12;
    }
    row += 14 * r.label.length + 12 * r.detail.length + 5;
  }
  return svgElement('g', { class: 'legend' }, parts);
}
