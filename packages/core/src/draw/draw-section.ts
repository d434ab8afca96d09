import type { SectionResult } from '../result';
import { CAUTION } from '../caution';
import type { Point, Section } from '../model/types';
import { fsText, VERDICT_WORDS } from '../verdict';
import { axisBottom, axisLeft } from './axis';
import { colorBar } from './color-bar';
import { equalScaleFrame, type Bounds } from './frame';
import { fraction, fsMapDomain, fsMapShape } from './fs-map-shape';
import type { Obstacles } from './free-place';
import { legend, legendHeight, type LegendItem } from './legend';
import { loadShapes } from './load-shapes';
import {
  ACCENT,
  fsColor,
  INK,
  MUTED,
  REINFORCEMENT,
  RIGID_FILL,
  WATER_FILL,
  WATER_LINE,
} from './palette';
import { pondedPolygons } from './ponded-polygons';
import {
  reinforcementLegend,
  reinforcementPoints,
  reinforcementShapes,
} from './reinforcement-shapes';
import { sectionInUnits } from './section-in-units';
import { sliceShapes } from './slice-shapes';
import { strataFills, strataLabels, strataShapes } from './strata-shapes';
import {
  criticalSurfaces,
  fsCallout,
  SURFACE_DASHES,
  surfaceShapes,
  trialSurfaceShapes,
} from './surface-shapes';
import { svgElement, svgText } from './svg-element';
import { cautionBlock, cautionLines, svgDocument } from './svg-document';
import { waterShapes } from './water-shapes';

/** A section result, with the search's report when a search ran. */
export type DrawableResult = SectionResult;

export interface DrawSectionOptions {
  /** Width of the drawing in pixels (default 1100); the height follows the section. */
  width?: number;
  /** Prefix of the ids inside the SVG (patterns, markers), unique per drawing on a page. */
  idPrefix?: string;
  /** Draw the radii from each circle's centre to the ends of its arc (default: no). */
  radii?: boolean;
}

/** The sliding mass above a surface (its base and the ground between its ends), as a ring. */
function massRing(base: readonly Point[], ground: readonly Point[]): Point[] {
  const b = base[0][0] <= base[base.length - 1][0] ? [...base] : [...base].reverse();
  const [x0, x1] = [b[0][0], b[b.length - 1][0]];
  return [...b, ...ground.filter((p) => p[0] > x0 && p[0] < x1).reverse()];
}

const LEFT = 72;
const RIGHT = 270;
const TOP = 74;

function bounds(model: ReturnType<typeof sectionInUnits>, r: DrawableResult): Bounds {
  const xs = model.ground.map((p) => p[0]);
  const x0 = Math.min(...xs);
  const x1 = Math.max(...xs);
  const span = x1 - x0;
  const pts: Point[] = [...model.ground];
  const within = (p: Point) => p[0] >= x0 - 0.3 * span && p[0] <= x1 + 0.3 * span;
  for (const s of model.strata) pts.push(...s.top);
  if (model.water.line) pts.push(...model.water.line.filter((p) => p[0] >= x0 && p[0] <= x1));
  for (const e of model.reinforcement)
    pts.push(...reinforcementPoints(e, model.ground).filter(within));
  for (const m of r.results) {
    if (!m.converged) continue;
    if (m.base) pts.push(...m.base);
    if (m.surface?.type === 'circle' && within(m.surface.center)) pts.push(m.surface.center);
    if (m.surface?.type === 'log-spiral') pts.push(...m.surface.points.filter(within));
  }
  const g = r.search?.grid;
  if (g) pts.push([g.x[0], g.y[0]], [g.x[1], g.y[1]]);
  for (const mv of r.search?.moves ?? [])
    pts.push([mv.grid.x[0], mv.grid.y[0]], [mv.grid.x[1], mv.grid.y[1]]);
  const ys = pts.map((p) => p[1]);
  let yMin = Math.min(...ys);
  let yMax = Math.max(...ys);
  const xMin = Math.min(x0, ...pts.map((p) => p[0]));
  const xMax = Math.max(x1, ...pts.map((p) => p[0]));
  const h = Math.max(yMax - yMin, 0.05 * (xMax - xMin));
  yMin -= 0.12 * h;
  yMax += (model.loads.length ? 0.22 : 0.08) * h;
  return { xMin, xMax, yMin, yMax };
}

/**
 * The cross-section drawn as an SVG document: the strata coloured by material (a rigid base
 * hatched), the ground, the piezometric line and ponded water, the loads as arrows, the
 * reinforcing elements with the governing method's reinforcement forces where its surface
 * crosses them (reinforcement-shapes.ts), the FS map
 * of the search as filled contours with its colour bar (when the result carries a search), the
 * trial surfaces within the search's band of the least FS, the governing method's slices,
 * every method's critical surface (the governing one in the accent colour, its FS in a callout
 * at the arc, its centre a ring in the colour of its FS on the map), each material labelled
 * with its description where the label keeps clear of the surfaces, axes at true scale in the
 * section's units, a legend, and the caution. Pure: no DOM, no I/O; the
 * same string serves a file and an inline drawing.
 *
 * @example drawSection(section, analyzeSection(section)) // → '<svg xmlns=…'
 */
export function drawSection(
  section: Section,
  result: DrawableResult,
  options: DrawSectionOptions = {},
): string {
  const width = Math.max(640, options.width ?? 1100);
  const ids = options.idPrefix ?? 'sl';
  const model = sectionInUnits(section);
  const L = model.length;
  const b = bounds(model, result);
  const frame = equalScaleFrame(b, LEFT, TOP, width - LEFT - RIGHT, 640);

  const governing = result.governing
    ? (result.results.find((m) => m.method === result.governing?.method) ?? null)
    : null;
  const groups = criticalSurfaces(result);
  const search = result.search ?? null;
  const domain = search?.map
    ? fsMapDomain(search.map, search.howFound?.confirmation.exact ?? Infinity)
    : null;

  // --- legend items
  const items: LegendItem[] = [];
  const fills = strataFills(model);
  const seen = new Set<string>();
  for (const s of model.strata) {
    if (seen.has(s.material)) continue;
    seen.add(s.material);
    items.push({
      swatch: 'box',
      style: {
        fill: s.rigid ? `url(#${ids}-hatch)` : fills[s.material],
        ...(s.rigid ? { 'fill-opacity': 1 } : {}),
      },
      label: s.description || s.material,
      detail: s.description ? `${s.material}: ${s.describe}` : s.describe,
    });
  }
  if (model.water.line) {
    items.push({
      swatch: 'line',
      style: { stroke: WATER_LINE, 'stroke-width': 1.4, 'stroke-dasharray': '7 3' },
      label: 'piezometric line',
    });
    if (pondedPolygons(model.ground, model.water.line).length)
      items.push({ swatch: 'box', style: { fill: WATER_FILL }, label: 'ponded water' });
  }
  if (model.water.ru !== null)
    items.push({ swatch: 'none', style: {}, label: `pore-pressure ratio ru = ${model.water.ru}` });
  if (model.loads.length)
    items.push({
      swatch: 'line',
      style: { stroke: INK, 'stroke-width': 1.3, 'marker-end': `url(#${ids}-arrow)` },
      label: 'loads (per unit run)',
    });
  const forces = (governing?.reinforcement ?? []).some((e) =>
    e.crossings.some((c) => c.counted && c.force > 0),
  );
  items.push(...reinforcementLegend(model, forces, governing?.method ?? null, ids));
  if (section.seismic.kh || section.seismic.kv)
    items.push({
      swatch: 'none',
      style: {},
      label: `pseudo-static kh = ${section.seismic.kh}, kv = ${section.seismic.kv}`,
    });
  let dash = 0;
  for (const g of groups) {
    const fs = g.methods.map((m, i) => `${m} ${g.fs[i].toFixed(3)}`).join(', ');
    items.push(
      g.governing
        ? {
            swatch: 'line',
            style: { stroke: ACCENT, 'stroke-width': 2.6 },
            label: `critical surface (governing: ${result.governing?.method})`,
            detail: `FS ${fs}`,
          }
        : {
            swatch: 'line',
            style: {
              stroke: INK,
              'stroke-width': 1.3,
              'stroke-dasharray': SURFACE_DASHES[dash++ % SURFACE_DASHES.length],
            },
            label: `critical surface (${g.methods.join(', ')})`,
            detail: `FS ${fs}`,
          },
    );
  }
  if (governing && governing.slices.length)
    items.push({
      swatch: 'line',
      style: { stroke: INK, 'stroke-width': 0.6, 'stroke-opacity': 0.5 },
      label: `${governing.slices.length} slices (${governing.method})`,
    });
  const band = search?.trialBand;
  if (band && band.surfaces.length)
    items.push({
      swatch: 'line',
      style: { stroke: MUTED, 'stroke-width': 0.8 },
      label: `trial surfaces within ${Number((band.within * 100).toFixed(1))} % of the least FS`,
      detail:
        band.surfaces.length >= band.count
          ? `${band.count} tried, all drawn`
          : `${band.count} tried; ${band.surfaces.length >= 100 ? 'the 100 lowest' : band.surfaces.length} distinct ones drawn`,
    });
  if (search) {
    const moved = search.moves.length ? `, grid moved ${search.moves.length}×` : '';
    items.push({
      swatch: 'none',
      style: {},
      label: `${search.type} search (${search.method}): ${search.trials} trials${moved}`,
    });
  }
  if (groups.length === 0)
    items.push({ swatch: 'none', style: {}, label: 'no critical surface: no method converged' });

  // --- the parts, back to front; the labels last, where they keep clear of the surfaces
  const yBottom = b.yMin;
  const trials = trialSurfaceShapes(search, model.ground, frame);
  const px = (line: readonly Point[]) =>
    line.map((p): [number, number] => [frame.x(p[0]), frame.y(p[1])]);
  const obstacles: Obstacles = {
    lines: [...groups.map((g) => px(g.points)), ...trials.lines.map(px)],
    areas: [],
    boxes: [],
  };
  const mass =
    governing?.base && governing.base.length > 1 ? massRing(governing.base, model.ground) : null;
  if (mass) obstacles.areas.push(px(mass));
  const map = search?.map;
  if (map && map.xs.length > 1 && map.ys.length > 1 && domain) {
    const [xa, xb] = [frame.x(map.xs[0]), frame.x(map.xs[map.xs.length - 1])];
    const [ya, yb] = [frame.y(map.ys[0]), frame.y(map.ys[map.ys.length - 1])];
    obstacles.boxes.push({
      x0: Math.min(xa, xb),
      x1: Math.max(xa, xb),
      y0: Math.min(ya, yb),
      y1: Math.max(ya, yb),
    });
  }
  const governingGroup = groups.find((g) => g.governing) ?? null;
  const callout =
    governingGroup && result.governing
      ? fsCallout(governingGroup, result.governing, frame, obstacles)
      : { svg: '', box: null };
  if (callout.box) obstacles.boxes.push(callout.box);
  const reinforced = reinforcementShapes(model, governing?.reinforcement, frame, obstacles, ids);
  obstacles.boxes.push(...reinforced.boxes);
  const labels = strataLabels(model, frame, yBottom, obstacles);
  const content = [
    strataShapes(model, frame, yBottom, ids),
    search && domain ? fsMapShape(search, frame, domain) : '',
    waterShapes(model, frame),
    governing
      ? sliceShapes(
          governing.slices,
          governing.surface?.type === 'log-spiral' ? governing.surface.points : governing.base,
          model.ground,
          frame,
        )
      : '',
    trials.svg,
    surfaceShapes(groups, frame, {
      radii: options.radii === true,
      ...(domain ? { fill: (fs: number) => fsColor(fraction(fs, domain)) } : {}),
    }),
    reinforced.svg,
    loadShapes(model, frame, ids),
    labels.svg,
    reinforced.labels,
    callout.svg,
  ];
  if (model.offset !== null && model.offset >= b.xMin && model.offset <= b.xMax) {
    const x = frame.x(model.offset);
    content.push(
      svgElement('line', {
        x1: x,
        y1: frame.top,
        x2: x,
        y2: frame.top + frame.height,
        stroke: MUTED,
        'stroke-width': 0.8,
        'stroke-dasharray': '12 3 2 3',
      }),
      svgText(x + 4, frame.top + 12, 'centreline', { fill: MUTED, 'font-size': 10 }),
    );
  }

  const legendX = width - RIGHT + 24;
  const legendSvg = legend(items, legendX, TOP);
  let rightBottom = TOP + legendHeight(items);
  let bar = '';
  if (search && domain) {
    const barTop = rightBottom + 34;
    const clipped =
      search.map?.fs.some((row) => row.some((v) => v !== null && v > domain[1])) ?? false;
    bar = colorBar(
      legendX,
      barTop,
      16,
      150,
      domain,
      `FS map: least FS at each centre (${search.method})`,
      clipped,
    );
    rightBottom = barTop + 150;
  }

  const plotBottom = frame.top + frame.height;
  const cautionTop = Math.max(plotBottom + 58, rightBottom + 20);
  const caution = cautionLines(result.caution || CAUTION, width);
  const height = cautionTop + caution.length * 14 + 14;

  // --- title
  const lines: string[] = [];
  lines.push(
    svgText(24, 28, `${result.id} — ${result.title}`, {
      'font-size': 15,
      'font-weight': 700,
      fill: INK,
    }),
  );
  let verdict: string;
  if (!result.governing) verdict = `no method converged: ${VERDICT_WORDS['no-fs']}`;
  else {
    const fs = `governing FS ${fsText(result.governing.fs)} (${result.governing.method})`;
    verdict =
      result.requiredFs === null
        ? `${fs}: ${VERDICT_WORDS['no-requirement']}`
        : `${fs} against required ${result.requiredFs}: ${VERDICT_WORDS[result.verdict]}`;
  }
  const caseText = result.case ? `  ·  case: ${result.case}` : '';
  const station = result.station !== null ? `  ·  station ${result.station}` : '';
  lines.push(
    svgText(24, 50, `${verdict}${caseText}${station}`, {
      'font-size': 12.5,
      fill: INK,
      'font-weight': result.verdict === 'below' ? 700 : 400,
    }),
  );

  const defs = svgElement('defs', {}, [
    svgElement(
      'pattern',
      {
        id: `${ids}-hatch`,
        width: 8,
        height: 8,
        patternUnits: 'userSpaceOnUse',
        patternTransform: 'rotate(45)',
      },
      [
        svgElement('rect', { width: 8, height: 8, fill: RIGID_FILL }),
        svgElement('line', {
          x1: 0,
          y1: 0,
          x2: 0,
          y2: 8,
          stroke: INK,
          'stroke-width': 1,
          'stroke-opacity': 0.45,
        }),
      ],
    ),
    svgElement(
      'marker',
      {
        id: `${ids}-arrow`,
        viewBox: '0 0 10 10',
        refX: 9,
        refY: 5,
        markerWidth: 7,
        markerHeight: 7,
        orient: 'auto-start-reverse',
      },
      [svgElement('path', { d: 'M0 0L10 5L0 10Z', fill: INK })],
    ),
    svgElement(
      'marker',
      {
        id: `${ids}-rarrow`,
        viewBox: '0 0 10 10',
        refX: 9,
        refY: 5,
        markerWidth: 6,
        markerHeight: 6,
        orient: 'auto-start-reverse',
      },
      [svgElement('path', { d: 'M0 0L10 5L0 10Z', fill: REINFORCEMENT })],
    ),
  ]);

  const body = [
    defs,
    svgElement('rect', { width, height, fill: '#ffffff' }),
    ...lines,
    axisBottom(frame, `x (${L})`),
    axisLeft(frame, `elevation (${L})`),
    // every shape in it is cut to the plot area in code (clip-rect.ts), not by the renderer
    svgElement('g', { class: 'plot' }, content.filter(Boolean)),
    svgElement('rect', {
      x: frame.left,
      y: frame.top,
      width: frame.width,
      height: frame.height,
      class: 'plot-frame',
      fill: 'none',
      stroke: INK,
      'stroke-width': 0.8,
    }),
    legendSvg,
    bar,
    cautionBlock(caution, cautionTop),
  ];
  return svgDocument(
    width,
    Math.round(height),
    `${result.id}: cross-section with the critical slip surface`,
    body.filter(Boolean),
  );
}
