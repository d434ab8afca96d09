/**
 * The project-local PostgreSQL (scripts/pg.js) of two checkouts at once: each on a port of its
 * own without SCARPLINE_PG_PORT, a port taken by another program passed over (and the new one
 * remembered), a failure in one line that says what to do, and `run` stopping only a cluster it
 * started. The second checkout is a copy of the script in a folder of its own, so it has a
 * cluster of its own (one initdb: a few seconds).
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';

type Pg = {
  status(): { running: boolean; port: number; dir: string };
  derivedPort(dir: string): number;
  startFailure(logFile: string, port: number, output: string): string;
};
// eslint-disable-next-line @typescript-eslint/no-require-imports
const pg = require('../scripts/pg.js') as Pg;

const ROOT = path.resolve(__dirname, '../../..');
let tmp: string;
let script: string;
let clusterDir: string;

/** Runs the second checkout's pg.js, without this checkout's settings. */
function other(args: string[], extra: Record<string, string> = {}) {
  const env: Record<string, string | undefined> = {
    ...process.env,
    NODE_PATH: path.join(ROOT, 'node_modules'),
    ...extra,
  };
  if (!extra.SCARPLINE_PG_PORT) delete env.SCARPLINE_PG_PORT;
  delete env.DATABASE_URL;
  delete env.SCARPLINE_PG_DIR;
  return spawnSync(process.execPath, [script, ...args], { env, encoding: 'utf8' });
}

/** Listens on a port of 127.0.0.1 (as another program would) until closed. */
function occupy(port: number): Promise<net.Server> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen({ port, host: '127.0.0.1', exclusive: true }, () => resolve(server));
  });
}
const close = (s: net.Server) => new Promise((r) => s.close(r));

beforeAll(() => {
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-checkout-'));
  fs.chmodSync(tmp, 0o755); // the postgres user must reach the cluster's folder
  const api = path.join(tmp, 'apps/api');
  fs.mkdirSync(path.join(api, 'scripts'), { recursive: true });
  script = path.join(api, 'scripts/pg.js');
  fs.copyFileSync(path.join(ROOT, 'apps/api/scripts/pg.js'), script);
  fs.copyFileSync(
    path.join(ROOT, 'apps/api/scripts/local-ports.js'),
    path.join(api, 'scripts/local-ports.js'),
  );
  clusterDir = path.join(api, '.data/pg');
});

afterAll(() => {
  other(['stop']);
  fs.rmSync(tmp, { recursive: true, force: true });
});

test('the port derived from a checkout is the same every time, and another for another', () => {
  const here = path.join(ROOT, 'apps/api/.data/pg');
  expect(pg.derivedPort(here)).toBe(pg.derivedPort(here));
  expect(pg.derivedPort(here)).not.toBe(pg.derivedPort('/srv/other-checkout/apps/api/.data/pg'));
  for (const dir of [here, clusterDir, '/a', '/b/c']) {
    expect(pg.derivedPort(dir)).toBeGreaterThanOrEqual(55000);
    expect(pg.derivedPort(dir)).toBeLessThan(57000);
  }
});

test('a second checkout starts its own cluster beside this one, and stops only its own', async () => {
  const ours = pg.status();
  expect(ours.running).toBe(true);
  // another program holds the port the second checkout would take
  const derived = pg.derivedPort(clusterDir);
  const held = await occupy(derived);
  try {
    const started = other(['start']);
    expect(started.status).toBe(0);
    const next = 55000 + ((derived - 55000 + 1) % 2000);
    expect(started.stderr).toContain(
      `pg: port ${derived} is taken by another program: using ${next} from now on`,
    );
    expect(started.stderr).toContain(`pg: started on 127.0.0.1:${next} (${clusterDir})`);
    expect(started.stdout).toContain(`postgres://postgres@127.0.0.1:${next}/scarpline`);
    expect(fs.readFileSync(path.join(clusterDir, 'scarpline-port'), 'utf8').trim()).toBe(
      String(next),
    );
    expect(other(['status']).stdout.trim()).toBe(`running on 127.0.0.1:${next} (${clusterDir})`);
    expect(next).not.toBe(ours.port);
  } finally {
    await close(held);
  }
  expect(other(['stop']).status).toBe(0);
  expect(other(['status']).stdout.trim()).toBe('stopped');
  // this checkout's cluster still runs, on its port
  expect(pg.status()).toEqual(ours);
});

test('a port taken under SCARPLINE_PG_PORT: one line that says what to do', async () => {
  const held = await occupy(0);
  const port = (held.address() as net.AddressInfo).port;
  try {
    const r = other(['start'], { SCARPLINE_PG_PORT: String(port) });
    expect(r.status).toBe(1);
    expect(r.stderr.trim().split('\n')).toEqual([
      `pg: port ${port} on 127.0.0.1 (SCARPLINE_PG_PORT) is taken by another program: set SCARPLINE_PG_PORT to a free port, or unset it to let this checkout choose one`,
    ]);
  } finally {
    await close(held);
  }
  expect(other(['start'], { SCARPLINE_PG_PORT: 'x' }).stderr.trim()).toBe(
    'pg: SCARPLINE_PG_PORT=x is not a port: give a number from 1024 to 65535',
  );
});

test("the server's own failures in one line, from its log", () => {
  const log = path.join(tmp, 'server.log');
  fs.writeFileSync(
    log,
    '2025-01-01 LOG:  starting PostgreSQL\n2025-01-01 LOG:  could not bind IPv4 address "127.0.0.1": Address already in use\n',
  );
  expect(pg.startFailure(log, 55123, 'pg_ctl: could not start server')).toBe(
    `PostgreSQL could not listen on 127.0.0.1:55123: another program has it; set SCARPLINE_PG_PORT to a free port (the server's log: ${log})`,
  );
  fs.writeFileSync(log, '2025-01-01 FATAL:  data directory "x" has invalid permissions\n');
  expect(pg.startFailure(log, 55123, '')).toBe(
    `PostgreSQL did not start: data directory "x" has invalid permissions (the server's log: ${log})`,
  );
});

test('run: starts a stopped cluster for a command, stops it after; leaves a running one running', () => {
  const r = other(['run', process.execPath, script, 'status']);
  expect(r.status).toBe(0);
  expect(r.stdout).toMatch(/^running on 127\.0\.0\.1:\d+ /m);
  expect(r.stderr).toMatch(/pg: stopped/);
  expect(other(['status']).stdout.trim()).toBe('stopped');

  // the command's exit code is run's
  expect(other(['run', process.execPath, '-e', 'process.exit(3)']).status).toBe(3);
  expect(other(['status']).stdout.trim()).toBe('stopped');

  // a cluster that was running before stays running
  expect(other(['start']).status).toBe(0);
  const kept = other(['run', '--', process.execPath, '-e', '0']);
  expect(kept.status).toBe(0);
  expect(kept.stderr).not.toMatch(/pg: stopped/);
  expect(other(['status']).status).toBe(0);
  expect(other(['stop']).status).toBe(0);
});
