import { yAt } from '../geometry/y-at';
import type { Point } from '../model/types';
import { INK, RIGID_FILL, strataColor } from './palette';
import type { DrawingModel } from './section-in-units';
import { pathData, svgElement, svgText } from './svg-element';
import { toPixels, type Scales } from './types';

/** Relative luminance (0 black to 1 white) of a #rrggbb colour. */
function luminance(hex: string): number {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const lin = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * lin[0] + 0.7152 * lin[1] + 0.0722 * lin[2];
}

/**
 * The fill of each material of a drawing, in order of first appearance from the top: the
 * strata ramp for soils, grey (hatched in the drawing) for a rigid base.
 *
 * @example strataFills(model) // → { fill: '#f1e6cc', clay: '#8a6f52', rock: '#a3a6aa' }
 */
export function strataFills(model: DrawingModel): Record<string, string> {
  const soils = [...new Set(model.strata.filter((s) => !s.rigid).map((s) => s.material))];
  const fills: Record<string, string> = {};
  soils.forEach((m, i) => (fills[m] = strataColor(i, soils.length)));
  for (const s of model.strata) if (s.rigid) fills[s.material] = RIGID_FILL;
  return fills;
}

/**
 * The strata as filled polygons (each from its top down to the next stratum's top, the last
 * one down to `yBottom`), a rigid base hatched (pattern `#<ids>-hatch`), and the ground line.
 *
 * @example strataShapes(model, scales, 10, 'sl')
 */
export function strataShapes(model: DrawingModel, s: Scales, yBottom: number, ids: string): string {
  const fills = strataFills(model);
  const x0 = model.ground[0][0];
  const x1 = model.ground[model.ground.length - 1][0];
  const polygons: string[] = [];
  model.strata.forEach((stratum, i) => {
    const top = stratum.top;
    const bottom: Point[] =
      i + 1 < model.strata.length
        ? model.strata[i + 1].top
        : [
            [x0, yBottom],
            [x1, yBottom],
          ];
    const ring = [...top, ...[...bottom].reverse()];
    const d = pathData(toPixels(ring, s), true);
    polygons.push(svgElement('path', { d, fill: fills[stratum.material], stroke: 'none' }));
    if (stratum.rigid)
      polygons.push(svgElement('path', { d, fill: `url(#${ids}-hatch)`, stroke: 'none' }));
    if (i > 0)
      polygons.push(
        svgElement('path', {
          d: pathData(toPixels(top, s)),
          fill: 'none',
          stroke: INK,
          'stroke-width': 0.8,
          'stroke-opacity': 0.55,
        }),
      );
  });
  const ground = svgElement('path', {
    d: pathData(toPixels(model.ground, s)),
    fill: 'none',
    stroke: INK,
    'stroke-width': 1.6,
  });
  return svgElement('g', { class: 'strata' }, [...polygons, ground]);
}

/**
 * Each stratum's material name and strength, written where the stratum is thickest in the
 * drawing (left out where it is thinner than a line of text).
 *
 * @example strataLabels(model, scales, 10)
 */
export function strataLabels(model: DrawingModel, s: Scales, yBottom: number): string {
  const x0 = model.ground[0][0];
  const x1 = model.ground[model.ground.length - 1][0];
  const labels: string[] = [];
  const fills = strataFills(model);
  model.strata.forEach((stratum, i) => {
    const top = stratum.top;
    const bottom: Point[] =
      i + 1 < model.strata.length
        ? model.strata[i + 1].top
        : [
            [x0, yBottom],
            [x1, yBottom],
          ];
    // the label where the stratum is thickest (in pixels), if it has room
    let best = { x: 0, thick: 0, mid: 0 };
    for (let k = 2; k <= 10; k++) {
      const x = x0 + ((x1 - x0) * k) / 12;
      const yt = yAt(top, x);
      const yb = yAt(bottom, x);
      const thick = s.y(yb) - s.y(yt);
      if (thick > best.thick) best = { x, thick, mid: (s.y(yt) + s.y(yb)) / 2 };
    }
    if (best.thick >= 15) {
      const two = best.thick >= 30 && stratum.describe;
      const fill = fills[stratum.material] ?? '#ffffff';
      const dark = luminance(fill) < 0.35;
      const attrs = { 'text-anchor': 'middle', fill: dark ? '#ffffff' : INK, 'font-size': 11 };
      labels.push(
        svgText(s.x(best.x), best.mid + (two ? -2 : 4), stratum.material, {
          ...attrs,
          'font-weight': 600,
        }),
      );
      if (two) labels.push(svgText(s.x(best.x), best.mid + 12, stratum.describe, attrs));
    }
  });
  return svgElement('g', { class: 'strata-labels' }, labels);
}
