#!/usr/bin/env node
/**
 * Benchmark (not a test): the service spread over hosts, shown rather than claimed. On this
 * one machine it makes four hosts of its own with network namespaces (Debian's iproute2:
 * `ip netns`, veth pairs on a bridge, addresses 10.231.<n>.0/24 of its own): one for
 * PostgreSQL, one for the API and two for workers. It runs a corridor through them with one
 * worker host, then with two, and prints the throughput of each and their ratio.
 *
 *   sudo node apps/api/bench/scale-out.js          (as root: namespaces need it; CI runs as root)
 *   BENCH_SMOKE=1 node apps/api/bench/scale-out.js 6 sections: checks the bench works
 *   BENCH_SECTIONS=300 BENCH_WORKERS_PER_HOST=1    the defaults
 *
 * Needs the built API (npx tsc -b apps/api) and PostgreSQL's server binaries (the local
 * cluster's, apps/api/scripts/pg.js installs them). Everything it made is removed at the end,
 * also after a failure or Ctrl-C.
 */
// the corridor as every bench runs it (a bench script, not the API: it may reach into the
// core's bench folder)
// eslint-disable-next-line no-restricted-syntax
const { oneCaseCorridor } = require('../../../packages/core/bench/one-case-corridor');
const { spawn, spawnSync } = require('node:child_process');
const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');

const ROOT = path.resolve(__dirname, '../../..');
const DIST = path.resolve(__dirname, '../dist');
const SMOKE = process.env.BENCH_SMOKE === '1';
const SECTIONS = Number(process.env.BENCH_SECTIONS ?? (SMOKE ? 6 : 300));
const PER_HOST = Number(process.env.BENCH_WORKERS_PER_HOST ?? 1);
const TIMEOUT_S = Number(process.env.BENCH_TIMEOUT_S ?? 900);
const ID = String(process.pid % 200);
const NET = `10.231.${ID}`;
const BRIDGE = `slbr${ID}`;
const HOSTS = { db: 2, api: 3, w1: 4, w2: 5 };
const ns = (h) => `sl${ID}${h}`;
const ip = (h) => `${NET}.${HOSTS[h]}`;
const PG_PORT = 5432;
const API_PORT = 8080;
const children = [];
let pgDir = null;
let pgBin = null;

function run(cmd, args, options = {}) {
  const r = spawnSync(cmd, args, { encoding: 'utf8', ...options });
  if (r.status !== 0)
    throw new Error(`${cmd} ${args.join(' ')} failed: ${(r.stderr || r.stdout || '').trim()}`);
  return r.stdout;
}
const quiet = (cmd, args) => spawnSync(cmd, args, { stdio: 'ignore' });

/** The bridge, the four namespaces and their veth pairs, each host at its own address. */
function makeHosts() {
  run('ip', ['link', 'add', BRIDGE, 'type', 'bridge']);
  run('ip', ['addr', 'add', `${NET}.1/24`, 'dev', BRIDGE]);
  run('ip', ['link', 'set', BRIDGE, 'up']);
  for (const h of Object.keys(HOSTS)) {
    const outer = `sl${ID}${h}o`;
    run('ip', ['netns', 'add', ns(h)]);
    run('ip', ['link', 'add', outer, 'type', 'veth', 'peer', 'name', 'eth0', 'netns', ns(h)]);
    run('ip', ['link', 'set', outer, 'master', BRIDGE]);
    run('ip', ['link', 'set', outer, 'up']);
    run('ip', ['netns', 'exec', ns(h), 'ip', 'addr', 'add', `${ip(h)}/24`, 'dev', 'eth0']);
    run('ip', ['netns', 'exec', ns(h), 'ip', 'link', 'set', 'eth0', 'up']);
    run('ip', ['netns', 'exec', ns(h), 'ip', 'link', 'set', 'lo', 'up']);
  }
}

function removeHosts() {
  for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
  if (pgDir && pgBin) {
    quiet('ip', [
      'netns',
      'exec',
      ns('db'),
      'runuser',
      '-u',
      'postgres',
      '--',
      path.join(pgBin, 'pg_ctl'),
      '-D',
      pgDir,
      '-m',
      'immediate',
      'stop',
    ]);
    fs.rmSync(pgDir, { recursive: true, force: true });
  }
  for (const h of Object.keys(HOSTS)) quiet('ip', ['netns', 'del', ns(h)]);
  quiet('ip', ['link', 'del', BRIDGE]);
}

/** A PostgreSQL cluster of its own on the database host, open to the hosts' network only. */
function startDatabase() {
  const base = '/usr/lib/postgresql';
  const version = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a))[0];
  if (!version) throw new Error('no PostgreSQL server: run node apps/api/scripts/pg.js start once');
  pgBin = path.join(base, version, 'bin');
  pgDir = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-scale-'));
  run('chown', ['postgres', pgDir]);
  const asPg = (cmd, args) =>
    run('ip', ['netns', 'exec', ns('db'), 'runuser', '-u', 'postgres', '--', cmd, ...args]);
  asPg(path.join(pgBin, 'initdb'), ['-D', pgDir, '-A', 'trust', '-U', 'postgres']);
  fs.appendFileSync(path.join(pgDir, 'pg_hba.conf'), `host all all ${NET}.0/24 trust\n`);
  const opts = `-p ${PG_PORT} -k ${pgDir} -c listen_addresses=${ip('db')} -c max_connections=200`;
  asPg(path.join(pgBin, 'pg_ctl'), [
    '-D',
    pgDir,
    '-o',
    opts,
    '-l',
    path.join(pgDir, 'log'),
    '-w',
    'start',
  ]);
}

const url = (db) => `postgres://postgres@${ip('db')}:${PG_PORT}/${db}`;

function startIn(host, label, file, env) {
  const child = spawn('ip', ['netns', 'exec', ns(host), process.execPath, path.join(DIST, file)], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  children.push(child);
  child.stderr.on('data', (c) => process.stderr.write(`${label}: ${c}`));
  return child;
}

async function until(what, check, seconds = 60) {
  const t0 = Date.now();
  for (;;) {
    try {
      if (await check()) return;
    } catch {
      // not yet
    }
    if (Date.now() - t0 > seconds * 1000) throw new Error(`${what}: not ready in ${seconds} s`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

function corridor(n, tag) {
  // each station in one case (its own settings): the workload the figures have always measured
  const c = oneCaseCorridor();
  const first = c.sections[0].station;
  const sections = Array.from({ length: n }, (_, i) => ({
    ...c.sections[i % c.sections.length],
    station: first + 20 * i,
  }));
  return { ...c, id: `scale-${tag}-${n}`, title: `${c.title} (scale-out, ${tag})`, sections };
}

/** Posts a corridor and waits until its last section is done; resolves with sections per second. */
async function throughput(base, token, projectId, tag) {
  const headers = { 'content-type': 'application/json', authorization: `Bearer ${token}` };
  const t0 = performance.now();
  const res = await fetch(`${base}/api/v1/projects/${projectId}/batches`, {
    method: 'POST',
    headers,
    body: JSON.stringify(corridor(SECTIONS, tag)),
  });
  if (!res.ok) throw new Error(`POST batch: ${res.status} ${await res.text()}`);
  const batch = await res.json();
  const deadline = Date.now() + TIMEOUT_S * 1000;
  for (;;) {
    const b = await (await fetch(`${base}/api/v1/batches/${batch.id}`, { headers })).json();
    if (b.status === 'done') break;
    if (Date.now() > deadline) throw new Error(`batch ${tag}: not done in ${TIMEOUT_S} s`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return SECTIONS / ((performance.now() - t0) / 1000);
}

async function main() {
  if (process.getuid?.() !== 0) throw new Error('network namespaces need root: run it with sudo');
  if (!fs.existsSync(path.join(DIST, 'server.js'))) throw new Error('run npx tsc -b apps/api');
  makeHosts();
  startDatabase();
  const { Client } = require('pg');
  const admin = new Client({ connectionString: url('postgres') });
  await admin.connect();
  await admin.query('CREATE DATABASE scarpline_scale');
  await admin.end();
  const dbUrl = url('scarpline_scale');
  process.env.DATABASE_URL = dbUrl;
  const { sequelize } = require(path.join(DIST, 'db.js'));
  await require(path.join(DIST, 'migrate.js')).migrate(sequelize);
  const email = 'scale@bench.scarpline.example';
  const password = 'scale-bench-password-1';
  await require(path.join(DIST, 'services/users.js')).createUser(null, {
    email,
    name: 'Scale-out engineer',
    role: 'engineer',
    password,
  });
  await sequelize.close();

  const env = { DATABASE_URL: dbUrl, NODE_ENV: 'development', LOGIN_LIMIT: '1000' };
  startIn('api', 'api', 'server.js', { ...env, PORT: String(API_PORT), HOST: ip('api') });
  const base = `http://${ip('api')}:${API_PORT}`;
  await until('the API', async () => (await fetch(`${base}/api/schemas/openapi.json`)).ok);
  const login = await fetch(`${base}/api/v1/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  const { token } = await login.json();
  const project = await (
    await fetch(`${base}/api/v1/projects`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
      body: JSON.stringify({ name: 'Scale-out' }),
    })
  ).json();

  const rates = [];
  for (const hosts of [['w1'], ['w1', 'w2']]) {
    for (const h of hosts) {
      if (children.some((c) => c.host === h)) continue;
      for (let k = 0; k < PER_HOST; k++) {
        const w = startIn(h, `worker ${h}.${k + 1}`, 'worker-main.js', {
          ...env,
          WORKER_CONCURRENCY: '1',
        });
        w.host = h;
      }
    }
    // let new workers connect to the queue before the clock starts (a smoke run has no clock)
    if (!SMOKE) await new Promise((r) => setTimeout(r, 3000));
    rates.push(await throughput(base, token, project.id, `${hosts.length}-hosts`));
  }
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): the figures are not a measurement');
  console.log(
    `scale-out: ${SECTIONS} sections; PostgreSQL, the API and the workers each on a host of its own (network namespaces on ${os.cpus().length} cores), ${PER_HOST} worker process a host`,
  );
  console.log(`  one worker host:  ${rates[0].toFixed(1)} sections/s`);
  console.log(`  two worker hosts: ${rates[1].toFixed(1)} sections/s`);
  console.log(`  ratio two / one:  ${(rates[1] / rates[0]).toFixed(2)}`);
}

for (const signal of ['SIGINT', 'SIGTERM']) {
  process.once(signal, () => {
    removeHosts();
    process.exit(130);
  });
}
main()
  .catch((e) => {
    console.error(e instanceof Error ? e.message : e);
    process.exitCode = 1;
  })
  .finally(() => removeHosts());
