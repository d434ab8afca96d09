import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';

// The API benchmark is not a test, but it must keep working: it runs here at a tiny size
// (BENCH_SMOKE=1: 4 sections, 2 worker processes) against the built API and workers, to
// completion, and prints its usual lines. It makes its own database (scarpline_bench) on the
// local cluster, so DATABASE_URL (the tests' database) is not passed on. No figure is checked.
const ROOT = path.resolve(__dirname, '../../..');

test('API batch bench (apps/api/bench/batch-300.js)', () => {
  if (!existsSync(path.join(ROOT, 'apps/api/dist/server.js')))
    throw new Error('apps/api/dist is missing: run npm run build first');
  const env: NodeJS.ProcessEnv = { ...process.env, BENCH_SMOKE: '1', BENCH_TIMEOUT_S: '90' };
  delete env.DATABASE_URL;
  delete env.NODE_ENV;
  const r = spawnSync(process.execPath, [path.join(ROOT, 'apps/api/bench/batch-300.js')], {
    cwd: ROOT,
    encoding: 'utf8',
    env,
  });
  expect(r.stderr).not.toMatch(/Error|exited early/);
  expect(r.status).toBe(0);
  expect(r.stdout).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
  expect(r.stdout).toMatch(
    /^batch-300: 4 sections \(4 done, 0 failed, \d+ below the required FS\) with 2 worker processes$/m,
  );
  expect(r.stdout).toMatch(/^ {2}POST \(validate, store, enqueue\): \d+\.\d\d s$/m);
  expect(r.stdout).toMatch(/^ {2}wall time POST → done: \d+\.\d s; \d+\.\d sections\/s$/m);
  // The reference in the same run, and the ratio to it (issue 14, item 6).
  expect(r.stdout).toMatch(
    /^ {2}the core alone, 2 worker threads, chunks of 1: \d+\.\d\d s \(before \d+\.\d\d s, after \d+\.\d\d s\); \d+\.\d sections\/s$/m,
  );
  expect(r.stdout).toMatch(/^ {2}ratio service \/ core throughput: \d+\.\d\d$/m);
  expect(r.stdout).toMatch(
    /^ {2}CPU a section: service \d+\.\d ms \(workers \d+\.\d, API \d+\.\d, PostgreSQL \d+\.\d\); the core alone \d+\.\d ms$/m,
  );
  expect(r.stdout).toMatch(
    /^ {2}worker processes' resident memory after the batch: \d+ MB, \d+ MB$/m,
  );
}, 120_000);

test('API probability bench (apps/api/bench/probability-300.js)', () => {
  const env: NodeJS.ProcessEnv = { ...process.env, BENCH_SMOKE: '1', BENCH_TIMEOUT_S: '90' };
  delete env.DATABASE_URL;
  delete env.NODE_ENV;
  const r = spawnSync(process.execPath, [path.join(ROOT, 'apps/api/bench/probability-300.js')], {
    cwd: ROOT,
    encoding: 'utf8',
    env,
  });
  expect(r.stderr).not.toMatch(/Error|exited early/);
  expect(r.status).toBe(0);
  expect(r.stdout).toMatch(/^smoke run \(BENCH_SMOKE=1\)/m);
  expect(r.stdout).toMatch(
    /^ {2}run 1: 4 stations \(4 done, 0 failed; 4 with P_f\) in \d+\.\d s$/m,
  );
  expect(r.stdout).toMatch(
    /^probability-300: 4 stations × 50 realisations on the critical surface, 2 worker processes, 1 runs$/m,
  );
  expect(r.stdout).toMatch(/^ {2}ratio service \/ core throughput: \d+\.\d\d$/m);
}, 120_000);
