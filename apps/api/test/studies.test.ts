/**
 * Section studies through the service (a probabilistic analysis, a sensitivity, a solve of a
 * section's current run, computed by the worker on a study thread) and the probability of
 * failure a corridor's stations carry. Each number the service gives is checked against the
 * core computing the same thing here, in one run with the same seed: the service's job (and,
 * searching again in each realisation, its chunks shared among jobs) must give exactly the
 * core's numbers. The core's own numbers are checked against closed forms in its tests
 * (packages/core/test/probability*.test.ts).
 */
import request from 'supertest';
import {
  analyzeProbability,
  normaliseProbability,
  sensitivity,
  solveForValue,
  stationProbability,
  type RawProbability,
  type Section,
} from '@scarpline/core';
import { CAUTION } from '@scarpline/core/caution';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { SectionRow, StudyRow } from '../src/models';
import { STUDY_QUEUE, stopQueue } from '../src/queue';
import { failOrphanedStudies } from '../src/services/studies';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';
import { corridorBatch, uncertainVariables } from './sections';

const app = createApp();
const bearer = { type: 'bearer' as const };
let engineer: string;
let viewer: string;
let reviewer: string;
let outsider: string;
let sectionId: number;
let section: Section;
let plainSectionId: number;
let batchId: number;

/** The random variables of the corridor's template (our invented Wendlecombe cutting). */
const VARIABLES: RawProbability = {
  seed: 19,
  method: 'latin-hypercube',
  realisations: 400,
  surface: 'critical',
  variables: uncertainVariables(),
};

/** A drawing's text (supertest buffers only the types it knows). */
function getSvg(url: string, token: string) {
  return request(app)
    .get(url)
    .auth(token, bearer)
    .buffer(true)
    .parse((res, done) => {
      let text = '';
      res.on('data', (c: Buffer) => (text += c.toString('utf8')));
      res.on('end', () => done(null, text));
    });
}

async function post(id: number, token: string, body: object) {
  return request(app).post(`/api/v1/sections/${id}/studies`).auth(token, bearer).send(body);
}

/** Polls a study until it is done or failed (a bound, not an assertion on time). */
async function waitForStudy(id: number, limitMs = 120_000) {
  const end = Date.now() + limitMs;
  for (;;) {
    const res = await request(app).get(`/api/v1/studies/${id}`).auth(viewer, bearer);
    expect(res.status).toBe(200);
    if (res.body.status === 'done' || res.body.status === 'failed') return res.body;
    if (Date.now() > end) throw new Error(`study ${id} not done: ${JSON.stringify(res.body)}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

beforeAll(async () => {
  // chunks of 7 realisations, so that a search-again run of 20 is shared among several jobs
  config.studyChunk = 7;
  await startWorker();
  const users = await makeUsers('studies');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  reviewer = await signIn(app, users.reviewer.email);
  const admin = await signIn(app, users.admin.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Studies' });
  const elsewhere = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Studies elsewhere' });
  const t = await request(app)
    .post('/api/v1/tokens')
    .auth(admin, bearer)
    .send({ userId: users.integration.id, name: 'other', projectIds: [elsewhere.body.id] });
  outsider = t.body.token as string;
  // two stations of the cutting near its least FS (about 1.3 against the required 1.5)
  const batch = corridorBatch('wcb-study', 14, {}, { oneCase: true });
  batch.sections = batch.sections.slice(12, 14);
  batch.template.probability = VARIABLES;
  const b = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send(batch);
  expect(b.status).toBe(201);
  batchId = b.body.id;
  const plain = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send(corridorBatch('wcb-plain', 1, {}, { oneCase: true }));
  await waitForBatch(app, engineer, batchId, 120_000);
  await waitForBatch(app, engineer, plain.body.id, 120_000);
  const list = await request(app)
    .get(`/api/v1/batches/${batchId}/sections?sort=station`)
    .auth(viewer, bearer);
  sectionId = list.body.items[0].id;
  section = (await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer)).body
    .input as Section;
  const plainList = await request(app)
    .get(`/api/v1/batches/${plain.body.id}/sections`)
    .auth(viewer, bearer);
  plainSectionId = plainList.body.items[0].id;
}, 300_000);

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('a corridor with a probability block: its rows, its section and its CSV carry each case’s P_f, as the core computes it', async () => {
  const list = await request(app)
    .get(`/api/v1/batches/${batchId}/sections?sort=station`)
    .auth(viewer, bearer);
  expect(list.status).toBe(200);
  expect(schemaErrors('SectionList', list.body)).toEqual([]);
  const item = list.body.items[0];
  const core = stationProbability(section)!;
  expect(item.probability).toEqual(JSON.parse(JSON.stringify(core.summary)));
  expect(item.probability[0].realisations).toBe(400);
  expect(item.probability[0].pFailure.p).toBeGreaterThan(0);

  const one = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  expect(one.body.probability).toEqual(item.probability);
  expect(schemaErrors('Section', one.body)).toEqual([]);

  const csv = await request(app).get(`/api/v1/batches/${batchId}/results.csv`).auth(viewer, bearer);
  const lines = csv.text.trim().split('\r\n');
  const header = lines[0].split(',');
  for (const c of ['pf', 'pf_se', 'beta_normal', 'beta_lognormal']) expect(header).toContain(c);
  const station = lines
    .map((l) => l.split(','))
    .find((cells) => cells[header.indexOf('section_id')] === section.id && cells[3] === 'station')!;
  const p = core.summary[0];
  expect(Number(station[header.indexOf('pf')])).toBeCloseTo(p.pFailure.p, 6);
  expect(Number(station[header.indexOf('pf_se')])).toBeCloseTo(p.pFailure.standardError, 6);
  expect(Number(station[header.indexOf('beta_normal')])).toBeCloseTo(p.betaNormal!, 3);
  expect(Number(station[header.indexOf('beta_lognormal')])).toBeCloseTo(p.betaLognormal!, 3);

  // a corridor without one: the columns are empty
  const plain = await request(app).get(`/api/v1/sections/${plainSectionId}`).auth(viewer, bearer);
  expect(plain.body.probability).toBeNull();
});

test('a probabilistic analysis from POST to done: P_f, the mean and SD of FS as the core gives them for the same seed, with the Taylor series check and the drawing', async () => {
  const block = { ...VARIABLES, seed: 4242, realisations: 1000 };
  const res = await post(sectionId, engineer, { kind: 'probability', probability: block });
  expect(res.status).toBe(202);
  expect(res.headers.location).toBe(`/api/v1/studies/${res.body.id}`);
  expect(res.body).toMatchObject({ kind: 'probability', status: 'queued', sectionId, batchId });
  expect(res.body.caution).toBe(CAUTION);
  expect(schemaErrors('Study', res.body)).toEqual([]);
  const done = await waitForStudy(res.body.id);
  expect(done.status).toBe('done');
  expect(schemaErrors('Study', done)).toEqual([]);
  expect(done.progress).toEqual({ done: 1000, total: 1000 });
  const core = analyzeProbability(section, normaliseProbability(block, section.units));
  expect(done.result.kind).toBe('probability');
  expect(done.result.probability.cases).toEqual(JSON.parse(JSON.stringify(core.cases)));
  expect(done.result.taylor.cases[0].terms).toHaveLength(2);

  const svg = await getSvg(`/api/v1/studies/${res.body.id}/plot.svg`, viewer);
  expect(svg.status).toBe(200);
  expect(svg.headers['content-type']).toMatch(/^image\/svg\+xml/);
  expect(svg.body).toContain('<svg');
  expect(svg.body).toContain('qualified geotechnical engineer');

  const list = await request(app).get(`/api/v1/sections/${sectionId}/studies`).auth(viewer, bearer);
  expect(list.status).toBe(200);
  expect(list.body[0].id).toBe(res.body.id);
});

test('searching again in each realisation: the realisations shared among jobs in chunks give the numbers of one run', async () => {
  const block = { ...VARIABLES, seed: 77, realisations: 20, surface: 'search' as const };
  const res = await post(sectionId, engineer, { kind: 'probability', probability: block });
  expect(res.status).toBe(202);
  const done = await waitForStudy(res.body.id, 240_000);
  expect(done.status).toBe('done');
  const core = analyzeProbability(section, normaliseProbability(block, section.units));
  expect(done.result.probability.cases).toEqual(JSON.parse(JSON.stringify(core.cases)));
  const chunks = await sequelize.query('SELECT position FROM study_chunks WHERE study_id = $1', {
    bind: [res.body.id],
  });
  expect(chunks[0]).toHaveLength(3); // 20 realisations of one case in chunks of 7
}, 300_000);

test('a sensitivity with the section’s own variables: the core’s series, and the tornado drawn', async () => {
  const res = await post(sectionId, engineer, { kind: 'sensitivity' });
  expect(res.status).toBe(202);
  const done = await waitForStudy(res.body.id);
  expect(done.status).toBe('done');
  const core = sensitivity(section, section.probability!);
  expect(done.result.sensitivity.cases).toEqual(JSON.parse(JSON.stringify(core.cases)));
  const svg = await getSvg(`/api/v1/studies/${res.body.id}/plot.svg?view=series`, viewer);
  expect(svg.status).toBe(200);
  expect(svg.body).toContain('<svg');
  expect(svg.body).toContain('qualified geotechnical engineer');
  const bad = await request(app)
    .get(`/api/v1/studies/${res.body.id}/plot.svg?case=nothing`)
    .auth(viewer, bearer);
  expectProblem(bad, 404);
});

test('a solve: the value at the required FS (the case’s, by default), as the core finds it; a range holding none ends done with found=false and the reason', async () => {
  const res = await post(sectionId, engineer, {
    kind: 'solve',
    target: 'materials.weathered-mudstone.frictionAngle',
    range: [5, 45],
  });
  expect(res.status).toBe(202);
  expect(res.body.request).toMatchObject({ targetFs: 1.5, range: [5, 45] });
  const done = await waitForStudy(res.body.id);
  expect(done.status).toBe('done');
  const core = solveForValue(section, {
    target: 'materials.weathered-mudstone.frictionAngle',
    targetFs: 1.5,
    range: [5, 45],
    caseName: res.body.request.case,
  });
  expect(core.found).toBe(true);
  expect(done.result.solve).toEqual(JSON.parse(JSON.stringify(core)));
  expect(Math.abs(done.result.solve.fs - 1.5)).toBeLessThan(1e-3);
  const svg = await request(app)
    .get(`/api/v1/studies/${res.body.id}/plot.svg`)
    .auth(viewer, bearer);
  expectProblem(svg, 404);

  const none = await post(sectionId, engineer, {
    kind: 'solve',
    target: 'materials.weathered-mudstone.frictionAngle',
    targetFs: 0.2,
    range: [40, 45],
  });
  const ended = await waitForStudy(none.body.id);
  expect(ended.status).toBe('done');
  expect(ended.result.solve.found).toBe(false);
  expect(ended.result.solve.reason).toEqual(expect.any(String));
});

test('a request that cannot be studied: 422 located in the body; 409 without a finished run', async () => {
  const kind = await post(sectionId, engineer, { kind: 'forecast' });
  expectProblem(kind, 422);
  expect(kind.body.errors[0].pointer).toBe('/kind');

  const target = await post(sectionId, engineer, {
    kind: 'probability',
    probability: {
      ...VARIABLES,
      variables: [{ ...VARIABLES.variables[0], target: 'materials.granite.cohesion' }],
    },
  });
  expectProblem(target, 422);
  expect(target.body.errors[0].pointer).toBe('/probability/variables/0/target');

  const many = await post(sectionId, engineer, {
    kind: 'probability',
    probability: { ...VARIABLES, surface: 'search', realisations: 6000 },
  });
  expectProblem(many, 422);
  expect(many.body.errors[0].pointer).toMatch(/^\/probability/);

  const none = await post(plainSectionId, engineer, { kind: 'sensitivity' });
  expectProblem(none, 422);
  expect(none.body.errors[0].pointer).toBe('/probability');

  const solve = await post(sectionId, engineer, {
    kind: 'solve',
    target: 'materials.weathered-mudstone.strength',
    range: 'wide',
    case: 'nothing',
  });
  expectProblem(solve, 422);
  expect(solve.body.errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual([
    '/case',
    '/range',
    '/target',
  ]);

  // the section re-running (a run without a result yet)
  const row = (await SectionRow.findByPk(sectionId))!;
  await row.update({ run: row.run + 1, status: 'queued' });
  try {
    expectProblem(await post(sectionId, engineer, { kind: 'sensitivity' }), 409);
  } finally {
    await row.update({ run: row.run - 1, status: 'done' });
  }
});

test('roles and projects: a viewer or a reviewer may not ask (403); another project’s token finds nothing (404)', async () => {
  expectProblem(await post(sectionId, viewer, { kind: 'sensitivity' }), 403);
  expectProblem(await post(sectionId, reviewer, { kind: 'sensitivity' }), 403);
  const list = await request(app).get(`/api/v1/sections/${sectionId}/studies`).auth(viewer, bearer);
  const id = list.body[0].id as number;
  expectProblem(await request(app).get(`/api/v1/studies/${id}`).auth(outsider, bearer), 404);
  expectProblem(
    await request(app).get(`/api/v1/sections/${sectionId}/studies`).auth(outsider, bearer),
    404,
  );
});

test('a study whose worker stopped on every try (the queue failed its job) is failed by the stall watch with the reason; one with a live job is left alone', async () => {
  const list = await request(app).get(`/api/v1/sections/${sectionId}/studies`).auth(viewer, bearer);
  const done = (await StudyRow.findByPk(list.body[0].id as number))!;
  const copy = (status: 'queued' | 'running') =>
    StudyRow.create({
      sectionId: done.sectionId,
      batchId: done.batchId,
      run: done.run,
      kind: done.kind,
      status,
      request: done.request,
      input: done.input,
      spec: done.spec,
      total: done.total,
      requestedBy: done.requestedBy,
    });
  // a study left running: its job was taken back at its expiry, tried again, and failed there
  const orphan = await copy('running');
  await sequelize.query(
    `INSERT INTO pgboss.job (name, data, state, retry_count, retry_limit, completed_on)
       VALUES ($1, $2::jsonb, 'failed', 1, 1, now())`,
    { bind: [STUDY_QUEUE, JSON.stringify({ studyId: orphan.id, step: 'run' })] },
  );
  // a study whose job a worker holds (active: the in-process worker only takes created jobs)
  const held = await copy('queued');
  await sequelize.query(
    `INSERT INTO pgboss.job (name, data, state, started_on) VALUES ($1, $2::jsonb, 'active', now())`,
    { bind: [STUDY_QUEUE, JSON.stringify({ studyId: held.id, step: 'run' })] },
  );
  try {
    const failed = await failOrphanedStudies();
    expect(failed).toContain(orphan.id);
    expect(failed).not.toContain(held.id);
    expect(failed).not.toContain(done.id);
    const res = await request(app).get(`/api/v1/studies/${orphan.id}`).auth(viewer, bearer);
    expect(res.body.status).toBe('failed');
    expect(res.body.problem.title).toBe('The study was not finished');
    expect(res.body.problem.detail).toMatch(/stopped before it finished, on every try/);
    expect(schemaErrors('Study', res.body)).toEqual([]);
    expect((await StudyRow.findByPk(held.id))!.status).toBe('queued');
    expect((await StudyRow.findByPk(done.id))!.status).toBe('done');
  } finally {
    await sequelize.query(
      `DELETE FROM pgboss.job WHERE name = $1 AND data->>'studyId' IN ($2, $3)`,
      {
        bind: [STUDY_QUEUE, String(orphan.id), String(held.id)],
      },
    );
    await StudyRow.destroy({ where: { id: [orphan.id, held.id] } });
  }
});
