/**
 * A worker process killed mid-batch (SIGKILL, no chance to clean up): its job times out, the
 * queue hands it to another worker, and every section still ends done or failed, once.
 * Runs the built worker (`npx tsc -b apps/api` first) as a child process against the test database.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { corridorBatch } from './sections';

// The jobs this file submits get a short time limit, so a killed worker's job comes back soon
// (read when src/config is imported below, in beforeAll; restored in afterAll).
const savedTimeout = process.env.JOB_TIMEOUT;
process.env.JOB_TIMEOUT = '5';

const ROOT = path.resolve(__dirname, '../../..');
const WORKER = path.join(ROOT, 'apps/api/dist/worker-main.js');
type Mods = {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  stopQueue: typeof import('../src/queue').stopQueue;
  helpers: typeof import('./helpers');
};
let m: Mods;
const children: ChildProcess[] = [];
const output: string[] = [];

function startWorker(label: string): ChildProcess {
  const child = spawn(process.execPath, [WORKER], {
    cwd: ROOT,
    env: {
      ...process.env,
      WORKER_CONCURRENCY: '1',
      QUEUE_MAINTENANCE_SECONDS: '1',
      JOB_TIMEOUT: '5',
      SMTP_URL: '',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (c: Buffer) => output.push(`${label}: ${c.toString()}`));
  child.stderr?.on('data', (c: Buffer) => output.push(`${label}: ${c.toString()}`));
  children.push(child);
  return child;
}

async function statuses(batchId: number): Promise<Record<string, number>> {
  const rows = await m.sequelize.query<{ status: string; n: string }>(
    'SELECT status, count(*) AS n FROM sections WHERE batch_id = $1 GROUP BY status',
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}

/** Polls `check` every 100 ms until it is true; throws after `limitMs`. */
async function until(what: string, limitMs: number, check: () => Promise<boolean>) {
  const end = Date.now() + limitMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}\n${output.join('')}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

beforeAll(async () => {
  if (!fs.existsSync(WORKER)) throw new Error(`${WORKER} is missing: run npx tsc -b apps/api`);
  m = {
    app: (await import('../src/app')).createApp(),
    sequelize: (await import('../src/db')).sequelize,
    stopQueue: (await import('../src/queue')).stopQueue,
    helpers: await import('./helpers'),
  };
});

afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGTERM');
  await Promise.all(
    children
      .filter((c) => c.exitCode === null && c.signalCode === null)
      .map((c) => new Promise((r) => c.once('exit', r))),
  );
  await m.stopQueue();
  await m.sequelize.close();
  if (savedTimeout === undefined) delete process.env.JOB_TIMEOUT;
  else process.env.JOB_TIMEOUT = savedTimeout;
});

test('SIGKILL a worker mid-batch: another finishes it, no section lost or solved twice', async () => {
  const { app, helpers } = m;
  const users = await helpers.makeUsers('kill');
  const engineer = await helpers.signIn(app, users.engineer.email);
  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Killed worker (test)' });
  const n = 10;
  const post = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(
      corridorBatch(
        'wcb-kill',
        n,
        // Finer slices and a search per method: a few hundred ms a section, so that the worker
        // is caught in the middle of one when it is killed (one case a station: the demo
        // corridor's earthquake case would make each section several times that).
        {
          methods: ['bishop', 'spencer', 'morgenstern-price'],
          slices: 500,
          searchEachMethod: true,
        },
        { oneCase: true },
      ),
    );
  expect(post.status).toBe(201);
  const batchId: number = post.body.id;

  const first = startWorker('worker 1');
  await until('some sections done and one running', 30000, async () => {
    const s = await statuses(batchId);
    return (s.done ?? 0) + (s.failed ?? 0) >= 3 && (s.running ?? 0) >= 1;
  });
  first.kill('SIGKILL');
  await new Promise((r) => first.once('exit', r));
  expect(first.signalCode).toBe('SIGKILL');
  const runningAtKill = (
    await m.sequelize.query<{ id: number }>(
      "SELECT id FROM sections WHERE batch_id = $1 AND status = 'running'",
      { bind: [batchId], type: QueryTypes.SELECT },
    )
  ).map((r) => r.id);
  // The killed worker left its section running: nothing closed it on the way out.
  expect(runningAtKill.length).toBeGreaterThanOrEqual(1);
  expect((await statuses(batchId)).queued ?? 0).toBeGreaterThan(0);

  startWorker('worker 2');
  await until('the batch to finish', 60000, async () => {
    const [b] = await m.sequelize.query<{ status: string }>(
      'SELECT status FROM batches WHERE id = $1',
      { bind: [batchId], type: QueryTypes.SELECT },
    );
    return b.status === 'done';
  });

  const sections = await m.sequelize.query<{ id: number; status: string; results: string }>(
    `SELECT s.id, s.status, (SELECT count(*) FROM results r WHERE r.section_id = s.id) AS results
       FROM sections s WHERE s.batch_id = $1 ORDER BY s.id`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  expect(sections).toHaveLength(n);
  for (const s of sections) {
    expect([s.id, ['done', 'failed'].includes(s.status)]).toEqual([s.id, true]);
    // One result row per solved section, never two (a retried job overwrites its own row).
    if (s.status === 'done') expect([s.id, Number(s.results)]).toEqual([s.id, 1]);
    else expect([s.id, Number(s.results) <= 1]).toEqual([s.id, true]);
  }
  // The section the killed worker held was taken up again and finished.
  for (const id of runningAtKill) {
    expect(['done', 'failed']).toContain(sections.find((s) => s.id === id)?.status);
  }
  const p = await request(app).get(`/api/v1/batches/${batchId}`).auth(engineer, { type: 'bearer' });
  expect(p.body.progress.done + p.body.progress.failed).toBe(n);
  expect(p.body.progress.total).toBe(n);
}, 120_000);
