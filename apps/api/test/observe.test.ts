/**
 * What an operator sees (issue 13): GET /health and /ready without a token, a request id in
 * every answer (X-Request-Id, and requestId in problem+json), and Prometheus metrics at /metrics
 * (requests by route and status, queue depth, workers alive, the workers' job figures summed
 * from their heartbeats), open to loopback only unless METRICS_TOKEN is set. Its own database,
 * so that the job figures are this file's alone.
 */
import request from 'supertest';
import { type OwnService, ownService, setEnv } from './own-database';
import { corridorBatch } from './sections';

let svc: OwnService;
type Mods = {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  startWorker: typeof import('../src/worker').startWorker;
  stopQueue: typeof import('../src/queue').stopQueue;
  log: typeof import('../src/log');
  helpers: typeof import('./helpers');
};
let m: Mods;

beforeAll(async () => {
  svc = await ownService('observe', { HEARTBEAT_SECONDS: '0.5', METRICS_TOKEN: '' });
  m = {
    app: svc.app,
    sequelize: svc.sequelize,
    startWorker: (await import('../src/worker')).startWorker,
    stopQueue: svc.queue.stopQueue,
    log: await import('../src/log'),
    helpers: svc.helpers,
  };
});

afterAll(() => svc.close());

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

/** The value of one series in Prometheus's text format, or undefined. */
function sample(text: string, series: string): number | undefined {
  const line = text.split('\n').find((l) => l.startsWith(`${series} `));
  return line === undefined ? undefined : Number(line.slice(series.length + 1));
}

test('GET /health answers without a token, never cached, with a request id', async () => {
  const res = await request(m.app).get('/health');
  expect(res.status).toBe(200);
  expect(res.body).toEqual({ status: 'ok', uptimeSeconds: expect.any(Number) });
  expect(res.headers['cache-control']).toBe('no-store');
  expect(res.headers['x-request-id']).toMatch(UUID);
});

test('a request id: the caller’s when it is a plain token, else a new one; in problem+json too', async () => {
  const given = await request(m.app).get('/health').set('X-Request-Id', 'lb-7f3a.42');
  expect(given.headers['x-request-id']).toBe('lb-7f3a.42');
  const odd = await request(m.app).get('/health').set('X-Request-Id', 'x'.repeat(200));
  expect(odd.headers['x-request-id']).toMatch(UUID);

  const missing = await request(m.app).post('/nothing-here').set('X-Request-Id', 'trace-1');
  m.helpers.expectProblem(missing, 404);
  expect(missing.body.requestId).toBe('trace-1');
  const unauthorized = await request(m.app).get('/api/v1/projects');
  m.helpers.expectProblem(unauthorized, 401);
  expect(unauthorized.body.requestId).toBe(unauthorized.headers['x-request-id']);
  expect(m.helpers.schemaErrors('Problem', unauthorized.body)).toEqual([]);
});

test('logged URLs never hold an access token', () => {
  expect(m.log.safeUrl('/api/v1/batches/3/events?access_token=abc.def&x=1')).toBe(
    '/api/v1/batches/3/events?access_token=[redacted]&x=1',
  );
  expect(m.log.safeUrl('/api/v1/batches/3/events?x=1&ACCESS_TOKEN=abc')).toBe(
    '/api/v1/batches/3/events?x=1&ACCESS_TOKEN=[redacted]',
  );
});

test('/metrics: requests by route and status, queue depth, workers, the workers’ job figures', async () => {
  const { app, helpers } = m;
  const users = await helpers.makeUsers('observe');
  const engineer = await helpers.signIn(app, users.engineer.email);
  const auth = { type: 'bearer' as const };
  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Metrics (test)' });
  const post = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, auth)
    .send(corridorBatch('wcb-metrics', 2));
  expect(post.status).toBe(201);

  const before = await request(app).get('/metrics');
  expect(before.status).toBe(200);
  expect(before.headers['content-type']).toMatch(/^text\/plain; version=0\.0\.4/);
  expect(
    sample(before.text, 'scarpline_queue_jobs{queue="section-analysis",state="created"}'),
  ).toBe(2);
  expect(sample(before.text, 'scarpline_workers_alive')).toBe(0);
  expect(sample(before.text, 'scarpline_database_up')).toBe(1);
  expect(before.text).toMatch(/^process_cpu_user_seconds_total /m);

  await m.startWorker();
  await helpers.waitForBatch(app, engineer, post.body.id);
  for (let i = 0; i < 3; i++) {
    await request(app).get(`/api/v1/batches/${post.body.id}`).auth(engineer, auth);
  }
  // The worker's figures arrive with its next heartbeat.
  let text = '';
  const end = Date.now() + 10000;
  while (Date.now() < end) {
    text = (await request(app).get('/metrics')).text;
    if (sample(text, 'scarpline_jobs_total{queue="section-analysis",outcome="done"}') === 2) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  expect(sample(text, 'scarpline_jobs_total{queue="section-analysis",outcome="done"}')).toBe(2);
  expect(sample(text, 'scarpline_job_duration_seconds_count{outcome="done"}')).toBe(2);
  expect(sample(text, 'scarpline_workers_alive')).toBe(1);
  expect(sample(text, 'scarpline_queue_jobs{queue="section-analysis",state="created"}')).toBe(0);
  expect(
    sample(
      text,
      'scarpline_http_request_duration_seconds_count{method="GET",route="/batches/:id",status="200"}',
    ),
  ).toBeGreaterThanOrEqual(3);
  expect(
    sample(
      text,
      'scarpline_http_request_duration_seconds_count{method="POST",route="/projects/:id/batches",status="201"}',
    ),
  ).toBe(1);
  // A request no route answered is counted under (none), never under its raw URL.
  await request(app).post('/nothing-here/42');
  text = (await request(app).get('/metrics')).text;
  expect(text).not.toMatch(/route="\/nothing/);
  expect(
    sample(
      text,
      'scarpline_http_request_duration_seconds_count{method="POST",route="(none)",status="404"}',
    ),
  ).toBeGreaterThanOrEqual(1);
});

test('/metrics answers only loopback without METRICS_TOKEN (and no proxy’s forwarding)', async () => {
  const res = await request(m.app).get('/metrics').set('X-Forwarded-For', '203.0.113.9');
  m.helpers.expectProblem(res, 403);
  expect(res.body.detail).toMatch(/METRICS_TOKEN/);
});

test('with METRICS_TOKEN, /metrics asks for it as a bearer token', async () => {
  const undo = setEnv({ METRICS_TOKEN: 'scrape-secret-1' });
  try {
    await jest.isolateModulesAsync(async () => {
      const app = (await import('../src/app')).createApp();
      m.helpers.expectProblem(await request(app).get('/metrics'), 401);
      m.helpers.expectProblem(
        await request(app).get('/metrics').auth('wrong', { type: 'bearer' }),
        401,
      );
      const ok = await request(app)
        .get('/metrics')
        .set('X-Forwarded-For', '203.0.113.9')
        .auth('scrape-secret-1', { type: 'bearer' });
      expect(ok.status).toBe(200);
      expect(ok.text).toMatch(/^scarpline_workers_alive /m);
      await (await import('../src/db')).sequelize.close();
    });
  } finally {
    undo();
  }
});
