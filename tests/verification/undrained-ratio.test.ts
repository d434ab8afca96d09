/**
 * Su from the vertical effective stress, Su = σ′v · S · OCRᵐ (SHANSEP, Ladd & Foott 1974), on
 * a φ = 0 circle. With φ = 0 every method that keeps moment equilibrium about the centre is
 * the φ = 0 circle (Fellenius 1927; common practice): F = R ∫ Su ds / Σ W·x. The reference
 * integrates that here along the arc and over the mass, independently of the solver's code,
 * with Su taken at each point of the arc from σ′v = γ (y_ground − y) − γw (y_water − y)⁺.
 */
import { analyzeSection, caseView, type Material, type Point, type Section } from '@scarpline/core';
import { GAMMA_W, homogeneous, relErr, simpleSlope } from './support';

const ground = simpleSlope(10, 2);
const center: Point = [35, 25];
const radius = 24;
const gamma = 18;
const S = 0.25;
const m = 0.8;
const OCR = 1.6;
const minimum = 4;
const yOn = (line: Point[], x: number) => {
  for (let i = 0; i + 1 < line.length; i++) {
    const [x0, y0] = line[i];
    const [x1, y1] = line[i + 1];
    if (x >= x0 && x <= x1) return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
  }
  return NaN;
};
const yGround = (x: number) => yOn(ground, x);
// a piezometric line below the ground: 1 m below the toe, rising to 4 m below the crest
const waterLine: Point[] = [
  [0, -1],
  [25, -1],
  [45, 6],
  [200, 6],
];
const clay: Material = {
  name: 'clay',
  unitWeight: gamma,
  saturatedUnitWeight: gamma,
  strength: { model: 'undrained-ratio', ratio: S, minimum, exponent: m, ocr: OCR, pop: null },
};

/** F of the φ = 0 circle by Simpson's rule over the arc (resistance) and over x (the moment of the mass). */
function reference(water: Point[] | null): number {
  const [xc, yc] = center;
  // the arc's ends: where the circle meets the ground, found by bisection on each side
  const below = (x: number) => yc - Math.sqrt(Math.max(0, radius * radius - (x - xc) ** 2));
  const crossing = (a: number, b: number) => {
    const g = (x: number) => yGround(x) - below(x);
    for (let k = 0; k < 200; k++) {
      const mid = 0.5 * (a + b);
      if (g(a) * g(mid) <= 0) b = mid;
      else a = mid;
    }
    return 0.5 * (a + b);
  };
  const xL = crossing(xc - radius + 1e-9, xc);
  const xR = crossing(xc, xc + radius - 1e-9);
  const simpson = (f: (t: number) => number, a: number, b: number, n = 20000) => {
    const h = (b - a) / n;
    let s = f(a) + f(b);
    for (let k = 1; k < n; k++) s += (k % 2 ? 4 : 2) * f(a + k * h);
    return (s * h) / 3;
  };
  const su = (x: number, y: number) => {
    const u = water === null ? 0 : GAMMA_W * Math.max(0, yOn(water, x) - y);
    const sv = gamma * (yGround(x) - y) - u;
    return Math.max(minimum, Math.max(0, sv) * S * Math.pow(OCR, m));
  };
  // the arc by its angle from the downward vertical: x = xc + R sin θ, y = yc − R cos θ
  const tL = Math.asin((xL - xc) / radius);
  const tR = Math.asin((xR - xc) / radius);
  const resisting =
    radius *
    simpson((t) => su(xc + radius * Math.sin(t), yc - radius * Math.cos(t)) * radius, tL, tR);
  const driving = Math.abs(simpson((x) => gamma * (yGround(x) - below(x)) * (x - xc), xL, xR));
  return resisting / driving;
}

function run(water: Section['water']) {
  const section = homogeneous(ground, clay, { water });
  return caseView(
    analyzeSection({
      ...section,
      analysis: {
        ...section.analysis,
        methods: ['ordinary', 'bishop', 'spencer', 'morgenstern-price', 'phi-zero-circle'],
        slices: 300,
        surface: { type: 'circle', center, radius },
      },
    }),
  ).results;
}

describe('Su from σ′v (SHANSEP) on a φ = 0 circle against the exact φ = 0 computation', () => {
  test.each([
    ['dry', null],
    ['a piezometric line below the ground', waterLine],
  ] as const)('%s: ordinary, Bishop, Spencer, Morgenstern–Price within 0.1 %', (_name, line) => {
    const water: Section['water'] =
      line === null
        ? { kind: 'none', unitWeight: GAMMA_W }
        : { kind: 'piezometric', line: [...line], unitWeight: GAMMA_W };
    const ref = reference(line);
    const results = run(water);
    for (const method of ['ordinary', 'bishop', 'spencer', 'morgenstern-price']) {
      const r = results.find((x) => x.method === method)!;
      expect(r.converged).toBe(true);
      expect(relErr(r.fs!, ref)).toBeLessThan(1e-3);
      // each base reports the σ′v its Su was taken at, and Su = σ′v S OCRᵐ there
      for (const s of r.slices) {
        expect(s.frictionAngle).toBe(0);
        expect(s.strengthAt!.kind).toBe('vertical');
        expect(s.cohesion).toBeCloseTo(
          Math.max(minimum, s.strengthAt!.stress * S * Math.pow(OCR, m)),
          9,
        );
      }
    }
    // the φ = 0 circle takes Su by depth from a datum, not from σ′v: not run, with its reason
    const phi0 = results.find((x) => x.method === 'phi-zero-circle')!;
    expect(phi0.fs).toBeNull();
    expect(phi0.reason).toMatch(/Su from σ′v/);
  });
});
