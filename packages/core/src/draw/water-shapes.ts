import { yAt } from '../geometry/y-at';
import { WATER_FILL, WATER_LINE } from './palette';
import { pondedPolygons } from './ponded-polygons';
import type { DrawingModel } from './section-in-units';
import { clippedLineData, clippedPolygonData, insideRect, plotRect } from './clip-rect';
import { svgElement } from './svg-element';
import { toPixels, type Frame } from './types';

/**
 * The piezometric line, the ponded water where it stands above the ground (filled), and the
 * water-table mark (an inverted triangle over short lines, as on geotechnical drawings) where
 * the line is below the ground, all cut to the frame's plot area. Nothing for ru or dry sections.
 *
 * @example waterShapes(model, frame)
 */
export function waterShapes(model: DrawingModel, s: Frame): string {
  const line = model.water.line;
  if (!line) return '';
  const r = plotRect(s);
  const parts: string[] = [];
  for (const polygon of pondedPolygons(model.ground, line)) {
    const d = clippedPolygonData(toPixels(polygon, s), r);
    if (!d) continue;
    parts.push(
      svgElement('path', {
        d,
        fill: WATER_FILL,
        'fill-opacity': 0.75,
        stroke: 'none',
      }),
    );
  }
  const x0 = model.ground[0][0];
  const x1 = model.ground[model.ground.length - 1][0];
  const visible = line.filter(([x]) => x >= x0 && x <= x1);
  const clipped = [
    [x0, yAt(line, x0)] as [number, number],
    ...visible,
    [x1, yAt(line, x1)] as [number, number],
  ];
  const d = clippedLineData(toPixels(clipped, s), r);
  if (d)
    parts.push(
      svgElement('path', {
        d,
        fill: 'none',
        stroke: WATER_LINE,
        'stroke-width': 1.4,
        'stroke-dasharray': '7 3',
      }),
    );
  // the mark: at the first of a few places where the line is below the ground
  for (const f of [0.8, 0.2, 0.5, 0.1, 0.9]) {
    const x = x0 + (x1 - x0) * f;
    const wy = yAt(line, x);
    if (wy >= yAt(model.ground, x)) continue;
    const px = s.x(x);
    const py = s.y(wy);
    if (!insideRect([px - 6, py - 9], r) || !insideRect([px + 6, py + 6], r)) continue;
    parts.push(
      svgElement('path', {
        d: `M${px - 6} ${py - 9}L${px + 6} ${py - 9}L${px} ${py - 1}Z`,
        fill: 'none',
        stroke: WATER_LINE,
        'stroke-width': 1.2,
      }),
      svgElement('path', {
        d: `M${px - 5} ${py + 3}L${px + 5} ${py + 3}M${px - 3} ${py + 6}L${px + 3} ${py + 6}`,
        stroke: WATER_LINE,
        'stroke-width': 1,
      }),
    );
    break;
  }
  return svgElement('g', { class: 'water' }, parts);
}
