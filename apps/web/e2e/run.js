#!/usr/bin/env node
/**
 * The browser tests of the web app, against the real product on this machine:
 *
 *   npm run test:browser -w @scarpline/web
 *
 * 1. Debian's chromium at /usr/bin/chromium and poppler's pdftotext (which reads downloaded
 *    reports back), installed with apt-get when missing, as root.
 * 2. The builds: apps/web/dist/browser (the root `npm test` builds it first; WEB_DIST names
 *    another folder) and apps/api/dist.
 * 3. The project-local PostgreSQL (apps/api/scripts/pg.js; it keeps running afterwards), the
 *    local S3 fake (apps/api/scripts/s3.js; stopped afterwards if this started it), and a
 *    fresh database scarpline_e2e on it (dropped first when a run left one behind).
 * 4. The API (`node apps/api/dist/server.js --seed`: migrations, the demo users and the seeded
 *    corridor, the local SMTP fake, the web build at /) on a free port, then one worker process
 *    (`node apps/api/dist/worker-main.js`) on the same database, mailing the API's SMTP fake.
 * 5. `node --test` on e2e/*.test.js (or the files named: `node e2e/run.js roles admin`), one
 *    file at a time, with BASE_URL set.
 * 6. Stops the API and the worker and drops the database. Exit code: the tests' (non-zero when
 *    one failed), or 1 when the setup failed.
 *
 * The servers' output goes to a log folder under the system's temp folder (printed at the end).
 * Screenshots go to e2e/screenshots/ (not kept in git).
 */
const { spawn, spawnSync } = require('node:child_process');
const fs = require('node:fs');
const net = require('node:net');
const os = require('node:os');
const path = require('node:path');

const WEB_DIR = path.resolve(__dirname, '..');
const ROOT = path.resolve(WEB_DIR, '../..');
const API_DIR = path.join(ROOT, 'apps/api');
/** The web build the API serves: apps/web/dist/browser, or the folder in WEB_DIST. */
const WEB_DIST = process.env.WEB_DIST
  ? path.resolve(process.env.WEB_DIST)
  : path.join(WEB_DIR, 'dist/browser');
const API_SERVER = path.join(API_DIR, 'dist/server.js');
const API_WORKER = path.join(API_DIR, 'dist/worker-main.js');
const CHROMIUM = '/usr/bin/chromium';
const DATABASE = 'scarpline_e2e';
const SHOTS = path.join(__dirname, 'screenshots');
const STARTUP_MS = 120_000;

/** A setup problem with a message for the person running the tests (no stack trace). */
class SetupError extends Error {}

function say(message) {
  process.stderr.write(`e2e: ${message}\n`);
}

function ensureChromium() {
  if (fs.existsSync(CHROMIUM)) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    throw new SetupError(
      `${CHROMIUM} is missing. Install Debian's chromium as root ` +
        '(`apt-get update && apt-get install -y chromium`), then run the tests again.',
    );
  }
  say(`${CHROMIUM} is missing: installing Debian's chromium with apt-get`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update'], ['install', '-y', 'chromium']]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) {
      throw new SetupError(`apt-get ${args.join(' ')} failed (exit ${r.status}); see above.`);
    }
  }
  if (!fs.existsSync(CHROMIUM)) {
    throw new SetupError(`apt-get installed chromium, but there is no ${CHROMIUM}.`);
  }
}

/** poppler's pdftotext, which reads the downloaded reports back (Debian's poppler-utils). */
function ensurePdftotext() {
  if (spawnSync('pdftotext', ['-v']).status === 0) return;
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  if (!isRoot) {
    throw new SetupError(
      "pdftotext is missing. Install Debian's poppler-utils as root " +
        '(`apt-get update && apt-get install -y poppler-utils`), then run the tests again.',
    );
  }
  say("pdftotext is missing: installing Debian's poppler-utils with apt-get");
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  for (const args of [['update'], ['install', '-y', 'poppler-utils']]) {
    const r = spawnSync('apt-get', args, { stdio: 'inherit', env });
    if (r.status !== 0) {
      throw new SetupError(`apt-get ${args.join(' ')} failed (exit ${r.status}); see above.`);
    }
  }
}

/** The newest modification time under a folder (or of a file). */
function newest(p) {
  const stat = fs.statSync(p);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return fs.readdirSync(p).reduce((t, e) => Math.max(t, newest(path.join(p, e))), -Infinity);
}

function ensureBuilds() {
  const index = path.join(WEB_DIST, 'index.html');
  if (!fs.existsSync(index)) {
    throw new SetupError(
      `There is no web build in ${path.relative(ROOT, WEB_DIST) || WEB_DIST}. Build it first with ` +
        '`npm run build -w @scarpline/web` (the root `npm test` builds it before these tests).',
    );
  }
  if (!process.env.WEB_DIST && newest(path.join(WEB_DIR, 'src')) > fs.statSync(index).mtimeMs) {
    say(
      'warning: apps/web/src changed after the build in apps/web/dist/browser; these tests ' +
        'run the older build (`npm run build -w @scarpline/web` to bring it up to date)',
    );
  }
  for (const file of [API_SERVER, API_WORKER]) {
    if (!fs.existsSync(file)) {
      throw new SetupError(
        `There is no API build (${path.relative(ROOT, file)}). Build it with ` +
          '`npx tsc -b apps/api` or `npm run build`.',
      );
    }
  }
}

function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

/** The URL of another database on the same server. */
function databaseUrl(url, database) {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

async function onServer(url, sql) {
  const { Client } = require('pg');
  const client = new Client({ connectionString: databaseUrl(url, 'postgres') });
  await client.connect();
  try {
    for (const statement of sql) await client.query(statement);
  } finally {
    await client.end();
  }
}

/** Starts a server process in its own process group, its output into a log file. */
function startProcess(name, args, env, logDir) {
  const log = path.join(logDir, `${name}.log`);
  const fd = fs.openSync(log, 'a');
  const child = spawn(process.execPath, args, {
    cwd: ROOT,
    env,
    detached: true,
    stdio: ['ignore', fd, fd],
  });
  fs.closeSync(fd);
  child.log = log;
  child.label = name;
  child.exited = new Promise((resolve) =>
    child.once('exit', (code, signal) => resolve({ code, signal })),
  );
  return child;
}

/** Ends a process this script started, and its children (the worker forks): TERM, then KILL. */
async function stopProcess(child) {
  if (!child || child.exitCode !== null || child.signalCode !== null) return;
  const signalGroup = (sig) => {
    try {
      process.kill(-child.pid, sig);
    } catch {
      // already gone
    }
  };
  signalGroup('SIGTERM');
  const ended = await Promise.race([
    child.exited.then(() => true),
    new Promise((r) => setTimeout(() => r(false), 8000)),
  ]);
  if (!ended) {
    say(`${child.label} did not stop within 8 s: killing it`);
    signalGroup('SIGKILL');
    await child.exited;
  }
  // Forked workers may outlive their primary by a moment.
  signalGroup('SIGKILL');
}

function tail(file, chars = 3000) {
  try {
    return fs.readFileSync(file, 'utf8').slice(-chars);
  } catch {
    return '';
  }
}

/** Waits until the API answers, then checks that it serves the web app's index.html at /. */
async function waitForApi(base, api) {
  const end = Date.now() + STARTUP_MS;
  for (;;) {
    if (api.exitCode !== null || api.signalCode !== null) {
      throw new SetupError(
        `The API ended (exit ${api.exitCode ?? api.signalCode}) before it answered. ` +
          `Its log (${api.log}):\n${tail(api.log)}`,
      );
    }
    try {
      const res = await fetch(`${base}/api/v1/me`);
      if (res.status === 401) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > end) {
      throw new SetupError(`The API did not answer within ${STARTUP_MS / 1000} s; see ${api.log}.`);
    }
    await new Promise((r) => setTimeout(r, 300));
  }
  const res = await fetch(`${base}/`, { headers: { accept: 'text/html' } });
  const html = await res.text();
  if (!res.ok || !html.includes('<sl-root')) {
    throw new SetupError(
      `The API answers, but GET / is not the web app's index.html (status ${res.status}). ` +
        `The API must serve the build in WEB_DIST=${WEB_DIST}.`,
    );
  }
}

/** e2e/*.test.js, or only those named on the command line (`node e2e/run.js roles admin`). */
function testFiles() {
  const all = fs
    .readdirSync(__dirname)
    .filter((f) => f.endsWith('.test.js'))
    .sort();
  const wanted = process.argv.slice(2).map((a) => `${a.replace(/(\.test)?\.js$/, '')}.test.js`);
  const unknown = wanted.filter((w) => !all.includes(w));
  if (unknown.length > 0) {
    throw new SetupError(
      `No such test file in e2e/: ${unknown.join(', ')} (there are ${all.join(', ')}).`,
    );
  }
  return (wanted.length > 0 ? wanted : all).map((f) => path.join(__dirname, f));
}

async function main() {
  const started = Date.now();
  const files = testFiles();
  ensureChromium();
  ensurePdftotext();
  ensureBuilds();
  fs.rmSync(SHOTS, { recursive: true, force: true });
  fs.mkdirSync(SHOTS, { recursive: true });

  const pg = require('../../api/scripts/pg.js');
  const { url } = await pg.start();
  // The local S3 fake the API keeps files in (already answering under `pg.js run`).
  const storage = await require('../../api/scripts/s3.js').start();
  const dbUrl = databaseUrl(url, DATABASE);
  const logDir = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-e2e-'));
  const children = [];
  let dbCreated = false;
  let cleaned = false;

  const cleanup = async () => {
    if (cleaned) return;
    cleaned = true;
    for (const c of children.reverse()) await stopProcess(c);
    await storage.stop();
    if (dbCreated) {
      try {
        await onServer(url, [`DROP DATABASE IF EXISTS ${DATABASE} WITH (FORCE)`]);
      } catch (e) {
        say(`could not drop the database ${DATABASE}: ${e.message}`);
      }
    }
  };
  const interrupted = (sig) => {
    say(`${sig}: stopping`);
    cleanup().finally(() => process.exit(130));
  };
  process.once('SIGINT', interrupted);
  process.once('SIGTERM', interrupted);

  try {
    await onServer(url, [
      `DROP DATABASE IF EXISTS ${DATABASE} WITH (FORCE)`,
      `CREATE DATABASE ${DATABASE}`,
    ]);
    dbCreated = true;
    say(`database ${DATABASE} on ${new URL(url).host}`);

    const port = await freePort();
    const smtpPort = await freePort();
    const base = `http://127.0.0.1:${port}`;
    const env = {
      ...process.env,
      NODE_ENV: 'development',
      DATABASE_URL: dbUrl,
      PORT: String(port),
      SMTP_FAKE_PORT: String(smtpPort),
      WEB_DIST,
      PUBLIC_URL: `${base}/`,
      // Every test signs in through the page; the default limit would lock them out.
      LOGIN_LIMIT: '1000',
    };
    delete env.SMTP_URL; // the API starts its own SMTP fake
    const api = startProcess('api', [API_SERVER, '--seed'], env, logDir);
    children.push(api);
    await waitForApi(base, api);
    const worker = startProcess(
      'worker',
      [API_WORKER],
      { ...env, SMTP_URL: `smtp://127.0.0.1:${smtpPort}` },
      logDir,
    );
    children.push(worker);
    say(
      `API and web app at ${base}/ (ready after ${((Date.now() - started) / 1000).toFixed(1)} s)`,
    );

    const run = spawn(
      process.execPath,
      ['--test', '--test-concurrency=1', '--test-reporter=spec', ...files],
      { cwd: WEB_DIR, env: { ...process.env, BASE_URL: base }, stdio: 'inherit' },
    );
    const { code, signal } = await new Promise((resolve) =>
      run.once('exit', (c, s) => resolve({ code: c, signal: s })),
    );
    if (worker.exitCode !== null)
      say(`the worker ended early (exit ${worker.exitCode}); see ${worker.log}`);
    say(`servers' logs: ${logDir}`);
    say(`screenshots: ${path.relative(ROOT, SHOTS)}/`);
    say(`took ${((Date.now() - started) / 1000).toFixed(1)} s`);
    return signal ? 1 : (code ?? 1);
  } finally {
    await cleanup();
  }
}

main()
  .then((code) => process.exit(code))
  .catch((e) => {
    say(e instanceof SetupError ? e.message : (e.stack ?? String(e)));
    process.exit(1);
  });
