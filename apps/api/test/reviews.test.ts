import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { AuditEntry, Review } from '../src/models';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
let users: Awaited<ReturnType<typeof makeUsers>>;
let engineer: string;
let reviewer: string;
let admin: string;
let viewer: string;
let batchId: number;
let sectionIds: number[];

beforeAll(async () => {
  await startWorker();
  users = await makeUsers('review');
  engineer = await signIn(app, users.engineer.email);
  reviewer = await signIn(app, users.reviewer.email);
  admin = await signIn(app, users.admin.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Review test corridor' });
  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  );
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'review-2', sections: corridor.sections.slice(0, 2) });
  expect(post.status).toBe(201);
  batchId = post.body.id;
  await waitForBatch(app, engineer, batchId);
  const list = await request(app).get(`/api/v1/batches/${batchId}/sections`).auth(viewer, bearer);
  sectionIds = list.body.items.map((i: { id: number }) => i.id);
  expect(sectionIds).toHaveLength(2);
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('a reviewer returns a section with a comment: review row, state on section and list, audit', async () => {
  const before = await request(app).get(`/api/v1/sections/${sectionIds[0]}`).auth(viewer, bearer);
  expect(before.body.review).toMatchObject({ state: 'pending', latest: null, history: [] });

  const res = await request(app)
    .post(`/api/v1/sections/${sectionIds[0]}/reviews`)
    .auth(reviewer, bearer)
    .send({ decision: 'returned', comment: 'Check the water table at this station.' });
  expect(res.status).toBe(201);
  expect(res.body).toMatchObject({
    scope: 'section',
    decision: 'returned',
    comment: 'Check the water table at this station.',
    run: 1,
    reviewer: { id: users.reviewer.id, name: 'review reviewer' },
    caution: CAUTION,
  });
  const row = await Review.findByPk(res.body.id);
  expect(row).toMatchObject({ reviewerId: users.reviewer.id, sectionId: sectionIds[0], run: 1 });
  expect(row?.createdAt).toBeInstanceOf(Date);

  const after = await request(app).get(`/api/v1/sections/${sectionIds[0]}`).auth(viewer, bearer);
  expect(after.body.review.state).toBe('returned');
  expect(after.body.review.latest.comment).toBe('Check the water table at this station.');
  expect(after.body.review.latest.reviewer).toEqual({
    id: users.reviewer.id,
    name: 'review reviewer',
  });
  const list = await request(app).get(`/api/v1/batches/${batchId}/sections`).auth(viewer, bearer);
  const states = Object.fromEntries(
    list.body.items.map((i: { id: number; reviewState: string }) => [i.id, i.reviewState]),
  );
  expect(states).toEqual({ [sectionIds[0]]: 'returned', [sectionIds[1]]: 'pending' });

  const entry = await AuditEntry.findOne({
    where: { action: 'review', entity: 'section', entityId: sectionIds[0] },
  });
  expect(entry?.userId).toBe(users.reviewer.id);
  expect(entry?.details).toMatchObject({ decision: 'returned', run: 1 });
});

test('signing off the whole batch: state on the batch, applied to sections not reviewed since', async () => {
  const res = await request(app)
    .post(`/api/v1/batches/${batchId}/reviews`)
    .auth(admin, bearer)
    .send({ decision: 'approved', comment: 'Corridor accepted for the preliminary design.' });
  expect(res.status).toBe(201);
  expect(res.body).toMatchObject({ scope: 'batch', sectionId: null, decision: 'approved' });
  const batch = await request(app).get(`/api/v1/batches/${batchId}`).auth(viewer, bearer);
  expect(batch.body.review.state).toBe('approved');
  expect(batch.body.review.latest.reviewer).toEqual({ id: users.admin.id, name: 'review admin' });
  const list = await request(app).get(`/api/v1/batches/${batchId}/sections`).auth(viewer, bearer);
  expect(list.body.items.map((i: { reviewState: string }) => i.reviewState)).toEqual([
    'approved',
    'approved',
  ]);
  expect(
    await AuditEntry.count({ where: { action: 'review', entity: 'batch', entityId: batchId } }),
  ).toBe(1);
});

test('nobody reviews a batch they submitted: 403 saying why, nothing written', async () => {
  // An admin who submitted a batch may not review it either.
  const p = await request(app).post('/api/v1/projects').auth(admin, bearer).send({ name: 'own' });
  const own = await request(app)
    .post(`/api/v1/projects/${p.body.id}/uploads`)
    .auth(admin, bearer)
    .attach('files', path.join(EXAMPLES, 'fill-clean-sand.yaml'));
  expect(own.status).toBe(201);
  await waitForBatch(app, admin, own.body.id);
  const before = await Review.count();
  const res = await request(app)
    .post(`/api/v1/batches/${own.body.id}/reviews`)
    .auth(admin, bearer)
    .send({ decision: 'approved', comment: 'fine' });
  expectProblem(res, 403);
  expect(res.body.detail).toMatch(/you submitted this batch/i);
  const list = await request(app)
    .get(`/api/v1/batches/${own.body.id}/sections`)
    .auth(admin, bearer);
  const sec = await request(app)
    .post(`/api/v1/sections/${list.body.items[0].id}/reviews`)
    .auth(admin, bearer)
    .send({ decision: 'approved', comment: 'fine' });
  expectProblem(sec, 403);
  expect(sec.body.detail).toMatch(/you submitted this batch/i);
  expect(await Review.count()).toBe(before);
});

test('a bad decision or a missing comment is refused; engineers and viewers may not review', async () => {
  const url = `/api/v1/sections/${sectionIds[1]}/reviews`;
  expectProblem(
    await request(app).post(url).auth(reviewer, bearer).send({ decision: 'maybe', comment: 'x' }),
    422,
  );
  expectProblem(
    await request(app).post(url).auth(reviewer, bearer).send({ decision: 'approved' }),
    400,
  );
  for (const t of [engineer, viewer]) {
    const res = await request(app)
      .post(url)
      .auth(t, bearer)
      .send({ decision: 'approved', comment: 'ok' });
    expectProblem(res, 403);
  }
});

test('whoever edited a section’s current run may not review it, nor its batch — admins included', async () => {
  const target = sectionIds[1];
  // The admin re-runs the engineer's section with edits of their own.
  const rerun = await request(app)
    .post(`/api/v1/sections/${target}/runs`)
    .auth(admin, bearer)
    .send({ requiredFs: 1.01 });
  expect(rerun.status).toBe(202);
  expect(rerun.body.editedBy).toBe(users.admin.id);
  await waitForBatch(app, admin, batchId);
  const rows = await Review.count({ where: { batchId } });
  for (const [url, words] of [
    [`/api/v1/sections/${target}/reviews`, /You edited the current run \(run 2\) of section/],
    [
      `/api/v1/batches/${batchId}/reviews`,
      /You edited the current run of section .* of this batch/,
    ],
  ] as const) {
    const res = await request(app)
      .post(url)
      .auth(admin, bearer)
      .send({ decision: 'approved', comment: 'Looks fine to me.' });
    expectProblem(res, 403);
    expect(res.body.detail).toMatch(words);
  }
  expect(await Review.count({ where: { batchId } })).toBe(rows);
  // Someone who did not edit it may; the edit of the earlier run does not bar the engineer's
  // reviewer, and the admin may review the other section, whose run they did not edit.
  const other = await request(app)
    .post(`/api/v1/sections/${target}/reviews`)
    .auth(reviewer, bearer)
    .send({ decision: 'approved', comment: 'Checked the edit.' });
  expect(other.status).toBe(201);
  const untouched = await request(app)
    .post(`/api/v1/sections/${sectionIds[0]}/reviews`)
    .auth(admin, bearer)
    .send({ decision: 'approved', comment: 'Not edited by me.' });
  expect(untouched.status).toBe(201);
});
