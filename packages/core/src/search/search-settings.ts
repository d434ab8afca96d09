import { yAt } from '../geometry/y-at';
import { toSi } from '../model/units';
import type { Polyline, SearchSurface, UnitSystem } from '../model/types';
import type { GridReport } from '../result';
import { MIN_RELIEF } from '../station-result';

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
  /**
   * Ground ranges on each slope face of its own when the ground has more than one (a low step
   * beside a long gentle rise, a berm between two batters): a face's shallow circles are a
   * valley of the FS map of their own, narrower than the grid's spacing. Empty when the ranges
   * were given, or the ground has one face.
   */
  faceRanges: GroundRangeSettings[];
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

/** Grade above which a stretch of ground counts as sloping rather than level (common practice). */
const SLOPING = 0.05;
/** At most this many faces, the highest, get ground ranges of their own. */
const MAX_FACES = 3;

/** A stretch of the ground where it is not level, its height and which side the crest is on. */
export interface SlopeZone {
  x0: number;
  x1: number;
  yLow: number;
  yHigh: number;
  crestRight: boolean;
}

/**
 * The slope faces of the ground: runs of consecutive segments steeper than 5 %, all rising or
 * all falling the same way, highest first.
 *
 * @example slopeFaces([[0, 0], [10, 0], [20, 5], [30, 5]]) // → [{ x0: 10, x1: 20, yLow: 0, yHigh: 5, crestRight: true }]
 */
export function slopeFaces(ground: Polyline): SlopeZone[] {
  const faces: SlopeZone[] = [];
  let run: { from: number; to: number; sign: number } | null = null;
  const close = () => {
    if (!run) return;
    const a = ground[run.from];
    const b = ground[run.to];
    faces.push({
      x0: a[0],
      x1: b[0],
      yLow: Math.min(a[1], b[1]),
      yHigh: Math.max(a[1], b[1]),
      crestRight: b[1] >= a[1],
    });
    run = null;
  };
  for (let i = 0; i + 1 < ground.length; i++) {
    const [ax, ay] = ground[i];
    const [bx, by] = ground[i + 1];
    const sloping = Math.abs(by - ay) > SLOPING * (bx - ax);
    const sign = Math.sign(by - ay);
    if (sloping && run && run.sign === sign) run.to = i + 1;
    else {
      close();
      if (sloping) run = { from: i, to: i + 1, sign };
    }
  }
  close();
  return faces.sort((p, q) => q.yHigh - q.yLow - (p.yHigh - p.yLow));
}

/** The part of the ground where it is not level, its height and which side the crest is on. */
export function slopeZone(ground: Polyline): SlopeZone {
  let x0 = Infinity;
  let x1 = -Infinity;
  for (let i = 0; i + 1 < ground.length; i++) {
    const [ax, ay] = ground[i];
    const [bx, by] = ground[i + 1];
    if (Math.abs(by - ay) > SLOPING * (bx - ax)) {
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

/** At most this many parts of faces between reinforcement heads get ranges of their own, each this many points a range and radii. */
const MAX_PARTS = 12;
const PART_POINTS = 7;

/**
 * The slope faces cut at the x of reinforcement heads on them (`stops`): the parts of a face
 * between two heads, below the lowest and above the highest, each at least MIN_RELIEF high
 * (at most MAX_PARTS, the highest first), each with its face. A surface that comes out of the
 * face between two rows of nails passes under the rows below it, and one that comes out above
 * the top row crosses none: each part is where such surfaces come out.
 */
export function faceParts(
  ground: Polyline,
  stops: readonly number[],
): { part: SlopeZone; face: SlopeZone }[] {
  const parts: { part: SlopeZone; face: SlopeZone }[] = [];
  for (const face of slopeFaces(ground)) {
    const inside = stops.filter((x) => x > face.x0 && x < face.x1).sort((a, b) => a - b);
    if (inside.length === 0) continue;
    const xs = [face.x0, ...inside, face.x1];
    for (let i = 0; i + 1 < xs.length; i++) {
      const ya = yAt(ground, xs[i]);
      const yb = yAt(ground, xs[i + 1]);
      const part = {
        x0: xs[i],
        x1: xs[i + 1],
        yLow: Math.min(ya, yb),
        yHigh: Math.max(ya, yb),
        crestRight: face.crestRight,
      };
      if (part.yHigh - part.yLow >= MIN_RELIEF) parts.push({ part, face });
    }
  }
  return parts
    .sort((p, q) => q.part.yHigh - q.part.yLow - (p.part.yHigh - p.part.yLow))
    .slice(0, MAX_PARTS);
}

/**
 * Search settings from the section's `analysis.surface` (in the file's units) and defaults
 * derived from the geometry: a 10 × 10 grid of centres above the slope, twelve tangent
 * elevations from just below the toe down to one and a half slope heights (or the rigid
 * base), ground ranges on the crest and at the toe (and on each face, and each part of a face
 * between reinforcement heads at `stops`), six-vertex noncircular surfaces.
 */
export function searchSettings(
  spec: SearchSurface,
  units: UnitSystem,
  ground: Polyline,
  deepest: number,
  stops: readonly number[] = [],
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
  const points = Math.max(2, Math.round(num(spec.points, 8)));
  const radiusCount = Math.max(1, Math.round(num(spec.radiusCount, 8)));
  /** Ranges on the crest and at the toe of a stretch of slope of height h and width w. */
  const rangesOf = (f: SlopeZone, h: number, w: number): GroundRangeSettings => {
    const crest = f.crestRight ? f.x1 : f.x0;
    const toe = f.crestRight ? f.x0 : f.x1;
    const side = f.crestRight ? 1 : -1;
    const range = (a: number, b: number): [number, number] => [
      clampX(Math.min(a, b)),
      clampX(Math.max(a, b)),
    ];
    return {
      upper: range(crest - side * 0.3 * w, crest + side * 0.8 * w),
      lower: range(toe - side * 0.6 * h, toe + side * 0.4 * w),
      points,
      radii: radiusCount,
    };
  };
  const zoneRanges = rangesOf(z, H, span);
  const groundRanges: GroundRangeSettings = {
    ...zoneRanges,
    upper: upper ?? zoneRanges.upper,
    lower: lower ?? zoneRanges.lower,
  };
  const faces = slopeFaces(ground)
    .filter((f) => f.yHigh - f.yLow >= MIN_RELIEF)
    .slice(0, MAX_FACES);
  const sameAsZone = (f: SlopeZone) => f.x0 === z.x0 && f.x1 === z.x1;
  /**
   * Surfaces that come out of a part of a face between reinforcement heads: the lower range
   * over the part, the upper from the part's top to beyond the face's crest; the parts are
   * small, so fewer points and radii each.
   */
  const partRanges = (part: SlopeZone, face: SlopeZone): GroundRangeSettings => {
    const side = face.crestRight ? 1 : -1;
    const w = Math.max(face.x1 - face.x0, face.yHigh - face.yLow);
    const top = face.crestRight ? part.x1 : part.x0;
    const crest = face.crestRight ? face.x1 : face.x0;
    const range = (a: number, b: number): [number, number] => [
      clampX(Math.min(a, b)),
      clampX(Math.max(a, b)),
    ];
    return {
      upper: range(top, crest + side * 0.8 * w),
      lower: range(part.x0, part.x1),
      points: PART_POINTS,
      radii: PART_POINTS,
    };
  };
  const own = (f: SlopeZone) => {
    const h = Math.max(f.yHigh - f.yLow, MIN_RELIEF);
    return rangesOf(f, h, Math.max(f.x1 - f.x0, h));
  };
  const faceRanges =
    upper || lower || spec.type === 'grid'
      ? []
      : [
          ...(faces.length === 1 && sameAsZone(faces[0]) ? [] : faces.map(own)),
          ...faceParts(ground, stops).map(({ part, face }) => partRanges(part, face)),
        ];
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
    faceRanges,
    noncircular: wantsNoncircular ? noncircular : null,
  };
}
