/**
 * A stalled batch does not look healthy (issue 13, item 5): with no worker alive, a batch whose
 * sections wait is shown stalled in GET /batches/:id, in its event stream (a `stalled` event,
 * and `stalled` in progress), /ready answers 503, and the administrators get one e-mail per
 * stall; once a worker writes its heartbeat the batch goes on and finishes. Its own database,
 * so that the other files' workers are not alive here.
 */
import type { Server } from 'node:http';
import request from 'supertest';
import { type OwnService, ownService } from './own-database';
import { corridorBatch } from './sections';
import { openStream } from './event-stream';

let svc: OwnService;
type Mods = {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  startWorker: typeof import('../src/worker').startWorker;
  stopQueue: typeof import('../src/queue').stopQueue;
  workers: typeof import('../src/services/workers');
  mail: typeof import('../src/services/mail');
  helpers: typeof import('./helpers');
};
let m: Mods;
let server: Server;
let base: string;

beforeAll(async () => {
  svc = await ownService('stall', {
    HEARTBEAT_SECONDS: '0.5',
    WORKER_STALE_SECONDS: '2',
    EVENT_POLL_MS: '100',
    SMTP_URL: '',
  });
  m = {
    app: svc.app,
    sequelize: svc.sequelize,
    startWorker: (await import('../src/worker')).startWorker,
    stopQueue: svc.queue.stopQueue,
    workers: await import('../src/services/workers'),
    mail: await import('../src/services/mail'),
    helpers: svc.helpers,
  };
  await m.mail.startSmtpFake(0);
  server = m.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const addr = server.address();
  base = `http://127.0.0.1:${typeof addr === 'object' && addr ? addr.port : 0}`;
});

afterAll(async () => {
  server.closeAllConnections();
  await new Promise((r) => server.close(r));
  await m.mail.stopSmtpFake();
  await svc.close();
});

/** Polls `check` until it is true; throws after `limitMs` (a bound, not a timing). */
async function until(what: string, check: () => Promise<boolean>, limitMs = 20000) {
  const end = Date.now() + limitMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

const stallMails = () => m.mail.fakeInbox().filter((x) => /^Subject: .*has stalled/m.test(x.raw));

test('no worker: stalled in the batch, its events, /ready and one e-mail; a worker comes and it finishes', async () => {
  const { app, helpers, workers } = m;
  const users = await helpers.makeUsers('stall');
  const engineer = await helpers.signIn(app, users.engineer.email);
  const auth = { type: 'bearer' as const };

  // Right after the cluster started no worker can be called gone: wait that out here.
  await until('the database to be up longer than WORKER_STALE_SECONDS', async () => {
    return !(await workers.workerState()).tooSoon;
  });
  expect((await request(app).get('/health')).body).toMatchObject({ status: 'ok' });
  const notReady = await request(app).get('/ready');
  helpers.expectProblem(notReady, 503);
  expect(notReady.body).toMatchObject({
    title: 'Not ready',
    ready: false,
    checks: {
      database: { ok: true },
      queue: { ok: true },
      workers: { ok: false, alive: 0, detail: expect.stringMatching(/no worker has written/) },
    },
  });

  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Stall (test)' });
  const post = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, auth)
    .send(corridorBatch('wcb-stall', 3));
  expect(post.status).toBe(201);
  const batchId = post.body.id as number;

  const view = await request(app).get(`/api/v1/batches/${batchId}`).auth(engineer, auth);
  expect(view.body.status).toBe('running');
  expect(view.body.progress).toMatchObject({ total: 3, queued: 3, stalled: true });
  expect(helpers.schemaErrors('Batch', view.body)).toEqual([]);

  const stream = openStream(`${base}/api/v1/batches/${batchId}/events`, {
    authorization: `Bearer ${engineer}`,
  });
  const stalled = await stream.waitFor((e) => e.event === 'stalled');
  expect(stalled.data).toMatchObject({
    id: batchId,
    message: expect.stringMatching(/^No worker is running: the sections wait/),
    progress: { stalled: true, queued: 3 },
    caution: expect.stringMatching(/qualified/),
  });
  expect(stream.events[0]).toMatchObject({
    event: 'progress',
    data: { stalled: true, caution: expect.any(String) },
  });

  // The stall watch tells the administrators once per stall, however often it looks.
  expect(await workers.checkStalls()).toEqual({ stalled: [batchId], resumed: [] });
  expect(await workers.checkStalls()).toEqual({ stalled: [], resumed: [] });
  await until('the stall e-mail', () => Promise.resolve(stallMails().length === 1));
  const [mail] = stallMails();
  expect(mail.to).toEqual([users.admin.email]);
  expect(mail.raw).toMatch(/batch wcb-stall has stalled/);
  expect(mail.raw).toMatch(/3 of 3 sections waiting/);

  // A worker comes: its heartbeat ends the stall, the batch goes on and finishes.
  await m.startWorker();
  const unstalled = await stream.waitFor((e) => e.event === 'progress' && e.data.stalled === false);
  expect(unstalled.data.caution).toEqual(expect.any(String));
  await stream.waitFor((e) => e.event === 'done', 40000);
  await stream.ended;
  expect(stream.events.filter((e) => e.event === 'stalled')).toHaveLength(1);
  const done = await request(app).get(`/api/v1/batches/${batchId}`).auth(engineer, auth);
  expect(done.body.progress).toMatchObject({ total: 3, done: 3, stalled: false });
  expect(await workers.checkStalls()).toEqual({ stalled: [], resumed: [batchId] });

  const ready = await request(app).get('/ready');
  expect(ready.status).toBe(200);
  expect(ready.body).toMatchObject({ ready: true, checks: { workers: { ok: true, alive: 1 } } });

  // The worker stops (its heartbeat row goes with it): the next batch stalls anew, and that
  // stall is told again, once; the finished one is not.
  await m.stopQueue();
  const next = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, auth)
    .send(corridorBatch('wcb-stall-again', 1));
  expect((await workers.checkStalls()).stalled).toEqual([next.body.id]);
  await until('the second stall e-mail', () => Promise.resolve(stallMails().length === 2));
  expect(stallMails()[1].raw).toMatch(/batch wcb-stall-again has stalled/);
  // A worker that stopped cleanly took its heartbeat with it: none is left to date the stall.
  expect(stallMails()[1].raw).toMatch(/No worker is running: the sections wait/);
}, 90000);
