/**
 * The general (moment about a point, loads included) formulation reduces to the familiar
 * textbook formulas, and behaves as the theory of effective stress requires.
 */
import {
  bishop,
  janbu,
  janbuCorrection,
  ordinary,
  spencer,
  morgensternPrice,
  type Point,
  type Section,
} from '@scarpline/core';
import {
  GAMMA_W,
  circleOptions,
  cut,
  homogeneous,
  mohrCoulomb,
  relErr,
  simpleSlope,
} from './support';

const ground = simpleSlope(10, 2);
const center: Point = [35, 25];
const radius = 24;
const circle = { type: 'circle' as const, center, radius };
const material = mohrCoulomb(19, 10, 27);

/** Σ over slices from the SliceSet with the textbook notation: b, α, W, u, c′, tan φ′. */
function textbook(section: Section, n: number) {
  const s = cut(section, circle, n).slices;
  const rows = Array.from({ length: s.n }, (_, i) => {
    const b = s.xr[i] - s.xl[i];
    const alpha = Math.atan2(s.yBaseR[i] - s.yBaseL[i], b);
    return { b, alpha, W: s.weight[i], u: s.porePressure[i], c: s.cohesion[i], t: s.tanPhi[i] };
  });
  const drive = rows.reduce((a, r) => a + r.W * Math.sin(r.alpha), 0);
  // Fellenius (1936): F = Σ[c′l + (W cos α − u l) tan φ′] / Σ W sin α
  const ord =
    rows.reduce((a, r) => {
      const l = r.b / Math.cos(r.alpha);
      return a + r.c * l + (r.W * Math.cos(r.alpha) - r.u * l) * r.t;
    }, 0) / drive;
  // Bishop (1955): F = Σ{[c′b + (W − u b) tan φ′]/mα} / Σ W sin α, iterated
  let F = 1;
  for (let k = 0; k < 100; k++) {
    F =
      rows.reduce(
        (a, r) =>
          a +
          (r.c * r.b + (r.W - r.u * r.b) * r.t) /
            (Math.cos(r.alpha) + (Math.sin(r.alpha) * r.t) / F),
        0,
      ) / drive;
  }
  return { ord, bishop: F };
}

describe('textbook forms', () => {
  // below the ground everywhere: no ponded water, which the textbook forms leave out
  const water = {
    kind: 'piezometric' as const,
    line: [
      [0, -2],
      [20, -1],
      [40, 5],
      [140, 6],
    ] as Point[],
    unitWeight: GAMMA_W,
  };
  const section = homogeneous(ground, material, { water });

  test('Bishop (1955) textbook formula = the general moment form (n = 400, to 0.05 %)', () => {
    const sliced = cut(section, circle, 400);
    const general = bishop(sliced.slices, circleOptions(sliced, center, section)).fs;
    expect(relErr(general, textbook(section, 400).bishop)).toBeLessThan(5e-4);
  });

  test('Fellenius (1936) textbook formula = the general moment form (n = 400, to 0.05 %)', () => {
    const sliced = cut(section, circle, 400);
    const general = ordinary(sliced.slices, circleOptions(sliced, center, section)).fs;
    expect(relErr(general, textbook(section, 400).ord)).toBeLessThan(5e-4);
  });

  test('ordinary ≤ Bishop on a c-φ slope with pore pressure (common practice: Fellenius is conservative)', () => {
    const r = textbook(section, 40);
    expect(r.ord).toBeLessThan(r.bishop);
  });
});

describe('submerged slope = buoyant unit weight (effective stress; Terzaghi; any textbook)', () => {
  // Still water above the crest: boundary water pressures amount to buoyancy, so F equals the
  // dry F computed with γ′ = γsat − γw.
  const gammaSat = 20;
  const wet = homogeneous(ground, mohrCoulomb(18, 10, 27, gammaSat), {
    water: {
      kind: 'piezometric',
      line: [
        [0, 15],
        [140, 15],
      ],
      unitWeight: GAMMA_W,
    },
  });
  const buoyant = homogeneous(ground, mohrCoulomb(gammaSat - GAMMA_W, 10, 27));
  const a = cut(wet, circle, 200);
  const b = cut(buoyant, circle, 200);
  test('Bishop', () => {
    expect(
      relErr(
        bishop(a.slices, circleOptions(a, center, wet)).fs,
        bishop(b.slices, circleOptions(b, center, buoyant)).fs,
      ),
    ).toBeLessThan(2e-4);
  });
  test('Janbu F0', () => {
    expect(
      relErr(
        janbu(a.slices, { seismic: wet.seismic }).fsUncorrected!,
        janbu(b.slices, { seismic: buoyant.seismic }).fsUncorrected!,
      ),
    ).toBeLessThan(2e-4);
  });
});

describe('facing direction (common practice: a mirrored section is the same problem)', () => {
  const loads = [{ type: 'strip' as const, from: 45, to: 52, pressure: 20 }];
  const right = homogeneous(ground, material, { loads, seismic: { kh: 0.1, kv: 0.05 } });
  const m = (p: Point): Point => [200 - p[0], p[1]];
  const mg = [...ground].reverse().map(m);
  const left = homogeneous(mg, material, {
    loads: [{ type: 'strip', from: 148, to: 155, pressure: 20 }],
    seismic: right.seismic,
  });
  const a = cut(right, circle, 40);
  const b = cut(left, { type: 'circle', center: m(center), radius }, 40);
  const methods = {
    ordinary: (s: typeof a, c: Point, sec: Section) =>
      ordinary(s.slices, circleOptions(s, c, sec)).fs,
    bishop: (s: typeof a, c: Point, sec: Section) => bishop(s.slices, circleOptions(s, c, sec)).fs,
    janbu: (s: typeof a, _c: Point, sec: Section) => janbu(s.slices, { seismic: sec.seismic }).fs,
    spencer: (s: typeof a, c: Point, sec: Section) =>
      spencer(s.slices, circleOptions(s, c, sec)).fs,
    'morgenstern-price': (s: typeof a, c: Point, sec: Section) =>
      morgensternPrice(s.slices, { ...circleOptions(s, c, sec), fn: { shape: 'half-sine' } }).fs,
  };
  for (const [name, f] of Object.entries(methods)) {
    test(`${name}: same F both ways`, () => {
      expect(relErr(f(b, m(center), left), f(a, center, right))).toBeLessThan(1e-9);
    });
  }
});

describe("Janbu's correction factor (Janbu 1973 curve fit; values from memory)", () => {
  test('f0 = 1 + b1·(d/L − 1.4 (d/L)²): for a circle with d/L ≈ 0.1 in c-φ soil f0 ≈ 1.04', () => {
    const s = cut(homogeneous(ground, material), circle, 40);
    const x0 = s.slices.xl[0];
    const y0 = s.slices.yBaseL[0];
    const x1 = s.slices.xr[s.slices.n - 1];
    const y1 = s.slices.yBaseR[s.slices.n - 1];
    const L = Math.hypot(x1 - x0, y1 - y0);
    // the deepest point of the arc below the chord, from the circle: the sagitta R − (distance of centre to chord)
    const dist = Math.abs((x1 - x0) * (center[1] - y0) - (y1 - y0) * (center[0] - x0)) / L;
    const d = radius - dist;
    const r = d / L;
    expect(janbuCorrection(s.slices)).toBeCloseTo(1 + 0.5 * (r - 1.4 * r * r), 3);
  });
});
