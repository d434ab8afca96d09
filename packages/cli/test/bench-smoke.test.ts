import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { MAIN, ROOT } from './run';

// The benchmarks of the command are not tests, but they must keep working: each runs here at
// a tiny size (BENCH_SMOKE=1), to completion, and prints its usual lines. No figure is
// checked: speed is for the benchmarks to report, never for a test to assert.

function smoke(script: string) {
  if (!existsSync(MAIN)) throw new Error(`${MAIN} is missing: run npm run build first`);
  const r = spawnSync(process.execPath, [join(ROOT, script)], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, BENCH_SMOKE: '1' },
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

const SECONDS = String.raw`\d+\.\d{3} s`;

test('start-up bench (packages/cli/bench/startup.js)', () => {
  const { code, out, err } = smoke('packages/cli/bench/startup.js');
  expect(err).toBe('');
  expect(code).toBe(0);
  const lines = out.split('\n');
  expect(lines[0]).toMatch(/^Scarpline start-up — node v\d+/);
  expect(lines[1]).toMatch(/^smoke run \(BENCH_SMOKE=1\)/);
  expect(out).toMatch(new RegExp(`^  node -e 0 +${SECONDS} +1\\.00$`, 'm'));
  expect(out).toMatch(
    new RegExp(`^  scarpline --version +${SECONDS} +\\d+\\.\\d\\d +≤ 2: (met|not met)$`, 'm'),
  );
  expect(out).toMatch(
    new RegExp(
      `^  scarpline analyze examples/cut-homogeneous\\.yaml +${SECONDS} +\\d+\\.\\d\\d +≤ 4: (met|not met)$`,
      'm',
    ),
  );
  expect(out).toMatch(
    new RegExp(
      `^  scarpline analyze examples/cut-mixed-units\\.yaml +${SECONDS} +\\d+\\.\\d\\d `,
      'm',
    ),
  );
  // what each command loads: the requirements of start-up, checked without a clock
  expect(out).toMatch(/^modules loaded \(solver, yaml, ajv compiler, mathjs\):$/m);
  expect(out).toMatch(/^ {2}scarpline --version +none$/m);
  expect(out).toMatch(/^ {2}scarpline analyze examples\/cut-homogeneous\.yaml +solver, yaml$/m);
  expect(out).toMatch(
    /^ {2}scarpline analyze examples\/cut-mixed-units\.yaml +solver, yaml, mathjs$/m,
  );
});

test('corridor bench (packages/cli/bench/corridor-300.js)', () => {
  const { code, out, err } = smoke('packages/cli/bench/corridor-300.js');
  const dir = /results in (\S+)$/m.exec(out)?.[1];
  try {
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
    expect(out).toMatch(/^4 sections in \d+\.\d s \(exit code [02]\), results in \S+$/m);
    expect(out).toMatch(/^peak resident memory \d+ MB$/m);
    expect(out).toMatch(/^resident memory at 25\/50\/75\/100% of the run: (\d+ MB( \/ )?){4}$/m);
    const results = join(dir!, 'results');
    const csv = readFileSync(join(results, 'results.csv'), 'utf8').trim().split('\n');
    // a row per station and case, then the station's: a station row for each of the four
    expect(csv[0]).toMatch(/^station,chainage,section_id,row,/);
    expect(csv.filter((line) => line.split(',')[3] === 'station')).toHaveLength(4);
    expect(readdirSync(join(results, 'sections'))).toHaveLength(4);
  } finally {
    if (dir) rmSync(dir, { recursive: true, force: true });
  }
});
