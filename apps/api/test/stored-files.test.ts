/**
 * Submitted inputs kept in object storage (the local S3 fake of scripts/s3.js): the bytes in
 * storage are the upload's, the metadata says their size and SHA-256, the download streams them
 * with their content type and a file name; an object deleted behind the service's back is a
 * 404; a user of another project gets the same answer as for the batch.
 */
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { DeleteObjectCommand, GetObjectCommand } from '@aws-sdk/client-s3';
import request from 'supertest';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { Batch, StoredFile } from '../src/models';
import { stopQueue } from '../src/queue';
import { storeFile } from '../src/services/files';
import { closeStorage, makeClient } from '../src/storage';
import { expectProblem, makeUsers, schemaErrors, signIn } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
const s3 = makeClient(config.s3);
let engineer: string;
let viewer: string;
let admin: string;
let users: Awaited<ReturnType<typeof makeUsers>>;
let projectId: number;
let otherProjectId: number;

const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

/** The object's bytes as the fake holds them, read with a client of the test's own. */
async function objectBytes(key: string): Promise<Buffer> {
  const r = await s3.send(new GetObjectCommand({ Bucket: config.s3.bucket, Key: key }));
  return Buffer.from(await r.Body!.transformToByteArray());
}

/** supertest's parser for a binary body: the bytes as they came. */
function bytes(res: request.Response, cb: (err: Error | null, body: Buffer) => void): void {
  const parts: Buffer[] = [];
  res.on('data', (c: Buffer) => parts.push(c));
  res.on('end', () => cb(null, Buffer.concat(parts)));
}

beforeAll(async () => {
  users = await makeUsers('files');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  admin = await signIn(app, users.admin.email);
  const mk = async (name: string) => {
    const p = await request(app).post('/api/v1/projects').auth(engineer, bearer).send({ name });
    expect(p.status).toBe(201);
    return p.body.id as number;
  };
  projectId = await mk('Wendlecombe stored inputs (test)');
  otherProjectId = await mk('Wendlecombe elsewhere (test)');
});

afterAll(async () => {
  s3.destroy();
  closeStorage();
  await stopQueue();
  await sequelize.close();
});

test('an upload is kept byte for byte: listed, in storage, downloaded with type and name', async () => {
  const yaml = fs.readFileSync(path.join(EXAMPLES, 'fill-clean-sand.yaml'));
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', yaml, 'fill-clean-sand.yaml');
  expect(post.status).toBe(201);
  const batchId = post.body.id as number;

  const list = await request(app).get(`/api/v1/batches/${batchId}/inputs`).auth(viewer, bearer);
  expect(list.status).toBe(200);
  expect(list.body).toHaveLength(1);
  const [f] = list.body;
  expect(f).toMatchObject({
    name: 'fill-clean-sand.yaml',
    contentType: 'application/yaml',
    size: yaml.length,
    sha256: sha256(yaml),
    creator: { id: users.engineer.id, name: 'files engineer' },
  });
  expect(schemaErrors('StoredFile', f)).toEqual([]);

  const row = await StoredFile.findByPk(f.id as number);
  expect(row).toMatchObject({ batchId, kind: 'batch-input', createdBy: users.engineer.id });
  expect((await objectBytes(row!.objectKey)).equals(yaml)).toBe(true);

  const down = await request(app)
    .get(`/api/v1/batches/${batchId}/inputs/${f.id}`)
    .auth(viewer, bearer)
    .buffer(true)
    .parse(bytes);
  expect(down.status).toBe(200);
  expect(down.headers['content-type']).toMatch(/^application\/yaml/);
  expect(down.headers['content-length']).toBe(String(yaml.length));
  const batch = await Batch.findByPk(batchId);
  expect(down.headers['content-disposition']).toBe(
    `attachment; filename=${batch!.name}-batch-${batchId}-input-${row!.createdAt.toISOString().slice(0, 10)}-fill-clean-sand.yaml`,
  );
  expect((down.body as Buffer).equals(yaml)).toBe(true);
});

test('a JSON batch is kept as sent; each file of a multi-file upload is kept', async () => {
  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  );
  const text = JSON.stringify({
    ...corridor,
    id: 'wcb-kept',
    sections: corridor.sections.slice(0, 1),
  });
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer)
    .set('Content-Type', 'application/json')
    .send(text);
  expect(post.status).toBe(201);
  const [json] = (
    await request(app).get(`/api/v1/batches/${post.body.id}/inputs`).auth(viewer, bearer)
  ).body;
  expect(json).toMatchObject({ name: 'wcb-kept.json', contentType: 'application/json' });
  const row = await StoredFile.findByPk(json.id as number);
  expect((await objectBytes(row!.objectKey)).toString('utf8')).toBe(text);

  const a = fs.readFileSync(path.join(EXAMPLES, 'fill-clean-sand.yaml'));
  const b = fs.readFileSync(path.join(EXAMPLES, 'cut-homogeneous.yaml'));
  const two = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', a, 'fill-clean-sand.yaml')
    .attach('files', b, 'cut-homogeneous.yaml');
  expect(two.status).toBe(201);
  const listed = (
    await request(app).get(`/api/v1/batches/${two.body.id}/inputs`).auth(viewer, bearer)
  ).body;
  expect(listed.map((f: { name: string; sha256: string }) => [f.name, f.sha256])).toEqual([
    ['fill-clean-sand.yaml', sha256(a)],
    ['cut-homogeneous.yaml', sha256(b)],
  ]);
});

test('an object deleted behind the service is a 404 problem, not a 500', async () => {
  const yaml = fs.readFileSync(path.join(EXAMPLES, 'cut-homogeneous.yaml'));
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', yaml, 'cut-homogeneous.yaml');
  expect(post.status).toBe(201);
  const row = await StoredFile.findOne({ where: { batchId: post.body.id } });
  await s3.send(new DeleteObjectCommand({ Bucket: config.s3.bucket, Key: row!.objectKey }));
  const res = await request(app)
    .get(`/api/v1/batches/${post.body.id}/inputs/${row!.id}`)
    .auth(viewer, bearer);
  expectProblem(res, 404);
  expect(res.body.detail).toMatch(/missing from storage/);
  // A file id of another batch, or none: 404 as well.
  const none = await request(app)
    .get(`/api/v1/batches/${post.body.id}/inputs/999999`)
    .auth(viewer, bearer);
  expectProblem(none, 404);
});

test("another project's user gets the batch's own answer (404) for its inputs", async () => {
  const yaml = fs.readFileSync(path.join(EXAMPLES, 'fill-clean-sand.yaml'));
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', yaml, 'fill-clean-sand.yaml');
  const batchId = post.body.id as number;
  const row = await StoredFile.findOne({ where: { batchId } });
  const t = await request(app)
    .post('/api/v1/tokens')
    .auth(admin, bearer)
    .send({ userId: users.integration.id, name: 'elsewhere', projectIds: [otherProjectId] });
  expect(t.status).toBe(201);
  const outsider = t.body.token as string;
  const batch = await request(app).get(`/api/v1/batches/${batchId}`).auth(outsider, bearer);
  expectProblem(batch, 404);
  for (const url of [
    `/api/v1/batches/${batchId}/inputs`,
    `/api/v1/batches/${batchId}/inputs/${row!.id}`,
  ]) {
    const res = await request(app).get(url).auth(outsider, bearer);
    expectProblem(res, 404);
    expect(res.body.detail).toBe(batch.body.detail);
  }
  expectProblem(await request(app).get(`/api/v1/batches/${batchId}/inputs`), 401);
});

test('storeFile keeps a report: object and row, SHA-256 and size of the bytes given', async () => {
  const body = Buffer.from('%PDF-1.7\n% a stand-in for a report\n');
  const f = await storeFile({
    kind: 'report',
    name: 'wcb-report.pdf',
    contentType: 'application/pdf',
    body,
    createdBy: users.engineer.id,
  });
  expect(f).toMatchObject({
    kind: 'report',
    name: 'wcb-report.pdf',
    size: body.length,
    sha256: sha256(body),
    batchId: null,
    sectionId: null,
  });
  expect(f.objectKey).toMatch(/^report\//);
  expect((await objectBytes(f.objectKey)).equals(body)).toBe(true);
  expect((await StoredFile.findByPk(f.id))?.size).toBe(body.length);
});

test('/ready reports the storage and its bucket', async () => {
  // Ready or not (no worker runs in this file), the storage check is there.
  const res = await request(app).get('/ready');
  expect(res.body.checks.storage).toEqual({
    ok: true,
    detail: `bucket ${config.s3.bucket} answers`,
  });
});
