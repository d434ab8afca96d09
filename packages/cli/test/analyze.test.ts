import { readFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { resultSchema } from '@scarpline/schemas';

// These tests run the built command (`npm test` builds first).
const ROOT = join(__dirname, '..', '..', '..');
const MAIN = join(ROOT, 'packages', 'cli', 'dist', 'main.js');
const run = (args: string[], input?: string) => {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: 'utf8', input });
  return { code: r.status, out: r.stdout, err: r.stderr };
};
const validate = new Ajv2020({ strict: false }).compile(resultSchema);

describe('scarpline analyze', () => {
  test('--json prints { caution, sections } and each section matches the result schema', () => {
    const { code, out } = run([
      'analyze',
      'examples/cut-surcharge-seismic.yaml',
      'examples/levee-land-side.yaml',
      '--json',
    ]);
    const doc = JSON.parse(out) as { caution: string; sections: unknown[] };
    expect(doc.caution).toMatch(/qualified geotechnical engineer/);
    expect(doc.sections).toHaveLength(2);
    for (const s of doc.sections) expect(validate(s)).toBe(true);
    expect(code).toBe(2); // the levee section is below its required FS
  });

  test('a rock cut in Hoek–Brown rock: the strengths its bases took, in the table and the JSON', () => {
    const table = run(['analyze', 'examples/cut-rock-hoek-brown.yaml']).out;
    expect(table).toMatch(
      /strengths taken at each slice base's stress, \w+ \(settled in \d+ solutions\): mudstone: c [\d.]+–[\d.]+ kPa, φ [\d.]+–[\d.]+° at σ′n -?\d+–\d+ kPa/,
    );
    const doc = JSON.parse(run(['analyze', 'examples/cut-rock-hoek-brown.yaml', '--json']).out) as {
      sections: { cases: { results: { slices: { strengthAt: unknown }[] }[] }[] }[];
    };
    expect(validate(doc.sections[0])).toBe(true);
    const slices = doc.sections[0].cases[0].results[1].slices;
    expect(slices.some((s) => s.strengthAt !== null)).toBe(true);
  });

  test('exit 0 when every section passes, with a readable table and the caution', () => {
    const { code, out } = run(['analyze', 'examples/cut-surcharge-seismic.yaml']);
    expect(code).toBe(0);
    expect(out).toMatch(/^\s+spencer\s+\d\.\d{3}\s+yes\s+circle centre/m);
    expect(out).toMatch(
      /governing: bishop FS \d\.\d{3} against required 1\.1: meets the required FS/,
    );
    expect(out).toMatch(/Caution: Results are for review by a qualified geotechnical engineer/);
  });

  test('exit 2 when a section is below its required FS', () => {
    const { code, out } = run(['analyze', 'examples/embankment-soft-clay.yaml']);
    expect(code).toBe(2);
    expect(out).toMatch(/: below the required FS/);
  });

  test('the words of an earlier version: a located message naming what to write instead', () => {
    const old = run([
      'analyze',
      'examples/cut-soft-clay-undrained.yaml',
      '--method',
      'swedish-circle',
    ]);
    expect(old.code).toBe(1);
    expect(old.err).toContain('--method: swedish-circle is now called phi-zero-circle');
    const text = readFileSync(join(ROOT, 'examples', 'levee-land-side.yaml'), 'utf8')
      .replace(
        /interslice:[^\n]*\n\s+shape: piecewise-linear\n\s+points: [^\n]+/,
        'interslice: { shape: trapezoid, end: 0.3, ramp: 0.2 }',
      )
      .replace('methods: [bishop,', 'methods: [swedish-circle,');
    const r = run(['analyze', '-'], text);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(
      /^<stdin>:\d+:\d+ analysis\.methods\[0\]: swedish-circle is now called phi-zero-circle \(the φ = 0 circle\): write phi-zero-circle$/m,
    );
    expect(r.err).toMatch(
      /^<stdin>:\d+:\d+ analysis\.interslice\.shape: the interslice shape trapezoid is no longer offered: .* interslice: \{ shape: piecewise-linear, points: \[\[0, 0\.3\], \[0\.2, 1\], \[0\.8, 1\], \[1, 0\.3\]\] \}$/m,
    );
    // one message for the shape, none for its former settings
    expect(r.err).not.toMatch(/interslice\.(end|ramp)/);
  });

  test('exit 1 with located messages on stderr for a bad file', () => {
    const { code, err } = run(['analyze', 'packages/core/test/in/ranges.yaml']);
    expect(code).toBe(1);
    expect(err).toMatch(/ranges\.yaml:\d+:\d+ /);
    expect(err).not.toMatch(/at .*\.js:\d+/); // no stack trace
  });

  test('a given polyline, a circle and an infinite slope all analyse', () => {
    const { code, out } = run([
      'analyze',
      'examples/fill-clean-sand.yaml',
      'examples/cut-soft-clay-undrained.yaml',
      '--json',
    ]);
    expect(code).toBe(0);
    const doc = JSON.parse(out) as {
      sections: { cases: { results: { method: string; converged: boolean }[] }[] }[];
    };
    const methods = doc.sections.flatMap((s) =>
      s.cases[0].results.filter((m) => m.converged).map((m) => m.method),
    );
    expect(methods).toEqual(
      expect.arrayContaining(['infinite-slope', 'phi-zero-circle', 'log-spiral', 'bishop']),
    );
  });
});
