/**
 * The fault test (issue 13): PostgreSQL restarted mid-batch, then a worker killed mid-batch.
 * Every section ends once, the API never goes down, the batch finishes when a worker is back,
 * and the stalled state is visible meanwhile (GET /batches/:id, the event stream, one e-mail to
 * the administrators).
 *
 * Real processes: a PostgreSQL cluster of this test's own (scripts/pg.js with SCARPLINE_PG_DIR
 * and SCARPLINE_PG_PORT: restarting it disturbs no other suite), two API processes
 * (dist/server.js, started at once on an empty database: they migrate it one at a time) and
 * workers (dist/worker-main.js) as child processes, talked to over HTTP. Needs the API's build
 * (npm run build:node). Bounds on waits, never assertions on time.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import crypto from 'node:crypto';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import fs from 'node:fs';
import { Client } from 'pg';
import { setEnv } from './own-database';
import { corridorBatch } from './sections';
import { openStream, type OpenStream, type SseEvent } from './event-stream';

const API_DIR = path.resolve(__dirname, '..');
const PG = path.join(API_DIR, 'scripts/pg.js');
const SERVER = path.join(API_DIR, 'dist/server.js');
const WORKER = path.join(API_DIR, 'dist/worker-main.js');
/** The cluster's folder: in a folder of its own (pg.js opens the parent to the postgres user). */
const CLUSTER = path.join(
  os.tmpdir(),
  `scarpline-fault-${crypto.createHash('sha256').update(API_DIR).digest('hex').slice(0, 12)}`,
  'pg',
);
const N = 14;
const PASSWORD = 'fault-test-password-1';

/** A free TCP port on 127.0.0.1. */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const addr = s.address();
      s.close(() => resolve(typeof addr === 'object' && addr ? addr.port : 0));
    });
  });
}

let pgPort = 0;
const pgEnv = () => ({
  ...process.env,
  DATABASE_URL: '',
  SCARPLINE_PG_DIR: CLUSTER,
  SCARPLINE_PG_PORT: String(pgPort),
});

/** `node scripts/pg.js <command>` for this test's cluster; resolves with its output. */
function pg(command: 'start' | 'stop'): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [PG, command], { env: pgEnv() });
    let out = '';
    child.stdout.on('data', (c: Buffer) => (out += c.toString()));
    child.stderr.on('data', (c: Buffer) => (out += c.toString()));
    child.once('exit', (code) =>
      code === 0 ? resolve(out) : reject(new Error(`pg.js ${command}: ${out}`)),
    );
  });
}

interface Proc {
  name: string;
  child: ChildProcess;
  /** Every line it wrote to stdout and stderr. */
  lines: string[];
}
const procs: Proc[] = [];
let env: Record<string, string> = {};

function launch(name: string, script: string, extra: Record<string, string> = {}): Proc {
  const child = spawn(process.execPath, [script], {
    cwd: API_DIR,
    env: { ...process.env, ...env, ...extra },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const proc: Proc = { name, child, lines: [] };
  for (const stream of [child.stdout, child.stderr]) {
    let rest = '';
    stream?.on('data', (c: Buffer) => {
      const text = rest + c.toString();
      const parts = text.split('\n');
      rest = parts.pop() ?? '';
      proc.lines.push(...parts.filter(Boolean));
    });
  }
  procs.push(proc);
  return proc;
}

const alive = (p: Proc) => p.child.exitCode === null && p.child.signalCode === null;

/** The JSON log objects of a process (every line must be one). */
function logOf(p: Proc): Record<string, unknown>[] {
  return p.lines.map((l) => JSON.parse(l) as Record<string, unknown>);
}

function dump(): string {
  return procs.map((p) => `--- ${p.name}\n${p.lines.slice(-40).join('\n')}`).join('\n');
}

/** Polls `check` every 100 ms until it is true; throws after `limitMs` with the processes' logs. */
async function until(what: string, limitMs: number, check: () => Promise<boolean> | boolean) {
  const end = Date.now() + limitMs;
  for (;;) {
    let ok = false;
    try {
      ok = await check();
    } catch {
      ok = false;
    }
    if (ok) return;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}\n${dump()}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Loops of the test that afterAll ends, should the test end early: the probe of /health, the event streams. */
let probing = true;
let following = true;
const streams: OpenStream[] = [];
/** The two API processes' addresses; requests go to the first unless said. */
let bases: string[] = [];
let databaseUrl = '';
let restoreEnv: () => void = () => {};
let db: Client | null = null;

/** A query on the test's own connection, opened anew after the restart. */
async function query<T>(sql: string, values: unknown[] = []): Promise<T[]> {
  if (!db) {
    const c = new Client({ connectionString: databaseUrl });
    c.on('error', () => (db = null));
    await c.connect();
    db = c;
  }
  try {
    return (await db.query(sql, values)).rows as T[];
  } catch (e) {
    db = null;
    throw e;
  }
}

async function api(
  route: string,
  options: {
    token?: string;
    method?: string;
    body?: unknown;
    headers?: Record<string, string>;
    /** Which API process: 0 or 1. */
    at?: number;
  } = {},
) {
  const res = await fetch(`${bases[options.at ?? 0]}${route}`, {
    method: options.method ?? 'GET',
    headers: {
      ...(options.token ? { authorization: `Bearer ${options.token}` } : {}),
      ...(options.body ? { 'content-type': 'application/json' } : {}),
      ...options.headers,
    },
    body: options.body ? JSON.stringify(options.body) : undefined,
  });
  const text = await res.text();
  let body: Record<string, unknown> = {};
  try {
    body = JSON.parse(text) as Record<string, unknown>;
  } catch {
    body = { text };
  }
  return { status: res.status, body };
}

beforeAll(async () => {
  for (const f of [SERVER, WORKER]) {
    if (!fs.existsSync(f)) throw new Error(`${f} is missing: build the API (npm run build:node)`);
  }
  pgPort = await freePort();
  const started = await pg('start');
  const clusterUrl = started.split('\n').find((l) => l.startsWith('postgres://'));
  if (!clusterUrl) throw new Error(`pg.js start printed no URL: ${started}`);
  const admin = new Client({ connectionString: clusterUrl.replace(/\/[^/]+$/, '/postgres') });
  await admin.connect();
  await admin.query('DROP DATABASE IF EXISTS scarpline_fault WITH (FORCE)');
  await admin.query('CREATE DATABASE scarpline_fault');
  await admin.end();
  databaseUrl = clusterUrl.replace(/\/[^/]+$/, '/scarpline_fault');

  env = {
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    HOST: '127.0.0.1',
    LOG_LEVEL: 'info',
    SMTP_URL: '',
    MAIL_TO: '',
    HEARTBEAT_SECONDS: '0.5',
    WORKER_STALE_SECONDS: '2',
    EVENT_POLL_MS: '200',
    QUEUE_MAINTENANCE_SECONDS: '1',
    // The time limit of an analysis; a killed worker's job comes back after it and a few seconds.
    JOB_TIMEOUT: '4',
    JOB_RETRY_DELAY: '1',
    WEB_DIST: path.join(os.tmpdir(), 'scarpline-fault-no-web'),
  };
}, 120000);

afterAll(async () => {
  probing = false;
  following = false;
  for (const s of streams) s.close();
  for (const p of procs) if (alive(p)) p.child.kill('SIGTERM');
  // FAULT_TEST_LOGS=<folder> keeps each process's log there, to read what happened.
  const keep = process.env.FAULT_TEST_LOGS;
  if (keep) {
    fs.mkdirSync(keep, { recursive: true });
    for (const p of procs) {
      fs.writeFileSync(path.join(keep, `${p.name.replace(/\W+/g, '-')}.log`), p.lines.join('\n'));
    }
  }
  await Promise.all(procs.filter(alive).map((p) => new Promise((r) => p.child.once('exit', r))));
  await db?.end().catch(() => undefined);
  restoreEnv();
  await pg('stop');
}, 60000);

test('PostgreSQL restarted and a worker killed mid-batch: every section ends once, the API stays up, the stall shows', async () => {
  // Two API processes at once on the empty database, each with its own port and mail fake.
  const ports = [await freePort(), await freePort()];
  const smtp = [await freePort(), await freePort()];
  bases = ports.map((p) => `http://127.0.0.1:${p}`);
  const servers = [0, 1].map((i) =>
    launch(`api ${i + 1}`, SERVER, { PORT: String(ports[i]), SMTP_FAKE_PORT: String(smtp[i]) }),
  );
  for (const at of [0, 1]) {
    await until(`API ${at + 1} to answer`, 30000, async () => {
      return (await api('/health', { at })).status === 200;
    });
  }
  // They migrated it once, one after the other (an advisory lock).
  const migrated = servers.flatMap(logOf).filter((l) => l.msg === 'database migrated');
  expect(migrated).toHaveLength(1);

  restoreEnv = setEnv({ DATABASE_URL: databaseUrl });
  const { sequelize } = await import('../src/db');
  const { createUser } = await import('../src/services/users');
  for (const role of ['admin', 'engineer'] as const) {
    await createUser(null, {
      email: `fault-${role}@test.scarpline.example`,
      name: `Fault ${role}`,
      role,
      password: PASSWORD,
    });
  }
  await sequelize.close();

  // The API must answer /health throughout; a refused connection or a non-200 is a failure.
  const health: string[] = [];
  const prober = (async () => {
    while (probing) {
      for (const base of bases) {
        try {
          const res = await fetch(`${base}/health`);
          health.push(String(res.status));
        } catch (e) {
          health.push(`error: ${(e as Error).message}`);
        }
      }
      await new Promise((r) => setTimeout(r, 100));
    }
  })();

  const workerA = launch('worker A', WORKER, {
    WORKER_CONCURRENCY: '1',
    SMTP_URL: `smtp://127.0.0.1:${smtp[0]}`,
  });
  await until('/ready with a worker', 30000, async () => (await api('/ready')).status === 200);

  const login = async (role: string) =>
    (
      await api('/api/v1/auth/login', {
        method: 'POST',
        body: { email: `fault-${role}@test.scarpline.example`, password: PASSWORD },
      })
    ).body.token as string;
  const admin = await login('admin');
  const engineer = await login('engineer');
  const project = await api('/api/v1/projects', {
    method: 'POST',
    token: engineer,
    body: { name: 'Fault test' },
  });
  // A few hundred ms a section: the worker is caught in the middle of one at each fault.
  const post = await api(`/api/v1/projects/${project.body.id as number}/batches`, {
    method: 'POST',
    token: engineer,
    // one case a station: the time a section takes is the faults' concern here, not its cases
    body: corridorBatch(
      'wcb-fault',
      N,
      { methods: ['bishop', 'spencer', 'morgenstern-price'], slices: 300, searchEachMethod: true },
      { oneCase: true },
    ),
  });
  expect(post.status).toBe(201);
  const batchId = post.body.id as number;
  const batch = () => api(`/api/v1/batches/${batchId}`, { token: engineer });

  // The event stream, reopened whenever the server closes it before `done` (as EventSource does);
  // the token in the query, which the logs must not show.
  const follower = (async () => {
    while (following) {
      const s = openStream(
        `${bases[1]}/api/v1/batches/${batchId}/events?access_token=${engineer}`,
        {
          'x-request-id': `fault-events-${streams.length + 1}`,
        },
      );
      streams.push(s);
      await s.ended;
      if (s.events.some((e) => e.event === 'done')) return;
      await new Promise((r) => setTimeout(r, 300));
    }
  })();
  const seen = (): SseEvent[] => streams.flatMap((s) => s.events);

  const ended = async () =>
    (
      await query<{ n: string }>(
        `SELECT count(*) AS n FROM sections WHERE batch_id = $1 AND status IN ('done', 'failed')`,
        [batchId],
      )
    ).map((r) => Number(r.n))[0];
  const running = async () =>
    (
      await query<{ n: string }>(
        `SELECT count(*) AS n FROM sections WHERE batch_id = $1 AND status = 'running'`,
        [batchId],
      )
    ).map((r) => Number(r.n))[0];

  // 1. PostgreSQL restarts while worker A is in the middle of a section.
  await until('a few sections ended and one running', 30000, async () => {
    return (await ended()) >= 2 && (await running()) === 1;
  });
  await pg('stop');
  const down = await api('/ready');
  expect(down.status).toBe(503);
  expect(down.body).toMatchObject({ ready: false, checks: { database: { ok: false } } });
  expect((await api('/health')).status).toBe(200);
  await new Promise((r) => setTimeout(r, 1500)); // the worker meets the outage
  await pg('start');
  const restartedAt = new Date().toISOString();
  await until('sections ending again after the restart', 30000, async () => {
    return (await ended()) >= 6 && (await running()) === 1;
  });
  expect(alive(workerA)).toBe(true);
  for (const server of servers) expect(alive(server)).toBe(true);

  // 2. Worker A is killed in the middle of a section: no worker is left.
  workerA.child.kill('SIGKILL');
  await new Promise((r) => workerA.child.once('exit', r));
  expect(workerA.child.signalCode).toBe('SIGKILL');
  const endedAtKill = await ended();
  expect(endedAtKill).toBeLessThan(N);

  await until('the batch shown stalled', 20000, async () => {
    const b = await batch();
    return (b.body.progress as { stalled: boolean }).stalled;
  });
  await until('a stalled event', 20000, () => seen().some((e) => e.event === 'stalled'));
  const stalledEvent = seen().find((e) => e.event === 'stalled')!;
  expect(stalledEvent.data).toMatchObject({
    id: batchId,
    message: expect.stringMatching(/^No worker has reported since \d{4}-/),
    progress: { stalled: true },
    caution: expect.stringMatching(/qualified/),
  });
  const notReady = await api('/ready');
  expect(notReady.status).toBe(503);
  expect(notReady.body).toMatchObject({
    checks: { database: { ok: true }, workers: { ok: false } },
  });
  // Both API processes watch for stalls; the stall is mailed once, by one of them.
  const stallMails = async () => {
    const inboxes = await Promise.all(
      [0, 1].map(async (at) => (await api('/api/v1/mail', { token: admin, at })).body),
    );
    return (inboxes as unknown as { raw: string }[][])
      .flat()
      .filter((x) => /^Subject: .*batch wcb-fault has stalled/m.test(x.raw));
  };
  await until('the stall e-mail', 20000, async () => (await stallMails()).length === 1);

  // 3. A worker is back: the batch goes on (the killed worker's job comes back after its time
  // limit) and finishes.
  const workerB = launch('worker B', WORKER, {
    WORKER_CONCURRENCY: '1',
    SMTP_URL: `smtp://127.0.0.1:${smtp[0]}`,
  });
  await until('the batch to finish', 90000, async () => (await batch()).body.status === 'done');
  following = false;
  await follower;
  probing = false;
  await prober;

  // Every section ended once: done, one result each, one completed job each, no dead letter,
  // and one "section ended" line among both workers' logs.
  const sections = await query<{ id: number; status: string; results: string }>(
    `SELECT s.id, s.status, (SELECT count(*) FROM results r WHERE r.section_id = s.id) AS results
       FROM sections s WHERE s.batch_id = $1 ORDER BY s.id`,
    [batchId],
  );
  expect(sections).toHaveLength(N);
  for (const s of sections) expect([s.id, s.status, Number(s.results)]).toEqual([s.id, 'done', 1]);
  const jobsOf = () =>
    query<{ name: string; state: string; n: string }>(
      `SELECT name, state::text AS state, count(*) AS n FROM pgboss.job
        WHERE (data->>'sectionId')::int = ANY($1) GROUP BY name, state`,
      [sections.map((s) => s.id)],
    );
  // The last job is completed just after its section is written and the batch closed.
  await until('every job settled', 10000, async () =>
    (await jobsOf()).every((j) => !['created', 'retry', 'active'].includes(j.state)),
  );
  const jobs = await jobsOf();
  expect(jobs).toEqual([{ name: 'section-analysis', state: 'completed', n: String(N) }]);
  const endings = [workerA, workerB]
    .flatMap(logOf)
    .filter((l) => l.msg === 'section ended')
    .map((l) => l.sectionId as number)
    .sort((a, b) => a - b);
  expect(endings).toEqual(sections.map((s) => s.id));
  // Worker A went on after the restart (it survived it) and B finished what A left.
  const byA = logOf(workerA).filter((l) => l.msg === 'section ended');
  expect(byA.some((l) => (l.time as string) > restartedAt)).toBe(true);
  expect(logOf(workerB).some((l) => l.msg === 'section ended')).toBe(true);

  // The API never went down.
  for (const server of servers) expect(alive(server)).toBe(true);
  expect(health.length).toBeGreaterThan(10);
  expect(health.filter((h) => h !== '200')).toEqual([]);

  // The stall was visible meanwhile, told once, and is over.
  const final = await batch();
  expect(final.body.progress).toMatchObject({ total: N, done: N, failed: 0, stalled: false });
  expect(await stallMails()).toHaveLength(1);
  const all = seen();
  expect(all.at(-1)?.event).toBe('done');
  const progress = all.filter((e) => e.event === 'progress');
  expect(progress.some((e) => e.data.stalled === true)).toBe(true);
  for (const e of progress) expect(e.data.caution).toEqual(expect.stringMatching(/qualified/));

  // Logs: JSON lines everywhere; the event stream's request logged by its id, its token blanked.
  const apiLog = servers.flatMap(logOf);
  for (const l of [...apiLog, ...logOf(workerA), ...logOf(workerB)]) {
    expect(l).toMatchObject({ level: expect.any(String), time: expect.any(String) });
  }
  const streamLine = apiLog.find(
    (l) => (l.req as { id?: string } | undefined)?.id === 'fault-events-1',
  );
  expect(streamLine).toBeDefined();
  expect((streamLine!.req as { url: string }).url).toMatch(/access_token=\[redacted\]/);
  for (const server of servers) expect(server.lines.join('\n')).not.toContain(engineer);
}, 240000);
