#!/usr/bin/env node
/**
 * Benchmark (not a test): a 300-section corridor through the API with 2 worker processes.
 *
 *   npm run bench:api                                    builds the core, CLI and API first
 *   node apps/api/bench/batch-300.js                     on a build of them
 *   BENCH_SMOKE=1 node apps/api/bench/batch-300.js       4 sections: checks the bench works
 *
 * Builds the corridor from examples/corridor/corridor.json (its 61 stations repeated at new
 * chainages, 20 m apart), uses a fresh database `scarpline_bench` on the local cluster (or
 * DATABASE_URL, which it migrates but does not empty), starts the built API and two workers
 * (WORKER_CONCURRENCY=1 each), waits until the API answers (GET /api/schemas/openapi.json,
 * not a start message, which may change), signs in, posts the batch and follows its event
 * stream until `done`. Prints the wall time from the POST to `done` and sections per second.
 * A child that exits early, or no `done` within BENCH_TIMEOUT_S (600 s), ends it with an error.
 */
const { spawn } = require('node:child_process');
const fs = require('node:fs');
const net = require('node:net');
const path = require('node:path');

const ROOT = path.resolve(__dirname, '../../..');
const DIST = path.resolve(__dirname, '../dist');
const SMOKE = process.env.BENCH_SMOKE === '1';
const SECTIONS = Number(process.env.BENCH_SECTIONS ?? (SMOKE ? 4 : 300));
const WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const TIMEOUT_S = Number(process.env.BENCH_TIMEOUT_S ?? 600);
const children = [];
/** Rejects when a child exits before the benchmark is over. */
let childFailed;
const childFailure = new Promise((_, reject) => (childFailed = reject));
childFailure.catch(() => undefined);

function corridor(n) {
  const c = JSON.parse(fs.readFileSync(path.join(ROOT, 'examples/corridor/corridor.json'), 'utf8'));
  const first = c.sections[0].station;
  const sections = Array.from({ length: n }, (_, i) => ({
    ...c.sections[i % c.sections.length],
    station: first + 20 * i,
  }));
  return { ...c, id: `bench-${n}`, title: `${c.title} (benchmark, ${n} sections)`, sections };
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

/** Resolves when the API answers a documented route; rejects after 30 s. */
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

/** Reads the batch's event stream until `done`; resolves with the final progress. */
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

  const port = await freePort();
  const env = { DATABASE_URL: url, NODE_ENV: 'development', LOGIN_LIMIT: '1000' };
  start('api', 'server.js', { ...env, PORT: String(port) });
  const base = `http://127.0.0.1:${port}`;
  await Promise.race([apiReady(base), childFailure]);
  for (let i = 0; i < WORKERS; i++) {
    start(`worker ${i + 1}`, 'worker-main.js', { ...env, WORKER_CONCURRENCY: '1' });
  }
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
  const project = await post('/api/v1/projects', { name: 'Benchmark' }, token);
  // Let the workers connect to the queue before the clock starts (a smoke run has no clock).
  if (!SMOKE) await new Promise((r) => setTimeout(r, 3000));

  const body = corridor(SECTIONS);
  const t0 = performance.now();
  const batch = await post(`/api/v1/projects/${project.id}/batches`, body, token);
  const tPosted = performance.now();
  const timeout = new Promise((_, reject) =>
    setTimeout(() => reject(new Error(`no done in ${TIMEOUT_S} s`)), TIMEOUT_S * 1000).unref(),
  );
  const progress = await Promise.race([followToDone(base, token, batch.id), childFailure, timeout]);
  const t1 = performance.now();
  const wall = (t1 - t0) / 1000;
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): the figures are not a measurement');
  console.log(
    `batch-300: ${progress.total} sections (${progress.done} done, ${progress.failed} failed, ` +
      `${progress.belowRequiredFs} below the required FS) with ${WORKERS} worker processes`,
  );
  console.log(`  POST (validate, store, enqueue): ${((tPosted - t0) / 1000).toFixed(2)} s`);
  console.log(
    `  wall time POST → done: ${wall.toFixed(1)} s; ${(progress.total / wall).toFixed(1)} sections/s`,
  );
}

let finished = false;
main()
  .catch((e) => {
    console.error(e);
    process.exitCode = 1;
  })
  .finally(() => {
    finished = true;
    for (const c of children) if (c.exitCode === null) c.kill('SIGTERM');
  });
