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
// The corridor as every bench runs it (a bench script may reach into the core's bench folder).
// eslint-disable-next-line no-restricted-syntax
const { oneCaseCorridor } = require('../../../packages/core/bench/one-case-corridor');
const { spawn } = require('node:child_process');
const fs = require('node:fs');
const net = require('node:net');
const path = require('node:path');
const { Worker } = require('node:worker_threads');

const ROOT = path.resolve(__dirname, '../../..');
const DIST = path.resolve(__dirname, '../dist');
const SMOKE = process.env.BENCH_SMOKE === '1';
const SECTIONS = Number(process.env.BENCH_SECTIONS ?? (SMOKE ? 4 : 300));
const REALISATIONS = Number(process.env.BENCH_REALISATIONS ?? (SMOKE ? 50 : 1000));
const RUNS = Number(process.env.BENCH_RUNS ?? (SMOKE ? 1 : 3));
const WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const TIMEOUT_S = Number(process.env.BENCH_TIMEOUT_S ?? 900);
const CHUNK = SMOKE ? 1 : 5;
const children = [];
let finished = false;
let childFailed;
const childFailure = new Promise((_, reject) => (childFailed = reject));
childFailure.catch(() => undefined);

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
    variables: [
      {
        name: 'c′ weathered mudstone',
        target: 'materials.weathered-mudstone.cohesion',
        distribution: 'lognormal',
        mean: 5,
        cov: 0.4,
      },
      {
        name: 'φ′ weathered mudstone',
        target: 'materials.weathered-mudstone.frictionAngle',
        distribution: 'normal',
        mean: 26,
        sd: 3,
      },
    ],
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

async function stopChildren() {
  finished = true;
  await Promise.all(
    children
      .filter((c) => c.exitCode === null && c.signalCode === null)
      .map((c) => new Promise((resolve) => (c.once('exit', resolve), c.kill('SIGTERM')))),
  );
}

function freePort() {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => resolve(port));
    });
  });
}

function start(label, file, env) {
  const child = spawn(process.execPath, [path.join(DIST, file)], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  child.stdout.resume();
  child.stderr.on('data', (c) => process.stderr.write(`${label}: ${c}`));
  child.once('exit', (code, signal) => {
    if (!finished) childFailed(new Error(`${label} exited early (${signal ?? code})`));
  });
  return child;
}

async function apiReady(base) {
  const t0 = Date.now();
  for (;;) {
    try {
      const res = await fetch(`${base}/api/schemas/openapi.json`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() - t0 > 30000) throw new Error(`the API at ${base} did not answer in 30 s`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function database() {
  if (process.env.DATABASE_URL) return process.env.DATABASE_URL;
  const pg = require('../scripts/pg.js');
  await pg.start();
  const { Client } = require('pg');
  const client = new Client({ connectionString: pg.urlFor('postgres') });
  await client.connect();
  await client.query('DROP DATABASE IF EXISTS scarpline_bench WITH (FORCE)');
  await client.query('CREATE DATABASE scarpline_bench');
  await client.end();
  return pg.urlFor('scarpline_bench');
}

async function followToDone(base, token, batchId) {
  const res = await fetch(`${base}/api/v1/batches/${batchId}/events`, {
    headers: { authorization: `Bearer ${token}` },
  });
  if (!res.ok) throw new Error(`events: ${res.status}`);
  const decoder = new TextDecoder();
  let text = '';
  for await (const chunk of res.body) {
    text += decoder.decode(chunk, { stream: true });
    const i = text.indexOf('event: done\ndata: ');
    const end = i >= 0 ? text.indexOf('\n\n', i) : -1;
    if (end >= 0) return JSON.parse(text.slice(i + 'event: done\ndata: '.length, end)).progress;
  }
  throw new Error('the event stream ended without done');
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

async function main() {
  if (!fs.existsSync(path.join(DIST, 'server.js'))) throw new Error('run npx tsc -b apps/api');
  const url = await database();
  process.env.DATABASE_URL = url;
  const { sequelize } = require(path.join(DIST, 'db.js'));
  await require(path.join(DIST, 'migrate.js')).migrate(sequelize);
  const email = `bench-${Date.now()}@bench.scarpline.example`;
  const password = 'bench-password-1';
  await require(path.join(DIST, 'services/users.js')).createUser(null, {
    email,
    name: 'Benchmark engineer',
    role: 'engineer',
    password,
  });
  await sequelize.close();

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
  const json = (r) => (r.ok ? r.json() : r.text().then((t) => Promise.reject(new Error(t))));
  const post = (p, body, token) =>
    fetch(base + p, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        ...(token ? { authorization: `Bearer ${token}` } : {}),
      },
      body: JSON.stringify(body),
    }).then(json);
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
