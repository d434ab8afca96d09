import { yAt } from '../geometry/y-at';
import type { Point } from '../model/types';
import { boxIsClear, textWidth, type Box, type Obstacles } from './free-place';
import { INK, materialFill, rgbDistance } from './palette';
import type { DrawingModel } from './section-in-units';
import { clippedLineData, clippedPolygonData, plotRect } from './clip-rect';
import { svgElement, svgText } from './svg-element';
import { toPixels, type Frame } from './types';

/**
 * The fill of each material of a drawing, by its kind and strength (materialFill): the same
 * material has the same colour in every drawing. Where two materials of one drawing would look
 * alike, the later one is moved along its ramp until they differ.
 *
 * @example strataFills(model) // → { 'bank-clay': '#b5947a', sand: '#cfa95c', rock: '#a3a6aa' }
 */
export function strataFills(model: DrawingModel): Record<string, string> {
  const fills: Record<string, string> = {};
  for (const s of model.strata) {
    if (fills[s.material]) continue;
    let fill = materialFill(s.tint);
    if (!s.rigid) {
      const others = Object.values(fills);
      for (const shift of [0.2, -0.2, 0.4, -0.4]) {
        if (others.every((o) => rgbDistance(o, fill) >= 24)) break;
        fill = materialFill(s.tint, shift);
      }
    }
    fills[s.material] = fill;
  }
  return fills;
}

/** The bottom of stratum i: the next stratum's top, or a level line at yBottom for the last. */
function bottomOf(model: DrawingModel, i: number, yBottom: number): Point[] {
  const x0 = model.ground[0][0];
  const x1 = model.ground[model.ground.length - 1][0];
  return i + 1 < model.strata.length
    ? model.strata[i + 1].top
    : [
        [x0, yBottom],
        [x1, yBottom],
      ];
}

/**
 * The strata as filled polygons (each from its top down to the next stratum's top, the last
 * one down to `yBottom`), coloured by material, a rigid base hatched (pattern `#<ids>-hatch`),
 * and the ground line, all cut to the frame's plot area.
 *
 * @example strataShapes(model, frame, 10, 'sl')
 */
export function strataShapes(model: DrawingModel, s: Frame, yBottom: number, ids: string): string {
  const fills = strataFills(model);
  const r = plotRect(s);
  const polygons: string[] = [];
  model.strata.forEach((stratum, i) => {
    const ring = [...stratum.top, ...[...bottomOf(model, i, yBottom)].reverse()];
    const d = clippedPolygonData(toPixels(ring, s), r);
    if (!d) return;
    polygons.push(svgElement('path', { d, fill: fills[stratum.material], stroke: 'none' }));
    if (stratum.rigid)
      polygons.push(svgElement('path', { d, fill: `url(#${ids}-hatch)`, stroke: 'none' }));
    const top = clippedLineData(toPixels(stratum.top, s), r);
    if (i > 0 && top)
      polygons.push(
        svgElement('path', {
          d: top,
          fill: 'none',
          stroke: INK,
          'stroke-width': 0.8,
          'stroke-opacity': 0.55,
        }),
      );
  });
  const ground = svgElement('path', {
    d: clippedLineData(toPixels(model.ground, s), r),
    fill: 'none',
    stroke: INK,
    'stroke-width': 1.6,
  });
  return svgElement('g', { class: 'strata' }, [...polygons, ground]);
}

const FONT = 11;
const LINE = 13;
const clip = (text: string, most: number) =>
  text.length > most ? `${text.slice(0, most - 1).trimEnd()}…` : text;

/**
 * Each material's label, once, inside a stratum of it where the label keeps clear of the slip
 * surfaces, the sliding mass, the FS map and the other labels: the material's description from
 * the file (or its name when it has none) and, under it, its name and strength; only the first
 * line where two do not fit, only its name where that does not fit; none where nothing fits
 * (the legend names it). Written over a
 * white halo so that it reads on any fill. Returns the labels and the boxes they took.
 *
 * @example strataLabels(model, frame, 10, { lines: [critical], areas: [mass], boxes: [] })
 */
export function strataLabels(
  model: DrawingModel,
  frame: Frame,
  yBottom: number,
  obstacles: Obstacles,
): { svg: string; boxes: Box[] } {
  const x0 = Math.max(model.ground[0][0], frame.x.invert(frame.left));
  const x1 = Math.min(
    model.ground[model.ground.length - 1][0],
    frame.x.invert(frame.left + frame.width),
  );
  const taken: Box[] = [];
  const labels: string[] = [];
  const done = new Set<string>();
  model.strata.forEach((stratum, i) => {
    if (done.has(stratum.material)) return;
    const head = clip(stratum.description || stratum.material, 44);
    const detail = stratum.description
      ? `${stratum.material}: ${stratum.describe}`
      : stratum.describe;
    const bottom = bottomOf(model, i, yBottom);
    const options = [[head, clip(detail, 48)], [head]];
    if (head !== stratum.material) options.push([stratum.material]);
    for (const lines of options) {
      const w = textWidth(Math.max(...lines.map((l) => l.length)), FONT) + 8;
      const h = lines.length * LINE + 4;
      let best: { box: Box; score: number } | null = null;
      for (let k = 0; k <= 40; k++) {
        const cx = frame.x(x0 + ((x1 - x0) * k) / 40);
        if (cx - w / 2 < frame.left + 4 || cx + w / 2 > frame.left + frame.width - 4) continue;
        // the stratum's band under the whole width of the label
        let top = -Infinity;
        let bot = Infinity;
        for (let q = 0; q <= 4; q++) {
          const x = frame.x.invert(cx - w / 2 + (w * q) / 4);
          top = Math.max(top, frame.y(yAt(stratum.top, x)));
          bot = Math.min(bot, frame.y(yAt(bottom, x)));
        }
        top = Math.max(top, frame.top + 2);
        bot = Math.min(bot, frame.top + frame.height - 2);
        if (bot - top < h + 4) continue;
        for (const at of [0.5, 0.2, 0.8]) {
          const y0 = top + 2 + (bot - top - h - 4) * at;
          const box = { x0: cx - w / 2, y0, x1: cx + w / 2, y1: y0 + h };
          if (!boxIsClear(box, { ...obstacles, boxes: [...obstacles.boxes, ...taken] })) continue;
          // prefer a thick part of the stratum, its middle, and the middle of the drawing
          const score =
            Math.min(bot - top, 4 * h) -
            Math.abs(at - 0.5) * h -
            (Math.abs(cx - (frame.left + frame.width / 2)) / frame.width) * h;
          if (!best || score > best.score) best = { box, score };
        }
      }
      if (!best) continue;
      const { box } = best;
      const attrs = {
        'text-anchor': 'middle',
        fill: INK,
        stroke: '#ffffff',
        'stroke-width': 3,
        'stroke-linejoin': 'round',
        'paint-order': 'stroke',
        'font-size': FONT,
      };
      const cx = (box.x0 + box.x1) / 2;
      lines.forEach((text, j) =>
        labels.push(
          svgText(cx, box.y0 + 2 + LINE * (j + 1) - 3, text, {
            ...attrs,
            ...(j === 0 ? { 'font-weight': 600 } : { 'font-size': FONT - 1 }),
          }),
        ),
      );
      taken.push(box);
      done.add(stratum.material);
      break;
    }
  });
  return { svg: svgElement('g', { class: 'strata-labels' }, labels), boxes: taken };
}
