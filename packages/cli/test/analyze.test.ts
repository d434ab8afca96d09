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

  describe('--slice-table', () => {
    interface Slice {
      x: number;
      material: string;
      cohesion: number;
      frictionAngle: number;
      strengthAt: { kind: 'normal' | 'vertical'; stress: number } | null;
    }
    interface Doc {
      sections: {
        cases: {
          governing: { method: string } | null;
          results: { method: string; slices: Slice[] }[];
        }[];
      }[];
    }
    /** The rows of the slice table printed under the (only) case. */
    const rows = (out: string) => {
      const lines = out.split('\n');
      const start = lines.findIndex((l) => /^\s+slices of /.test(l));
      expect(start).toBeGreaterThan(0);
      const rest = lines.slice(start + 2);
      const end = rest.findIndex((l) => !/^\s+\d+\s/.test(l));
      return { head: lines.slice(start, start + 2), rows: rest.slice(0, end) };
    };
    /** The governing method's slices of the same analysis, from --json. */
    const governingSlices = (file: string) => {
      const doc = JSON.parse(run(['analyze', file, '--json']).out) as Doc;
      const c = doc.sections[0].cases[0];
      return c.results.find((r) => r.method === c.governing?.method)!.slices;
    };

    test.each([
      ['examples/cut-rock-hoek-brown.yaml', 'mudstone', 'σ′n'],
      ['examples/embankment-soft-clay-shansep.yaml', 'soft-clay', 'σ′v'],
    ])(
      '%s: each slice with the c, φ′ its base took and the stress it was taken at, as in --json',
      (file, material, kind) => {
        const r = run(['analyze', file, '--slice-table']);
        expect([0, 2]).toContain(r.code);
        const { head, rows: table } = rows(r.out);
        expect(head[0]).toMatch(/slices of [a-z-]+ \(x, b in m; W, N′, S in kN\/m; u, c′\/Su/);
        expect(head[1]).toMatch(
          /#\s+x\s+b\s+α°\s+W\s+u\s+N′\s+S\s+material\s+c′\/Su\s+φ′°\s+taken at$/,
        );
        const slices = governingSlices(file);
        expect(table).toHaveLength(slices.length);
        let taken = 0;
        slices.forEach((s, i) => {
          const cells = table[i].trim().split(/\s+/);
          expect(cells[0]).toBe(String(i + 1));
          expect(cells[1]).toBe(s.x.toFixed(2));
          expect(cells[8]).toBe(s.material);
          expect(cells[9]).toBe(s.cohesion.toFixed(1));
          expect(cells[10]).toBe(s.frictionAngle.toFixed(1));
          if (s.strengthAt === null) expect(cells[11]).toBe('—');
          else {
            expect(cells.slice(11)).toEqual([
              s.strengthAt.kind === 'normal' ? 'σ′n' : 'σ′v',
              s.strengthAt.stress.toFixed(1),
            ]);
            taken++;
          }
        });
        expect(taken).toBeGreaterThan(0);
        expect(table.some((l) => l.includes(`${material} `) && l.includes(kind))).toBe(true);
      },
    );

    test('no stress column where every strength is fixed; not with --json or --csv', () => {
      const r = run(['analyze', 'examples/cut-homogeneous.yaml', '--slice-table']);
      const { head, rows: table } = rows(r.out);
      expect(head[1]).toMatch(/material\s+c′\/Su\s+φ′°$/);
      expect(table.length).toBeGreaterThan(5);
      // without the option the table is as it was
      expect(run(['analyze', 'examples/cut-homogeneous.yaml']).out).not.toMatch(/slices of /);
      const both = run(['analyze', 'examples/cut-homogeneous.yaml', '--slice-table', '--json']);
      expect(both.code).toBe(1);
      expect(both.err).toMatch(/--slice-table is for the table/);
    });
  });

  test('reinforcement: the force of each element and what limits it, and the required force, in the table as in the JSON', () => {
    const file = 'examples/embankment-basal-reinforcement.yaml';
    const table = run(['analyze', file]).out;
    const doc = JSON.parse(run(['analyze', file, '--json']).out) as {
      sections: {
        cases: {
          governing: { method: string };
          requiredReinforcement: { value: number; fs: number };
          results: {
            method: string;
            reinforcement: {
              name: string;
              crossings: { force: number; available: number; at: number[] }[];
            }[];
          }[];
        }[];
      }[];
    };
    expect(validate(doc.sections[0])).toBe(true);
    const c = doc.sections[0].cases[0];
    const m = c.results.find((r) => r.method === c.governing.method)!;
    const x = m.reinforcement[0].crossings[0];
    expect(table).toContain(
      `geosynthetic "basal geotextile" ${x.force.toFixed(1)} at x = ${x.at[0].toFixed(2)} of ${x.available.toFixed(1)} (tensile strength), divided by F`,
    );
    expect(table).toContain(
      `required reinforcement: a further uniform force of ${c.requiredReinforcement.value.toFixed(1)} kN/m at 11.00 m`,
    );
    expect(c.requiredReinforcement.fs).toBeGreaterThanOrEqual(1.3);
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
