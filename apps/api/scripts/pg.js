#!/usr/bin/env node
/**
 * The project-local PostgreSQL cluster for development and tests.
 *
 *   node apps/api/scripts/pg.js start    # install (apt) if missing, init, start, create databases
 *   node apps/api/scripts/pg.js status   # prints running / stopped; exit 0 when running
 *   node apps/api/scripts/pg.js stop
 *
 * With DATABASE_URL set it does nothing: the database is someone else's. Otherwise the cluster
 * lives in apps/api/.data/pg (git-ignored) when the postgres user can reach that folder, else in
 * /tmp/scarpline-pg-<hash of the repository path>. It listens on 127.0.0.1 only, on port 54329
 * (SCARPLINE_PG_PORT overrides), with trust authentication for the superuser `postgres`.
 * PostgreSQL refuses to run as root, so as root every server command runs as `postgres`.
 * Idempotent: starting a running cluster is fine.
 */
const { execFileSync, spawnSync } = require('node:child_process');
const crypto = require('node:crypto');
const fs = require('node:fs');
const path = require('node:path');

const API_DIR = path.resolve(__dirname, '..');
const PORT = Number(process.env.SCARPLINE_PG_PORT || 54329);
const DATABASES = ['scarpline', 'scarpline_test'];
const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function log(message) {
  process.stderr.write(`pg: ${message}\n`);
}

/** The newest /usr/lib/postgresql/<version>/bin that has initdb, or null. */
function findBinDir() {
  const base = '/usr/lib/postgresql';
  if (!fs.existsSync(base)) return null;
  const versions = fs
    .readdirSync(base)
    .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(base, versions[0], 'bin') : null;
}

/** Installs Debian's postgresql package (needs root, as CI is) and returns its bin folder. */
function installPostgres() {
  log('PostgreSQL server not found: installing it with apt-get');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const sudo = isRoot ? [] : ['sudo'];
  const run = (args) => {
    const cmd = [...sudo, ...args];
    const r = spawnSync(cmd[0], cmd.slice(1), { stdio: 'inherit', env });
    if (r.status !== 0) throw new Error(`${cmd.join(' ')} failed (exit ${r.status})`);
  };
  run(['apt-get', 'update']);
  run(['apt-get', 'install', '-y', 'postgresql']);
  const bin = findBinDir();
  if (!bin) throw new Error('apt-get installed postgresql but no /usr/lib/postgresql/*/bin/initdb');
  return bin;
}

/** Runs a command as the postgres user when we are root, as ourselves otherwise. */
function asOwner(cmd, args, options = {}) {
  const full = isRoot ? ['runuser', '-u', 'postgres', '--', cmd, ...args] : [cmd, ...args];
  return spawnSync(full[0], full.slice(1), { encoding: 'utf8', ...options });
}

/** True when the postgres user can enter every folder down to dir (as root), or always otherwise. */
function reachable(dir) {
  if (!isRoot) return true;
  return spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]).status === 0;
}

/** Where the cluster lives (see the header). */
function dataDir() {
  if (process.env.SCARPLINE_PG_DIR) return process.env.SCARPLINE_PG_DIR;
  const local = path.join(API_DIR, '.data', 'pg');
  if (reachable(API_DIR)) return local;
  const hash = crypto.createHash('sha256').update(API_DIR).digest('hex').slice(0, 12);
  return path.join('/tmp', `scarpline-pg-${hash}`);
}

function urlFor(database) {
  return `postgres://postgres@127.0.0.1:${PORT}/${database}`;
}

function isRunning(bin, dir) {
  if (!fs.existsSync(path.join(dir, 'PG_VERSION'))) return false;
  return asOwner(path.join(bin, 'pg_ctl'), ['-D', dir, 'status']).status === 0;
}

function ensureCluster(bin, dir) {
  if (fs.existsSync(path.join(dir, 'PG_VERSION'))) return;
  // Parents must stay traversable by postgres; only the cluster folder itself is private.
  fs.mkdirSync(path.dirname(dir), { recursive: true, mode: 0o755 });
  fs.chmodSync(path.dirname(dir), 0o755);
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  if (isRoot) execFileSync('chown', ['-R', 'postgres:postgres', dir]);
  log(`creating a cluster in ${dir}`);
  const r = asOwner(path.join(bin, 'initdb'), [
    '-D',
    dir,
    '-A',
    'trust',
    '-U',
    'postgres',
    '-E',
    'UTF8',
  ]);
  if (r.status !== 0) throw new Error(`initdb failed:\n${r.stdout}${r.stderr}`);
}

async function createDatabases() {
  const { Client } = require('pg');
  const client = new Client({ connectionString: urlFor('postgres') });
  await client.connect();
  try {
    for (const name of DATABASES) {
      const found = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
      if (found.rowCount === 0) {
        await client.query(`CREATE DATABASE ${name}`);
        log(`created database ${name}`);
      }
    }
  } finally {
    await client.end();
  }
}

/** Starts the cluster (installing and creating it first when needed); returns the URLs. */
async function start() {
  if (process.env.DATABASE_URL) return { url: process.env.DATABASE_URL, external: true };
  const bin = findBinDir() || installPostgres();
  const dir = dataDir();
  ensureCluster(bin, dir);
  if (!isRunning(bin, dir)) {
    const logFile = path.join(dir, 'server.log');
    const opts = `-p ${PORT} -k ${dir} -c listen_addresses=127.0.0.1`;
    const r = asOwner(path.join(bin, 'pg_ctl'), [
      '-D',
      dir,
      '-o',
      opts,
      '-l',
      logFile,
      '-w',
      'start',
    ]);
    if (r.status !== 0) {
      const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').slice(-2000) : '';
      throw new Error(`pg_ctl start failed:\n${r.stdout}${r.stderr}\n${tail}`);
    }
    log(`started on 127.0.0.1:${PORT} (${dir})`);
  }
  await createDatabases();
  return { url: urlFor('scarpline'), testUrl: urlFor('scarpline_test'), external: false };
}

function stop() {
  if (process.env.DATABASE_URL) return;
  const bin = findBinDir();
  const dir = dataDir();
  if (!bin || !isRunning(bin, dir)) return;
  const r = asOwner(path.join(bin, 'pg_ctl'), ['-D', dir, '-m', 'fast', '-w', 'stop']);
  if (r.status !== 0) throw new Error(`pg_ctl stop failed:\n${r.stdout}${r.stderr}`);
  log('stopped');
}

function status() {
  if (process.env.DATABASE_URL) return { running: true, external: true };
  const bin = findBinDir();
  const dir = dataDir();
  return { running: Boolean(bin) && isRunning(bin, dir), dir, port: PORT };
}

module.exports = { start, stop, status, urlFor, PORT };

if (require.main === module) {
  const command = process.argv[2] || 'status';
  (async () => {
    if (process.env.DATABASE_URL) {
      log('DATABASE_URL is set: nothing to do');
      return;
    }
    if (command === 'start') {
      const { url, testUrl } = await start();
      console.log(url);
      console.log(testUrl);
    } else if (command === 'stop') {
      stop();
    } else if (command === 'status') {
      const s = status();
      console.log(s.running ? `running on 127.0.0.1:${s.port} (${s.dir})` : 'stopped');
      process.exitCode = s.running ? 0 : 1;
    } else {
      console.error('usage: pg.js start | stop | status');
      process.exitCode = 64;
    }
  })().catch((e) => {
    console.error(e.message);
    process.exitCode = 1;
  });
}
