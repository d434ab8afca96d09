/**
 * The intake pool keeps its promises: a job past its time limit is stopped (its thread ended)
 * and answered 422 saying so, the pool goes on with the next job, and when more jobs wait than
 * it holds the request is answered 503 at once. One thread, a queue of one and a short limit,
 * set before the app's modules are loaded (they read the environment once).
 */
import type { Express } from 'express';
import request from 'supertest';

const saved = { ...process.env };
process.env.INTAKE_THREADS = '1';
process.env.INTAKE_QUEUE = '1';
process.env.INTAKE_TIMEOUT_MS = '5000';

type Mods = {
  app: Express;
  closeIntake: typeof import('../src/intake/pool').closeIntake;
  sequelize: typeof import('../src/db').sequelize;
  stopQueue: typeof import('../src/queue').stopQueue;
  helpers: typeof import('./helpers');
};
let m: Mods;
const auth = { type: 'bearer' as const };
let engineer: string;
let projectId: number;

/** YAML within every limit that takes the core well over a second to read. */
const SLOW = Array.from({ length: 99 }, () => `- [${'1.5, '.repeat(1999)}1.5]`).join('\n');

const upload = (files: [string, string][]) => {
  let r = request(m.app).post(`/api/v1/projects/${projectId}/uploads`).auth(engineer, auth);
  for (const [name, text] of files) r = r.attach('files', Buffer.from(text), name);
  return r;
};

beforeAll(async () => {
  const { createApp } = await import('../src/app');
  const { closeIntake } = await import('../src/intake/pool');
  const { sequelize } = await import('../src/db');
  const { queue, stopQueue } = await import('../src/queue');
  const helpers = await import('./helpers');
  m = { app: createApp(), closeIntake, sequelize, stopQueue, helpers };
  await queue();
  const users = await helpers.makeUsers('intake-limits');
  engineer = await helpers.signIn(m.app, users.engineer.email);
  const p = await request(m.app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Intake limits (test)' });
  projectId = p.body.id;
  // the thread is started (and has loaded the core) before the limits are tried
  expect((await upload([['warm.json', '{}']])).status).toBe(422);
});

afterAll(async () => {
  await m.closeIntake();
  await m.stopQueue();
  await m.sequelize.close();
  process.env = saved;
});

test('a job past its time limit is stopped and answered 422; the next job is read', async () => {
  // a dozen files of about a second each: far past the limit of 5 s
  const res = await upload(
    Array.from({ length: 12 }, (_, i): [string, string] => [`slow-${i}.yaml`, SLOW]),
  );
  m.helpers.expectProblem(res, 422);
  expect(res.body.detail).toMatch(/took longer than its limit \(5 s\) and was stopped/);
  const next = await upload([
    ['one.json', JSON.stringify({ format: 'scarpline/1', id: 'x', units: 'si' })],
  ]);
  m.helpers.expectProblem(next, 422);
  expect(next.body.errors[0].file).toBe('one.json');
});

test('more jobs than the pool holds: 503 at once, with Retry-After', async () => {
  const all = await Promise.all(
    [1, 2, 3, 4].map((i) => upload([[`slow-${i}.yaml`, SLOW]]).then((r) => r)),
  );
  const statuses = all.map((r) => r.status);
  expect(statuses).toContain(503);
  for (const r of all) {
    expect(r.status).not.toBe(500);
    if (r.status === 503) {
      m.helpers.expectProblem(r, 503);
      expect(r.headers['retry-after']).toBeDefined();
    }
  }
});
