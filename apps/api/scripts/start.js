#!/usr/bin/env node
/**
 * Starts the whole product on this machine: the local PostgreSQL (scripts/pg.js), the local S3
 * fake (scripts/s3.js, unless AWS_ENDPOINT_URL_S3 names other storage), the API build,
 * the web app's build when it is missing or older than its sources, migrations, the demo seed
 * (the invented Wendlecombe corridor, demo users with their passwords printed), the API and one
 * worker process, then prints the address to open and the demo users. The API and the worker
 * log JSON lines (pino: one object a line) and are kept running (scripts/supervise.js): one
 * that ends is started again after a pause, with a line that says so, and a worker's end never
 * stops the API. Ctrl-C stops the API, the worker and the fake (the database
 * keeps running; `node apps/api/scripts/pg.js stop` ends it).
 */
const { spawnSync } = require('node:child_process');
const fs = require('node:fs');
const path = require('node:path');
const pg = require('./pg.js');
const s3 = require('./s3.js');
const { supervise, stopOnSignals } = require('./supervise.js');

const API_DIR = path.resolve(__dirname, '..');
const ROOT = path.resolve(API_DIR, '../..');
const WEB_DIR = path.join(ROOT, 'apps/web');
const WEB_DIST = process.env.WEB_DIST
  ? path.resolve(process.env.WEB_DIST)
  : path.join(WEB_DIR, 'dist/browser');
const SMTP_FAKE_PORT = process.env.SMTP_FAKE_PORT || '2525';
const PORT = process.env.PORT || '8080';
const SKIP_DIRS = new Set(['node_modules', 'dist', '.angular', '.git']);

/** The newest modification time of a file, or of any file under a folder; -Infinity if none. */
function newest(p) {
  let stat;
  try {
    stat = fs.statSync(p);
  } catch {
    return -Infinity;
  }
  if (!stat.isDirectory()) return stat.mtimeMs;
  let t = -Infinity;
  for (const entry of fs.readdirSync(p)) {
    if (!SKIP_DIRS.has(entry)) t = Math.max(t, newest(path.join(p, entry)));
  }
  return t;
}

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch {
    return null;
  }
}

/** What the web build is made from: its sources and settings (and the core, if it uses it). */
function webSources(webDir, pkg) {
  const files = [
    'src',
    'public',
    'angular.json',
    'package.json',
    'tsconfig.json',
    'tsconfig.app.json',
  ];
  const list = files.map((p) => path.join(webDir, p));
  const deps = { ...(pkg && pkg.dependencies), ...(pkg && pkg.devDependencies) };
  if (deps['@scarpline/core']) list.push(path.join(webDir, '../../packages/core/src'));
  return list;
}

/**
 * Whether the web app in `webDir` needs building into `dist`: `{ build: true }` when
 * dist/index.html is missing or older than a source file and the workspace has a build script;
 * otherwise `{ build: false }`. `message` says which, in a line to print.
 */
function webBuildPlan(webDir, dist) {
  const pkg = readJson(path.join(webDir, 'package.json'));
  if (!pkg)
    return { build: false, message: `web: no ${webDir}/package.json; not building the web app` };
  const built = newest(path.join(dist, 'index.html'));
  const sources = Math.max(...webSources(webDir, pkg).map(newest));
  if (built !== -Infinity && built >= sources) {
    return { build: false, message: `web: the build in ${dist} is up to date` };
  }
  if (!(pkg.scripts && pkg.scripts.build)) {
    return {
      build: false,
      message:
        `web: ${pkg.name} has no "build" script yet; not building the web app` +
        (built === -Infinity
          ? ' (a placeholder page is served at /)'
          : ' (serving the older build)'),
    };
  }
  return {
    build: true,
    message:
      built === -Infinity
        ? `web: no build in ${dist}; building the web app`
        : 'web: sources changed since the last build; building the web app',
  };
}

/**
 * Builds the web app (`npm run build -w @scarpline/web`) when webBuildPlan says so, and prints
 * why when it does not (a WEB_DIST of one's own is never built here). A failed build stops the
 * start.
 */
function buildWebIfNeeded() {
  if (process.env.WEB_DIST) {
    console.log(`web: serving the build in WEB_DIST (${WEB_DIST}); not building apps/web`);
    return;
  }
  const plan = webBuildPlan(WEB_DIR, WEB_DIST);
  console.log(plan.message.replace(ROOT + path.sep, ''));
  if (!plan.build) return;
  const r = spawnSync('npm', ['run', 'build', '-w', '@scarpline/web'], {
    cwd: ROOT,
    stdio: 'inherit',
  });
  if (r.status !== 0) throw new Error('build of apps/web failed (npm run build -w @scarpline/web)');
}

/** Waits until the storage fake answers (the API's seed stores its input there). */
async function waitForStorage() {
  const end = Date.now() + 30000;
  while (Date.now() < end) {
    if (await s3.answers(s3.portOf())) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`the S3 fake does not answer on ${s3.endpoint()} (see its lines above)`);
}

/** Waits until the API answers (the seed may take a while), then says where to go. */
async function announce() {
  const base = `http://127.0.0.1:${PORT}`;
  const end = Date.now() + 120000;
  let answered = false;
  while (!answered && Date.now() < end) {
    try {
      const res = await fetch(`${base}/api/schemas/openapi.json`);
      answered = res.ok;
    } catch {
      // not listening yet
    }
    if (!answered) await new Promise((r) => setTimeout(r, 250));
  }
  if (!answered) return;
  const web = fs.existsSync(path.join(WEB_DIST, 'index.html'));
  console.log('');
  console.log(
    web
      ? `Scarpline web app: ${base}/`
      : `Scarpline: ${base}/ (placeholder page: the web app is not built)`,
  );
  console.log(`REST API: ${base}/api/v1 (documentation at ${base}/api/docs)`);
  console.log(
    `Health: ${base}/health, ${base}/ready; metrics: ${base}/metrics (from this machine)`,
  );
  printDemoUsers();
}

/** The demo users the API seeded, for the person who started it (the API itself logs JSON). */
function printDemoUsers() {
  const { DEMO_USERS } = require(path.join(API_DIR, 'dist/demo-users.js'));
  console.log('demo users (e-mail / password):');
  for (const u of DEMO_USERS) {
    console.log(
      `  ${u.role.padEnd(12)} ${u.email.padEnd(32)} ${u.password ?? '(API tokens only)'}`,
    );
  }
}

async function main() {
  const { url } = await pg.start();
  const build = spawnSync('npx', ['tsc', '-b', 'apps/api'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) throw new Error('build of apps/api failed');
  buildWebIfNeeded();
  const env = { ...process.env, DATABASE_URL: url, SMTP_FAKE_PORT, PORT };
  const storage = process.env.AWS_ENDPOINT_URL_S3
    ? null
    : supervise([
        {
          name: 'storage',
          command: process.execPath,
          args: [path.join(__dirname, 's3.js'), 'serve'],
          options: { env, stdio: 'inherit' },
        },
      ]);
  if (storage) await waitForStorage();
  const services = supervise([
    {
      name: 'API',
      command: process.execPath,
      args: [path.join(API_DIR, 'dist/server.js'), '--seed'],
      options: { env, stdio: 'inherit' },
    },
    {
      name: 'worker',
      command: process.execPath,
      args: [path.join(API_DIR, 'dist/worker-main.js')],
      options: {
        env: {
          ...env,
          WORKER_CONCURRENCY: process.env.WORKER_CONCURRENCY || '1',
          SMTP_URL: process.env.SMTP_URL || `smtp://127.0.0.1:${SMTP_FAKE_PORT}`,
        },
        stdio: 'inherit',
      },
    },
  ]);
  stopOnSignals({
    stop: (signal) => Promise.all([services.stop(signal), storage?.stop(signal)]),
  });
  await announce();
}

module.exports = { webBuildPlan };

if (require.main === module) {
  main().catch((e) => {
    console.error(e.message);
    process.exit(1);
  });
}
