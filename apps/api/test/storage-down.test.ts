/**
 * File storage away: the API's client points at a port where nothing listens (set before the
 * app's modules are loaded). A download is a 503 problem+json with Retry-After, a submission is
 * a 503 that creates no batch (nor any row), and /ready says not ready, naming the storage.
 */
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import type { Express } from 'express';
import request from 'supertest';

type Mods = {
  app: Express;
  sequelize: typeof import('../src/db').sequelize;
  models: typeof import('../src/models');
  helpers: typeof import('./helpers');
  stopQueue: typeof import('../src/queue').stopQueue;
};
const EXAMPLES = path.resolve(__dirname, '../../../examples');
const bearer = { type: 'bearer' as const };
const saved = { ...process.env };
let m: Mods;
let engineer: string;
let engineerId: number;
let projectId: number;

/** A port on 127.0.0.1 that nothing listens on (taken, then let go). */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((r) => server.close(r));
  return port;
}

beforeAll(async () => {
  process.env.AWS_ENDPOINT_URL_S3 = `http://127.0.0.1:${await closedPort()}`;
  process.env.AWS_ACCESS_KEY_ID = 'test-key';
  process.env.AWS_SECRET_ACCESS_KEY = 'test-secret';
  const { createApp } = await import('../src/app');
  const { sequelize } = await import('../src/db');
  const { stopQueue } = await import('../src/queue');
  m = {
    app: createApp(),
    sequelize,
    models: await import('../src/models'),
    helpers: await import('./helpers'),
    stopQueue,
  };
  const users = await m.helpers.makeUsers('s3down');
  engineerId = users.engineer.id;
  engineer = await m.helpers.signIn(m.app, users.engineer.email);
  const p = await request(m.app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Wendlecombe storage away (test)' });
  projectId = p.body.id;
});

afterAll(async () => {
  await m.stopQueue();
  await m.sequelize.close();
  process.env = saved;
});

test('a submission while storage is away is a 503 and creates nothing', async () => {
  const yaml = fs.readFileSync(path.join(EXAMPLES, 'fill-clean-sand.yaml'));
  const up = await request(m.app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', yaml, 'fill-clean-sand.yaml');
  m.helpers.expectProblem(up, 503);
  expect(up.headers['retry-after']).toBe('5');
  expect(up.body.detail).toMatch(/storage cannot be reached/);

  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  );
  const json = await request(m.app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'wcb-away', sections: corridor.sections.slice(0, 1) });
  m.helpers.expectProblem(json, 503);

  expect(await m.models.Batch.count({ where: { projectId } })).toBe(0);
  expect(await m.models.StoredFile.count({ where: { createdBy: engineerId } })).toBe(0);
  const list = await request(m.app)
    .get(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer);
  expect(list.body).toEqual([]);
});

test('a download while storage is away is a 503 problem with Retry-After, never a 500', async () => {
  const { Batch, StoredFile } = m.models;
  const b = await Batch.create({
    projectId,
    submittedBy: engineerId,
    name: 'wcb-kept-before',
    title: null,
    status: 'done',
    total: 0,
    source: 'upload',
    finishedAt: new Date(),
  });
  const f = await StoredFile.create({
    objectKey: `batch-input/s3down-${b.id}`,
    kind: 'batch-input',
    name: 'corridor.yaml',
    contentType: 'application/yaml',
    size: 10,
    sha256: '0'.repeat(64),
    batchId: b.id,
    sectionId: null,
    createdBy: engineerId,
  });
  // The list is metadata only: it answers.
  const list = await request(m.app).get(`/api/v1/batches/${b.id}/inputs`).auth(engineer, bearer);
  expect(list.status).toBe(200);
  expect(list.body).toHaveLength(1);
  const res = await request(m.app)
    .get(`/api/v1/batches/${b.id}/inputs/${f.id}`)
    .auth(engineer, bearer);
  m.helpers.expectProblem(res, 503);
  expect(res.headers['retry-after']).toBe('5');
  expect(res.body.detail).toMatch(/storage cannot be reached/);
});

test('storeFile while storage is away: StorageUnavailable, and no row', async () => {
  const { storeFile } = await import('../src/services/files');
  const { StorageUnavailable } = await import('../src/storage');
  const mine = { where: { createdBy: engineerId } };
  const before = await m.models.StoredFile.count(mine);
  await expect(
    storeFile({
      kind: 'report',
      name: 'r.pdf',
      contentType: 'application/pdf',
      body: Buffer.from('x'),
      createdBy: engineerId,
    }),
  ).rejects.toBeInstanceOf(StorageUnavailable);
  expect(await m.models.StoredFile.count(mine)).toBe(before);
});

test('/ready is not ready and names the storage', async () => {
  const res = await request(m.app).get('/ready');
  m.helpers.expectProblem(res, 503);
  expect(res.body.ready).toBe(false);
  expect(res.body.checks.storage.ok).toBe(false);
  expect(res.body.checks.database.ok).toBe(true);
  expect(res.body.detail).toMatch(/ECONNREFUSED|unavailable/);
});
