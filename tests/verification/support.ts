/**
 * Builders for the verification cases: normalised sections in SI, sliced surfaces and the
 * method options every check needs.
 */
import {
  bishop,
  type Material,
  type Point,
  type Section,
  type SlicedSurface,
  formatMessage,
  parseSections,
  prepareSection,
  seededRandom,
  sliceSurface,
} from '@scarpline/core';

export const GAMMA_W = 9.81;

export function mohrCoulomb(
  unitWeight: number,
  cohesion: number,
  frictionAngle: number,
  sat?: number,
): Material {
  return {
    name: 'soil',
    unitWeight,
    saturatedUnitWeight: sat ?? unitWeight,
    strength: { model: 'mohr-coulomb', cohesion, frictionAngle },
  };
}

export function undrained(
  unitWeight: number,
  su: number,
  suRate = 0,
  suDatum: number | null = null,
): Material {
  return {
    name: 'soil',
    unitWeight,
    saturatedUnitWeight: unitWeight,
    strength: { model: 'undrained', su, suRate, suDatum },
  };
}

/** A homogeneous section. */
export function homogeneous(
  ground: Point[],
  material: Material,
  over: Partial<Section> = {},
): Section {
  return {
    format: 'scarpline/1',
    id: 'check',
    title: 'verification case',
    station: null,
    offset: null,
    units: 'si',
    ground,
    materials: { soil: material },
    strata: [{ material: 'soil', top: ground }],
    water: { kind: 'none', unitWeight: GAMMA_W },
    loads: [],
    reinforcement: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis: {
      methods: ['bishop'],
      slices: 40,
      surface: null,
      infiniteSlope: null,
      case: null,
      requiredFs: null,
    },
    ...over,
  };
}

/** A simple slope: flat toe at y = 0 up to x = toe, rising at 1 : run to height h, flat crest beyond. */
export function simpleSlope(h: number, run: number, toe = 20, width = 100): Point[] {
  return [
    [0, 0],
    [toe, 0],
    [toe + h * run, h],
    [toe + h * run + width, h],
  ];
}

export function cut(
  section: Section,
  surface: Parameters<typeof sliceSurface>[1],
  n = 40,
): SlicedSurface {
  const out = sliceSurface(prepareSection(section), surface, n);
  if (!out.ok) throw new Error(out.reason);
  return out;
}

/** Method options for a circle: the centre in sliding orientation. */
export function circleOptions(sliced: SlicedSurface, center: Point, section: Section) {
  return {
    seismic: section.seismic,
    pivot: [(sliced.slices.mirrored ? -1 : 1) * center[0], center[1]] as Point,
  };
}

export const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

export interface LayeredOptions {
  /** Water: none, a piezometric line, or a pore-pressure ratio. */
  water?: 'none' | 'line' | 'ru';
  /** Add a strip surcharge behind the crest, kh, and a tension crack (for the evaluator check). */
  extras?: boolean;
}

/**
 * A test geometry (not a real site): a cut or an embankment of height 4–14 m at 1.5–3
 * horizontal to 1 vertical, in a firm soil with a weak layer 0.2–2 m thick, horizontal or
 * dipping out of the slope by up to 10°, crossing the face or lying below the toe, over a
 * firmer soil; drawn from `seed`, written as a section file and read by parseSections (so
 * the strata are clipped under the ground as for any file). The parameters span the ranges
 * of the trade's textbooks; they describe no site.
 */
export function layeredSection(seed: number, options: LayeredOptions = {}): Section {
  const rand = seededRandom(seed);
  const pick = (a: number, b: number) => Math.round((a + (b - a) * rand()) * 1000) / 1000;
  const H = pick(4, 14);
  const run = pick(1.5, 3) * H;
  const flat = Math.round(3 * H + 10);
  // a cut rises away from the road (crest on the right); an embankment is the same shape mirrored
  const mirror = rand() < 0.5 ? -1 : 1;
  const X = (x: number) => Math.round(mirror * x * 1000) / 1000;
  const line = (pts: Point[]): Point[] =>
    (mirror < 0 ? [...pts].reverse() : pts).map(([x, y]) => [X(x), y]);
  const ground = line([
    [-flat, 0],
    [0, 0],
    [run, H],
    [run + flat, H],
  ]);
  const x0 = -flat;
  const x1 = run + flat;
  const thick = pick(0.2, 2);
  // an embankment: fill above the original ground (y = 0) and the weak layer in the foundation
  const embankment = rand() < 0.4;
  // the bottom of the weak layer: through the face (at 20–70 % of the height) or 0–4 m below the toe
  const yb = !embankment && rand() < 0.6 ? pick(0.2, 0.7) * H : -thick - pick(0, 4);
  // dipping out of the slope (down toward the toe) by 2–10°, half of the cases level
  const dip = rand() < 0.5 ? 0 : pick(2, 10);
  const k = Math.tan((dip * Math.PI) / 180);
  const xm = 0.5 * run;
  const boundary = (y: number) =>
    line([
      [x0, Math.round((y + k * (x0 - xm)) * 1000) / 1000],
      [x1, Math.round((y + k * (x1 - xm)) * 1000) / 1000],
    ]);
  const undrained = rand() < 0.25;
  const raw = {
    format: 'scarpline/1',
    id: `layered-${seed}`,
    title: `layered test geometry ${seed}`,
    units: 'si',
    ground,
    materials: {
      fill: {
        unitWeight: 20,
        saturatedUnitWeight: 21,
        strength: { model: 'mohr-coulomb', cohesion: pick(0, 8), frictionAngle: pick(30, 38) },
      },
      firm: {
        unitWeight: 19,
        saturatedUnitWeight: 20,
        strength: { model: 'mohr-coulomb', cohesion: pick(6, 20), frictionAngle: pick(26, 36) },
      },
      weak: undrained
        ? { unitWeight: 18, strength: { model: 'undrained', su: pick(10, 30) } }
        : {
            unitWeight: 18,
            saturatedUnitWeight: 19,
            strength: { model: 'mohr-coulomb', cohesion: pick(0, 5), frictionAngle: pick(10, 20) },
          },
      base: {
        unitWeight: 20,
        saturatedUnitWeight: 21,
        strength: { model: 'mohr-coulomb', cohesion: pick(10, 30), frictionAngle: pick(28, 38) },
      },
    },
    strata: [
      ...(embankment
        ? [{ material: 'fill' }, { material: 'firm', top: 0 }]
        : [{ material: 'firm' }]),
      { material: 'weak', top: boundary(yb + thick) },
      { material: 'base', top: boundary(yb) },
    ],
    water: {},
    analysis: { methods: ['bishop'], slices: 30, surface: { type: 'auto' } },
  } as Record<string, unknown> & { water: Record<string, unknown> };
  const water = options.water ?? (['none', 'line', 'ru'] as const)[Math.floor(rand() * 3)];
  if (water === 'line') {
    const hw = pick(0.3, 0.8) * H;
    raw.water = {
      piezometric: line([
        [x0, -0.5],
        [0, -0.5],
        [run, hw],
        [x1, hw],
      ]),
    };
  } else if (water === 'ru') raw.water = { ru: pick(0.05, 0.3) };
  else delete (raw as { water?: unknown }).water;
  if (options.extras) {
    raw.loads = [{ type: 'strip', from: X(run + 2), to: X(run + 8), pressure: pick(5, 25) }].map(
      (l) => ({ ...l, from: Math.min(l.from, l.to), to: Math.max(l.from, l.to) }),
    );
    raw.seismic = { kh: pick(0.05, 0.2) };
    raw.crack = { depth: 'auto', waterDepth: pick(0, 1) };
  }
  const parsed = parseSections(JSON.stringify(raw), `layered-${seed}.json`);
  const errors = parsed.messages.filter((m) => m.severity === 'error').map(formatMessage);
  if (errors.length > 0 || parsed.sections.length !== 1)
    throw new Error(`layered test geometry ${seed}: ${errors.join('; ')}`);
  return parsed.sections[0];
}

/**
 * Compass search (pattern search with step halving to 1 mm) from x0; f may be Infinity. The
 * least f found (Hooke & Jeeves 1961 pattern moves), for the dense references of the search checks.
 */
export function compass(f: (x: number[]) => number, x0: number[], step: number): number {
  let x = [...x0];
  let fx = f(x);
  let h = step;
  while (h > 1e-3) {
    let moved = false;
    for (let i = 0; i < x.length; i++) {
      for (const s of [1, -1]) {
        const y = [...x];
        y[i] += s * h;
        const fy = f(y);
        if (fy < fx) {
          x = y;
          fx = fy;
          moved = true;
        }
      }
    }
    if (!moved) h /= 2;
  }
  return fx;
}

export type Circle = [number, number, number];

export function exactBishop(section: Section): (c: Circle) => number {
  const prepared = prepareSection(section);
  return ([xc, yc, r]) => {
    if (!(r > 0)) return Infinity;
    const cut = sliceSurface(
      prepared,
      { type: 'circle', center: [xc, yc], radius: r },
      section.analysis.slices,
    );
    if (!cut.ok) return Infinity;
    const pivot: Point = [(cut.slices.mirrored ? -1 : 1) * xc, yc];
    const res = bishop(cut.slices, { seismic: section.seismic, pivot });
    return res.converged ? res.fs : Infinity;
  };
}

/** Distance from (x, y) to the nearest point of a polyline below y (Infinity when none). */
function distanceBelow(line: Point[], x: number, y: number): number {
  let best = Infinity;
  for (let i = 0; i + 1 < line.length; i++) {
    const [ax, ay] = line[i];
    const [bx, by] = line[i + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
    const px = ax + t * dx;
    const py = ay + t * dy;
    if (py < y) best = Math.min(best, Math.hypot(px - x, py - y));
  }
  return best;
}

/** Radii at (x, y) tangent to each segment of a polyline (the foot inside the segment, below the centre). */
function tangentsTo(line: Point[], x: number, y: number): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < line.length; i++) {
    const [ax, ay] = line[i];
    const [bx, by] = line[i + 1];
    const dx = bx - ax;
    const dy = by - ay;
    const t = ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy);
    if (t >= 0 && t <= 1 && ay + t * dy < y) out.push(Math.hypot(ax + t * dx - x, ay + t * dy - y));
  }
  const d = distanceBelow(line, x, y);
  if (d < Infinity) out.push(d);
  return out;
}

/** The least Bishop F over a dense set of circles, refined. */
export function denseReference(section: Section): number {
  const F = exactBishop(section);
  const g = section.ground;
  const ys = g.map((p) => p[1]);
  const yTop = Math.max(...ys);
  const yLow = Math.min(...ys);
  const H = yTop - yLow;
  // the sloping part of the ground, and a window a slope height beyond it either side
  const steep = g.filter(
    (p, i) => i > 0 && Math.abs(p[1] - g[i - 1][1]) > 0.05 * (p[0] - g[i - 1][0]),
  );
  const xs = [...steep.map((p) => p[0]), ...steep.map((p) => g[g.indexOf(p) - 1][0])];
  const wx0 = Math.min(...xs) - H;
  const wx1 = Math.max(...xs) + H;
  const boundaries = section.strata.slice(1).map((s) => s.top);
  const deepest = yLow - 1.5 * H;
  const found: { fs: number; c: Circle; line: Point[] | null }[] = [];
  // centres from the toe's level (small circles on the face) to two and a half heights above the crest
  const N = 22;
  const M = 28;
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < M; j++) {
      const xc = wx0 + ((wx1 - wx0) * i) / (N - 1);
      const yc = yLow + 0.3 * H + (3.2 * H * j) / (M - 1);
      const tryCircle = (r: number, line: Point[] | null) => {
        const fs = F([xc, yc, r]);
        if (fs < Infinity) found.push({ fs, c: [xc, yc, r], line });
      };
      for (let k = 0; k < 20; k++) {
        const r = yc - (yTop - ((yTop - deepest) * (k + 0.5)) / 20);
        if (r > 0) tryCircle(r, null);
      }
      for (const line of boundaries) for (const r of tangentsTo(line, xc, yc)) tryCircle(r, line);
    }
  }
  found.sort((a, b) => a.fs - b.fs);
  // refine the best few that lie apart, freely and (for those made on a boundary) touching it
  const starts: typeof found = [];
  for (const t of found) {
    if (starts.length >= 4) break;
    if (starts.every((s) => Math.hypot(s.c[0] - t.c[0], s.c[1] - t.c[1]) > 0.1 * H)) starts.push(t);
  }
  for (const line of boundaries) {
    const t = found.find((f) => f.line === line);
    if (t) starts.push(t);
  }
  let best = found[0]?.fs ?? Infinity;
  for (const s of starts) {
    best = Math.min(
      best,
      compass((c) => F(c as Circle), s.c, 0.1 * H),
    );
    if (s.line) {
      const line = s.line;
      best = Math.min(
        best,
        compass(([x, y]) => F([x, y, distanceBelow(line, x, y)]), [s.c[0], s.c[1]], 0.1 * H),
      );
    }
  }
  return best;
}
