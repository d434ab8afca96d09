#!/usr/bin/env node
/**
 * Benchmark (not a test): a probabilistic corridor through the API with 2 worker processes —
 * 300 stations, each asking for its probability of failure on the critical surface with 1 000
 * realisations (a `probability` block in the corridor's template), so that every section job
 * runs the deterministic analysis and then the realisations.
 *
 *   npm run bench:api:probability                             builds the core, CLI and API first
 *   node apps/api/bench/probability-300.js                    on a build of them
 *   BENCH_SMOKE=1 node apps/api/bench/probability-300.js      4 stations, 50 realisations, 1 run
 *   BENCH_SECTIONS, BENCH_REALISATIONS, BENCH_RUNS (3), BENCH_WORKERS (2), BENCH_TIMEOUT_S (900)
 *
 * Uses a fresh database `scarpline_bench` on the local cluster (or DATABASE_URL), starts the
 * built API and the workers, signs in, and posts the corridor BENCH_RUNS times, each followed on
 * its event stream until `done`. The reference: the same stations through the core alone
 * (analyzeSection, then stationProbability) on as many worker threads as there are worker
 * processes, in one run before the service starts and one after it stops. Prints each run and
 * the medians: wall time POST → done, the core's time, and the ratio of the service's
 * throughput to the core's.
 */
// The corridor as every bench runs it, and the demo's random variables (a bench script may
// reach into the core's bench folder).
// eslint-disable-next-line no-restricted-syntax
const corridors = require('../../../packages/core/bench/one-case-corridor');
const { oneCaseCorridor, uncertainVariables } = corridors;
const path = require('node:path');
const { Worker } = require('node:worker_threads');
const {
  apiReady,
  childProcesses,
  followToDone,
  freePort,
  json,
  poster,
  prepareDatabase,
} = require('./service');

const SMOKE = process.env.BENCH_SMOKE === '1';
const SECTIONS = Number(process.env.BENCH_SECTIONS ?? (SMOKE ? 4 : 300));
const REALISATIONS = Number(process.env.BENCH_REALISATIONS ?? (SMOKE ? 50 : 1000));
const RUNS = Number(process.env.BENCH_RUNS ?? (SMOKE ? 1 : 3));
const WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const TIMEOUT_S = Number(process.env.BENCH_TIMEOUT_S ?? 900);
const CHUNK = SMOKE ? 1 : 5;
const { start, stop: stopChildren, failure: childFailure } = childProcesses();

/** The corridor of `n` stations with the template's random variables (our invented cutting). */
function corridor(n, tag) {
  const c = oneCaseCorridor();
  const first = c.sections[0].station;
  const sections = Array.from({ length: n }, (_, i) => ({
    ...c.sections[i % c.sections.length],
    station: first + 20 * i,
  }));
  const probability = {
    seed: 300,
    method: 'monte-carlo',
    realisations: REALISATIONS,
    surface: 'critical',
    variables: uncertainVariables(),
  };
  return {
    ...c,
    id: `bench-probability-${n}-${tag}`,
    title: `${c.title} (probability benchmark, ${n} stations)`,
    template: { ...c.template, probability },
    sections,
  };
}

/** Milliseconds the core alone takes for `sections` on `threads` threads (loading not counted). */
async function coreRun(sections, threads) {
  const pool = Array.from(
    { length: threads },
    () => new Worker(path.join(__dirname, 'probability-worker.js')),
  );
  await Promise.all(
    pool.map((w) => new Promise((resolve) => (w.once('message', resolve), w.postMessage([])))),
  );
  const t0 = performance.now();
  let next = 0;
  let done = 0;
  const ms = await new Promise((resolve, reject) => {
    const feed = (w) => {
      if (next >= sections.length) return;
      w.postMessage(sections.slice(next, next + CHUNK));
      next += CHUNK;
    };
    for (const w of pool) {
      w.on('message', (out) => {
        done += out.length;
        if (done === sections.length) resolve(performance.now() - t0);
        else feed(w);
      });
      w.once('error', reject);
      feed(w);
    }
  });
  await Promise.all(pool.map((w) => w.terminate()));
  return ms;
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function main() {
  const { url, email, password } = await prepareDatabase();

  const { parseSections } = require('@scarpline/core');
  const coreSections = parseSections(
    JSON.stringify(corridor(SECTIONS, 'core')),
    'bench.json',
  ).sections;
  if (coreSections.length !== SECTIONS) throw new Error('the corridor did not parse');
  const coreBefore = await coreRun(coreSections, WORKERS);

  const port = await freePort();
  const env = { DATABASE_URL: url, NODE_ENV: 'development', LOGIN_LIMIT: '1000' };
  start('api', 'server.js', { ...env, PORT: String(port) });
  const base = `http://127.0.0.1:${port}`;
  await Promise.race([apiReady(base), childFailure]);
  for (let i = 0; i < WORKERS; i++)
    start(`worker ${i + 1}`, 'worker-main.js', { ...env, WORKER_CONCURRENCY: '1' });
  const post = poster(base);
  const { token } = await post('/api/v1/auth/login', { email, password });
  const project = await post('/api/v1/projects', { name: 'Probability benchmark' }, token);
  if (!SMOKE) await new Promise((r) => setTimeout(r, 3000));
  const walls = [];
  let stations = 0;
  for (let run = 1; run <= RUNS; run++) {
    const t0 = performance.now();
    const batch = await post(
      `/api/v1/projects/${project.id}/batches`,
      corridor(SECTIONS, run),
      token,
    );
    const timeout = new Promise((_, reject) =>
      setTimeout(() => reject(new Error(`no done in ${TIMEOUT_S} s`)), TIMEOUT_S * 1000).unref(),
    );
    const progress = await Promise.race([
      followToDone(base, token, batch.id),
      childFailure,
      timeout,
    ]);
    const wall = (performance.now() - t0) / 1000;
    walls.push(wall);
    // every station's row carries its probability
    const rows = await fetch(`${base}/api/v1/batches/${batch.id}/sections?pageSize=500`, {
      headers: { authorization: `Bearer ${token}` },
    }).then(json);
    stations = rows.items.filter((x) => x.probability?.[0]?.realisations === REALISATIONS).length;
    console.log(
      `  run ${run}: ${progress.total} stations (${progress.done} done, ${progress.failed} failed; ${stations} with P_f) in ${wall.toFixed(1)} s`,
    );
  }
  await stopChildren();
  const coreAfter = await coreRun(coreSections, WORKERS);
  const coreS = (coreBefore + coreAfter) / 2000;
  const wall = median(walls);
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): the figures are not a measurement');
  console.log(
    `probability-300: ${SECTIONS} stations × ${REALISATIONS} realisations on the critical surface, ${WORKERS} worker processes, ${RUNS} runs`,
  );
  console.log(`  wall time POST → done, median: ${wall.toFixed(1)} s`);
  console.log(
    `  the core alone, ${WORKERS} worker threads: ${coreS.toFixed(1)} s (before ${(coreBefore / 1000).toFixed(1)} s, after ${(coreAfter / 1000).toFixed(1)} s)`,
  );
  console.log(`  ratio service / core throughput: ${(coreS / wall).toFixed(2)}`);
  if (stations !== SECTIONS) throw new Error(`${SECTIONS - stations} stations without P_f`);
}

main()
  .catch((e) => {
    console.error(e);
    process.exitCode = 1;
  })
  .finally(() => stopChildren());
