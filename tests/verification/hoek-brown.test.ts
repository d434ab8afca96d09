/**
 * The generalised Hoek–Brown criterion (Hoek, Carranza-Torres & Corkum 2002) on slice bases,
 * checked against the criterion itself, computed here independently of the solver's code:
 * mb, s, a from the paper's eqs. 2–4 and σ1 = σ3 + σci (mb σ3/σci + s)^a, and the τ–σn
 * envelope as the envelope of the Mohr circles at failure — at a given σn, the highest of all
 * those circles there (closed form: a curve tangent to every circle of a family lies above
 * each and touches it), found by a scan and a golden-section search over σ3.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  bishop,
  caseView,
  hoekBrownEnvelope,
  infiniteSlope,
  parseSections,
  prepareSection,
  sliceSurface,
  solveSlices,
  type HoekBrownStrength,
  type Material,
  type Point,
  type Section,
} from '@scarpline/core';
import { GAMMA_W, compass, homogeneous, relErr } from './support';

/** The criterion as the paper writes it. */
function criterion(h: HoekBrownStrength) {
  const mb = h.mi * Math.exp((h.gsi - 100) / (28 - 14 * h.disturbance));
  const s = Math.exp((h.gsi - 100) / (9 - 3 * h.disturbance));
  const a = 1 / 2 + (Math.exp(-h.gsi / 15) - Math.exp(-20 / 3)) / 6;
  const sci = h.intactStrength;
  const sigma1 = (s3: number) => s3 + sci * Math.pow(Math.max(0, (mb * s3) / sci + s), a);
  const tensile = (-s * sci) / mb;
  return { mb, s, a, sigma1, tensile };
}

/** Height at σn of the Mohr circle at failure of minor principal stress σ3 (−Infinity off the circle). */
function circleHeight(h: HoekBrownStrength, s3: number, sn: number): number {
  const s1 = criterion(h).sigma1(s3);
  const p = 0.5 * (s1 + s3);
  const r = 0.5 * (s1 - s3);
  const d = r * r - (sn - p) * (sn - p);
  return d >= 0 ? Math.sqrt(d) : -Infinity;
}

/** τ of the envelope at σn: the highest circle there, over σ3 from σt to σn (a circle touches the envelope at σn ≥ σ3). */
function tauAt(h: HoekBrownStrength, sn: number): number {
  const lo = criterion(h).tensile;
  const f = (s3: number) => circleHeight(h, s3, sn);
  const n = 400;
  let best = 0;
  let bestV = -Infinity;
  for (let k = 0; k <= n; k++) {
    const x = lo + ((sn - lo) * k) / n;
    const v = f(x);
    if (v > bestV) {
      bestV = v;
      best = k;
    }
  }
  let a = lo + ((sn - lo) * Math.max(0, best - 1)) / n;
  let b = lo + ((sn - lo) * Math.min(n, best + 1)) / n;
  const g = (Math.sqrt(5) - 1) / 2;
  let x1 = b - g * (b - a);
  let x2 = a + g * (b - a);
  let f1 = f(x1);
  let f2 = f(x2);
  for (let it = 0; it < 200 && b - a > 1e-13 * Math.max(1, Math.abs(sn)); it++) {
    if (f1 > f2) {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = f(x1);
    } else {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = f(x2);
    }
  }
  return Math.max(f1, f2, bestV);
}

const hb = (
  intactStrength: number,
  gsi: number,
  mi: number,
  disturbance = 0,
): HoekBrownStrength => ({
  model: 'hoek-brown',
  intactStrength,
  gsi,
  mi,
  disturbance,
});

const ROCKS: [string, HoekBrownStrength][] = [
  ['weak mudstone, GSI 25, blasted (D 0.7)', hb(10000, 25, 8, 0.7)],
  ['sandstone, GSI 50', hb(50000, 50, 17)],
  ['granite, GSI 75', hb(120000, 75, 30)],
];

describe('Hoek–Brown instantaneous c and φ against the criterion’s own tangent', () => {
  test.each(ROCKS)('%s', (_name, h) => {
    const env = hoekBrownEnvelope(h);
    const out = new Float64Array(2);
    for (const fraction of [0.0005, 0.002, 0.01, 0.05, 0.2, 0.5]) {
      const sn = fraction * h.intactStrength;
      env.tangent(sn, out);
      // numerical derivative of τ(σn), central differences
      const dx = 1e-3 * sn;
      const tanPhi = (tauAt(h, sn + dx) - tauAt(h, sn - dx)) / (2 * dx);
      const tau = tauAt(h, sn);
      const c = tau - sn * tanPhi;
      expect(relErr(out[1], tanPhi)).toBeLessThan(1e-5);
      // the tangent line passes through the envelope at σn: c + σn tan φ = τ
      expect(relErr(out[0] + sn * out[1], tau)).toBeLessThan(1e-8);
      expect(Math.abs(out[0] - c)).toBeLessThan(1e-5 * tau);
    }
    // below the tensile strength σt the base is held at it, where τ = 0 (taken a hair inside)
    expect(relErr(env.floor, criterion(h).tensile)).toBeLessThan(1e-3);
  });
});

describe('an infinite slope in Hoek–Brown rock against the criterion on the plane', () => {
  // 35° slope, plane 6 m deep, dry: σn = γ z cos²β and τ_driving = γ z sin β cos β do not
  // depend on F, so F is the root of τ(σn) = F·τ_driving: F = τ(σn)/τ_driving (closed form)
  const rock = hb(10000, 30, 10, 0);
  const material: Material = {
    name: 'rock',
    unitWeight: 24,
    saturatedUnitWeight: 24,
    strength: rock,
  };
  const beta = 35;
  const z = 6;
  const b = (beta * Math.PI) / 180;
  const sn = 24 * z * Math.cos(b) ** 2;
  const drive = 24 * z * Math.sin(b) * Math.cos(b);
  const reference = tauAt(rock, sn) / drive;

  test('the infinite-slope method takes the envelope at the plane’s σn', () => {
    const r = infiniteSlope({
      angle: beta,
      depth: z,
      waterRatio: 0,
      material,
      waterUnitWeight: GAMMA_W,
      kh: 0,
    });
    expect(r.converged).toBe(true);
    expect(relErr(r.fs, reference)).toBeLessThan(1e-8);
  });

  test.each(['janbu', 'spencer', 'morgenstern-price'] as const)(
    'a long plane through %s tends to it as 1/L (common practice: the end wedges add a resistance that does not grow with L)',
    (method) => {
      const L = 1000;
      const H = L * Math.tan(b);
      const ground: Point[] = [
        [0, 0],
        [20, 0],
        [20 + L, H],
        [60 + L, H],
      ];
      const section = homogeneous(ground, material);
      const y = (x: number) => (x - 20) * Math.tan(b) - z;
      const lengths = [400, 900];
      const fs = lengths.map((len) => {
        const x0 = 20 + (L - len) / 2;
        const x1 = x0 + len;
        const points: Point[] = [
          [x0 - 3, y(x0 - 3) + z + 0.5],
          [x0 + 3, y(x0 + 3)],
          [x1 - 3, y(x1 - 3)],
          [x1 + 3, y(x1 + 3) + z + 0.5],
        ];
        const r = caseView(
          analyzeSection({
            ...section,
            analysis: {
              ...section.analysis,
              methods: [method],
              slices: 300,
              surface: { type: 'polyline', points },
            },
          }),
        ).results[0];
        expect(r.converged).toBe(true);
        // every base in rock took its strength at its own normal stress
        expect(r.slices.every((s) => s.strengthAt?.kind === 'normal')).toBe(true);
        return r.fs!;
      });
      const extrapolated = (fs[1] * lengths[1] - fs[0] * lengths[0]) / (lengths[1] - lengths[0]);
      expect(relErr(extrapolated, reference)).toBeLessThan(0.005);
    },
  );
});

type Circle = [number, number, number];

/** Bishop's F of a circle, cut afresh and solved in full with the strengths that vary with stress. */
function exactBishop(section: Section): (c: Circle) => number {
  const prepared = prepareSection(section);
  return ([xc, yc, r]) => {
    if (!(r > 0)) return Infinity;
    const cut = sliceSurface(prepared, { type: 'circle', center: [xc, yc], radius: r }, 40);
    if (!cut.ok) return Infinity;
    const pivot: Point = [(cut.slices.mirrored ? -1 : 1) * xc, yc];
    const res = solveSlices(cut.slices, prepared.rules, section.water.unitWeight, (s) =>
      bishop(s, { seismic: section.seismic, pivot }),
    );
    return res.converged ? res.fs : Infinity;
  };
}

/**
 * The least Bishop F over a dense set of circles (as tests/verification/search-layers.test.ts
 * builds its reference): centres on a grid over a window a slope height beyond the face,
 * twenty depths at each, the best few refined by a compass search to 1 mm.
 */
function denseReference(section: Section): number {
  const F = exactBishop(section);
  const g = section.ground;
  const ys = g.map((p) => p[1]);
  const yTop = Math.max(...ys);
  const yLow = Math.min(...ys);
  const H = yTop - yLow;
  const steep = g.filter(
    (p, i) => i > 0 && Math.abs(p[1] - g[i - 1][1]) > 0.05 * (p[0] - g[i - 1][0]),
  );
  const xs = [...steep.map((p) => p[0]), ...steep.map((p) => g[g.indexOf(p) - 1][0])];
  const wx0 = Math.min(...xs) - H;
  const wx1 = Math.max(...xs) + H;
  const deepest = yLow - 1.5 * H;
  const found: { fs: number; c: Circle }[] = [];
  const N = 18;
  const M = 22;
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < M; j++) {
      const xc = wx0 + ((wx1 - wx0) * i) / (N - 1);
      const yc = yLow + 0.3 * H + (3.2 * H * j) / (M - 1);
      for (let k = 0; k < 20; k++) {
        const r = yc - (yTop - ((yTop - deepest) * (k + 0.5)) / 20);
        if (!(r > 0)) continue;
        const fs = F([xc, yc, r]);
        if (fs < Infinity) found.push({ fs, c: [xc, yc, r] });
      }
    }
  }
  found.sort((a, b) => a.fs - b.fs);
  const starts: typeof found = [];
  for (const t of found) {
    if (starts.length >= 4) break;
    if (starts.every((s) => Math.hypot(s.c[0] - t.c[0], s.c[1] - t.c[1]) > 0.1 * H)) starts.push(t);
  }
  let best = found[0]?.fs ?? Infinity;
  for (const s of starts)
    best = Math.min(
      best,
      compass((c) => F(c as Circle), s.c, 0.1 * H),
    );
  return best;
}

describe('the search in a Hoek–Brown rock cut', () => {
  test('the searched minimum is within 0.5 % of a dense exhaustive search (the rock-cut example)', () => {
    const file = join(__dirname, '..', '..', 'examples', 'cut-rock-hoek-brown.yaml');
    const section = parseSections(readFileSync(file, 'utf8'), file).sections[0];
    const r = caseView(
      analyzeSection({ ...section, analysis: { ...section.analysis, methods: ['bishop'] } }),
    );
    const searched = r.results[0].fs!;
    const reference = denseReference(section);
    expect(searched).toBeLessThanOrEqual(reference * 1.005);
  }, 120_000);
});
