/**
 * The per-job time limit is kept (issue 13, item 3): a section whose analysis would take longer
 * than JOB_TIMEOUT (here 3 s; the heavy section takes about ten unbounded, see sections.ts) ends
 * failed with a reason that says what to change, at once and without retries, and a 2-section
 * batch queued behind it is analysed after it has been stopped. States and order only, never
 * timings.
 * Its own database, so that the other files' workers (with the default limit) never take its jobs.
 */
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { type OwnService, ownService } from './own-database';
import { HEAVY_ANALYSIS, HEAVY_CENTRES, corridorBatch } from './sections';

let svc: OwnService;
type Mods = {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  startWorker: typeof import('../src/worker').startWorker;
  stopQueue: typeof import('../src/queue').stopQueue;
  queues: { section: string; dead: string };
  helpers: typeof import('./helpers');
};
let m: Mods;

beforeAll(async () => {
  svc = await ownService('time_limit', { JOB_TIMEOUT: '3' });
  m = {
    app: svc.app,
    sequelize: svc.sequelize,
    startWorker: (await import('../src/worker')).startWorker,
    stopQueue: svc.queue.stopQueue,
    queues: { section: svc.queue.SECTION_QUEUE, dead: svc.queue.DEAD_QUEUE },
    helpers: svc.helpers,
  };
});

afterAll(() => svc.close());

test('a heavy section stops at the limit, failed with what to change, once; the batch behind it goes on', async () => {
  const { app, helpers, sequelize } = m;
  const users = await helpers.makeUsers('limit');
  const engineer = await helpers.signIn(app, users.engineer.email);
  const auth = { type: 'bearer' as const };
  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Time limit (test)' });
  const heavy = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, auth)
    // (one case a station: with the corridor's earthquake case it asks more than a file may)
    .send(corridorBatch('wcb-heavy', 1, HEAVY_ANALYSIS, { oneCase: true }));
  expect(heavy.status).toBe(201);
  // Its grid made larger than the checks allow (sections.ts says why).
  await sequelize.query(
    `UPDATE sections SET input = jsonb_set(input, '{analysis,surface,centers}', $2::jsonb)
      WHERE batch_id = $1`,
    { bind: [heavy.body.id, JSON.stringify({ nx: HEAVY_CENTRES, ny: HEAVY_CENTRES })] },
  );
  const light = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, auth)
    .send(corridorBatch('wcb-behind', 2));
  expect(light.status).toBe(201);

  // One worker, taking one job at a time: the heavy section first, as it was queued first.
  await m.startWorker();
  const lightDone = await helpers.waitForBatch(app, engineer, light.body.id, 60000);
  const heavyDone = await helpers.waitForBatch(app, engineer, heavy.body.id, 60000);
  expect(heavyDone.progress).toMatchObject({ total: 1, done: 0, failed: 1, stalled: false });
  expect(lightDone.progress).toMatchObject({ total: 2, done: 2, failed: 0, stalled: false });

  const [stopped] = (
    await request(app).get(`/api/v1/batches/${heavy.body.id}/sections`).auth(engineer, auth)
  ).body.items as { id: number; status: string; failReason: string }[];
  expect(stopped.status).toBe('failed');
  expect(stopped.failReason).toMatch(
    /^(stopped at its time limit after [\d,]+ trial surfaces|the analysis did not end within the time limit of 3 s a section and was stopped): use fewer grid centres, radii, moves, ground-range points or slices, or give the surface/,
  );
  const section = (await request(app).get(`/api/v1/sections/${stopped.id}`).auth(engineer, auth))
    .body;
  expect(section.result).toBeNull();

  // Ended at once and only once: its job completed on the first attempt, no dead letter.
  const jobs = await sequelize.query<{ name: string; state: string; retry_count: number }>(
    `SELECT name, state::text AS state, retry_count FROM pgboss.job WHERE (data->>'sectionId')::int = $1`,
    { bind: [stopped.id], type: QueryTypes.SELECT },
  );
  expect(jobs).toEqual([{ name: m.queues.section, state: 'completed', retry_count: 0 }]);

  // The batch behind it: each section analysed once, after the heavy one had been stopped.
  const order = await sequelize.query<{ key: string; ended: Date; started: Date | null }>(
    `SELECT s.key, s.updated_at AS ended, r.started_at AS started
       FROM sections s LEFT JOIN results r ON r.section_id = s.id AND r.run = s.run
      WHERE s.batch_id IN ($1, $2) ORDER BY s.id`,
    { bind: [heavy.body.id, light.body.id], type: QueryTypes.SELECT },
  );
  expect(order).toHaveLength(3);
  const [first, ...behind] = order;
  for (const s of behind) {
    expect(s.started).not.toBeNull();
    expect(s.started!.getTime()).toBeGreaterThanOrEqual(first.ended.getTime());
  }
  const attempts = await sequelize.query<{ attempt: number }>(
    `SELECT r.attempt FROM results r JOIN sections s ON s.id = r.section_id WHERE s.batch_id = $1`,
    { bind: [light.body.id], type: QueryTypes.SELECT },
  );
  expect(attempts).toEqual([{ attempt: 1 }, { attempt: 1 }]);
}, 90000);
