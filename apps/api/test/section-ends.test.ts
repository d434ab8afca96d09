/**
 * The worker's bulk path (issue 14, item 2): jobs taken several at a time with their sections
 * read in one statement, a taken job's clock in the queue restarted as it starts, ends written
 * together in one statement (each section ended once, its input copied into its result, a
 * second delivery skipped), the batch's close told to those who follow it, and idle workers
 * woken when a submission commits. Runs the API's build of the analysis thread (npm run
 * build:node). Its own database, so that no other file's worker takes its jobs.
 */
import crypto from 'node:crypto';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { type OwnService, ownService } from './own-database';
import { corridorBatch } from './sections';

let svc: OwnService;
type Mods = {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  queue: typeof import('../src/queue');
  solve: typeof import('../src/services/solve');
  Solver: typeof import('../src/solver').Solver;
  helpers: typeof import('./helpers');
};
let m: Mods;
let solver: InstanceType<Mods['Solver']>;

beforeAll(async () => {
  svc = await ownService('section_ends');
  m = {
    app: svc.app,
    sequelize: svc.sequelize,
    queue: svc.queue,
    solve: await import('../src/services/solve'),
    Solver: (await import('../src/solver')).Solver,
    helpers: svc.helpers,
  };
  solver = new m.Solver();
});

afterAll(async () => {
  await solver.close();
  await svc.close();
});

test('taken together, analysed, written together: each section ends once with its input', async () => {
  const { app, helpers, sequelize, queue, solve } = m;
  const users = await helpers.makeUsers('ends');
  const engineer = await helpers.signIn(app, users.engineer.email);
  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Section ends (test)' });
  const post = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(corridorBatch('wcb-ends', 2));
  expect(post.status).toBe(201);
  const batchId = post.body.id as number;

  // Both jobs in one fetch, both sections in one read (the input as the database's JSON text).
  const boss = await queue.queue();
  const jobs = await boss.fetch<import('../src/queue').SectionJob>(queue.SECTION_QUEUE, {
    batchSize: 4,
    includeMetadata: true,
  });
  expect(jobs).toHaveLength(2);
  const held = await solve.readSections(jobs.map((j) => j.data));
  expect(held.size).toBe(2);
  for (const j of jobs) {
    const s = held.get(j.data.sectionId);
    expect(solve.waitsFor(s, j.data)).toBe(true);
    expect(typeof s?.input).toBe('string');
  }

  // A taken job's clock restarts while it is this worker's; not for another delivery.
  const [job] = jobs;
  const startedOn = async () =>
    (
      await sequelize.query<{ started_on: Date }>(
        'SELECT started_on FROM pgboss.job WHERE id = $1',
        { bind: [job.id], type: QueryTypes.SELECT },
      )
    )[0].started_on;
  const before = await startedOn();
  await new Promise((r) => setTimeout(r, 20));
  expect(await queue.restartJobClock(job.id, job.retryCount)).toBe(true);
  expect((await startedOn()).getTime()).toBeGreaterThan(before.getTime());
  expect(await queue.restartJobClock(job.id, job.retryCount + 1)).toBe(false);

  // Analysed from the JSON text; the thread hashes the input as the API always has.
  const ends: import('../src/services/solve').SectionEnd[] = [];
  for (const j of jobs) {
    const section = held.get(j.data.sectionId)!;
    const startedAt = new Date();
    const outcome = await solver.solve(section.input, 60000);
    if (outcome.kind !== 'result') throw new Error(JSON.stringify(outcome));
    expect(outcome.result.inputHash).toBe(
      crypto
        .createHash('sha256')
        .update(JSON.stringify(JSON.parse(section.input)))
        .digest('hex'),
    );
    ends.push({
      kind: 'result',
      job: j.data,
      attempt: j.retryCount,
      section,
      result: outcome.result,
      startedAt,
      finishedAt: new Date(),
    });
  }
  // Those who follow the batch are told when it closes (at once, not at their next poll).
  const closed: (number | null)[] = [];
  let listening: () => void = () => undefined;
  const started = new Promise<void>((r) => (listening = r));
  const stopListening = solve.onBatchClosed((id) => {
    closed.push(id);
    listening();
  });
  await started;

  // The same end twice in a group (two deliveries of one job): the second is skipped.
  const written = await solve.endSections([...ends, ends[0]]);
  expect(written.slice(0, 2).every((e) => e === 'done' || e === 'unsolved')).toBe(true);
  expect(written[2]).toBe('skipped');

  const rows = await sequelize.query<{
    id: number;
    status: string;
    same_input: boolean;
    results: string;
    attempt: number;
    cases: { name: string; methods: unknown }[];
    updated_at: Date;
  }>(
    `SELECT s.id, s.status, r.input = s.input AS same_input, r.attempt, r.updated_at,
            (SELECT count(*) FROM results x WHERE x.section_id = s.id) AS results,
            (SELECT json_agg(json_build_object('name', c.name, 'methods', c.methods)
                      ORDER BY c.position)
               FROM case_results c WHERE c.result_id = r.id) AS cases
       FROM sections s JOIN results r ON r.section_id = s.id AND r.run = s.run
      WHERE s.batch_id = $1 ORDER BY s.id`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  expect(rows).toHaveLength(2);
  for (const r of rows) {
    expect(['done', 'failed']).toContain(r.status);
    expect(r.same_input).toBe(true);
    expect(Number(r.results)).toBe(1);
    expect(r.attempt).toBe(1);
    const end = ends.find((e) => e.job.sectionId === r.id)!;
    if (end.kind !== 'result') throw new Error('a result');
    // a row per case, each with its reports, once
    expect(r.cases.map((c) => c.name)).toEqual(end.result.cases.map((c) => c.name));
    r.cases.forEach((c, i) =>
      expect(c.methods).toEqual(JSON.parse(end.result.cases[i].json.methods)),
    );
  }
  // The last end closed the batch.
  const [batch] = await sequelize.query<{ status: string }>(
    'SELECT status FROM batches WHERE id = $1',
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  expect(batch.status).toBe('done');
  for (let i = 0; i < 50 && !closed.includes(batchId); i++)
    await new Promise((r) => setTimeout(r, 20));
  await stopListening();
  expect(closed).toEqual([null, batchId]);

  // Another delivery later: skipped, nothing rewritten.
  expect(await solve.endSections([ends[1]])).toEqual(['skipped']);
  const again = await sequelize.query<{ updated_at: Date }>(
    `SELECT r.updated_at FROM results r JOIN sections s ON s.id = r.section_id
      WHERE s.batch_id = $1 ORDER BY s.id`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  expect(again.map((r) => r.updated_at)).toEqual(rows.map((r) => r.updated_at));

  // Completed together; a completed job is no longer this worker's to restart.
  await boss.complete(
    queue.SECTION_QUEUE,
    jobs.map((j) => j.id),
  );
  expect(await queue.restartJobClock(job.id, job.retryCount)).toBe(false);
});

test('a submission wakes the idle workers when it commits, and only then', async () => {
  const { sequelize, queue } = m;
  let wakes = 0;
  let listening: () => void = () => undefined;
  const started = new Promise<void>((r) => (listening = r));
  const stop = queue.onNewJobs(() => {
    wakes += 1;
    listening();
  });
  try {
    // It wakes once as it starts listening (jobs may have come meanwhile).
    await started;
    const settled = () => new Promise((r) => setTimeout(r, 300));
    const woken = wakes;
    await sequelize
      .transaction(async (t) => {
        await queue.enqueueSections([{ sectionId: -1, run: 1 }], t);
        throw new Error('roll it back');
      })
      .catch(() => undefined);
    await settled();
    expect(wakes).toBe(woken);
    await sequelize.transaction((t) => queue.enqueueSections([{ sectionId: -2, run: 1 }], t));
    await settled();
    expect(wakes).toBe(woken + 1);
  } finally {
    await stop();
  }
});
