import { spawnSync } from 'node:child_process';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { resultSchema } from '@scarpline/schemas';

// These tests run the built command (`npm test` builds first).
const ROOT = join(__dirname, '..', '..', '..');
const MAIN = join(ROOT, 'packages', 'cli', 'dist', 'main.js');
const run = (args: string[]) => {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: 'utf8' });
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
      sections: { results: { method: string; converged: boolean }[] }[];
    };
    const methods = doc.sections.flatMap((s) =>
      s.results.filter((m) => m.converged).map((m) => m.method),
    );
    expect(methods).toEqual(
      expect.arrayContaining(['infinite-slope', 'phi-zero-circle', 'log-spiral', 'bishop']),
    );
  });
});
