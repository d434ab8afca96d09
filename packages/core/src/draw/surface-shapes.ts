import type { MethodReport, SectionResult } from '../result';
import type { MethodId, Point, Polyline } from '../model/types';
import { circleBelowGround } from './circle-below-ground';
import { boxIsClear, textWidth, type Box, type Obstacles } from './free-place';
import { ACCENT, ACCENT_TEXT, INK, MUTED } from './palette';
import { clippedLineData, clipSegment, insideRect, plotRect } from './clip-rect';
import { svgElement, svgText } from './svg-element';
import type { SearchReport } from '../result';
import { toPixels, type Frame } from './types';

/** Methods that found the same slip surface, drawn once. */
export interface SurfaceGroup {
  methods: MethodId[];
  fs: number[];
  points: Point[];
  center: Point | null;
  governing: boolean;
}

/** The drawn line of a method's surface: the spiral, or the base actually used. */
function linePoints(m: MethodReport): Point[] | null {
  if (m.surface?.type === 'log-spiral') return m.surface.points;
  if (m.base && m.base.length >= 2) return m.base;
  if (m.surface?.type === 'polyline') return m.surface.points;
  return null;
}

/**
 * The converged methods' critical surfaces, grouped where they coincide, the governing
 * method's group marked. A plane (infinite slope) has no line in the section and is left out.
 *
 * @example criticalSurfaces(result) // → [{ methods: ['bishop', 'spencer'], governing: true, … }]
 */
export function criticalSurfaces(result: SectionResult): SurfaceGroup[] {
  const groups = new Map<string, SurfaceGroup>();
  for (const m of result.results) {
    if (!m.converged || m.fs === null) continue;
    const points = linePoints(m);
    if (!points) continue;
    const key = points.map(([x, y]) => `${x.toFixed(3)},${y.toFixed(3)}`).join(' ');
    const center =
      m.surface?.type === 'circle'
        ? m.surface.center
        : m.surface?.type === 'log-spiral'
          ? m.surface.pole
          : null;
    const g = groups.get(key) ?? { methods: [], fs: [], points, center, governing: false };
    g.methods.push(m.method);
    g.fs.push(m.fs);
    if (result.governing?.method === m.method) g.governing = true;
    groups.set(key, g);
  }
  // the governing surface last, so it is drawn on top
  return [...groups.values()].sort((a, b) => Number(a.governing) - Number(b.governing));
}

/** Dash patterns for the other methods' surfaces, one per group. */
export const SURFACE_DASHES = ['6 4', '2 3', '10 3 2 3', '1 2'];

/**
 * The critical surfaces: the governing one in the accent colour over a white halo, the others
 * dark and dashed; the centre of each circle (or the pole of a spiral) as a small ring, the
 * governing one filled with the colour of its FS on the FS map when `fill` gives it. Radii from
 * the centre to the surface's ends only when asked (`radii`). All cut to the frame's plot area
 * (a centre outside it is not drawn).
 *
 * @example surfaceShapes(criticalSurfaces(result), frame)
 */
export function surfaceShapes(
  groups: readonly SurfaceGroup[],
  s: Frame,
  options: { radii?: boolean; fill?: (fs: number) => string } = {},
): string {
  const parts: string[] = [];
  const r = plotRect(s);
  let dash = 0;
  for (const g of groups) {
    const d = clippedLineData(toPixels(g.points, s), r);
    const colour = g.governing ? ACCENT : INK;
    if (g.center && options.radii) {
      const [cx, cy] = [s.x(g.center[0]), s.y(g.center[1])];
      for (const end of [g.points[0], g.points[g.points.length - 1]]) {
        const radius = clipSegment([cx, cy], [s.x(end[0]), s.y(end[1])], r);
        if (!radius) continue;
        parts.push(
          svgElement('line', {
            x1: radius[0][0],
            y1: radius[0][1],
            x2: radius[1][0],
            y2: radius[1][1],
            stroke: colour,
            'stroke-width': 0.7,
            'stroke-opacity': 0.45,
            'stroke-dasharray': '2 3',
          }),
        );
      }
    }
    if (!d) {
      if (!g.governing) dash++; // the legend's dashes stay in step
      continue;
    }
    if (g.governing) {
      parts.push(
        svgElement('path', {
          d,
          fill: 'none',
          stroke: '#ffffff',
          'stroke-width': 5.5,
          'stroke-linejoin': 'round',
          'stroke-opacity': 0.9,
        }),
        svgElement('path', {
          d,
          fill: 'none',
          stroke: ACCENT,
          'stroke-width': 2.6,
          'stroke-linejoin': 'round',
          class: 'critical',
        }),
      );
    } else {
      parts.push(
        svgElement('path', {
          d,
          fill: 'none',
          stroke: INK,
          'stroke-width': 1.3,
          'stroke-dasharray': SURFACE_DASHES[dash++ % SURFACE_DASHES.length],
        }),
      );
    }
  }
  // the centres last, over the surfaces' lines
  for (const g of groups) {
    if (!g.center) continue;
    const [cx, cy] = [s.x(g.center[0]), s.y(g.center[1])];
    const ring = g.governing ? 4.5 : 3;
    if (!insideRect([cx, cy], r, ring + 1)) continue;
    const least = Math.min(...g.fs);
    parts.push(
      svgElement('circle', {
        cx,
        cy,
        r: ring,
        fill: g.governing && options.fill ? options.fill(least) : '#ffffff',
        stroke: g.governing ? ACCENT : INK,
        'stroke-width': g.governing ? 2 : 1.2,
        class: g.governing ? 'critical-centre' : 'centre',
      }),
    );
  }
  return svgElement('g', { class: 'surfaces' }, parts);
}

/**
 * The governing method's factor of safety in a callout at its surface's arc: a box with "FS
 * 1.275 (bishop)" — that method's FS, not the least of the methods that share the surface —
 * below the lowest point of the surface (or beside it, or above the ground, wherever
 * it first keeps clear of the obstacles and inside the frame), joined to the arc by a short
 * leader. Returns the callout and the box it took (for the labels to keep clear of).
 *
 * @example fsCallout(group, { method: 'bishop', fs: 1.275 }, frame, obstacles)
 */
export function fsCallout(
  g: SurfaceGroup,
  governing: { method: string; fs: number },
  frame: Frame,
  obstacles: Obstacles,
): { svg: string; box: Box | null } {
  const px = toPixels(g.points, frame);
  if (px.length < 2) return { svg: '', box: null };
  const text = `FS ${governing.fs.toFixed(3)} (${governing.method})`;
  const w = textWidth(text.length, 12) + 14;
  const h = 20;
  let low = px[0];
  for (const p of px) if (p[1] > low[1]) low = p;
  const third = px[Math.floor(px.length / 3)];
  const twoThirds = px[Math.floor((2 * px.length) / 3)];
  const tries: { anchor: [number, number]; dx: number; dy: number }[] = [
    { anchor: low, dx: 0, dy: 26 },
    { anchor: third, dx: -w / 2 - 18, dy: 22 },
    { anchor: twoThirds, dx: w / 2 + 18, dy: 22 },
    { anchor: low, dx: -w / 2 - 30, dy: 40 },
    { anchor: low, dx: w / 2 + 30, dy: 40 },
    { anchor: px[px.length - 1], dx: w / 2 + 16, dy: -24 },
    { anchor: px[0], dx: -w / 2 - 16, dy: -24 },
  ];
  const inside = (b: Box) =>
    b.x0 >= frame.left + 2 &&
    b.x1 <= frame.left + frame.width - 2 &&
    b.y0 >= frame.top + 2 &&
    b.y1 <= frame.top + frame.height - 2;
  let chosen: { box: Box; anchor: [number, number] } | null = null;
  for (const t of tries) {
    const cx = t.anchor[0] + t.dx;
    const cy = t.anchor[1] + t.dy;
    const box = { x0: cx - w / 2, y0: cy - h / 2, x1: cx + w / 2, y1: cy + h / 2 };
    if (inside(box) && boxIsClear(box, obstacles)) {
      chosen = { box, anchor: t.anchor };
      break;
    }
  }
  // nowhere clear: under the lowest point, inside the frame
  if (!chosen) {
    const cx = Math.min(
      Math.max(low[0], frame.left + w / 2 + 2),
      frame.left + frame.width - w / 2 - 2,
    );
    const cy = Math.min(low[1] + 26, frame.top + frame.height - h / 2 - 2);
    chosen = {
      box: { x0: cx - w / 2, y0: cy - h / 2, x1: cx + w / 2, y1: cy + h / 2 },
      anchor: low,
    };
  }
  const { box, anchor } = chosen;
  const cx = (box.x0 + box.x1) / 2;
  const cy = (box.y0 + box.y1) / 2;
  // the leader from the arc to the nearest point of the box's edge
  const ex = Math.min(Math.max(anchor[0], box.x0), box.x1);
  const ey = Math.min(Math.max(anchor[1], box.y0), box.y1);
  const svg = svgElement('g', { class: 'fs-callout' }, [
    svgElement('line', {
      x1: anchor[0],
      y1: anchor[1],
      x2: ex,
      y2: ey,
      stroke: ACCENT,
      'stroke-width': 1.2,
    }),
    svgElement('circle', { cx: anchor[0], cy: anchor[1], r: 2.2, fill: ACCENT }),
    svgElement('rect', {
      x: box.x0,
      y: box.y0,
      width: box.x1 - box.x0,
      height: h,
      rx: 3,
      fill: '#ffffff',
      stroke: ACCENT,
      'stroke-width': 1.2,
    }),
    svgText(cx, cy + 4.5, text, {
      'text-anchor': 'middle',
      fill: ACCENT_TEXT,
      'font-size': 12,
      'font-weight': 700,
    }),
  ]);
  return { svg, box };
}

/**
 * The search's trial surfaces within its band of the least FS (search.trialBand) as thin faint
 * lines under the critical one; circles are drawn where they are below the ground.
 *
 * @example trialSurfaceShapes(result.search, ground, frame)
 */
export function trialSurfaceShapes(
  search: SearchReport | null | undefined,
  ground: Polyline,
  s: Frame,
): { svg: string; lines: Point[][] } {
  const surfaces = search?.trialBand?.surfaces ?? [];
  if (surfaces.length === 0) return { svg: '', lines: [] };
  const parts: string[] = [];
  const all: Point[][] = [];
  for (const { surface } of surfaces) {
    let lines: Point[][] = [];
    if (surface.type === 'circle')
      lines = circleBelowGround(surface.center, surface.radius, ground);
    else if (surface.type === 'polyline' || surface.type === 'log-spiral') lines = [surface.points];
    for (const line of lines) {
      all.push(line);
      const d = clippedLineData(toPixels(line, s), plotRect(s));
      if (!d) continue;
      parts.push(
        svgElement('path', {
          d,
          fill: 'none',
          stroke: MUTED,
          'stroke-width': 0.8,
          'stroke-opacity': 0.6,
        }),
      );
    }
  }
  return { svg: svgElement('g', { class: 'trial-surfaces' }, parts), lines: all };
}
