import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { AuditEntry, Batch } from '../src/models';
import { stopQueue } from '../src/queue';
import { fakeInbox, startSmtpFake, stopSmtpFake } from '../src/services/mail';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';

const app = createApp();
let users: Awaited<ReturnType<typeof makeUsers>>;
let engineer: string;
let projectId: number;

beforeAll(async () => {
  await startSmtpFake(0);
  await startWorker();
  users = await makeUsers('revreq');
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Review requests (test)' });
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await stopSmtpFake();
  await sequelize.close();
});

test('a review request mails the reviewers (not the submitter) through the local SMTP fake', async () => {
  const corridor = JSON.parse(
    fs.readFileSync(path.resolve(__dirname, '../../../examples/corridor/corridor.json'), 'utf8'),
  );
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send({ ...corridor, id: 'wcb-revreq', sections: corridor.sections.slice(0, 2) });
  expect(post.status).toBe(201);
  await waitForBatch(app, engineer, post.body.id);

  const before = fakeInbox().length;
  const res = await request(app)
    .post(`/api/v1/batches/${post.body.id}/review-requests`)
    .auth(engineer, { type: 'bearer' })
    .send({ comment: 'Chainages 0+000 to 0+040, please check the toe drainage.' });
  expect(res.status).toBe(202);
  expect(res.body).toMatchObject({ batchId: post.body.id, sent: true, caution: CAUTION });
  expect(res.body.recipients).toContain(users.reviewer.email);
  expect(res.body.recipients).not.toContain(users.engineer.email);

  const arrived = fakeInbox()
    .slice(before)
    .filter((m) => m.raw.includes('review requested for batch wcb-revreq'));
  expect(arrived).toHaveLength(1);
  const mail = arrived[0];
  expect(mail.to).toContain(users.reviewer.email);
  expect(mail.to).not.toContain(users.engineer.email);
  expect(mail.to).not.toContain(users.viewer.email);
  expect(mail.raw).toContain('toe drainage');
  expect(mail.raw).toContain(users.engineer.email);
  expect(mail.raw.replace(/=\r?\n/g, '').replace(/\r?\n/g, ' ')).toContain('Caution:');

  const logged = await AuditEntry.findOne({
    where: { action: 'request-review', entityId: post.body.id },
  });
  expect(logged?.userId).toBe(users.engineer.id);
});

test('a running batch cannot be put up for review yet; a bad comment is refused', async () => {
  const b = await Batch.create({
    projectId,
    submittedBy: users.engineer.id,
    name: 'revreq-running',
    title: null,
    status: 'running',
    total: 0,
    source: 'json',
    finishedAt: null,
  });
  const before = fakeInbox().length;
  expectProblem(
    await request(app)
      .post(`/api/v1/batches/${b.id}/review-requests`)
      .auth(engineer, { type: 'bearer' })
      .send({}),
    409,
  );
  await b.update({ status: 'done', finishedAt: new Date() });
  expectProblem(
    await request(app)
      .post(`/api/v1/batches/${b.id}/review-requests`)
      .auth(engineer, { type: 'bearer' })
      .send({ comment: 42 }),
    422,
  );
  expectProblem(
    await request(app)
      .post('/api/v1/batches/999999/review-requests')
      .auth(engineer, { type: 'bearer' })
      .send({}),
    404,
  );
  expect(fakeInbox().length).toBe(before);
});
