/**
 * The search for the critical slip surface, checked against Taylor's (1937) stability
 * numbers, an exact φ = 0 reference of our own, the infinite slope, a dense exhaustive search
 * and a thin weak layer that circles miss.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  caseView,
  circlePolygonMoments,
  bishopCircleEvaluator,
  nelderMead,
  parseSections,
  prepareSection,
  searchSection,
  type Material,
  type Point,
  type Section,
} from '@scarpline/core';
import { homogeneous, mohrCoulomb, relErr, undrained } from './support';

/** Every section of every example file, by id. */
function exampleSections(): [string, Section][] {
  const dir = join(__dirname, '..', '..', 'examples');
  return readdirSync(dir)
    .filter((f) => f.endsWith('.yaml'))
    .flatMap((f) =>
      parseSections(readFileSync(join(dir, f), 'utf8'), f).sections.map(
        (s) => [s.id, s] as [string, Section],
      ),
    );
}

const rigid: Material = {
  name: 'rock',
  unitWeight: 0,
  saturatedUnitWeight: 0,
  strength: { model: 'rigid' },
};

/** A slope of height H at angle β (degrees), toe at x = 0, with long flats either side. */
function slope(H: number, beta: number, flat: number): Point[] {
  const run = H / Math.tan((beta * Math.PI) / 180);
  return [
    [-flat, 0],
    [0, 0],
    [run, H],
    [run + flat, H],
  ];
}

/**
 * Independent φ = 0 reference (no slices, no solver code but the disk ∩ polygon primitive,
 * itself checked against closed forms): for a circle, the weight and lever arm of disk ∩ soil
 * and the arc length inside the soil give F = Su·L·R / (W·a); minimised over circles by
 * Nelder–Mead from many starts.
 */
function exactPhiZero(ground: Point[], base: number, gamma: number, su: number) {
  const soil: Point[] = [...ground, [ground[ground.length - 1][0], base], [ground[0][0], base]];
  const F = (xc: number, yc: number, r: number) => {
    if (!(r > 0) || yc - r < base - 1e-9) return Infinity;
    const m = circlePolygonMoments([xc, yc], r, soil);
    const area = Math.abs(m.area);
    if (area < 1e-6) return Infinity;
    const xg = m.mx / m.area;
    // arc inside the soil: the lower arc below the ground, by fine angular sampling of the crossings
    const K = 4000;
    let inside = 0;
    for (let k = 0; k < K; k++) {
      const th = Math.PI + (Math.PI * (k + 0.5)) / K; // lower half
      const x = xc + r * Math.cos(th);
      const y = yc + r * Math.sin(th);
      let gy = NaN;
      for (let i = 0; i + 1 < ground.length; i++) {
        if (x >= ground[i][0] && x <= ground[i + 1][0]) {
          gy =
            ground[i][1] +
            ((ground[i + 1][1] - ground[i][1]) * (x - ground[i][0])) /
              (ground[i + 1][0] - ground[i][0]);
        }
      }
      if (Number.isNaN(gy)) return Infinity; // leaves the section
      if (y < gy) inside++;
    }
    const L = (Math.PI * r * inside) / K;
    const arm = Math.abs(xg - xc);
    return (su * L * r) / (gamma * area * arm);
  };
  return F;
}

function minimise(
  F: (x: number, y: number, r: number) => number,
  starts: [number, number, number][],
) {
  let best = Infinity;
  for (const s of starts) {
    const r = nelderMead(([x, y, rr]) => F(x, y, rr), s, [1, 1, 1], 1e-9, 800);
    best = Math.min(best, r.fx);
  }
  return best;
}

describe("Taylor's stability numbers for φ = 0 (Taylor 1937; values from memory)", () => {
  const H = 10;
  const gamma = 18;
  const su = 30;

  test('60° slope, toe circle: N = c/(γ H F) ≈ 0.191, and the search matches the exact reference', () => {
    const ground = slope(H, 60, 60);
    const section = homogeneous(ground, undrained(gamma, su), {
      materials: { soil: undrained(gamma, su), rock: rigid },
      strata: [
        { material: 'soil', top: ground },
        {
          material: 'rock',
          top: [
            [-60, -40],
            [80, -40],
          ],
        },
      ],
      analysis: {
        methods: ['phi-zero-circle', 'bishop'],
        slices: 60,
        surface: { type: 'auto' },
        infiniteSlope: null,
        case: null,
        requiredFs: null,
      },
    });
    const r = caseView(analyzeSection(section));
    const fs = r.results.find((m) => m.method === 'phi-zero-circle')!.fs!;
    const N = su / (gamma * H * fs);
    expect(relErr(N, 0.191)).toBeLessThan(0.03);
    const exact = minimise(exactPhiZero(ground, -40, gamma, su), [
      [2, 14, 15],
      [4, 12, 12],
      [0, 18, 18],
    ]);
    expect(relErr(fs, exact)).toBeLessThan(0.005);
  });

  test('30° slope over deep clay: N rises toward 0.181 as the firm base gets deeper (deep circle to the base)', () => {
    const Ns = [1.5, 4].map((D) => {
      const ground = slope(H, 30, 8 * D * H);
      const baseY = H - D * H;
      const section = homogeneous(ground, undrained(gamma, su), {
        materials: { soil: undrained(gamma, su), rock: rigid },
        strata: [
          { material: 'soil', top: ground },
          {
            material: 'rock',
            top: [
              [-8 * D * H, baseY],
              [20 + 8 * D * H, baseY],
            ],
          },
        ],
        analysis: {
          methods: ['bishop'],
          slices: 80,
          surface: { type: 'auto' },
          infiniteSlope: null,
          case: null,
          requiredFs: null,
        },
      });
      const fs = caseView(analyzeSection(section)).governing!.fs;
      return su / (gamma * H * fs);
    });
    expect(Ns[1]).toBeGreaterThan(Ns[0]);
    expect(relErr(Ns[1], 0.181)).toBeLessThan(0.03);
  });
});

describe('cohesionless slope (common practice: circles tend to the infinite slope)', () => {
  const ground = slope(8, Math.atan(0.5) * (180 / Math.PI), 30);
  const section = homogeneous(ground, mohrCoulomb(19, 0, 35), {
    analysis: {
      methods: ['bishop'],
      slices: 40,
      surface: { type: 'auto' },
      infiniteSlope: null,
      case: null,
      requiredFs: 1.3,
    },
  });
  const fInf = Math.tan((35 * Math.PI) / 180) / 0.5;

  test('circles through two points of the face approach tan φ′/tan β from above as the radius grows', () => {
    const evaluate = bishopCircleEvaluator(prepareSection(section), 60);
    // chord between x = 4 and x = 12 on the face (y = x/2), centres up the normal
    const a: Point = [4, 2];
    const b: Point = [12, 6];
    const mid: Point = [8, 4];
    const half = Math.hypot(b[0] - a[0], b[1] - a[1]) / 2;
    const n: Point = [-1 / Math.sqrt(5), 2 / Math.sqrt(5)];
    const fs = [1.2, 2, 3.5, 6].map((k) => {
      const R = half * k;
      const h = Math.sqrt(R * R - half * half);
      return evaluate(mid[0] + n[0] * h, mid[1] + n[1] * h, R);
    });
    for (let i = 1; i < fs.length; i++) expect(fs[i]).toBeLessThan(fs[i - 1]);
    for (const f of fs) expect(f).toBeGreaterThan(fInf);
    expect(relErr(fs[3], fInf)).toBeLessThan(0.03);
  });

  test('the search reports the infinite slope as governing, with the cohesionless-circle warning', () => {
    const r = caseView(analyzeSection(section));
    expect(r.governing?.method).toBe('infinite-slope');
    expect(r.governing?.fs).toBeCloseTo(fInf, 10);
    expect(r.warnings.map((w) => w.code)).toContain('cohesionless-circle');
    // the shallowest circles found are within the slices' discretisation of the infinite slope
    const circle = r.results.find((m) => m.method === 'bishop')!;
    expect(relErr(circle.fs!, fInf)).toBeLessThan(0.005);
  });
});

describe('search quality: within 0.5 % of a dense exhaustive search on every example', () => {
  const sections = exampleSections();
  test.each(sections)('%s', (_id, given) => {
    const section: Section = {
      ...given,
      analysis: { ...given.analysis, surface: { type: 'auto' } },
    };
    const prepared = prepareSection(section);
    const found = searchSection(prepared, { type: 'auto' });
    expect(found.circle).not.toBeNull();
    // dense: centres on a 36 × 36 grid over a wide window, 36 tangent elevations, same evaluator
    const evaluate = bishopCircleEvaluator(prepared, section.analysis.slices);
    const g = section.ground;
    const ys = g.map((p) => p[1]);
    const H = Math.max(...ys) - Math.min(...ys);
    const x0 = g[0][0];
    const x1 = g[g.length - 1][0];
    const rock = prepared.normal.rigidTop;
    const deepest = rock ? Math.min(...rock.map((p) => p[1])) : Math.min(...ys) - 2 * H;
    let dense = Infinity;
    const n = 36;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const xc = x0 + ((x1 - x0) * i) / (n - 1);
        const yc = Math.max(...ys) + (3 * H * (j + 0.5)) / n;
        for (let k = 0; k < n; k++) {
          const t = Math.max(...ys) - ((Math.max(...ys) - deepest) * (k + 0.5)) / n;
          const f = evaluate(xc, yc, yc - t);
          if (f > 0 && f < dense) dense = f;
        }
      }
    }
    expect(found.circle!.fs).toBeLessThanOrEqual(dense * 1.005);
  });
});

describe('grid moves', () => {
  const ground = slope(10, 35, 40);
  const base = homogeneous(ground, mohrCoulomb(19, 12, 25));
  test('a grid placed off to one side is moved until its minimum is inside, and each move is reported', () => {
    const section: Section = {
      ...base,
      analysis: {
        ...base.analysis,
        surface: { type: 'grid', centers: { x: [30, 40], y: [25, 32], nx: 6, ny: 6 }, moves: 16 },
      },
    };
    const r = caseView(analyzeSection(section));
    expect(r.search!.moves.length).toBeGreaterThan(0);
    const g = r.search!.grid!;
    expect(g.x[0]).toBeLessThan(30);
    expect(r.warnings.map((w) => w.code)).not.toContain('minimum-on-edge');
  });
  test('with no moves allowed the minimum stays on the edge and the minimum-on-edge warning says so', () => {
    const section: Section = {
      ...base,
      analysis: {
        ...base.analysis,
        surface: { type: 'grid', centers: { x: [30, 40], y: [25, 32], nx: 6, ny: 6 }, moves: 0 },
      },
    };
    const r = caseView(analyzeSection(section));
    expect(r.warnings.map((w) => w.code)).toContain('minimum-on-edge');
  });
});

describe('noncircular search', () => {
  test('a thin weak layer: the noncircular F is clearly below the best circle (at least 10 %)', () => {
    // 1 : 1.5 slope 10 m high in stiff clay; a 0.5 m seam of c′ = 0, φ′ = 10° 1 m below the toe
    const ground = slope(10, Math.atan(1 / 1.5) * (180 / Math.PI), 45);
    const stiff = { ...mohrCoulomb(19, 20, 32), name: 'stiff' };
    const seam = { ...mohrCoulomb(18, 0, 10), name: 'seam' };
    const section = homogeneous(ground, stiff, {
      materials: { stiff, seam, under: { ...mohrCoulomb(19, 20, 32), name: 'under' } },
      strata: [
        { material: 'stiff', top: ground },
        {
          material: 'seam',
          top: [
            [-45, -1],
            [60, -1],
          ],
        },
        {
          material: 'under',
          top: [
            [-45, -1.5],
            [60, -1.5],
          ],
        },
      ],
      analysis: {
        methods: ['spencer'],
        slices: 50,
        surface: { type: 'noncircular' },
        infiniteSlope: null,
        case: null,
        requiredFs: null,
      },
    });
    const found = searchSection(prepareSection(section), { type: 'noncircular' });
    expect(found.circle).not.toBeNull();
    expect(found.polyline).not.toBeNull();
    expect(found.polyline!.fs).toBeLessThan(0.9 * found.circle!.fs);
    const r = caseView(analyzeSection(section));
    expect(r.results[0].surface?.type).toBe('polyline');
  });
});

describe('every example finds its critical surface without a warning it should not have', () => {
  const sections = exampleSections();
  test.each(sections)('%s', (_id, given) => {
    // (a section that lists design cases: each case searched, the governing one looked at)
    const r = caseView(
      analyzeSection({
        ...given,
        analysis: { ...given.analysis, surface: { type: 'auto' } },
        ...(given.cases
          ? {
              cases: given.cases.map((c) => ({
                ...c,
                analysis: { ...c.analysis, surface: { type: 'auto' as const } },
              })),
            }
          : {}),
      }),
    );
    expect(r.governing).not.toBeNull();
    const codes = r.warnings.map((w) => w.code);
    for (const bad of ['minimum-on-edge', 'no-surface', 'no-convergence', 'surface-rejected'])
      expect(codes).not.toContain(bad);
    const cohesionless = Object.values(given.materials).every(
      (m) =>
        m.strength.model === 'rigid' ||
        (m.strength.model === 'mohr-coulomb' && m.strength.cohesion === 0),
    );
    expect(codes.includes('cohesionless-circle')).toBe(cohesionless);
    expect(r.search!.trials).toBeGreaterThan(500);
  });
});
