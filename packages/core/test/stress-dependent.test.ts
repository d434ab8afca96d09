/**
 * The one mechanism for strengths that vary with the stress on each slice base
 * (slices/stress-dependent.ts): Mohr–Coulomb sections untouched, the iteration settled where
 * each base's strength is the tangent at its own normal stress, methods that take one strength
 * a material refused with their reason, a rapid drawdown refused.
 */
import {
  WorkMeter,
  analyzeDrawdown,
  analyzeSection,
  caseView,
  hoekBrownEnvelope,
  infiniteSlope,
  parseSections,
  readSectionDocument,
  sectionDocument,
  undrainedRatioSu,
  type DrawdownSpec,
  type HoekBrownStrength,
  type Material,
  type Point,
  type Section,
} from '@scarpline/core';

const ground: Point[] = [
  [0, 20],
  [20, 20],
  [30, 40],
  [70, 40],
];
const rock: HoekBrownStrength = {
  model: 'hoek-brown',
  intactStrength: 8000,
  gsi: 30,
  mi: 8,
  disturbance: 0.5,
};
const material = (strength: Material['strength']): Material => ({
  name: 'ground',
  unitWeight: 23,
  saturatedUnitWeight: 23,
  strength,
});

function section(strength: Material['strength'], over: Partial<Section['analysis']> = {}): Section {
  return {
    format: 'scarpline/1',
    id: 'mechanism',
    title: 'mechanism',
    station: null,
    offset: null,
    units: 'si',
    ground,
    materials: { ground: material(strength) },
    strata: [{ material: 'ground', top: ground }],
    water: {
      kind: 'piezometric',
      line: [
        [0, 19],
        [70, 30],
      ],
      unitWeight: 9.81,
    },
    loads: [],
    reinforcement: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis: {
      methods: ['ordinary', 'bishop', 'janbu', 'spencer', 'morgenstern-price', 'phi-zero-circle'],
      slices: 40,
      surface: { type: 'circle', center: [18, 50], radius: 32 },
      infiniteSlope: null,
      case: null,
      requiredFs: null,
      ...over,
    },
  };
}

describe('strengths that vary with stress, on every method of slices', () => {
  const r = caseView(analyzeSection(section(rock)));

  test.each(['ordinary', 'bishop', 'janbu', 'spencer', 'morgenstern-price'])(
    '%s: settled, each base at the tangent of its own normal stress',
    (method) => {
      const m = r.results.find((x) => x.method === method)!;
      expect(m.converged).toBe(true);
      expect(m.strengthIterations).toBeGreaterThan(1);
      expect(m.warnings.map((w) => w.code)).not.toContain('stress-iteration');
      const env = hoekBrownEnvelope(rock);
      const out = new Float64Array(2);
      for (const s of m.slices) {
        // the normal stress it was taken at is the method's own N′/l …
        const sigma = Math.max(env.floor, s.normal / s.baseLength);
        expect(Math.abs(s.strengthAt!.stress - sigma)).toBeLessThan(
          1e-3 * Math.max(1, Math.abs(sigma)),
        );
        // … and c, φ are the envelope's tangent there (its root search ends within 10⁻¹² σci)
        env.tangent(s.strengthAt!.stress, out);
        expect(s.cohesion).toBeCloseTo(out[0], 6);
        expect(Math.tan((s.frictionAngle! * Math.PI) / 180)).toBeCloseTo(out[1], 9);
      }
    },
  );

  test('the φ = 0 circle, which takes one strength a material, is not run, with its reason', () => {
    const m = r.results.find((x) => x.method === 'phi-zero-circle')!;
    expect(m.fs).toBeNull();
    expect(m.warnings[0].code).toBe('not-applicable');
    expect(m.reason).toMatch(/"ground" \(Hoek–Brown\) varies from slice base to slice base/);
  });
});

describe('Mohr–Coulomb sections are solved as before', () => {
  test('no iteration, each slice reports its c′ and φ′ and no stress', () => {
    const r = caseView(
      analyzeSection(section({ model: 'mohr-coulomb', cohesion: 8, frictionAngle: 30 })),
    );
    for (const m of r.results.filter((x) => x.method !== 'phi-zero-circle')) {
      expect(m.converged).toBe(true);
      expect(m.strengthIterations).toBeUndefined();
      for (const s of m.slices) {
        expect(s.cohesion).toBe(8);
        expect(s.frictionAngle).toBeCloseTo(30, 12);
        expect(s.strengthAt).toBeNull();
      }
    }
  });
});

describe('a rapid drawdown', () => {
  test('is not run where a strength varies with stress, with its reason', () => {
    const spec: DrawdownSpec = {
      after: {
        kind: 'piezometric',
        line: [
          [0, 19],
          [70, 25],
        ],
        unitWeight: 9.81,
      },
      materials: {},
    };
    const d = analyzeDrawdown(section(rock, { methods: ['bishop'] }), spec, new WorkMeter());
    expect(d.results[0].fs).toBeNull();
    expect(d.results[0].reason).toMatch(/rapid drawdown: not available .* "ground" \(Hoek–Brown\)/);
  });
});

describe('the settings of the new strengths as a file writes them', () => {
  const file = (units: 'si' | 'us', strength: string) => `format: scarpline/1
id: s
units: ${units}
ground: [[0, 0], [20, 0], [40, 10], [80, 10]]
materials:
  m: { unitWeight: ${units === 'si' ? 20 : 125}, strength: ${strength} }
strata: [{ material: m }]
analysis: { methods: [bishop], surface: { type: circle, center: [30, 30], radius: 32 } }
`;
  const strengthOf = (text: string) => {
    const r = parseSections(text, 's.yaml');
    expect(r.messages.filter((m) => m.severity === 'error')).toEqual([]);
    return r.sections[0].materials.m.strength;
  };
  const PSF = 0.3048 ** -2 * 4.4482216152605e-3; // kPa in one psf

  test('the points of a shear–normal function in psf are converted, both σn and τ', () => {
    const s = strengthOf(file('us', '{ model: shear-normal, points: [[0, 0], [2000, 1500]] }'));
    expect(s.model === 'shear-normal' && s.points[1][0]).toBeCloseTo(2000 * PSF, 9);
    expect(s.model === 'shear-normal' && s.points[1][1]).toBeCloseTo(1500 * PSF, 9);
  });

  test('σci with its unit, and the defaults of D and of Su from σ′v', () => {
    const h = strengthOf(
      file('si', '{ model: hoek-brown, intactStrength: 25 MPa, gsi: 40, mi: 9 }'),
    );
    expect(h).toEqual({
      model: 'hoek-brown',
      intactStrength: 25000,
      gsi: 40,
      mi: 9,
      disturbance: 0,
    });
    const u = strengthOf(file('si', '{ model: undrained-ratio, ratio: 0.22 }'));
    expect(u).toEqual({
      model: 'undrained-ratio',
      ratio: 0.22,
      minimum: 0,
      exponent: 0.8,
      ocr: 1,
      pop: null,
    });
  });

  test('Su from σ′v with a pre-overburden pressure: σ′v S ((σ′v + POP)/σ′v)ᵐ (Ladd & Foott 1974)', () => {
    const s = {
      model: 'undrained-ratio' as const,
      ratio: 0.22,
      minimum: 5,
      exponent: 0.8,
      ocr: 1,
      pop: 40,
    };
    // 60 kPa: OCR = 100/60
    expect(undrainedRatioSu(s, 60)).toBeCloseTo(60 * 0.22 * (100 / 60) ** 0.8, 12);
    // at the surface the least Su holds
    expect(undrainedRatioSu(s, 0)).toBe(5);
  });
});

describe('the infinite slope with a strength that varies with stress (closed form: σ′n and σ′v on the plane do not depend on F)', () => {
  const plane = (strength: Material['strength'], waterRatio = 0) =>
    infiniteSlope({
      angle: 30,
      depth: 4,
      waterRatio,
      material: { name: 'm', unitWeight: 20, saturatedUnitWeight: 20, strength },
      waterUnitWeight: 9.81,
      kh: 0,
    });
  const b = Math.PI / 6;
  const drive = 20 * 4 * Math.sin(b) * Math.cos(b);

  test('shear–normal points: F = τ(σ′n)/τ_driving, σ′n = γz cos²β − u', () => {
    const u = 9.81 * 0.5 * 4 * Math.cos(b) ** 2;
    const sn = 20 * 4 * Math.cos(b) ** 2 - u;
    // σ′n ≈ 40.6 kPa lies on the segment (20, 25)–(100, 70)
    const tau = 25 + ((sn - 20) * 45) / 80;
    const r = plane(
      {
        model: 'shear-normal',
        points: [
          [0, 5],
          [20, 25],
          [100, 70],
        ],
        beyond: 'extend',
      },
      0.5,
    );
    expect(r.fs).toBeCloseTo(tau / drive, 12);
  });

  test('bilinear beyond its break: F = [c′ + σ′b tan φ′ + (σ′n − σ′b) tan φ′₂]/τ_driving', () => {
    const sn = 20 * 4 * Math.cos(b) ** 2;
    const tan = (d: number) => Math.tan((d * Math.PI) / 180);
    const tau = 3 + 30 * tan(38) + (sn - 30) * tan(30);
    const r = plane({
      model: 'bilinear',
      cohesion: 3,
      frictionAngle: 38,
      breakStress: 30,
      frictionAngleBeyond: 30,
    });
    expect(r.fs).toBeCloseTo(tau / drive, 12);
  });

  test('Su from σ′v: F = S·OCRᵐ·(γz − u)/τ_driving', () => {
    const u = 9.81 * 1 * 4 * Math.cos(b) ** 2;
    const su = 0.25 * 2 ** 0.8 * (20 * 4 - u);
    const r = plane(
      { model: 'undrained-ratio', ratio: 0.25, minimum: 0, exponent: 0.8, ocr: 2, pop: null },
      1,
    );
    expect(r.fs).toBeCloseTo(su / drive, 12);
  });
});

describe('the located warning for bases outside an envelope’s range', () => {
  test('bases beyond the last point of a shear–normal function are named, numbered from the left', () => {
    const r = caseView(
      analyzeSection(
        section(
          {
            model: 'shear-normal',
            points: [
              [0, 5],
              [40, 35],
            ],
            beyond: 'hold',
          },
          { methods: ['bishop'] },
        ),
      ),
    );
    const m = r.results[0];
    const beyond = m.slices
      .map((s, i) => [i + 1, s.strengthAt!.stress] as const)
      .filter(([, sn]) => sn > 40)
      .map(([i]) => i);
    expect(beyond.length).toBeGreaterThan(0);
    const w = m.warnings.find((x) => x.code === 'stress-range')!;
    expect(w.message).toMatch(/beyond the last point of the shear–normal function \(τ held/);
    // the first and last such slice are in the list
    expect(w.message).toContain(`${beyond[0]}`);
    expect(w.message).toContain(`${beyond[beyond.length - 1]}`);
    // held beyond the last point: φ = 0 there, τ = 35
    for (const s of m.slices.filter((x) => x.strengthAt!.stress > 40)) {
      expect(s.cohesion).toBe(35);
      expect(s.frictionAngle).toBe(0);
    }
  });
});

describe('a section document (SI, as the service’s re-run edits it) reads back as the same section', () => {
  test.each([
    [
      'shear–normal, held',
      {
        model: 'shear-normal',
        points: [
          [10, 12],
          [80, 60],
        ],
        beyond: 'hold',
      },
    ],
    [
      'bilinear',
      {
        model: 'bilinear',
        cohesion: 2,
        frictionAngle: 40,
        breakStress: 150,
        frictionAngleBeyond: 33,
      },
    ],
    ['Hoek–Brown, disturbed', { ...rock }],
    [
      'Su from σ′v, constant OCR',
      { model: 'undrained-ratio', ratio: 0.3, minimum: 6, exponent: 0.75, ocr: 1.8, pop: null },
    ],
  ] as [string, Material['strength']][])('%s', (_name, strength) => {
    const s = section(strength);
    const back = readSectionDocument(sectionDocument(s), 'edited-section.json', 'si');
    expect(back.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(back.section!.materials).toEqual(s.materials);
  });
});
