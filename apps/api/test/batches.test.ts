import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch, ResultRow, SectionRow } from '../src/models';
import { enqueueSections, stopQueue } from '../src/queue';
import { fakeInbox, startSmtpFake, stopSmtpFake } from '../src/services/mail';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
let engineer: string;
let viewer: string;
let projectId: number;
let users: Awaited<ReturnType<typeof makeUsers>>;

/** The first n stations of the demo corridor. */
function smallCorridor(n: number) {
  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  );
  return { ...corridor, id: `wcb-test-${n}`, sections: corridor.sections.slice(0, n) };
}

beforeAll(async () => {
  await startSmtpFake(0);
  await startWorker();
  users = await makeUsers('batch');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Wendlecombe bypass (test)' });
  expect(p.status).toBe(201);
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await stopSmtpFake();
  await sequelize.close();
});

test('a 3-section corridor posted as JSON is solved by the worker; results readable', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(smallCorridor(3));
  expect(post.status).toBe(201);
  expect(post.body.progress.total).toBe(3);
  expect(post.body.caution).toBe(CAUTION);

  const done = await waitForBatch(app, viewer, post.body.id);
  expect(done.progress).toMatchObject({ total: 3, done: 3, failed: 0, queued: 0, running: 0 });

  // Who submitted it, by name, for every role (here a viewer), in the view and the project list.
  const submitter = { id: users.engineer.id, name: 'batch engineer' };
  expect(post.body.submitter).toEqual(submitter);
  const view = await request(app)
    .get(`/api/v1/batches/${post.body.id}`)
    .auth(viewer, { type: 'bearer' });
  expect(view.body).toMatchObject({ submittedBy: users.engineer.id, submitter });
  expect(schemaErrors('Batch', view.body)).toEqual([]);
  const listed = await request(app)
    .get(`/api/v1/projects/${projectId}/batches`)
    .auth(viewer, { type: 'bearer' });
  expect(listed.status).toBe(200);
  expect(listed.body.find((b: { id: number }) => b.id === post.body.id).submitter).toEqual(
    submitter,
  );

  const list = await request(app)
    .get(`/api/v1/batches/${post.body.id}/sections?sort=fs&order=asc`)
    .auth(viewer, { type: 'bearer' });
  expect(list.status).toBe(200);
  expect(list.body.total).toBe(3);
  expect(list.body.caution).toBe(CAUTION);
  expect(schemaErrors('SectionList', list.body)).toEqual([]);
  for (const item of list.body.items) {
    expect(item).toMatchObject({
      stationLabel: expect.stringMatching(/^1\+0[024]0$/),
      title: expect.any(String),
      units: 'si',
      status: 'done',
      reviewState: 'pending',
      geometry: null,
      result: {
        verdict: expect.stringMatching(/^(meets|below|no-slope)$/),
        governingMethod: expect.any(String),
        requiredFs: expect.any(Number),
        warnings: expect.any(Array),
      },
    });
    // the governing case's requirement: the long term's 1.5 or the earthquake's 1.1
    expect([1.5, 1.1]).toContain(item.result.requiredFs);
  }
  const fs3 = list.body.items.map((i: { result: { governingFs: number } }) => i.result.governingFs);
  expect(fs3).toEqual([...fs3].sort((a: number, b: number) => a - b));
  expect(fs3.every((v: number) => v > 0 && Number.isFinite(v))).toBe(true);

  const byStation = await request(app)
    .get(`/api/v1/batches/${post.body.id}/sections?sort=station&order=desc&pageSize=2&page=1`)
    .auth(viewer, { type: 'bearer' });
  expect(byStation.body.items).toHaveLength(2);
  expect(byStation.body.items[0].station).toBeGreaterThan(byStation.body.items[1].station);

  const one = await request(app)
    .get(`/api/v1/sections/${list.body.items[0].id}`)
    .auth(viewer, { type: 'bearer' });
  expect(one.status).toBe(200);
  expect(one.body.input.format).toBe('scarpline/1');
  expect(one.body.result).toMatchObject({
    run: 1,
    solverVersion: expect.any(String),
    inputHash: expect.stringMatching(/^[0-9a-f]{64}$/),
    caution: CAUTION,
  });
  expect(one.body.result.governing.fs).toBeCloseTo(fs3[0], 10);
  expect(one.body.result.methods.length).toBeGreaterThan(0);
  expect(one.body.result.criticalSurface).not.toBeNull();
  expect(schemaErrors('Section', one.body)).toEqual([]);
  expect(one.body).toMatchObject({
    id: list.body.items[0].id,
    batchId: post.body.id,
    station: list.body.items[0].station,
    stationLabel: list.body.items[0].stationLabel,
    submittedBy: users.engineer.id,
    submitter: { id: users.engineer.id, name: 'batch engineer' },
    inputWarnings: [],
    geometry: null,
    previous: [],
    review: { state: 'pending', latest: null, history: [] },
  });
  expect(one.body.result.warnings).toEqual(list.body.items[0].result.warnings);
  // The search report the drawing of the section uses: where it looked, and the FS it found.
  expect(one.body.result.search).toMatchObject({
    trials: expect.any(Number),
    trialBand: expect.objectContaining({ within: 0.05, surfaces: expect.any(Array) }),
  });
  expect(one.body.result.search.trials).toBeGreaterThan(0);

  // Exactly one result per section, and the completion mail reached the local fake.
  const sectionIds = (await SectionRow.findAll({ where: { batchId: post.body.id } })).map(
    (s) => s.id,
  );
  expect(await ResultRow.count({ where: { sectionId: sectionIds } })).toBe(3);
  const end = Date.now() + 10000;
  while (!fakeInbox().some((m) => m.raw.includes('wcb-test-3 finished')) && Date.now() < end) {
    await new Promise((r) => setTimeout(r, 100));
  }
  const mail = fakeInbox().find((m) => m.raw.includes('wcb-test-3 finished'));
  expect(mail?.to).toContain(users.engineer.email);
  expect(mail?.raw).toContain('below the required FS');
});

test('section files uploaded with multipart become a batch', async () => {
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, { type: 'bearer' })
    .attach('files', path.join(EXAMPLES, 'fill-clean-sand.yaml'))
    .attach('files', path.join(EXAMPLES, 'cut-homogeneous.yaml'));
  expect(res.status).toBe(201);
  expect(res.body.progress.total).toBe(2);
  const done = await waitForBatch(app, engineer, res.body.id);
  expect(done.progress.done + done.progress.failed).toBe(2);
  const failing = await request(app)
    .get(`/api/v1/batches/${res.body.id}/sections?verdict=below`)
    .auth(engineer, { type: 'bearer' });
  expect(failing.status).toBe(200);
  for (const item of failing.body.items) expect(item.result.verdict).toBe('below');
  // the old words are not codes of the vocabulary
  const old = await request(app)
    .get(`/api/v1/batches/${res.body.id}/sections?verdict=fail`)
    .auth(engineer, { type: 'bearer' });
  expectProblem(old, 400);
  expect(old.body.detail).toMatch(/meets, below, no-fs, no-requirement, no-slope, input-error/);
});

test('an invalid batch → 422 with located messages, nothing written', async () => {
  const before = await Batch.count();
  const bad = smallCorridor(2);
  bad.template.materials['weathered-mudstone'].strength.frictionAngle = 95;
  const text = JSON.stringify(bad, null, 2);
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .set('content-type', 'application/json')
    .send(text);
  expectProblem(res, 422);
  const err = res.body.errors.find((e: { path: string }) => /frictionAngle/.test(e.path));
  expect(err).toBeDefined();
  const line = text.split('\n').findIndex((l) => l.includes('"frictionAngle": 95')) + 1;
  expect(err.line).toBe(line);
  expect(err.column).toBeGreaterThan(1);
  expect(err.text).toMatch(new RegExp(`^batch\\.json:${line}:\\d+ `));
  expect(await Batch.count()).toBe(before);
});

test('malformed JSON, a wrong format, a broken upload → 4xx problem+json', async () => {
  const auth = { type: 'bearer' as const };
  expectProblem(
    await request(app)
      .post(`/api/v1/projects/${projectId}/batches`)
      .auth(engineer, auth)
      .set('content-type', 'application/json')
      .send('{"format": "scarpline-batch/1", '),
    400,
  );
  const wrong = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, auth)
    .send({ format: 'something-else', id: 'x' });
  expectProblem(wrong, 422);
  expect(wrong.body.errors.length).toBeGreaterThan(0);
  const broken = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, auth)
    .attach('files', Buffer.from('format: scarpline/1\nid: [unclosed\n'), 'broken.yaml');
  expectProblem(broken, 422);
  expect(broken.body.errors[0]).toMatchObject({ file: 'broken.yaml', line: expect.any(Number) });
});

test('a section the solver throws on is retried, then ends failed with its reason via the dead letters', async () => {
  const b = await Batch.create({
    projectId,
    submittedBy: users.engineer.id,
    name: 'broken-input',
    title: null,
    status: 'running',
    total: 1,
    source: 'json',
    finishedAt: null,
  });
  await sequelize.transaction(async (t) => {
    const s = await SectionRow.create(
      {
        batchId: b.id,
        key: 'broken',
        position: 0,
        station: 0,
        input: { format: 'scarpline/1' },
        status: 'queued',
        failReason: null,
      },
      { transaction: t },
    );
    await enqueueSections([{ sectionId: s.id, run: 1 }], t);
  });
  const done = await waitForBatch(app, engineer, b.id);
  expect(done.progress).toMatchObject({ total: 1, done: 0, failed: 1 });
  const s = await SectionRow.findOne({ where: { batchId: b.id } });
  expect(s?.status).toBe('failed');
  expect(s?.failReason).toMatch(/^gave up after 3 attempts: attempt 3: solver error: /);
  expect(await ResultRow.count({ where: { sectionId: s!.id } })).toBe(0);
});
