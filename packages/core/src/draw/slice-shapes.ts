import type { SliceReport } from '../result';
import { yAt } from '../geometry/y-at';
import type { Point, Polyline } from '../model/types';
import { INK } from './palette';
import { clipSegment, plotRect } from './clip-rect';
import { num, svgElement } from './svg-element';
import type { Frame } from './types';

/**
 * The slices of a method as thin vertical lines at their sides, from the slip surface (`base`)
 * up to the ground, cut to the frame's plot area.
 *
 * @example sliceShapes(governing.slices, governing.base, model.ground, frame)
 */
export function sliceShapes(
  slices: readonly SliceReport[],
  base: readonly Point[] | undefined,
  ground: Polyline,
  s: Frame,
): string {
  const r = plotRect(s);
  if (slices.length === 0 || !base || base.length < 2) return '';
  const line = [...base].sort((a, b) => a[0] - b[0]);
  const sides = slices.map((sl) => sl.x - sl.width / 2);
  const last = slices[slices.length - 1];
  sides.push(last.x + last.width / 2);
  let d = '';
  for (const x of sides) {
    const yb = s.y(yAt(line, x));
    const yt = s.y(yAt(ground, x));
    if (yb - yt <= 0.5) continue;
    const side = clipSegment([s.x(x), yt], [s.x(x), yb], r);
    if (side) d += `M${num(side[0][0])} ${num(side[0][1])}V${num(side[1][1])}`;
  }
  return d
    ? svgElement('path', {
        class: 'slices',
        d,
        stroke: INK,
        'stroke-width': 0.6,
        'stroke-opacity': 0.5,
      })
    : '';
}
