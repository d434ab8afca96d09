import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import {
  formatMessage,
  parseSections,
  US_TO_SI,
  type QuantityKind,
  type UnitSystem,
} from '@scarpline/core';
import {
  isValueWithUnit,
  readValueWithUnit,
  VALUE_WITH_UNIT_PATTERN,
} from '../src/model/value-with-unit';
import { quantityAt, readValuesWithUnits } from '../src/input/values-with-units';

// Reference values: NIST SP 811 (2008), Appendix B.8 — 1 ft = 0.3048 m and 1 in = 0.0254 m
// exactly, 1 lbf = 4.4482216152605 N exactly, 1 psi = 1 lbf/in² = 144 psf; the ton-force
// (short, 2000 lbf) and kip (1000 lbf) of US practice; psf, pcf, plf, ksf, tsf, klf are the
// trade's abbreviations for lbf/ft², lbf/ft³, lbf/ft and their multiples (common practice).
const FT = 0.3048;
const LBF_KN = 4.4482216152605e-3;

function value(text: string, kind: QuantityKind, units: UnitSystem): number {
  const r = readValueWithUnit(text, kind, units);
  if (!r.ok) throw new Error(r.message);
  return r.value;
}

/** Equal to a relative 1e-13: a conversion through SI and back rounds at each step. */
const near = (actual: number, expected: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-13 * Math.abs(expected));

describe('readValueWithUnit: converted to the file’s unit system (mathjs, loaded on use)', () => {
  test('a value in the file’s own unit keeps its number exactly', () => {
    expect(value('250 psf', 'pressure', 'us')).toBe(250);
    expect(value('12 kPa', 'pressure', 'si')).toBe(12);
    expect(value('18.5 kN/m³', 'unitWeight', 'si')).toBe(18.5);
    expect(value('18.5 kN/m^3', 'unitWeight', 'si')).toBe(18.5);
    expect(value('120 pcf', 'unitWeight', 'us')).toBe(120);
    expect(value('12ft', 'length', 'us')).toBe(12);
    expect(value(' -3.5e1 m ', 'length', 'si')).toBe(-35);
    expect(value('10 psf/ft', 'pressurePerLength', 'us')).toBe(10);
    expect(value('3000 lbf/ft', 'forcePerLength', 'us')).toBe(3000);
    expect(value('150 mm', 'displacement', 'si')).toBe(150);
    expect(value('6 in', 'displacement', 'us')).toBe(6);
  });
  test('displacements: mm in si files, in in us files (1 in = 25.4 mm exactly)', () => {
    near(value('6 in', 'displacement', 'si'), 152.4);
    near(value('15 cm', 'displacement', 'si'), 150);
    near(value('0.1 m', 'displacement', 'us'), 100 / 25.4);
    near(value('0.5 ft', 'displacement', 'us'), 6);
    expect(readValueWithUnit('15 kPa', 'displacement', 'si')).toMatchObject({
      ok: false,
      code: 'wrong-dimension',
    });
  });
  test('lengths: 12 ft = 3.6576 m, 18 in = 1.5 ft (NIST exact foot and inch)', () => {
    near(value('12 ft', 'length', 'si'), 12 * FT);
    near(value('18 in', 'length', 'us'), 1.5);
    near(value('2 m', 'length', 'us'), 2 / FT);
  });
  test('pressures: kPa ↔ psf with 1 lbf = 4.4482216152605 N; psi = 144 psf; ksf, tsf', () => {
    near(value('35 kPa', 'pressure', 'us'), 35 / (LBF_KN / FT ** 2));
    near(value('250 psf', 'pressure', 'si'), 250 * (LBF_KN / FT ** 2));
    near(value('1 psi', 'pressure', 'us'), 144);
    near(value('1.5 ksf', 'pressure', 'us'), 1500);
    near(value('0.25 tsf', 'pressure', 'us'), 500);
    near(value('0.1 MPa', 'pressure', 'si'), 100);
  });
  test('unit weights, line loads and Su rates', () => {
    near(value('19 kN/m³', 'unitWeight', 'us'), 19 / (LBF_KN / FT ** 3));
    near(value('120 pcf', 'unitWeight', 'si'), 120 * (LBF_KN / FT ** 3));
    near(value('0.12 kip/ft^3', 'unitWeight', 'us'), 120);
    near(value('2 klf', 'forcePerLength', 'us'), 2000);
    near(value('3000 plf', 'forcePerLength', 'si'), 3000 * (LBF_KN / FT));
    near(value('2 kPa/m', 'pressurePerLength', 'us'), 2 / (LBF_KN / FT ** 3));
  });
  test('kip and psi exact from the lbf (mathjs’s own are rounded: 4448.2216 N, 6894.757… Pa)', () => {
    expect(value('1 kip', 'force', 'us')).toBe(1000);
    near(value('1 psi', 'pressure', 'si'), LBF_KN / (FT / 12) ** 2);
    near(value('1 kip', 'force', 'si'), 1000 * LBF_KN);
  });
  test('the same factors as units.ts, whose constants are the only ones the solver uses', () => {
    for (const [text, kind, us] of [
      ['1 ft', 'length', 1],
      ['1 psf', 'pressure', 1],
      ['1 pcf', 'unitWeight', 1],
      ['1 lbf/ft', 'forcePerLength', 1],
      ['1 psf/ft', 'pressurePerLength', 1],
    ] as const) {
      near(value(text, kind, 'si'), us * US_TO_SI[kind]);
    }
  });
  test('a unit of the wrong kind: a force where a pressure belongs, a density for a weight', () => {
    expect(readValueWithUnit('12 kN', 'pressure', 'si')).toEqual({
      ok: false,
      code: 'wrong-dimension',
      message: '"12 kN" is a force, not a pressure; give a pressure, e.g. "12 kPa" or "250 psf"',
    });
    const density = readValueWithUnit('1900 kg/m^3', 'unitWeight', 'si');
    expect(density).toMatchObject({ ok: false, code: 'wrong-dimension' });
    expect(!density.ok && density.message).toMatch(/is a density/);
    expect(readValueWithUnit('5 kPa', 'length', 'us')).toMatchObject({
      ok: false,
      code: 'wrong-dimension',
    });
  });
  test('an unknown unit, with the right spelling when only the case is wrong', () => {
    expect(readValueWithUnit('40 kpa', 'pressure', 'si')).toEqual({
      ok: false,
      code: 'unknown-unit',
      message: '"40 kpa": kpa is not a unit Scarpline knows; did you mean kPa?',
    });
    expect(readValueWithUnit('3 furlongs', 'length', 'si')).toMatchObject({
      ok: false,
      code: 'unknown-unit',
    });
  });
});

describe('which text is a value with a unit (no mathjs needed)', () => {
  test.each(['250 psf', '12 kPa', '18.5 kN/m³', '-3 ft', '.5 m', '1e3 psf', '12ft', '2 kN·m'])(
    '%s is',
    (text) => expect(isValueWithUnit(text)).toBe(true),
  );
  test.each(['auto', '250', 'psf 250', '', 'twelve ft', '12 ft; drop table', 'bishop'])(
    '%s is not',
    (text) => expect(isValueWithUnit(text)).toBe(false),
  );
});

type Json = Record<string, unknown>;
const isObject = (v: unknown): v is Json =>
  v !== null && typeof v === 'object' && !Array.isArray(v);

describe('the schemas', () => {
  const defs = (sectionSchema as Json).$defs as Record<string, Json>;
  test('every quantity definition and the boundary take the same pattern as the core', () => {
    for (const name of [
      'length',
      'pressure',
      'unitWeight',
      'forcePerLength',
      'pressurePerLength',
      'displacement',
      'boundary',
    ]) {
      expect(defs[name].pattern).toBe(VALUE_WITH_UNIT_PATTERN);
      expect(defs[name].type).toEqual(expect.arrayContaining(['number', 'string']));
    }
  });

  // Every number left plain has no dimension (angles, ratios, coefficients, the required FS,
  // counts), or is the station, or sits in a list (points, polylines, ranges).
  const PLAIN = new Set([
    ...['station', 'frictionAngle', 'angle', 'ru', 'kh', 'kv', 'waterRatio', 'requiredFs'],
    ...['trialBand'],
    ...['slices', 'nx', 'ny', 'count', 'moves', 'points', 'radiusCount', 'vertices'],
    ...['restarts', 'seed'],
    // a drawdown's ψR (an angle), an earthquake's pga (a fraction of g) and magnitude
    ...['psiR', 'pga', 'magnitude'],
    // Hoek–Brown's GSI, mi and D; a ratio Su/σ′v, its exponent and OCR; a second friction angle
    ...['gsi', 'mi', 'disturbance', 'ratio', 'exponent', 'ocr', 'frictionAngleBeyond'],
    ...['interaction', 'coverage', 'inclination', 'maxLayers'],
    // a random variable's values are in the units of the input it varies (converted by its
    // target's kind of quantity, probability/normalise-probability.ts); counts and coefficients
    ...['realisations', 'coefficient', 'mean', 'sd', 'cov', 'min', 'mode', 'max'],
  ]);
  test.each([
    ['section', sectionSchema],
    ['batch', batchSchema],
  ])('%s: every setting typed as a plain number has no dimension', (_name, schema) => {
    const plain: string[] = [];
    const visit = (node: unknown): void => {
      if (Array.isArray(node)) node.forEach(visit);
      if (!isObject(node)) return;
      if (isObject(node.properties)) {
        for (const [key, sub] of Object.entries(node.properties)) {
          if (isObject(sub) && (sub.type === 'number' || sub.type === 'integer')) plain.push(key);
        }
      }
      Object.values(node).forEach(visit);
    };
    visit(schema);
    expect(plain).toContain('station');
    expect(plain.filter((k) => !PLAIN.has(k))).toEqual([]);
  });

  test('where the quantities are, read from the schemas', () => {
    expect(quantityAt('section', ['materials', 'clay', 'strength', 'cohesion'])).toBe('pressure');
    expect(quantityAt('section', ['materials', 'clay', 'strength', 'su'])).toBe('pressure');
    expect(quantityAt('section', ['materials', 'clay', 'strength', 'suRate'])).toBe(
      'pressurePerLength',
    );
    expect(quantityAt('section', ['materials', 'clay', 'unitWeight'])).toBe('unitWeight');
    expect(quantityAt('section', ['strata', 1, 'top'])).toBe('length');
    expect(quantityAt('section', ['loads', 0, 'force'])).toBe('forcePerLength');
    expect(quantityAt('section', ['crack', 'depth'])).toBe('length');
    expect(quantityAt('section', ['analysis', 'surface', 'radius'])).toBe('length');
    expect(quantityAt('section', ['analysis', 'surface', 'radii', 'from'])).toBe('length');
    expect(quantityAt('section', ['analysis', 'infiniteSlope', 'depth'])).toBe('length');
    expect(quantityAt('batch', ['template', 'strata', 1, 'depth'])).toBe('length');
    expect(quantityAt('batch', ['sections', 4, 'water', 'unitWeight'])).toBe('unitWeight');
    expect(quantityAt('batch', ['sections', 4, 'materials', 'x', 'strength', 'cohesion'])).toBe(
      'pressure',
    );
    // the settings of design cases
    expect(quantityAt('section', ['cases', 0, 'water', 'piezometric'])).toBe('length');
    expect(quantityAt('section', ['cases', 0, 'materials', 'clay', 'unitWeight'])).toBe(
      'unitWeight',
    );
    expect(quantityAt('section', ['cases', 0, 'materials', 'clay', 'strength', 'su'])).toBe(
      'pressure',
    );
    expect(quantityAt('section', ['cases', 1, 'loads', 0, 'pressure'])).toBe('pressure');
    expect(quantityAt('section', ['cases', 1, 'analysis', 'surface', 'radius'])).toBe('length');
    expect(quantityAt('section', ['cases', 1, 'drawdown', 'after', 'piezometric'])).toBe('length');
    expect(quantityAt('section', ['cases', 1, 'drawdown', 'materials', 'core', 'dR'])).toBe(
      'pressure',
    );
    expect(quantityAt('section', ['cases', 1, 'earthquake', 'allowableDisplacement'])).toBe(
      'displacement',
    );
    expect(quantityAt('batch', ['template', 'cases', 0, 'water', 'depth'])).toBe('length');
    expect(quantityAt('batch', ['sections', 3, 'cases', 0, 'drawdown', 'after', 'depth'])).toBe(
      'length',
    );
    expect(quantityAt('section', ['cases', 1, 'earthquake', 'pga'])).toBeUndefined();
    expect(quantityAt('section', ['cases', 1, 'drawdown', 'materials', 'core', 'psiR'])).toBe(
      undefined,
    );
    // plain numbers
    expect(quantityAt('section', ['station'])).toBeUndefined();
    expect(quantityAt('batch', ['sections', 0, 'station'])).toBeUndefined();
    expect(quantityAt('section', ['ground', 2, 0])).toBeUndefined();
    expect(quantityAt('section', ['strata', 1, 'top', 0, 1])).toBeUndefined();
    expect(quantityAt('section', ['analysis', 'surface', 'center', 0])).toBeUndefined();
    expect(quantityAt('section', ['analysis', 'surface', 'centers', 'x', 0])).toBeUndefined();
    expect(quantityAt('section', ['materials', 'clay', 'strength', 'frictionAngle'])).toBe(
      undefined,
    );
  });
});

describe('readValuesWithUnits on a document', () => {
  const doc = {
    format: 'scarpline/1',
    units: 'us',
    title: '12 ft cut',
    materials: { clay: { unitWeight: '19 kN/m³', strength: { model: 'undrained', su: 1000 } } },
    strata: [{ material: 'clay' }, { material: 'clay', top: '100 ft' }],
  };
  test('converts only the quantities, leaves the input as it was', () => {
    const before = JSON.stringify(doc);
    const { data, issues } = readValuesWithUnits(doc, 'section', 'us');
    expect(issues).toEqual([]);
    expect(JSON.stringify(doc)).toBe(before);
    expect(data).toMatchObject({ title: '12 ft cut', strata: [{}, { top: 100 }] });
    near(
      (data.materials as { clay: { unitWeight: number } }).clay.unitWeight,
      19 / 0.15708746384624617,
    );
  });
  test('a document of plain numbers comes back as the same object', () => {
    const plain = { ...doc, materials: {}, strata: [] };
    expect(readValuesWithUnits(plain, 'section', 'us').data).toBe(plain);
  });
});

describe('the example written with units (examples/cut-mixed-units.yaml)', () => {
  const file = join(__dirname, '..', '..', '..', 'examples', 'cut-mixed-units.yaml');
  const text = readFileSync(file, 'utf8');
  const parsed = parseSections(text, 'cut-mixed-units.yaml');
  test('reads without a message', () => {
    expect(parsed.messages.map(formatMessage)).toEqual([]);
    expect(parsed.sections).toHaveLength(1);
  });
  test('the values given in SI arrive in SI unchanged, through the us file', () => {
    const s = parsed.sections[0];
    expect(s.units).toBe('us');
    const clay = s.materials['lean-clay'];
    near(clay.unitWeight, 19.2);
    near(clay.saturatedUnitWeight, 20);
    expect(clay.strength).toMatchObject({ model: 'mohr-coulomb', frictionAngle: 26 });
    if (clay.strength.model === 'mohr-coulomb') near(clay.strength.cohesion, 7);
    const stiff = s.materials['stiff-clay'];
    near(stiff.unitWeight, 125 * US_TO_SI.unitWeight);
    if (stiff.strength.model !== 'undrained') throw new Error('stiff-clay is undrained');
    near(stiff.strength.su, 95);
    near(stiff.strength.suRate, 3);
    near(stiff.strength.suDatum!, 186 * FT);
    const load = s.loads[0];
    if (load.type !== 'strip') throw new Error('a strip load');
    near(load.pressure, 85);
    near(load.from, 125 * FT);
    const surface = s.analysis.surface as { radius: number };
    near(surface.radius, 21.2);
  });
  test('equals the same section written with plain numbers in us units', () => {
    const plain = text
      .replace('19.2 kN/m³', String(19.2 / US_TO_SI.unitWeight))
      .replace('20.0 kN/m³', String(20 / US_TO_SI.unitWeight))
      .replace('7 kPa', String(7 / US_TO_SI.pressure))
      .replace('125 pcf', '125')
      .replace('95 kPa', String(95 / US_TO_SI.pressure))
      .replace('3 kPa/m', String(3 / US_TO_SI.pressurePerLength))
      .replace('186 ft', '186')
      .replace('125 ft', '125')
      .replace('134 ft', '134')
      .replace('85 kPa', String(85 / US_TO_SI.pressure))
      .replace('21.2 m', String(21.2 / US_TO_SI.length));
    const settings = plain.split('\n').filter((line) => !line.startsWith('#'));
    expect(settings.join('\n')).not.toMatch(/\d\s*(kN|kPa|pcf|ft|m)\b/);
    const other = parseSections(plain, 'plain.yaml');
    expect(other.messages).toEqual([]);
    const compare = (x: unknown, y: unknown): void => {
      if (typeof x === 'number' && typeof y === 'number') near(x, y);
      else if (Array.isArray(x) && Array.isArray(y)) x.forEach((v, i) => compare(v, y[i]));
      else if (isObject(x) && isObject(y)) {
        expect(Object.keys(x).sort()).toEqual(Object.keys(y).sort());
        for (const k of Object.keys(x)) compare(x[k], y[k]);
      } else expect(x).toEqual(y);
    };
    compare(parsed.sections[0], other.sections[0]);
  });
});
