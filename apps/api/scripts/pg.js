#!/usr/bin/env node
/**
 * The project-local PostgreSQL cluster for development and tests.
 *
 *   node apps/api/scripts/pg.js start    # install (apt) if missing, init, start, create databases
 *   node apps/api/scripts/pg.js status   # prints running / stopped; exit 0 when running
 *   node apps/api/scripts/pg.js stop
 *   node apps/api/scripts/pg.js run <command…>   # start it if stopped, run the command, then
 *                                                # stop it again if this started it; the local
 *                                                # S3 fake (scripts/s3.js) answers meanwhile
 *
 * With DATABASE_URL set it does nothing: the database is someone else's. Otherwise the cluster
 * lives in apps/api/.data/pg (git-ignored) when the postgres user can reach that folder, else in
 * /tmp/scarpline-pg-<hash of the repository path>. It listens on 127.0.0.1 only, with trust
 * authentication for the superuser `postgres`, on a port of its own checkout: SCARPLINE_PG_PORT
 * when set; else the port remembered in the cluster's folder (`scarpline-port`); else one
 * derived from the cluster's folder (55000 to 56999), so that two checkouts do not meet. When
 * that port is taken by another program at start, the next free one is taken and remembered.
 * PostgreSQL refuses to run as root, so as root every server command runs as `postgres`.
 * Idempotent: starting a running cluster is fine. A failure says in one line what to do.
 */
const { execFileSync, spawn, spawnSync } = require('node:child_process');
const crypto = require('node:crypto');
const fs = require('node:fs');
const net = require('node:net');
const os = require('node:os');
const path = require('node:path');
const ports = require('./local-ports');

const API_DIR = path.resolve(__dirname, '..');
const DATABASES = ['scarpline', 'scarpline_test'];
/** Ports derived from a checkout: 55000 + (hash of the cluster's folder mod PORT_SPAN). */
const PORT_BASE = 55000;
const PORT_SPAN = 2000;
/** The file in the cluster's folder that remembers its port. */
const PORT_FILE = 'scarpline-port';
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

let cachedDir = null;

/** Where the cluster lives (see the header). */
function dataDir() {
  if (process.env.SCARPLINE_PG_DIR) return process.env.SCARPLINE_PG_DIR;
  if (cachedDir) return cachedDir;
  const local = path.join(API_DIR, '.data', 'pg');
  if (reachable(API_DIR)) cachedDir = local;
  else {
    const hash = crypto.createHash('sha256').update(API_DIR).digest('hex').slice(0, 12);
    cachedDir = path.join('/tmp', `scarpline-pg-${hash}`);
  }
  return cachedDir;
}

/** The port derived from a cluster's folder: the same for a checkout every time, another for another. */
const derivedPort = (dir) => ports.derivedPort(dir, PORT_BASE, PORT_SPAN);

/** The port written in SCARPLINE_PG_PORT, or null; a value that is no port is an error. */
const portFromEnvironment = () => ports.portFromEnvironment('SCARPLINE_PG_PORT');

/** The port a running cluster listens on (line 4 of postmaster.pid), or null. */
function runningPort(dir) {
  try {
    const port = Number(fs.readFileSync(path.join(dir, 'postmaster.pid'), 'utf8').split('\n')[3]);
    return Number.isInteger(port) && port > 0 ? port : null;
  } catch {
    return null;
  }
}

/** The port remembered in the cluster's folder, or null. */
function rememberedPort(dir) {
  try {
    const port = Number(fs.readFileSync(path.join(dir, PORT_FILE), 'utf8').trim());
    return Number.isInteger(port) && port > 0 ? port : null;
  } catch {
    return null;
  }
}

/**
 * The port of the cluster in `dir`: the one it runs on, else SCARPLINE_PG_PORT, else the one
 * remembered in its folder, else the one derived from the folder.
 */
function portOf(dir = dataDir()) {
  return runningPort(dir) ?? portFromEnvironment() ?? rememberedPort(dir) ?? derivedPort(dir);
}

/** Whether nothing listens on 127.0.0.1:port (we can listen there ourselves). */
function isFree(port) {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen({ port, host: '127.0.0.1', exclusive: true }, () =>
      server.close(() => resolve(true)),
    );
  });
}

/**
 * The port to start the cluster in `dir` on: SCARPLINE_PG_PORT (which must be free), or the
 * remembered or derived one, or, when another program has taken that, the next free one after
 * it, remembered in the cluster's folder from then on.
 */
async function choosePort(dir) {
  const wanted = portFromEnvironment();
  if (wanted !== null) {
    if (!(await isFree(wanted))) {
      throw new Error(
        `port ${wanted} on 127.0.0.1 (SCARPLINE_PG_PORT) is taken by another program: set SCARPLINE_PG_PORT to a free port, or unset it to let this checkout choose one`,
      );
    }
    return wanted;
  }
  const first = rememberedPort(dir) ?? derivedPort(dir);
  for (let k = 0; k < 100; k++) {
    const port = PORT_BASE + ((first - PORT_BASE + k) % PORT_SPAN);
    if (await isFree(port)) {
      if (port !== rememberedPort(dir)) {
        if (k > 0) log(`port ${first} is taken by another program: using ${port} from now on`);
        fs.writeFileSync(path.join(dir, PORT_FILE), `${port}\n`);
      }
      return port;
    }
  }
  throw new Error(
    `no free port from ${first} on for PostgreSQL: set SCARPLINE_PG_PORT to a free port`,
  );
}

function urlFor(database) {
  return `postgres://postgres@127.0.0.1:${portOf()}/${database}`;
}

/** The one line that says why the server did not start and what to do, from its log. */
function startFailure(logFile, port, output) {
  const log = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').slice(-4000) : '';
  const where = `(the server's log: ${logFile})`;
  if (/could not bind|address already in use/i.test(log + output)) {
    return `PostgreSQL could not listen on 127.0.0.1:${port}: another program has it; set SCARPLINE_PG_PORT to a free port ${where}`;
  }
  if (/could not create lock file|Permission denied/i.test(log + output)) {
    return `PostgreSQL cannot write its files in ${path.dirname(logFile)}: check that the postgres user owns that folder ${where}`;
  }
  const fatal = /^.*\b(FATAL|PANIC):\s*(.*)$/m.exec(log);
  const said = fatal ? fatal[2] : (output.trim().split('\n').pop() ?? 'no reason given');
  return `PostgreSQL did not start: ${said} ${where}`;
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
  if (r.status !== 0) {
    const said = `${r.stdout}${r.stderr}`.trim().split('\n').filter(Boolean).pop() ?? '';
    throw new Error(
      `initdb could not create a cluster in ${dir} (${said}): remove that folder and start again`,
    );
  }
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

/**
 * Starts the cluster (installing and creating it first when needed); returns the URLs, and
 * `started`: whether this call started it (it was not running).
 */
async function start() {
  if (process.env.DATABASE_URL) {
    return { url: process.env.DATABASE_URL, external: true, started: false };
  }
  const bin = findBinDir() || installPostgres();
  const dir = dataDir();
  ensureCluster(bin, dir);
  let started = false;
  if (!isRunning(bin, dir)) {
    const port = await choosePort(dir);
    const logFile = path.join(dir, 'server.log');
    const opts = `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1`;
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
    if (r.status !== 0) throw new Error(startFailure(logFile, port, `${r.stdout}${r.stderr}`));
    log(`started on 127.0.0.1:${port} (${dir})`);
    started = true;
  } else {
    const env = portFromEnvironment();
    const port = runningPort(dir);
    if (env !== null && port !== null && env !== port) {
      log(
        `already running on 127.0.0.1:${port}, not SCARPLINE_PG_PORT=${env}: using ${port} (stop it to move it)`,
      );
    }
  }
  await createDatabases();
  return {
    url: urlFor('scarpline'),
    testUrl: urlFor('scarpline_test'),
    external: false,
    started,
  };
}

function stop() {
  if (process.env.DATABASE_URL) return;
  const bin = findBinDir();
  const dir = dataDir();
  if (!bin || !isRunning(bin, dir)) return;
  const r = asOwner(path.join(bin, 'pg_ctl'), ['-D', dir, '-m', 'fast', '-w', 'stop']);
  if (r.status !== 0) {
    const said = `${r.stdout}${r.stderr}`.trim().split('\n').filter(Boolean).pop() ?? '';
    throw new Error(
      `PostgreSQL in ${dir} did not stop (${said}): try again, or stop it with pg_ctl`,
    );
  }
  log(`stopped (${dir})`);
}

function status() {
  if (process.env.DATABASE_URL) return { running: true, external: true };
  const bin = findBinDir();
  const dir = dataDir();
  return { running: Boolean(bin) && isRunning(bin, dir), dir, port: portOf(dir) };
}

/**
 * Runs a command with the cluster running (and the S3 fake of scripts/s3.js, which it stops
 * again if it started it): starts it when it is stopped, runs the command
 * (its output is ours), and stops the cluster again afterwards if this started it, and only
 * then. Resolves with the command's exit code (128 + the signal's number when a signal ended it).
 */
async function run(command, args) {
  const { started } = await start();
  // The S3 fake beside this script (a copy of this script alone runs without one).
  const fake = path.join(__dirname, 's3.js');
  const storage = fs.existsSync(fake) ? await require(fake).start() : { stop: async () => {} };
  const child = spawn(command, args, { stdio: 'inherit' });
  // Ctrl-C reaches the command from the terminal; here it only waits for the command to end.
  const ignore = () => {};
  process.on('SIGINT', ignore);
  process.on('SIGTERM', ignore);
  const code = await new Promise((resolve) => {
    child.once('error', (e) => {
      log(`could not run ${command}: ${e.message}`);
      resolve(127);
    });
    child.once('exit', (c, signal) => resolve(c ?? 128 + (os.constants.signals[signal] ?? 0)));
  });
  process.off('SIGINT', ignore);
  process.off('SIGTERM', ignore);
  await storage.stop();
  if (started) stop();
  return code;
}

module.exports = { start, stop, status, run, urlFor, portOf, derivedPort, dataDir, startFailure };

if (require.main === module) {
  const command = process.argv[2] || 'status';
  (async () => {
    if (process.env.DATABASE_URL && command !== 'run') {
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
    } else if (command === 'run' && process.argv.length > 3) {
      const [cmd, ...args] = process.argv.slice(3).filter((a, i) => i > 0 || a !== '--');
      process.exitCode = await run(cmd, args);
    } else {
      console.error('usage: pg.js start | stop | status | run <command…>');
      process.exitCode = 64;
    }
  })().catch((e) => {
    console.error(`pg: ${e.message}`);
    process.exitCode = 1;
  });
}
