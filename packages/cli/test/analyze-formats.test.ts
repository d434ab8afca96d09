import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import Ajv2020 from 'ajv/dist/2020';
import { resultSchema } from '@scarpline/schemas';
import { ROOT, run } from './run';

const validate = new Ajv2020({ strict: false }).compile(resultSchema);
type Doc = {
  caution: string;
  sections: {
    id: string;
    units: string;
    cases: {
      results: {
        method: string;
        fs: number | null;
        surface: { type: string; center: number[]; radius: number } | null;
        slices: { weight: number; x: number }[];
      }[];
      requiredFs: number | null;
    }[];
    governing: { fs: number } | null;
    requiredFs: number | null;
  }[];
};

describe('scarpline analyze: formats, units, overrides, stdin', () => {
  test('--csv: a row per section and method with the documented columns and the caution', () => {
    const { code, out } = run([
      'analyze',
      'examples/cut-homogeneous.yaml',
      // two sections of two methods each: one document a design case
      'packages/core/test/fixtures/embankment-stages-two-documents.yaml',
      '--csv',
    ]);
    expect(code).toBe(2);
    const rows = parse<Record<string, string>>(out, { columns: true });
    expect(Object.keys(rows[0])).toEqual([
      'file',
      'id',
      'station',
      'case',
      'kind',
      'units',
      'method',
      'fs',
      'converged',
      'governing',
      'required_fs',
      'verdict',
      'station_verdict',
      'reason',
      'caution',
    ]);
    expect(rows).toHaveLength(4 + 2 + 2); // four methods, then two sections of two
    expect(rows.filter((r) => r.governing === 'true')).toHaveLength(3);
    expect(new Set(rows.map((r) => r.verdict))).toEqual(new Set(['meets', 'below']));
    for (const r of rows) {
      expect(r.fs).toMatch(/^\d+\.\d{3}$/);
      expect(Number(r.fs)).toBeGreaterThan(0.5);
      expect(r.caution).toMatch(/qualified geotechnical engineer/);
    }
    expect(new Set(rows.map((r) => r.id))).toEqual(
      new Set(['wcb-1240-L', 'wcb-2940-R-eoc', 'wcb-2940-R-lt']),
    );
  });

  test('a us file is answered in US units; --units si converts every length and force', () => {
    const us = JSON.parse(run(['analyze', 'examples/cut-us-units.yaml', '--json']).out) as Doc;
    const si = JSON.parse(
      run(['analyze', 'examples/cut-us-units.yaml', '--json', '--units', 'si']).out,
    ) as Doc;
    const [a, b] = [us.sections[0], si.sections[0]];
    expect(validate(a)).toBe(true);
    expect(validate(b)).toBe(true);
    expect(a.units).toBe('us');
    // the circle as given in the file, in feet
    expect(a.cases[0].results[0].surface).toEqual({
      type: 'circle',
      center: [55.08, 265],
      radius: 69.67,
    });
    expect(b.units).toBe('si');
    expect(b.cases[0].results[0].surface?.radius).toBeCloseTo(69.67 * 0.3048, 9);
    // slice weights: lbf per ft of run against kN per m (1 lbf/ft = 0.0145939 kN/m)
    expect(b.cases[0].results[0].slices[5].weight).toBeCloseTo(
      a.cases[0].results[0].slices[5].weight * 0.014593903,
      6,
    );
    expect(b.cases[0].results[0].slices[5].x).toBeCloseTo(
      a.cases[0].results[0].slices[5].x * 0.3048,
      9,
    );
    expect(b.governing?.fs).toBe(a.governing?.fs);
    const table = run(['analyze', 'examples/cut-us-units.yaml']).out;
    expect(table).toMatch(/circle centre \(55\.08, 265\.00\) R 69\.67 ft/);
  });

  test("--method, --slices and --required-fs replace the file's settings", () => {
    const { code, out } = run([
      'analyze',
      'examples/cut-homogeneous.yaml',
      '--json',
      '--method',
      'bishop,janbu',
      '--slices',
      '25',
      '--required-fs',
      '1.2',
    ]);
    expect(code).toBe(0);
    const s = (JSON.parse(out) as Doc).sections[0];
    expect(s.cases[0].results.map((m) => m.method)).toEqual(['bishop', 'janbu']);
    // 25 equal slices, each vertex or crossing inside the mass (five here) cutting one in two
    expect(s.cases[0].results[0].slices.length).toBeGreaterThanOrEqual(25);
    expect(s.cases[0].results[0].slices.length).toBeLessThanOrEqual(31);
    expect(s.cases[0].requiredFs).toBe(1.2);
  });

  test('a bad override is a plain message and exit 1', () => {
    const r = run(['analyze', 'examples/cut-homogeneous.yaml', '--method', 'fellenius']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(
      /^scarpline: --method: "fellenius" is not a method; use ordinary, bishop/,
    );
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(run(['analyze', 'examples/cut-homogeneous.yaml', '--slices', 'many']).code).toBe(1);
    expect(run(['analyze', 'examples/cut-homogeneous.yaml', '--units', 'imperial']).code).toBe(1);
  });

  test('- reads standard input (YAML or JSON); its messages are located as <stdin>', () => {
    const text = readFileSync(join(ROOT, 'examples', 'cut-surcharge-seismic.yaml'), 'utf8');
    const ok = run(['analyze', '-'], text);
    expect(ok.code).toBe(0);
    expect(ok.out).toMatch(/^wcb-4100-L /m);
    const bad = run(['analyze', '-'], text.replace('frictionAngle: 31', 'frictionAngle: 95'));
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(
      /^<stdin>:\d+:\d+ materials\.residual\.strength\.frictionAngle: 95 is above 90°/m,
    );
  });

  test('a section with no factor of safety (the surface misses the soil) exits 1 and says why', () => {
    const text = readFileSync(join(ROOT, 'examples', 'cut-homogeneous.yaml'), 'utf8').replace(
      'center: [23.19, 84], radius: 23.84',
      'center: [30, 120], radius: 5',
    );
    const r = run(['analyze', '-'], text);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/governing: no method converged/);
  });
});
