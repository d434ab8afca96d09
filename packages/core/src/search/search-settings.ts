import { toSi } from '../model/units';
import type { Polyline, SearchSurface, UnitSystem } from '../model/types';
import type { GridReport } from '../result';

/** A rectangle of circle centres (the shape the result reports, here in SI). */
export type CenterGrid = GridReport;

/** Radii of the circles at each centre: by radius, or by the elevation the circle is tangent to. */
export type RadiusSpec =
  | { kind: 'radii'; from: number; to: number; count: number }
  | { kind: 'tangents'; from: number; to: number; count: number };

export interface GridSettings {
  centers: CenterGrid;
  radii: RadiusSpec;
  /** Largest number of times the grid is moved when its minimum lies on the edge. */
  moves: number;
}

export interface GroundRangeSettings {
  /** x-ranges on the ground where the slide starts (upper) and comes out (lower). */
  upper: [number, number];
  lower: [number, number];
  points: number;
  radii: number;
}

export interface NoncircularSettings {
  vertices: number;
  restarts: number;
  seed: number;
}

/** The search asked for, in SI, with every default filled from the geometry. */
export interface SearchSettings {
  type: SearchSurface['type'];
  grid: GridSettings | null;
  groundRanges: GroundRangeSettings | null;
  noncircular: NoncircularSettings | null;
}

const num = (v: unknown, fallback: number) =>
  typeof v === 'number' && Number.isFinite(v) ? v : fallback;
const pair = (v: unknown): [number, number] | null =>
  Array.isArray(v) && v.length === 2 && v.every((t) => typeof t === 'number')
    ? ([v[0], v[1]].sort((a, b) => a - b) as [number, number])
    : null;
const obj = (v: unknown): Record<string, unknown> =>
  v && typeof v === 'object' ? (v as Record<string, unknown>) : {};

/** The part of the ground where it is not level, its height and which side the crest is on. */
export function slopeZone(ground: Polyline): {
  x0: number;
  x1: number;
  yLow: number;
  yHigh: number;
  crestRight: boolean;
} {
  let x0 = Infinity;
  let x1 = -Infinity;
  for (let i = 0; i + 1 < ground.length; i++) {
    const [ax, ay] = ground[i];
    const [bx, by] = ground[i + 1];
    if (Math.abs(by - ay) > 0.05 * (bx - ax)) {
      x0 = Math.min(x0, ax);
      x1 = Math.max(x1, bx);
    }
  }
  if (!Number.isFinite(x0)) {
    x0 = ground[0][0];
    x1 = ground[ground.length - 1][0];
  }
  let yLow = Infinity;
  let yHigh = -Infinity;
  for (const [x, y] of ground) {
    if (x >= x0 && x <= x1) {
      yLow = Math.min(yLow, y);
      yHigh = Math.max(yHigh, y);
    }
  }
  const yAtX = (x: number) =>
    ground.reduce((best, p) => (Math.abs(p[0] - x) < Math.abs(best[0] - x) ? p : best))[1];
  return { x0, x1, yLow, yHigh, crestRight: yAtX(x1) >= yAtX(x0) };
}

/**
 * Search settings from the section's `analysis.surface` (in the file's units) and defaults
 * derived from the geometry: a 10 × 10 grid of centres above the slope, twelve tangent
 * elevations from just below the toe down to one and a half slope heights (or the rigid
 * base), ground ranges on the crest and at the toe, six-vertex noncircular surfaces.
 */
export function searchSettings(
  spec: SearchSurface,
  units: UnitSystem,
  ground: Polyline,
  deepest: number,
): SearchSettings {
  const L = (v: number) => toSi(v, 'length', units);
  const Lp = (p: [number, number] | null) => (p ? ([L(p[0]), L(p[1])] as [number, number]) : null);
  const z = slopeZone(ground);
  const H = Math.max(z.yHigh - z.yLow, 0.05 * (ground[ground.length - 1][0] - ground[0][0]), 1);
  const span = Math.max(z.x1 - z.x0, H);
  const xMin = ground[0][0];
  const xMax = ground[ground.length - 1][0];
  const clampX = (x: number) => Math.min(xMax, Math.max(xMin, x));

  const g = obj(spec.centers);
  const gx = Lp(pair(g.x));
  const gy = Lp(pair(g.y));
  const centers: CenterGrid = {
    x: gx ?? [z.x0 - 0.25 * span, z.x1 + 0.25 * span],
    y: gy ?? [z.yHigh + 0.25 * H, z.yHigh + 2 * H],
    nx: Math.max(1, Math.round(num(g.nx, 10))),
    ny: Math.max(1, Math.round(num(g.ny, 10))),
  };
  const r = obj(spec.radii);
  const t = obj(spec.tangents);
  const deep = Math.max(deepest, z.yLow - 1.5 * H);
  const radii: RadiusSpec =
    spec.radii !== undefined
      ? {
          kind: 'radii',
          from: L(num(r.from, H)),
          to: L(num(r.to, 3 * H)),
          count: Math.max(1, Math.round(num(r.count, 12))),
        }
      : spec.tangents !== undefined
        ? {
            kind: 'tangents',
            from: L(num(t.from, z.yLow)),
            to: L(num(t.to, deep)),
            count: Math.max(1, Math.round(num(t.count, 12))),
          }
        : { kind: 'tangents', from: z.yLow + 0.3 * H, to: deep, count: 12 };
  const grid: GridSettings = { centers, radii, moves: Math.max(0, Math.round(num(spec.moves, 6))) };

  const upper = Lp(pair(spec.upper));
  const lower = Lp(pair(spec.lower));
  const crest = z.crestRight ? z.x1 : z.x0;
  const toe = z.crestRight ? z.x0 : z.x1;
  const side = z.crestRight ? 1 : -1;
  const range = (a: number, b: number): [number, number] => [
    clampX(Math.min(a, b)),
    clampX(Math.max(a, b)),
  ];
  const groundRanges: GroundRangeSettings = {
    upper: upper ?? range(crest - side * 0.3 * span, crest + side * 0.8 * span),
    lower: lower ?? range(toe - side * 0.6 * H, toe + side * 0.4 * span),
    points: Math.max(2, Math.round(num(spec.points, 8))),
    radii: Math.max(1, Math.round(num(spec.radiusCount, 8))),
  };
  const noncircular: NoncircularSettings = {
    vertices: Math.min(12, Math.max(3, Math.round(num(spec.vertices, 6)))),
    restarts: Math.max(0, Math.round(num(spec.restarts, 4))),
    seed: Math.round(num(spec.seed, 1)),
  };
  const wantsNoncircular =
    spec.type === 'noncircular' || (spec.type === 'auto' && spec.noncircular === true);
  return {
    type: spec.type,
    grid: spec.type === 'ground-ranges' ? null : grid,
    groundRanges: spec.type === 'grid' ? null : groundRanges,
    noncircular: wantsNoncircular ? noncircular : null,
  };
}
