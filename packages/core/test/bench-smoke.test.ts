import { spawnSync } from 'node:child_process';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseSections } from '@scarpline/core';

// The solver's benchmarks are not tests, but they must keep working: `npm run bench` runs here
// at a tiny size (BENCH_SMOKE=1), to completion, and prints its usual lines. No figure is
// checked: speed is for the benchmark to report, never for a test to assert.
const ROOT = join(__dirname, '..', '..', '..');
const EXAMPLES = join(ROOT, 'examples');

test('solver bench (packages/core/bench/run.js)', () => {
  if (!existsSync(join(ROOT, 'packages', 'core', 'dist', 'index.js')))
    throw new Error('packages/core/dist is missing: run npm run build first');
  const r = spawnSync(process.execPath, [join(ROOT, 'packages', 'core', 'bench', 'run.js')], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, BENCH_SMOKE: '1' },
  });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const out = r.stdout;
  const number = String.raw`[\d,]+(\.\d+)?`;
  expect(out).toMatch(/^Scarpline solver benchmarks — node v\d+/);
  expect(out).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
  expect(out).toMatch(new RegExp(`^Bishop circles per second, one core .*: +${number}$`, 'm'));
  expect(out).toMatch(new RegExp(`^Spencer circles per second, one core .*: +${number}$`, 'm'));
  expect(out).toMatch(
    new RegExp(`^grid search of ${number} trial surfaces .*: ${number} ms$`, 'm'),
  );
  expect(out).toMatch(/^auto search .* on each design case of each example/m);
  // a row for every design case of every section of every example (the section's id alone
  // when it lists no cases): a moved or renamed example shows here
  const rows = readdirSync(EXAMPLES)
    .filter((f) => f.endsWith('.yaml'))
    .flatMap((f) => parseSections(readFileSync(join(EXAMPLES, f), 'utf8'), f).sections)
    .flatMap((s) =>
      s.cases && s.cases.length > 1 ? s.cases.map((c) => `${s.id} ${c.name}`) : [s.id],
    );
  expect(rows.length).toBeGreaterThan(5);
  for (const row of rows) {
    expect(out).toMatch(
      new RegExp(
        `^  ${row.replace(/[.+()]/g, '\\$&')} +${number} ms +${number} trials \\(grid ${number}, ground ranges ${number}, polish ${number}\\) +FS \\d+\\.\\d{3}( +\\((seismic|rapid-drawdown)\\))?$`,
        'm',
      ),
    );
  }
  expect(out).toMatch(
    /^\d+-section corridor through the core .*one thread and \d+ threads in turn, \d+ pairs:$/m,
  );
  expect(out).toMatch(
    new RegExp(
      `^  fresh threads \\(each compiles the solver as it works\\): one thread ${number} ms, \\d+ threads ${number} ms \\(medians\\); speed-up ${number} \\(median of the pairs' ratios; range ${number}–${number}; target ≥ ${number}, 0\\.9 × \\d+\\)$`,
      'm',
    ),
  );
  expect(out).toMatch(
    new RegExp(
      `^  the same threads again, compiled: one thread ${number} ms, \\d+ threads ${number} ms \\(medians\\); speed-up ${number} `,
      'm',
    ),
  );
  expect(out).toMatch(
    new RegExp(
      `^  the demo corridor as it ships \\(\\d+ stations, each with its design cases\\), fresh threads, \\d+ pairs: one thread ${number} ms, \\d+ threads ${number} ms \\(medians\\); speed-up ${number} \\(range ${number}–${number}\\)$`,
      'm',
    ),
  );
}, 180_000);

test('input bench (packages/core/bench/input.js)', () => {
  const r = spawnSync(process.execPath, [join(ROOT, 'packages', 'core', 'bench', 'input.js')], {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, BENCH_SMOKE: '1' },
  });
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const out = r.stdout;
  expect(out).toMatch(/^Scarpline input benchmarks — node v\d+/);
  expect(out).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
  const line = (what: string, first: string) =>
    new RegExp(
      `^  ${what}, [\\d.]+ MB: [\\d,]+ ms, peak memory \\+[\\d,]+ MB; \\d+ sections, \\d+ messages \\([\\d,]+ bytes\\), the first ${first}$`,
      'm',
    );
  expect(out).toMatch(line('10 000 nested lists \\(YAML\\)', 'too-deep'));
  expect(out).toMatch(line('10 000 nested lists \\(JSON\\)', 'too-deep'));
  expect(out).toMatch(line('five million numbers, 10 MB', 'too-large'));
  expect(out).toMatch(line('a method name of 1 MB', 'too-long'));
  expect(out).toMatch(line('a batch of 20 000 sections', 'too-many'));
  expect(out).toMatch(line('the demo corridor as 100 sections \\(JSON, valid\\)', 'none'));
  expect(out.trim().split('\n')).toHaveLength(15);
}, 120_000);

test('probability bench (packages/core/bench/probability.js)', () => {
  const r = spawnSync(
    process.execPath,
    [join(ROOT, 'packages', 'core', 'bench', 'probability.js')],
    { cwd: ROOT, encoding: 'utf8', env: { ...process.env, BENCH_SMOKE: '1' } },
  );
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  const out = r.stdout;
  const number = String.raw`[\d,]+(\.\d+)?`;
  expect(out).toMatch(/^Scarpline probability benchmarks — node v\d+/);
  expect(out).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
  expect(out).toMatch(
    new RegExp(
      `^${number} realisations on the critical surface, one core: ${number} ms \\(median of \\d+; target ≤ 1 000 ms\\)$`,
      'm',
    ),
  );
  expect(out).toMatch(
    new RegExp(`^  the same with the \\d+ material variables only .*: ${number} ms$`, 'm'),
  );
  expect(out).toMatch(
    new RegExp(
      `^${number} realisations with the critical surface searched again in each, 2 worker threads: ${number} ms \\(median of \\d+; target ≤ 30 000 ms\\); mean FS \\d\\.\\d{3}, P\\(FS < 1\\) ${number} %$`,
      'm',
    ),
  );
  expect(out.trim().split('\n')).toHaveLength(6);
}, 120_000);
