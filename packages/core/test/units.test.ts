import { create, all, unit, type BigNumber } from 'mathjs';
import {
  FOOT_IN_M,
  fromSi,
  POUND_FORCE_IN_N,
  POUND_IN_KG,
  QUANTITY_KINDS,
  rawSectionToSi,
  SI_FILE_TO_SI,
  STANDARD_GRAVITY,
  toSi,
  US_TO_SI,
  type QuantityKind,
  type RawSection,
} from '@scarpline/core';

// Exact definitions, NIST SP 811 (2008), Appendix B.8: 1 ft = 0.3048 m, 1 in = 0.0254 m,
// 1 lb = 0.45359237 kg, standard gravity g_n = 9.80665 m/s² (all exact), hence
// 1 lbf = 1 lb × g_n = 4.4482216152605 N exactly. The factors are checked twice: against the
// exact decimal value worked out here in 60-digit arithmetic, and against mathjs's own unit
// definitions (a general-purpose reference library, independent of Scarpline's constants).
const FT = 0.3048; // m
const IN = 0.0254; // m
const LBF = 4.4482216152605; // N

/** Equal to within a few units in the last place of a double. */
function expectExact(actual: number, expected: number): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(4 * Number.EPSILON * Math.abs(expected));
}

const big = create(all, { number: 'BigNumber', precision: 60 });
const B = (text: string): BigNumber => big.bignumber(text);
const ftExact = B('0.3048');
const lbfExact = B('0.45359237').times(B('9.80665')); // N

/** Each us unit in SI (m, kN, kN/m, kPa, kN/m³, kPa/m), exact to 60 digits. */
const EXACT: Record<QuantityKind, BigNumber> = {
  length: ftExact,
  force: lbfExact.div(1000),
  forcePerLength: lbfExact.div(ftExact).div(1000),
  pressure: lbfExact.div(ftExact.pow(2)).div(1000),
  unitWeight: lbfExact.div(ftExact.pow(3)).div(1000),
  pressurePerLength: lbfExact.div(ftExact.pow(3)).div(1000),
  displacement: B('0.0254'),
};

/** The same factors through mathjs's unit conversions (its ft, lbf, kN, kPa definitions). */
const MATHJS: Record<QuantityKind, [string, string]> = {
  length: ['ft', 'm'],
  force: ['lbf', 'kN'],
  forcePerLength: ['lbf/ft', 'kN/m'],
  pressure: ['lbf/ft^2', 'kPa'],
  unitWeight: ['lbf/ft^3', 'kN/m^3'],
  pressurePerLength: ['lbf/ft^2/ft', 'kPa/m'],
  displacement: ['in', 'm'],
};

describe('US_TO_SI (NIST SP 811 exact definitions)', () => {
  test('the constants are the exact definitions', () => {
    expect(FOOT_IN_M).toBe(0.3048);
    expect(POUND_IN_KG).toBe(0.45359237);
    expect(STANDARD_GRAVITY).toBe(9.80665);
  });
  test('1 lbf = 0.45359237 kg × 9.80665 m/s² = 4.4482216152605 N exactly', () => {
    expect(lbfExact.equals(B('4.4482216152605'))).toBe(true);
    expect(POUND_FORCE_IN_N).toBe(4.4482216152605);
  });
  test.each(QUANTITY_KINDS)('%s: the double nearest the exact value', (kind) => {
    const exact = EXACT[kind];
    const error = big.bignumber(US_TO_SI[kind]).minus(exact).abs().div(exact);
    // a double carries 53 bits: the nearest one is within 2^-53 relative, and a product of a
    // few exact decimals rounds at each step; allow 4 units in the last place
    expect(error.toNumber()).toBeLessThanOrEqual(4 * Number.EPSILON);
  });
  test.each(QUANTITY_KINDS)("%s: equal to mathjs's conversion", (kind) => {
    const [us, si] = MATHJS[kind];
    expectExact(US_TO_SI[kind], unit(1, us).toNumber(si));
  });
  test('length: 1 ft = 0.3048 m = 12 in', () => {
    expectExact(US_TO_SI.length, FT);
    expectExact(US_TO_SI.length, 12 * IN);
  });
  test('force: 1 lbf = 4.4482216152605 N = 0.0044482216152605 kN', () => {
    expectExact(US_TO_SI.force, LBF / 1000);
  });
  test('pressure: 1 psf = 1 lbf/ft² in kPa', () => {
    expectExact(US_TO_SI.pressure, LBF / FT ** 2 / 1000);
  });
  test('pressure: 1 psi = 144 psf = 6.894757… kPa (NIST SP 811 B.8: 6.894 757 E+03 Pa)', () => {
    expect(144 * US_TO_SI.pressure).toBeCloseTo(6.894757, 6);
  });
  test('unit weight: 1 pcf = 1 lbf/ft³ in kN/m³ (about 0.15709)', () => {
    expectExact(US_TO_SI.unitWeight, LBF / FT ** 3 / 1000);
    expect(US_TO_SI.unitWeight).toBeCloseTo(0.157087, 6);
  });
  test('line load: 1 lbf/ft in kN/m', () => {
    expectExact(US_TO_SI.forcePerLength, LBF / FT / 1000);
  });
  test('Su rate: 1 psf/ft in kPa/m equals 1 pcf in kN/m³', () => {
    expectExact(US_TO_SI.pressurePerLength, LBF / FT ** 2 / 1000 / FT);
  });
});

describe('toSi and fromSi', () => {
  test('us values convert with the factors; si values pass through', () => {
    expectExact(toSi(10, 'length', 'us'), 3.048);
    expect(toSi(10, 'length', 'si')).toBe(10);
    expectExact(toSi(62.4, 'unitWeight', 'us'), (62.4 * LBF) / FT ** 3 / 1000);
  });
  test('a displacement is in mm in an si file and in in a us file (1 in = 0.0254 m exactly)', () => {
    expect(toSi(150, 'displacement', 'si')).toBeCloseTo(0.15, 15);
    expectExact(toSi(6, 'displacement', 'us'), 6 * IN);
    expectExact(fromSi(0.1524, 'displacement', 'si'), 152.4);
    expectExact(fromSi(0.1524, 'displacement', 'us'), 6);
    expect(SI_FILE_TO_SI.displacement).toBe(0.001);
    for (const kind of QUANTITY_KINDS.filter((k) => k !== 'displacement'))
      expect(SI_FILE_TO_SI[kind]).toBe(1);
  });
  test('fromSi undoes toSi', () => {
    for (const kind of Object.keys(US_TO_SI) as (keyof typeof US_TO_SI)[]) {
      expectExact(fromSi(toSi(123.45, kind, 'us'), kind, 'us'), 123.45);
    }
  });
});

describe('rawSectionToSi', () => {
  const raw: RawSection = {
    format: 'scarpline/1',
    id: 'us-demo',
    units: 'us',
    station: 1000,
    offset: 10,
    ground: [
      [0, 100],
      [50, 125],
    ],
    materials: {
      clay: {
        unitWeight: 120,
        saturatedUnitWeight: 125,
        strength: { model: 'undrained', su: 1000, suRate: 20, suDatum: 100 },
      },
      sand: {
        unitWeight: 115,
        strength: { model: 'mohr-coulomb', cohesion: 50, frictionAngle: 32 },
      },
    },
    strata: [{ material: 'sand' }, { material: 'clay', top: 95 }],
    water: {
      piezometric: [
        [0, 98],
        [50, 110],
      ],
      unitWeight: 62.4,
    },
    loads: [
      { type: 'strip', from: 30, to: 40, pressure: 250 },
      { type: 'line', x: 45, force: 1000, angle: 10 },
    ],
    crack: { depth: 5, waterDepth: 2 },
    analysis: {
      surface: { type: 'circle', center: [20, 150], radius: 60 },
      infiniteSlope: { angle: 26, depth: 4 },
    },
  };
  const si = rawSectionToSi(raw);

  test('lengths in m, angles unchanged; station and offset stay the labels they are', () => {
    expect(si.station).toBe(1000);
    expect(si.offset).toBe(10);
    expectExact(si.ground[1][0], 50 * FT);
    expectExact(si.ground[1][1], 125 * FT);
    expectExact(si.strata[1].top as number, 95 * FT);
    expectExact((si.water!.piezometric as [number, number][])[1][1], 110 * FT);
    expectExact(si.crack!.depth as number, 5 * FT);
    expectExact(si.crack!.waterDepth!, 2 * FT);
    const surface = si.analysis!.surface as { center: [number, number]; radius: number };
    expectExact(surface.center[1], 150 * FT);
    expectExact(surface.radius, 60 * FT);
    expectExact(si.analysis!.infiniteSlope!.depth, 4 * FT);
    expect(si.analysis!.infiniteSlope!.angle).toBe(26);
    expect(si.materials.sand.strength).toMatchObject({ frictionAngle: 32 });
    expect(si.loads![1]).toMatchObject({ angle: 10 });
  });
  test('unit weights in kN/m³, strengths and pressures in kPa, Su rate in kPa/m', () => {
    const clay = si.materials.clay;
    expectExact(clay.unitWeight!, (120 * LBF) / FT ** 3 / 1000);
    expectExact(clay.saturatedUnitWeight!, (125 * LBF) / FT ** 3 / 1000);
    expect(clay.strength.model).toBe('undrained');
    if (clay.strength.model !== 'undrained') return;
    expectExact(clay.strength.su, (1000 * LBF) / FT ** 2 / 1000);
    expectExact(clay.strength.suRate!, (20 * LBF) / FT ** 3 / 1000);
    expectExact(clay.strength.suDatum!, 100 * FT);
    const sand = si.materials.sand.strength;
    if (sand.model !== 'mohr-coulomb') throw new Error('sand');
    expectExact(sand.cohesion, (50 * LBF) / FT ** 2 / 1000);
    expectExact(si.water!.unitWeight!, (62.4 * LBF) / FT ** 3 / 1000);
    const strip = si.loads![0];
    if (strip.type !== 'strip') throw new Error('strip');
    expectExact(strip.pressure, (250 * LBF) / FT ** 2 / 1000);
    expectExact(strip.from, 30 * FT);
  });
  test('line loads in kN/m', () => {
    const line = si.loads![1];
    if (line.type !== 'line') throw new Error('line');
    expectExact(line.force, (1000 * LBF) / FT / 1000);
    expectExact(line.x, 45 * FT);
  });
  test('keeps the file units and leaves the input untouched', () => {
    expect(si.units).toBe('us');
    expect(raw.ground[1]).toEqual([50, 125]);
  });
  test('an si section comes back equal', () => {
    const siRaw: RawSection = { ...raw, units: 'si' };
    expect(rawSectionToSi(siRaw)).toEqual(siRaw);
  });

  describe('design cases', () => {
    const withCases: RawSection = {
      ...raw,
      cases: [
        {
          name: 'drawdown',
          kind: 'rapid-drawdown',
          water: { piezometric: 110, unitWeight: 62.4 },
          materials: {
            clay: {
              unitWeight: 118,
              strength: { model: 'mohr-coulomb', cohesion: 100, frictionAngle: 26 },
            },
          },
          loads: [{ type: 'strip', from: 31, to: 41, pressure: 200 }],
          crack: { depth: 4, waterDepth: 1 },
          analysis: { surface: { type: 'circle', center: [21, 151], radius: 61 } },
          drawdown: {
            after: {
              piezometric: [
                [0, 99],
                [50, 101],
              ],
            },
            materials: { clay: { drains: 'slow', dR: 300, psiR: 15 }, sand: { drains: 'free' } },
          },
        },
        {
          name: 'quake',
          kind: 'seismic',
          seismic: { kh: 0.15 },
          earthquake: { pga: 0.3, magnitude: 6.5, allowableDisplacement: 6 },
        },
      ],
    };
    const [dd, quake] = rawSectionToSi(withCases).cases!;

    test("a case's overrides convert as the section's settings do", () => {
      expectExact(dd.water!.piezometric as number, 110 * FT);
      expectExact(dd.water!.unitWeight!, (62.4 * LBF) / FT ** 3 / 1000);
      expectExact(dd.materials!.clay.unitWeight!, (118 * LBF) / FT ** 3 / 1000);
      const clay = dd.materials!.clay.strength!;
      if (clay.model !== 'mohr-coulomb') throw new Error('clay');
      expectExact(clay.cohesion, (100 * LBF) / FT ** 2 / 1000);
      expect(clay.frictionAngle).toBe(26);
      const strip = dd.loads![0];
      if (strip.type !== 'strip') throw new Error('strip');
      expectExact(strip.from, 31 * FT);
      expectExact(strip.pressure, (200 * LBF) / FT ** 2 / 1000);
      expectExact(dd.crack!.depth as number, 4 * FT);
      expectExact(dd.crack!.waterDepth!, 1 * FT);
      const surface = dd.analysis!.surface as { center: [number, number]; radius: number };
      expectExact(surface.radius, 61 * FT);
      expect(quake.seismic).toEqual({ kh: 0.15 });
    });
    test('the water after drawdown in m, dR in kPa, ψR in degrees', () => {
      const after = dd.drawdown!.after.piezometric as [number, number][];
      expectExact(after[1][1], 101 * FT);
      const clay = dd.drawdown!.materials!.clay;
      if (clay.drains !== 'slow') throw new Error('slow');
      expectExact(clay.dR, (300 * LBF) / FT ** 2 / 1000);
      expect(clay.psiR).toBe(15);
      expect(dd.drawdown!.materials!.sand).toEqual({ drains: 'free' });
    });
    test('an allowable displacement in m: from in (us) or mm (si); pga and magnitude unchanged', () => {
      expect(quake.earthquake!.pga).toBe(0.3);
      expect(quake.earthquake!.magnitude).toBe(6.5);
      expectExact(quake.earthquake!.allowableDisplacement!, 6 * IN);
      const si = rawSectionToSi({ ...withCases, units: 'si' });
      expect(si.cases![1].earthquake!.allowableDisplacement).toBeCloseTo(0.006, 15);
      // every other value of an si file keeps its number
      expect({ ...si, cases: [si.cases![0]] }).toEqual({
        ...withCases,
        units: 'si',
        cases: [withCases.cases![0]],
      });
    });
  });
});
