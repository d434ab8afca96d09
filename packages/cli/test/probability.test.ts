/** `scarpline probability`, `sensitivity` and `solve` on the example with random variables. */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLValidator } from 'fast-xml-parser';
import type { ProbabilityResult, SensitivityResult, SolveResult } from '@scarpline/core';
import { run } from './run';

const dir = mkdtempSync(join(tmpdir(), 'scarpline-probability-'));
const EXAMPLE = 'examples/levee-probability.yaml';
const CAUTION = /Caution: Results are for review by a qualified geotechnical engineer/;

describe('scarpline probability', () => {
  test('a table per case with P_f, its standard error and β, the Taylor series check, the caution; the drawing', () => {
    const svg = join(dir, 'fs.svg');
    const r = run(['probability', EXAMPLE, '-n', '2000', '--taylor', '--svg', svg]);
    expect(r.code).toBe(0);
    expect(r.out).toContain('Latin hypercube sampling, seed 520, N = 2000');
    expect(r.out).toMatch(/P\(FS < 1\), counted +\d+\.\d+ % ± \d+\.\d+ %/);
    expect(r.out).toMatch(/β, FS lognormal +\d\.\d\d/);
    expect(r.out).toMatch(/Taylor series method \(11 analyses\)/);
    expect(r.out).toContain(`wrote ${svg}`);
    expect(r.out).toMatch(CAUTION);
    const drawing = readFileSync(svg, 'utf8');
    expect(XMLValidator.validate(drawing)).toBe(true);
    expect(drawing).toMatch(CAUTION);
  });

  test('--json: the results with the caution; the same seed repeats the run', () => {
    const a = run(['probability', EXAMPLE, '-n', '500', '--json']);
    const b = run(['probability', EXAMPLE, '-n', '500', '--json']);
    expect(a.code).toBe(0);
    const json = JSON.parse(a.out) as { caution: string; sections: ProbabilityResult[] };
    expect(json.caution).toMatch(/qualified/);
    expect(json.sections[0].cases[0]).toMatchObject({ realisations: 500, valid: 500 });
    expect(b.out).toBe(a.out);
    const other = run(['probability', EXAMPLE, '-n', '500', '--json', '--seed', '7']);
    expect(other.out).not.toBe(a.out);
  });

  test('--search on two worker threads gives the numbers of one thread', () => {
    const args = [
      'probability',
      EXAMPLE,
      '--search',
      '-n',
      '24',
      '--json',
      '--sampling',
      'monte-carlo',
    ];
    const two = run([...args, '--jobs', '2']);
    const one = run([...args, '--jobs', '1']);
    expect(two.code).toBe(0);
    expect(two.out).toBe(one.out);
    const c = (JSON.parse(two.out) as { sections: ProbabilityResult[] }).sections[0].cases[0];
    expect(c).toMatchObject({ surface: 'search', realisations: 24, valid: 24 });
  });

  test('a section without random variables is refused, with what to add', () => {
    const r = run(['probability', 'examples/levee-land-side.yaml']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/section wfb-0410 gives no random variables: add a probability block/);
  });
});

describe('scarpline sensitivity', () => {
  test('the table, widest FS range first, both drawings with the caution', () => {
    const svg = join(dir, 'oat.svg');
    const tornado = join(dir, 'tornado.svg');
    const r = run(['sensitivity', EXAMPLE, '--points', '5', '--svg', svg, '--tornado', tornado]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/case steady-seepage: FS at the means 1\.\d{3}/);
    expect(r.out).toMatch(CAUTION);
    for (const f of [svg, tornado]) {
      const d = readFileSync(f, 'utf8');
      expect(XMLValidator.validate(d)).toBe(true);
      expect(d).toMatch(CAUTION);
    }
    const json = JSON.parse(run(['sensitivity', EXAMPLE, '--points', '5', '--json']).out) as {
      sections: SensitivityResult[];
    };
    const widths = json.sections[0].cases[0].series.map((s) => s.fsHigh! - s.fsLow!);
    expect([...widths].sort((a, b) => b - a)).toEqual(widths);
  });
});

describe('scarpline solve', () => {
  test('back-analysis: the friction angle of the alluvium at FS = 1, the surface there, the analyses', () => {
    const r = run([
      'solve',
      EXAMPLE,
      '--for',
      'materials.alluvium.frictionAngle',
      '--target',
      '1',
      '--range',
      '10,30',
    ]);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/value \d+\.\d+: FS 1\.000 \(bishop\), after \d+ analyses/);
    expect(r.out).toMatch(/critical surface: circle, centre/);
    expect(r.out).toMatch(CAUTION);
    const json = JSON.parse(
      run([
        'solve',
        EXAMPLE,
        '--for',
        'materials.alluvium.frictionAngle',
        '--target',
        '1',
        '--range',
        '10,30',
        '--json',
      ]).out,
    ) as { sections: SolveResult[] };
    const s = json.sections[0];
    expect(s.found).toBe(true);
    expect(s.fs).toBeCloseTo(1, 4);
    expect(s.analyses).toBe(s.steps.length);
  });

  test('a range that holds no value says so, with exit status 2', () => {
    const r = run(['solve', EXAMPLE, '--for', 'water.level', '--target', '1.5', '--range', '-1,0']);
    expect(r.code).toBe(2);
    expect(r.out).toMatch(/no value found: no value in -1 … 0 m gives FS = 1\.5/);
  });

  test('a file in US units: the range, the value and the reason in its units', () => {
    const file = 'examples/cut-us-units.yaml';
    const args = ['solve', file, '--for', 'materials.lean-clay.cohesion', '--range', '0,2000'];
    const found = run([...args, '--target', '1.5']);
    expect(found.code).toBe(0);
    expect(found.out).toContain('looked for in 0 … 2000 psf');
    expect(found.out).toMatch(/value \d+(\.\d+)? psf: FS 1\.500/);
    expect(found.out).toMatch(/radius \d+(\.\d+)? ft/);
    const none = run([...args, '--target', '1']);
    expect(none.code).toBe(2);
    expect(none.out).toMatch(
      /no value in 0 … 2000 psf gives FS = 1: over the range the critical FS lies between/,
    );
  });

  test('an input the section does not have, and a bad range, are refused', () => {
    const r = run([
      'solve',
      EXAMPLE,
      '--for',
      'materials.peat.cohesion',
      '--target',
      '1',
      '--range',
      '0,10',
    ]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--for: section wfb-0520: the section has no material "peat"/);
    const bad = run([
      'solve',
      EXAMPLE,
      '--for',
      'strata.1.top',
      '--target',
      '1',
      '--range',
      '0,10',
    ]);
    expect(bad.code).toBe(1);
    expect(bad.err).toMatch(/--for: "strata\.1\.top" is not a target/);
    const range = run(['solve', EXAMPLE, '--for', 'seismic.kh', '--target', '1', '--range', '0.1']);
    expect(range.code).toBe(1);
    expect(range.err).toMatch(/--range: 0\.1 is not two different numbers/);
  });
});
