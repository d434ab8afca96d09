/**
 * Reinforcement against closed forms and hand calculations.
 *
 * 1. Culmann's planar wedge (as in planar-wedge.test.ts) with tie forces: on one plane the
 *    whole wedge is one rigid block, so force equilibrium along and across the plane gives F
 *    in closed form, and every method that satisfies force equilibrium (Spencer,
 *    Morgenstern–Price, Janbu's F0) must give it (common practice). With forces T_j in
 *    directions u_j, t = (cos θ, sin θ) up the plane and n = (−sin θ, cos θ) its normal:
 *    - divided by F: c′L + (W cos θ − Σ T_j u_j·n / F) tan φ′ + Σ T_j u_j·t = F W sin θ,
 *      a quadratic in F;
 *    - at full value: F = [c′L + (W cos θ − Σ T u·n) tan φ′] / (W sin θ − Σ T u·t).
 * 2. A geosynthetic that governs in pullout, against the hand calculation of its pullout
 *    2·Ci·Rc·(c′ + σ′v tan φ′)·Le behind the surface (the pullout form of FHWA NHI-10-024,
 *    Berg, Christopher & Samtani 2009, with the soil's c′ included as the interaction
 *    coefficient's definition takes it; from memory of the manual).
 * 3. The reinforced-slope moment form of the same manual (from memory): a horizontal
 *    reinforcement force T_S at lever arm D about the centre of a circle adds T_S·D to the
 *    resisting moment, FS_R = FS_U + T_S·D/M_D. In a φ = 0 soil the base normal force does not
 *    enter the strength, so every circular method must give exactly this.
 */
import {
  analyzeSection,
  caseView,
  type MethodId,
  type MethodReport,
  type Point,
  type Reinforcement,
  type Section,
  polygonArea,
} from '@scarpline/core';
import { denseReference, homogeneous, mohrCoulomb, relErr, undrained } from './support';

const deg = Math.PI / 180;

// toe (10, 0), crest (20, 10): β = 45°; the plane through the toe at θ = 30°
const ground: Point[] = [
  [0, 0],
  [10, 0],
  [20, 10],
  [40, 10],
];
const theta = 30 * deg;
const xExit = 10 + 10 / Math.tan(theta);
const gamma = 18;
const c = 10;
const phi = 25 * deg;
const tanPhi = Math.tan(phi);
const W =
  gamma *
  Math.abs(
    polygonArea([
      [10, 0],
      [xExit, 10],
      [20, 10],
    ]),
  );
const L = 10 / Math.sin(theta);
const plane = {
  type: 'polyline' as const,
  points: [
    [10, 0],
    [xExit, 10],
  ] as Point[],
};
const t: Point = [Math.cos(theta), Math.sin(theta)];
const n: Point = [-Math.sin(theta), Math.cos(theta)];
const dot = (a: Point, b: Point) => a[0] * b[0] + a[1] * b[1];

/** The wedge's F with forces T in directions u, divided by F or not (the closed forms above). */
function wedgeFs(forces: { T: number; u: Point }[], dividedByF: boolean): number {
  const along = forces.reduce((s, f) => s + f.T * dot(f.u, t), 0);
  const across = forces.reduce((s, f) => s + f.T * dot(f.u, n), 0);
  if (!dividedByF)
    return (c * L + (W * Math.cos(theta) - across) * tanPhi) / (W * Math.sin(theta) - along);
  const a = W * Math.sin(theta);
  const b = c * L + W * Math.cos(theta) * tanPhi + along;
  const c0 = across * tanPhi;
  return (b + Math.sqrt(b * b - 4 * a * c0)) / (2 * a);
}

const FORCE_METHODS: MethodId[] = ['janbu', 'spencer', 'morgenstern-price'];

function onPlane(reinforcement: Reinforcement[]): Map<MethodId, MethodReport> {
  const section: Section = homogeneous(ground, mohrCoulomb(gamma, c, 25), {
    reinforcement,
  });
  const r = caseView(
    analyzeSection({
      ...section,
      analysis: { ...section.analysis, methods: FORCE_METHODS, slices: 30, surface: plane },
    }),
  );
  return new Map(r.results.map((m) => [m.method, m]));
}

/** F of force equilibrium: Janbu's uncorrected F0 (its correction is 1 on a straight line), the others' F. */
const forceFs = (m: MethodReport) => (m.method === 'janbu' ? m.fsUncorrected! : m.fs!);

// a horizontal geogrid at y = 5 from the face into the slope, its strength governing
const grid = (dividedByF: boolean): Reinforcement => ({
  type: 'geosynthetic',
  name: 'grid',
  line: [
    [15, 5],
    [40, 5],
  ],
  strength: 25,
  interaction: 0.8,
  coverage: 1,
  dividedByF,
});
// a nail from the face at 15° below horizontal, its bar governing (30 kN per m run)
const nail = (dividedByF: boolean): Reinforcement => ({
  type: 'nail',
  name: 'nail',
  head: [17, 7],
  inclination: 15,
  toward: 'right',
  length: 12,
  spacing: 1.5,
  tensileCapacity: 45,
  bond: 100,
  facingCapacity: 60,
  dividedByF,
});
const uNail: Point = [Math.cos(15 * deg), -Math.sin(15 * deg)];

describe('planar wedge with a horizontal and an inclined tie force (closed form)', () => {
  for (const dividedByF of [true, false]) {
    const label = dividedByF ? 'divided by F' : 'at full value';
    const results = onPlane([grid(dividedByF), nail(dividedByF)]);
    const expected = wedgeFs(
      [
        { T: 25, u: [1, 0] },
        { T: 30, u: uNail },
      ],
      dividedByF,
    );
    test(`${label}: both cross the plane once, their strengths governing`, () => {
      const m = results.get('spencer')!;
      const [g, nl] = m.reinforcement!;
      expect(g.crossings).toHaveLength(1);
      expect(g.crossings[0].mode).toBe('strength');
      expect(g.crossings[0].available).toBeCloseTo(25, 10);
      expect(nl.crossings[0].mode).toBe('strength');
      expect(nl.crossings[0].available).toBeCloseTo(30, 10);
      // the forces' own directions on the mass
      expect(g.crossings[0].direction).toBeCloseTo(0, 10);
      expect(nl.crossings[0].direction).toBeCloseTo(-15, 10);
    });
    for (const method of FORCE_METHODS) {
      test(`${label}: ${method} = closed form`, () => {
        const m = results.get(method)!;
        expect(m.converged).toBe(true);
        expect(relErr(forceFs(m), expected)).toBeLessThan(1e-7);
        if (method === 'janbu') expect(m.correction).toBeCloseTo(1, 12);
      });
    }
  }
  test('the ties raise F above the unreinforced wedge (closed form without them)', () => {
    expect(wedgeFs([{ T: 25, u: [1, 0] }], true)).toBeGreaterThan(wedgeFs([], true));
    const bare = onPlane([]).get('spencer')!.fs!;
    expect(relErr(bare, wedgeFs([], true))).toBeLessThan(1e-8);
  });
});

describe('a pile and an anchor on the wedge (closed form)', () => {
  test('a pile row across the plane: its shear along the plane, divided by F', () => {
    const results = onPlane([
      { type: 'pile', name: 'piles', x: 24, top: null, bottom: -2, shear: 20, dividedByF: true },
    ]);
    const expected = wedgeFs([{ T: 20, u: t }], true);
    for (const method of FORCE_METHODS)
      expect(relErr(forceFs(results.get(method)!), expected)).toBeLessThan(1e-7);
  });
  test('a prestressed anchor crossed on its free length: its whole load, at full value', () => {
    const anchor: Reinforcement = {
      type: 'anchor',
      name: 'anchor',
      head: [15, 5],
      inclination: 20,
      toward: 'right',
      freeLength: 8,
      bondLength: 6,
      spacing: 2,
      capacity: 150,
      bond: 25,
      acts: 'load',
      dividedByF: false,
    };
    const results = onPlane([anchor]);
    const expected = wedgeFs([{ T: 75, u: [Math.cos(20 * deg), -Math.sin(20 * deg)] }], false);
    for (const method of FORCE_METHODS)
      expect(relErr(forceFs(results.get(method)!), expected)).toBeLessThan(1e-7);
    expect(results.get('spencer')!.reinforcement![0].crossings[0].force).toBeCloseTo(75, 10);
  });
});

describe('a geosynthetic that governs in pullout (hand calculation)', () => {
  // at y = 6 the plane lies under the flat crest (x ≥ 20): σ′v = γ·(10 − 6) behind it
  const y = 6;
  const xCross = 10 + y / Math.tan(theta);
  const Ci = 0.7;
  const Rc = 0.9;
  const end = 22;
  const layer: Reinforcement = {
    type: 'geosynthetic',
    name: 'short grid',
    line: [
      [16, y],
      [end, y],
    ],
    strength: 200,
    interaction: Ci,
    coverage: Rc,
    dividedByF: true,
  };
  const results = onPlane([layer]);
  const sigmaV = gamma * (10 - y);
  const pullout = 2 * Ci * Rc * (c + sigmaV * tanPhi) * (end - xCross);
  test('its force is the pullout of the part behind the plane', () => {
    const x = results.get('spencer')!.reinforcement![0].crossings[0];
    expect(x.mode).toBe('pullout');
    expect(relErr(x.available, pullout)).toBeLessThan(1e-9);
    expect(x.capacities.front!).toBeGreaterThan(pullout);
  });
  test('and the wedge takes it as the closed form does', () => {
    const expected = wedgeFs([{ T: pullout, u: [1, 0] }], true);
    for (const method of FORCE_METHODS)
      expect(relErr(forceFs(results.get(method)!), expected)).toBeLessThan(1e-7);
  });
});

describe('the reinforced-slope moment form in a φ = 0 soil (FS_R = FS_U + T·D/M_D)', () => {
  const g: Point[] = [
    [0, 0],
    [20, 0],
    [32, 6],
    [80, 6],
  ];
  const circle = { type: 'circle' as const, center: [24, 14] as Point, radius: 14.5 };
  const methods: MethodId[] = ['phi-zero-circle', 'ordinary', 'bishop'];
  const run = (reinforcement: Reinforcement[]) =>
    caseView(
      analyzeSection({
        ...homogeneous(g, undrained(18, 25), { reinforcement }),
        analysis: {
          ...homogeneous(g, undrained(18, 25)).analysis,
          methods,
          slices: 60,
          surface: circle,
        },
      }),
    );
  const bare = run([]);
  const phiZero = bare.results.find((m) => m.method === 'phi-zero-circle')!;
  const MD = phiZero.massWeight! * phiZero.leverArm!;
  const level = 1;
  const T = 30;
  const D = circle.center[1] - level;
  const layer = (dividedByF: boolean): Reinforcement => ({
    type: 'geosynthetic',
    name: 'basal layer',
    line: [
      [0, level],
      [80, level],
    ],
    strength: T,
    interaction: 1,
    coverage: 1,
    dividedByF,
  });
  test('divided by F: each method adds T·D/M_D to its own unreinforced F', () => {
    const r = run([layer(true)]);
    for (const m of r.results) {
      const fsU = bare.results.find((b) => b.method === m.method)!.fs!;
      expect(relErr(m.fs!, fsU + (T * D) / MD)).toBeLessThan(1e-9);
      // crossed once, under the crest side of the mass, where the movement pulls it
      const crossings = m.reinforcement![0].crossings;
      expect(crossings.map((x) => x.counted)).toEqual([true]);
      expect(crossings[0].available).toBeCloseTo(T, 10);
    }
  });
  test('at full value: F = M_R / (M_D − T·D)', () => {
    const r = run([layer(false)]);
    for (const m of r.results) {
      const fsU = bare.results.find((b) => b.method === m.method)!.fs!;
      expect(relErr(m.fs!, (fsU * MD) / (MD - T * D))).toBeLessThan(1e-9);
    }
  });
});

describe('the required force (the moment form solved for T_S = (FS_R − FS_U)·M_D/D)', () => {
  const g: Point[] = [
    [0, 0],
    [20, 0],
    [32, 6],
    [80, 6],
  ];
  const circle = { type: 'circle' as const, center: [24, 14] as Point, radius: 14.5 };
  const section = homogeneous(g, undrained(18, 25));
  const analysis = {
    ...section.analysis,
    methods: ['phi-zero-circle' as MethodId],
    slices: 60,
    surface: circle,
  };
  const bare = caseView(analyzeSection({ ...section, analysis }));
  const m = bare.results[0];
  const MD = m.massWeight! * m.leverArm!;
  const required = Math.ceil(m.fs! * 10) / 10 + 0.2;
  const level = 1;
  const exact = ((required - m.fs!) * MD) / (circle.center[1] - level);
  test('is found within 0.5 % above the closed form, and meets the requirement', () => {
    const r = analyzeSection({
      ...section,
      analysis: {
        ...analysis,
        requiredFs: required,
        requiredReinforcement: {
          kind: 'force',
          line: [
            [0, level],
            [80, level],
          ],
          dividedByF: true,
        },
      },
    });
    const req = r.cases[0].requiredReinforcement!;
    expect(req.reached).toBe(true);
    expect(req.value!).toBeGreaterThanOrEqual(exact * (1 - 1e-9));
    expect(req.value!).toBeLessThanOrEqual(exact * 1.006);
    expect(req.fs!).toBeGreaterThanOrEqual(required);
  });
});

/**
 * The search sees the reinforcement: on reinforced slopes (test geometries, not real sites) the
 * auto search's least Bishop F is within 0.5 % of the dense exhaustive search's (support.ts:
 * denseReference, every circle cut and solved by bishop() in full with its reinforcement), and
 * the critical circle is another than the unreinforced slope's.
 */
describe('the search on reinforced slopes against a dense exhaustive search', () => {
  const fill: Point[] = [
    [-20, 0],
    [0, 0],
    [8, 10],
    [40, 10],
  ];
  const grids: Reinforcement[] = [2, 4, 6, 8].map((y) => ({
    type: 'geosynthetic',
    name: `grid at ${y} m`,
    line: [
      [y * 0.8 + 0.3, y],
      [y * 0.8 + 7, y],
    ],
    strength: 20,
    interaction: 0.8,
    coverage: 1,
    dividedByF: true,
  }));
  const nails: Reinforcement[] = [2.5, 5, 7.5].map((y) => ({
    type: 'nail',
    name: `nail at ${y} m`,
    head: [y * 0.8, y],
    inclination: 15,
    toward: 'right',
    length: 7,
    spacing: 1.5,
    tensileCapacity: 100,
    bond: 35,
    facingCapacity: 20,
    dividedByF: true,
  }));
  for (const [label, reinforcement] of [
    ['a steepened fill with four geogrids', grids],
    ['a cut with three rows of nails', nails],
  ] as const) {
    test(label, () => {
      const base = homogeneous(fill, mohrCoulomb(19, 4, 32), { reinforcement });
      const section: Section = {
        ...base,
        analysis: { ...base.analysis, slices: 30, surface: { type: 'auto' } },
      };
      const searched = caseView(analyzeSection(section)).results[0];
      const reference = denseReference(section);
      expect(searched.fs!).toBeLessThanOrEqual(reference * 1.005);
      const bare = caseView(analyzeSection({ ...section, reinforcement: [] })).results[0];
      expect(searched.fs!).toBeGreaterThan(bare.fs! * 1.05);
      expect(searched.surface).not.toEqual(bare.surface);
    });
  }
});
