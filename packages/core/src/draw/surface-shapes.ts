import type { MethodReport, SectionResult } from '../result';
import type { MethodId, Point, Polyline } from '../model/types';
import { circleBelowGround } from './circle-below-ground';
import { ACCENT, INK, MUTED } from './palette';
import { pathData, svgElement, svgText } from './svg-element';
import type { SearchReport } from '../result';
import { toPixels, type Scales } from './types';

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
 * The critical surfaces: the governing one in the accent colour over a white halo, with its
 * centre (circle) or pole (log spiral) marked and its FS written there; the others dark and
 * dashed. Radii from the centre to the surface's ends are drawn faintly.
 *
 * @example surfaceShapes(criticalSurfaces(result), scales)
 */
export function surfaceShapes(groups: readonly SurfaceGroup[], s: Scales): string {
  const parts: string[] = [];
  let dash = 0;
  for (const g of groups) {
    const d = pathData(toPixels(g.points, s));
    const colour = g.governing ? ACCENT : INK;
    if (g.center) {
      const [cx, cy] = [s.x(g.center[0]), s.y(g.center[1])];
      for (const end of [g.points[0], g.points[g.points.length - 1]]) {
        parts.push(
          svgElement('line', {
            x1: cx,
            y1: cy,
            x2: s.x(end[0]),
            y2: s.y(end[1]),
            stroke: colour,
            'stroke-width': 0.7,
            'stroke-opacity': 0.45,
            'stroke-dasharray': '2 3',
          }),
        );
      }
      parts.push(
        svgElement('path', {
          d: `M${cx - 5} ${cy}L${cx + 5} ${cy}M${cx} ${cy - 5}L${cx} ${cy + 5}`,
          stroke: colour,
          'stroke-width': g.governing ? 2 : 1.2,
        }),
      );
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
      if (g.center) {
        const [cx, cy] = [s.x(g.center[0]), s.y(g.center[1])];
        parts.push(
          svgText(cx + 8, cy - 7, `FS ${Math.min(...g.fs).toFixed(3)}`, {
            fill: ACCENT,
            'font-size': 12,
            'font-weight': 700,
            stroke: '#ffffff',
            'stroke-width': 3,
            'paint-order': 'stroke',
          }),
        );
      }
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
  return svgElement('g', { class: 'surfaces' }, parts);
}

/**
 * The search's lowest trial surfaces (up to ten) as thin faint lines under the critical one;
 * circles are drawn where they are below the ground.
 *
 * @example trialSurfaceShapes(result.search, ground, scales)
 */
export function trialSurfaceShapes(
  search: SearchReport | null | undefined,
  ground: Polyline,
  s: Scales,
): string {
  if (!search || search.lowest.length === 0) return '';
  const parts: string[] = [];
  for (const { surface } of search.lowest) {
    let lines: Point[][] = [];
    if (surface.type === 'circle')
      lines = circleBelowGround(surface.center, surface.radius, ground);
    else if (surface.type === 'polyline' || surface.type === 'log-spiral') lines = [surface.points];
    for (const line of lines) {
      parts.push(
        svgElement('path', {
          d: pathData(toPixels(line, s)),
          fill: 'none',
          stroke: MUTED,
          'stroke-width': 0.8,
          'stroke-opacity': 0.6,
        }),
      );
    }
  }
  return svgElement('g', { class: 'trial-surfaces' }, parts);
}
