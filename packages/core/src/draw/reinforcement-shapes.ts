import { yAt } from '../geometry/y-at';
import type { Point, Polyline } from '../model/types';
import { limitWords } from '../reinforcement/limit-words';
import type { CrossingReport, ReinforcementReport } from '../reinforcement/types';
import { boxIsClear, textWidth, type Box, type Obstacles } from './free-place';
import type { LegendItem } from './legend';
import { REINFORCEMENT, REINFORCEMENT_TEXT } from './palette';
import type { DrawingModel, DrawingReinforcement } from './section-in-units';
import { clippedLineData, insideRect, plotRect, type Rect } from './clip-rect';
import { escapeXml, svgElement, svgText } from './svg-element';
import { toPixels, type Frame } from './types';

const ARROW = 30; // pixels, whatever the force: the label gives it
const FONT = 10.5;
const fmt = (v: number) => String(Number(v.toPrecision(3)));

/** The style of each kind of element: a line shape of its own, in the one reinforcement colour. */
const STYLE = {
  geosynthetic: { stroke: REINFORCEMENT, 'stroke-width': 2, 'stroke-dasharray': '9 2 2 2' },
  nail: { stroke: REINFORCEMENT, 'stroke-width': 2 },
  free: { stroke: REINFORCEMENT, 'stroke-width': 1.2 },
  bond: { stroke: REINFORCEMENT, 'stroke-width': 4.5, 'stroke-linecap': 'butt' },
  pile: { stroke: REINFORCEMENT, 'stroke-width': 3.5, 'stroke-dasharray': '14 3' },
} as const;

/** The far end of a bar from its head, `length` along its side and inclination below the horizontal. */
function along(head: Point, inclination: number, toward: 'left' | 'right', length: number): Point {
  const a = (inclination * Math.PI) / 180;
  const sx = toward === 'right' ? 1 : -1;
  return [head[0] + sx * length * Math.cos(a), head[1] - length * Math.sin(a)];
}

/** The points of an element in section coordinates (for the drawing's extent). */
export function reinforcementPoints(r: DrawingReinforcement, ground: Polyline): Point[] {
  switch (r.type) {
    case 'geosynthetic':
      return r.line;
    case 'nail':
      return [r.head, along(r.head, r.inclination, r.toward, r.length)];
    case 'anchor':
      return [r.head, along(r.head, r.inclination, r.toward, r.freeLength + r.bondLength)];
    case 'pile':
      return [
        [r.x, r.top ?? yAt(ground, r.x)],
        [r.x, r.bottom],
      ];
  }
}

/** A small square plate at a head (a nail's facing, an anchor's head), in pixels; none outside the plot area. */
function plate(p: [number, number], r: Rect): string {
  if (!insideRect(p, r, 3)) return '';
  return svgElement('rect', {
    x: p[0] - 3,
    y: p[1] - 3,
    width: 6,
    height: 6,
    fill: REINFORCEMENT,
  });
}

/** One element drawn: a layer as its line, a nail or an anchor as its bar from the head (an anchor's bond length thick), a pile as its line. */
function elementShape(r: DrawingReinforcement, ground: Polyline, s: Frame): string {
  const area = plotRect(s);
  const px = (pts: readonly Point[]) => toPixels(pts, s);
  const cut = (pts: readonly Point[]) => clippedLineData(px(pts), area);
  const line = (pts: readonly Point[], style: Record<string, string | number>) =>
    cut(pts) ? svgElement('path', { d: cut(pts), fill: 'none', ...style }) : '';
  const title = svgElement('title', {}, [escapeXml(r.name)]);
  switch (r.type) {
    case 'geosynthetic':
      return svgElement('g', { 'data-element': r.type }, [title, line(r.line, STYLE.geosynthetic)]);
    case 'nail': {
      const end = along(r.head, r.inclination, r.toward, r.length);
      return svgElement('g', { 'data-element': r.type }, [
        title,
        line([r.head, end], STYLE.nail),
        plate(px([r.head])[0], area),
      ]);
    }
    case 'anchor': {
      const bondStart = along(r.head, r.inclination, r.toward, r.freeLength);
      const end = along(r.head, r.inclination, r.toward, r.freeLength + r.bondLength);
      return svgElement('g', { 'data-element': r.type }, [
        title,
        line([r.head, bondStart], STYLE.free),
        cut([bondStart, end])
          ? svgElement('path', {
              d: cut([bondStart, end]),
              fill: 'none',
              'data-part': 'bond',
              ...STYLE.bond,
            })
          : '',
        plate(px([r.head])[0], area),
      ]);
    }
    case 'pile':
      return svgElement('g', { 'data-element': r.type }, [
        title,
        line(reinforcementPoints(r, ground), STYLE.pile),
      ]);
  }
}

/** A box of w × h at `at`, moved the least it takes to lie in the plot area where it fits. */
function intoArea(at: [number, number], w: number, h: number, r: Rect): Box {
  const x0 = Math.max(r.x0 + 1, Math.min(at[0], r.x1 - 1 - w));
  const y0 = Math.max(r.y0 + 1, Math.min(at[1], r.y1 - 1 - h));
  return { x0, y0, x1: x0 + w, y1: y0 + h };
}

/** The label of a crossing's force: its value per unit run and what limits it. */
export function crossingLabel(
  c: CrossingReport,
  type: ReinforcementReport['type'],
  forceUnit: string,
): string {
  return `${fmt(c.force)} ${forceUnit}, ${limitWords(c.mode, type)}`;
}

/**
 * The reinforcement on the section: every element (a geosynthetic as its line, a nail as its
 * bar from the head plate, an anchor's free length thin and its bond length thick, a pile as
 * its line), and where the governing method's critical surface crosses one and it carries a
 * force, an arrow in the force's direction on the sliding mass labelled with the force (per
 * unit run, in the equilibrium) and what limits it; crossings that carry nothing are not
 * marked. Lines are cut to the plot area; a plate or an arrow not wholly inside it is left out,
 * and a label is moved into it. Labels are placed clear of the surfaces and of each other where
 * they can be; their boxes are returned so that other words keep clear of them. Arrow heads use
 * `#<ids>-rarrow`.
 *
 * @example reinforcementShapes(model, governing.reinforcement, frame, obstacles, 'sl')
 */
export function reinforcementShapes(
  model: DrawingModel,
  reports: readonly ReinforcementReport[] | undefined,
  s: Frame,
  obstacles: Obstacles,
  ids: string,
): { svg: string; labels: string; boxes: Box[] } {
  const area = plotRect(s);
  if (model.reinforcement.length === 0) return { svg: '', labels: '', boxes: [] };
  const elements = model.reinforcement.map((r) => elementShape(r, model.ground, s));
  const arrows: string[] = [];
  const labels: string[] = [];
  const boxes: Box[] = [];
  for (const e of reports ?? []) {
    for (const c of e.crossings) {
      if (!c.counted || !(c.force > 0)) continue;
      const [x, y] = [s.x(c.at[0]), s.y(c.at[1])];
      const a = (c.direction * Math.PI) / 180;
      const [dx, dy] = [Math.cos(a), -Math.sin(a)];
      const tip: [number, number] = [x + ARROW * dx, y + ARROW * dy];
      // an arrow, with its head, wholly in the plot area or not at all
      if (!insideRect([x, y], area, 3) || !insideRect(tip, area, 5)) continue;
      arrows.push(
        svgElement('circle', { cx: x, cy: y, r: 2.5, fill: REINFORCEMENT }),
        svgElement('line', {
          x1: x,
          y1: y,
          x2: tip[0],
          y2: tip[1],
          stroke: REINFORCEMENT,
          'stroke-width': 1.6,
          'marker-end': `url(#${ids}-rarrow)`,
        }),
      );
      const text = crossingLabel(c, e.type, model.labels.forcePerLength);
      const w = textWidth(text.length, FONT);
      const h = FONT + 3;
      // beyond the tip first, then beside it; the first place clear of lines and other labels
      const places: [number, number][] = [
        [tip[0] + (dx >= 0 ? 4 : -4 - w), tip[1] - h / 2 + dy * 6],
        [tip[0] - w / 2, tip[1] + (dy >= 0 ? 6 : -6 - h)],
        [tip[0] - w / 2, tip[1] + (dy >= 0 ? -6 - h : 6)],
        [tip[0] + (dx >= 0 ? -4 - w : 4), tip[1] - h / 2],
      ];
      const near: Obstacles = {
        lines: obstacles.lines,
        areas: [],
        boxes: [...boxes, ...obstacles.boxes],
      };
      const inArea = (b: Box) => insideRect([b.x0, b.y0], area) && insideRect([b.x1, b.y1], area);
      const box =
        places
          .map(([bx, by]): Box => ({ x0: bx, y0: by, x1: bx + w, y1: by + h }))
          .find((b) => inArea(b) && boxIsClear(b, near)) ?? intoArea(places[0], w, h, area);
      boxes.push(box);
      if (!inArea(box)) continue; // wider or taller than the plot area
      labels.push(
        svgText(box.x0, box.y1 - 3, text, {
          'font-size': FONT,
          fill: REINFORCEMENT_TEXT,
          stroke: '#ffffff',
          'stroke-width': 3,
          'paint-order': 'stroke',
          'data-crossing': e.name,
        }),
      );
    }
  }
  return {
    svg: svgElement('g', { class: 'reinforcement' }, [...elements, ...arrows]),
    labels: labels.length ? svgElement('g', { class: 'reinforcement-forces' }, labels) : '',
    boxes,
  };
}

/** The legend entries of the reinforcement: one a kind of element present, and the forces. */
export function reinforcementLegend(
  model: DrawingModel,
  forces: boolean,
  method: string | null,
  ids: string,
): LegendItem[] {
  const kinds = new Set(model.reinforcement.map((r) => r.type));
  const items: LegendItem[] = [];
  const count = (t: string) => model.reinforcement.filter((r) => r.type === t).length;
  if (kinds.has('geosynthetic'))
    items.push({
      swatch: 'line',
      style: STYLE.geosynthetic,
      label: `geosynthetic layer${count('geosynthetic') > 1 ? 's' : ''}`,
    });
  if (kinds.has('nail'))
    items.push({ swatch: 'line', style: STYLE.nail, label: 'soil nails (square: head)' });
  if (kinds.has('anchor'))
    items.push({
      swatch: 'line',
      style: STYLE.bond,
      label: 'ground anchors: bond length thick, free length thin',
    });
  if (kinds.has('pile'))
    items.push({ swatch: 'line', style: STYLE.pile, label: 'piles or shear keys' });
  if (forces && items.length)
    items.push({
      swatch: 'line',
      style: { stroke: REINFORCEMENT, 'stroke-width': 1.6, 'marker-end': `url(#${ids}-rarrow)` },
      label: `reinforcement force on the sliding mass${method ? ` (${method})` : ''}`,
      detail: `per ${model.labels.length} run, in the equilibrium, and what limits it`,
    });
  return items;
}
