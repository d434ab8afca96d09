#!/usr/bin/env node
/**
 * Starts the whole product on this machine: the local PostgreSQL (scripts/pg.js), the API build,
 * migrations, the demo seed (the invented Wendlecombe corridor, demo users with their passwords
 * printed), the API and one worker process. Ctrl-C stops the API and the worker (the database
 * keeps running; `node apps/api/scripts/pg.js stop` ends it).
 */
const { spawn, spawnSync } = require('node:child_process');
const path = require('node:path');
const pg = require('./pg.js');

const API_DIR = path.resolve(__dirname, '..');
const ROOT = path.resolve(API_DIR, '../..');
const SMTP_FAKE_PORT = process.env.SMTP_FAKE_PORT || '2525';

async function main() {
  const { url } = await pg.start();
  const build = spawnSync('npx', ['tsc', '-b', 'apps/api'], { cwd: ROOT, stdio: 'inherit' });
  if (build.status !== 0) throw new Error('build of apps/api failed');
  const env = { ...process.env, DATABASE_URL: url, SMTP_FAKE_PORT };
  const api = spawn(process.execPath, [path.join(API_DIR, 'dist/server.js'), '--seed'], {
    env,
    stdio: 'inherit',
  });
  const worker = spawn(process.execPath, [path.join(API_DIR, 'dist/worker-main.js')], {
    env: {
      ...env,
      WORKER_CONCURRENCY: process.env.WORKER_CONCURRENCY || '1',
      SMTP_URL: process.env.SMTP_URL || `smtp://127.0.0.1:${SMTP_FAKE_PORT}`,
    },
    stdio: 'inherit',
  });
  const children = [api, worker];
  const stop = () => children.forEach((c) => c.exitCode === null && c.kill('SIGTERM'));
  process.once('SIGINT', stop);
  process.once('SIGTERM', stop);
  for (const c of children) {
    c.on('exit', (code) => {
      if (code) process.exitCode = code;
      stop();
    });
  }
}

main().catch((e) => {
  console.error(e.message);
  process.exit(1);
});
