/**
 * What the service's benches share (batch-300.js, probability-300.js): a fresh database for
 * them, an engineer to sign in as, the built API and its workers as child processes (one that
 * ends before the bench stops them fails the bench), JSON posts, and a batch followed to `done`
 * on its event stream.
 */
const { spawn } = require('node:child_process');
const fs = require('node:fs');
const net = require('node:net');
const path = require('node:path');

const ROOT = path.resolve(__dirname, '../../..');
const DIST = path.resolve(__dirname, '../dist');

/**
 * The bench's child processes: `start` runs a file of the built API (with BENCH_NODE_ARGS, node
 * options for profiling), `stop` ends them all, and `failure` rejects when one exits before.
 */
function childProcesses() {
  const children = [];
  let stopping = false;
  let failed;
  const failure = new Promise((_, reject) => (failed = reject));
  failure.catch(() => undefined);
  function start(label, file, env) {
    const nodeArgs = (process.env.BENCH_NODE_ARGS ?? '').split(' ').filter(Boolean);
    const child = spawn(process.execPath, [...nodeArgs, path.join(DIST, file)], {
      cwd: ROOT,
      env: { ...process.env, ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    children.push(child);
    child.stdout.resume();
    child.stderr.on('data', (c) => process.stderr.write(`${label}: ${c}`));
    child.once('exit', (code, signal) => {
      if (!stopping) failed(new Error(`${label} exited early (${signal ?? code})`));
    });
    return child;
  }
  async function stop() {
    stopping = true;
    await Promise.all(
      children
        .filter((c) => c.exitCode === null && c.signalCode === null)
        .map((c) => new Promise((resolve) => (c.once('exit', resolve), c.kill('SIGTERM')))),
    );
  }
  return { start, stop, failure };
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

/**
 * The bench's database: DATABASE_URL when set (migrated, not emptied; BENCH_EXTERNAL_DB says so),
 * else a fresh `scarpline_bench` on the local cluster.
 */
async function database() {
  if (process.env.DATABASE_URL) {
    process.env.BENCH_EXTERNAL_DB = '1';
    return process.env.DATABASE_URL;
  }
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

/** The database ready (DATABASE_URL set, migrated) and an engineer to sign in as. */
async function prepareDatabase() {
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
  return { url, email, password };
}

/** A response's JSON, or a rejection with its text. */
const json = (r) => (r.ok ? r.json() : r.text().then((t) => Promise.reject(new Error(t))));

/** POSTs JSON to the API at `base` (with a bearer token when given); resolves with the answer's JSON. */
const poster = (base) => (p, body, token) =>
  fetch(base + p, {
    method: 'POST',
    headers: {
      'content-type': 'application/json',
      ...(token ? { authorization: `Bearer ${token}` } : {}),
    },
    body: JSON.stringify(body),
  }).then(json);

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

module.exports = {
  apiReady,
  childProcesses,
  followToDone,
  freePort,
  json,
  poster,
  prepareDatabase,
};
