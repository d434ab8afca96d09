/**
 * Requests that once answered 500 (issue 13, item 6), each now a 4xx problem+json that says
 * what is wrong, with nothing written; every write and its audit entry in one transaction; ids
 * that are plain positive integers; no cache of personal data; HSTS only over HTTPS.
 */
import type { AddressInfo } from 'node:net';
import zlib from 'node:zlib';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { closeIntake } from '../src/intake/pool';
import { AuditEntry, Batch, SectionRow } from '../src/models';
import { queue, stopQueue } from '../src/queue';
import { expectProblem, makeUsers, signIn } from './helpers';

const app = createApp();
const auth = { type: 'bearer' as const };
let admin: string;
let engineer: string;
let users: Awaited<ReturnType<typeof makeUsers>>;
let projectId: number;
let batchId: number;

/**
 * Rows these requests could write, scoped to this file's users (other test files write at the
 * same time): projects, users made by them, integration tokens, batches, reviews, audit entries.
 */
async function counts(): Promise<Record<string, number>> {
  const ids = [users.admin.id, users.engineer.id];
  const [row] = await sequelize.query<Record<string, string>>(
    `SELECT (SELECT count(*) FROM projects WHERE created_by = ANY($1)) AS projects,
            (SELECT count(*) FROM users WHERE email LIKE '%@y.example') AS users,
            (SELECT count(*) FROM api_tokens WHERE user_id = $2) AS tokens,
            (SELECT count(*) FROM batches WHERE submitted_by = ANY($1)) AS batches,
            (SELECT count(*) FROM reviews WHERE reviewer_id = ANY($1)) AS reviews,
            (SELECT count(*) FROM audit_log WHERE user_id = ANY($1)) AS audit`,
    { bind: [ids, users.integration.id], type: QueryTypes.SELECT },
  );
  return Object.fromEntries(Object.entries(row).map(([k, v]) => [k, Number(v)]));
}

const NUL = 'a\u0000b';
const LONE = 'a\ud800b';

beforeAll(async () => {
  await queue();
  users = await makeUsers('badreq');
  admin = await signIn(app, users.admin.email);
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app).post('/api/v1/projects').auth(engineer, auth).send({ name: 'P' });
  projectId = p.body.id;
  const b = await Batch.create({
    projectId,
    submittedBy: users.engineer.id,
    name: 'b',
    title: null,
    status: 'done',
    total: 1,
    source: 'json',
    finishedAt: new Date(),
  });
  batchId = b.id;
  await SectionRow.create({
    batchId,
    key: 'b@0',
    position: 0,
    station: 0,
    input: { format: 'scarpline/1', units: 'si' },
    status: 'failed',
    failReason: null,
  });
});

afterAll(async () => {
  await closeIntake();
  await stopQueue();
  await sequelize.close();
});

test('U+0000 and lone surrogates in names and titles: 422 naming the field, nothing written', async () => {
  const before = await counts();
  const cases: [string, string, object][] = [
    ['post', '/api/v1/projects', { name: NUL }],
    ['post', '/api/v1/projects', { name: LONE }],
    ['post', '/api/v1/projects', { name: 'ok', description: NUL }],
    ['post', '/api/v1/users', { email: 'x@y.example', name: NUL, role: 'viewer' }],
    ['post', '/api/v1/users', { email: `a${NUL}@y.example`, name: 'N', role: 'viewer' }],
    ['post', '/api/v1/tokens', { userId: users.integration.id, name: NUL, projectIds: [] }],
    ['post', '/api/v1/tokens', { userId: users.integration.id, name: LONE, projectIds: [] }],
    ['post', `/api/v1/batches/${batchId}/reviews`, { decision: 'approved', comment: NUL }],
    [
      'post',
      `/api/v1/projects/${projectId}/batches`,
      { format: 'scarpline-batch/1', id: 'x', title: NUL, sections: [] },
    ],
  ];
  for (const [method, path, body] of cases) {
    const res = await (request(app) as unknown as Record<string, (p: string) => request.Test>)
      [method](path)
      .auth(admin, auth)
      .send(body);
    expect([path, res.status]).toEqual([path, 422]);
    expectProblem(res, 422);
    expect(JSON.stringify(res.body)).toMatch(/U\+0000|U\+D800|half of a character/);
  }
  expect(await counts()).toEqual(before);
});

test('names longer than allowed: 422 before the database; at the limit they are taken', async () => {
  const before = await counts();
  for (const [path, body] of [
    ['/api/v1/projects', { name: 'x'.repeat(201) }],
    ['/api/v1/projects', { name: 'x'.repeat(100_000) }],
    ['/api/v1/users', { email: 'long@y.example', name: 'x'.repeat(256), role: 'viewer' }],
    ['/api/v1/users', { email: `${'x'.repeat(250)}@y.example`, name: 'L', role: 'viewer' }],
    ['/api/v1/tokens', { userId: users.integration.id, name: 'x'.repeat(256), projectIds: [] }],
  ] as const) {
    const res = await request(app).post(path).auth(admin, auth).send(body);
    expect([path, res.status]).toEqual([path, res.status === 413 ? 413 : 422]);
    expectProblem(res, res.status);
  }
  expect(await counts()).toEqual(before);
  const ok = await request(app)
    .post('/api/v1/projects')
    .auth(admin, auth)
    .send({ name: 'x'.repeat(200) });
  expect(ok.status).toBe(201);
});

test('a write whose audit entry fails leaves no row: project, integration token', async () => {
  const spy = jest
    .spyOn(AuditEntry, 'create')
    .mockRejectedValue(new Error('audit log unavailable (test)'));
  const silence = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  try {
    const name = `half-written ${Date.now()}`;
    const p = await request(app).post('/api/v1/projects').auth(engineer, auth).send({ name });
    expectProblem(p, 500);
    const [{ n }] = await sequelize.query<{ n: string }>(
      'SELECT count(*) AS n FROM projects WHERE name = $1',
      { bind: [name], type: QueryTypes.SELECT },
    );
    expect(Number(n)).toBe(0);

    const t = await request(app)
      .post('/api/v1/tokens')
      .auth(admin, auth)
      .send({ userId: users.integration.id, name, projectIds: [projectId] });
    expectProblem(t, 500);
    const [{ m }] = await sequelize.query<{ m: string }>(
      'SELECT count(*) AS m FROM api_tokens WHERE name = $1',
      { bind: [name], type: QueryTypes.SELECT },
    );
    expect(Number(m)).toBe(0);
  } finally {
    spy.mockRestore();
    silence.mockRestore();
  }
});

test('page and ids: plain positive integers only (1e20, 0x1, 01, -1, huge → 400)', async () => {
  const list = (q: string) =>
    request(app).get(`/api/v1/batches/${batchId}/sections?${q}`).auth(engineer, auth);
  for (const q of [
    'page=1e20',
    'page=0',
    'page=-1',
    'page=2.5',
    'pageSize=1e9',
    'pageSize=0',
    'page=1&page=2',
    'order=sideways',
    'sort=fs&sort=station',
  ]) {
    expect([q, (await list(q)).status]).toEqual([q, 400]);
  }
  expect((await list('page=2&pageSize=10')).status).toBe(200);
  // %zz (a broken escape) once answered 500: found by the fuzz test
  for (const id of ['0x1', '1e0', '01', '-1', '0', '99999999999', '1.0', '%201', 'abc', '%zz']) {
    const res = await request(app).get(`/api/v1/batches/${id}`).auth(engineer, auth);
    expect([id, res.status]).toEqual([id, 400]);
    expectProblem(res, 400);
  }
  const plain = await request(app).get(`/api/v1/batches/${batchId}`).auth(engineer, auth);
  expect(plain.status).toBe(200);
  const hex = await request(app)
    .post('/api/v1/tokens')
    .auth(admin, auth)
    .send({ userId: `0x${users.integration.id.toString(16)}`, name: 'hex', projectIds: [] });
  expectProblem(hex, 400);
});

test('charsets, encodings and broken gzip: 4xx, never 500', async () => {
  // over a socket of its own: supertest's client handles Content-Encoding itself
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as AddressInfo;
  const send = async (headers: Record<string, string>, body?: string | Buffer) => {
    const res = await fetch(`http://127.0.0.1:${port}/api/v1/projects`, {
      method: 'POST',
      headers: { authorization: `Bearer ${engineer}`, ...headers },
      body,
    });
    return {
      status: res.status,
      headers: { 'content-type': res.headers.get('content-type') ?? '' },
      body: (await res.json()) as Record<string, unknown>,
    } as unknown as request.Response;
  };
  try {
    const json = JSON.stringify({ name: 'encoded' });
    expectProblem(await send({ 'content-type': 'application/json; charset=klingon' }, json), 415);
    expect(
      (await send({ 'content-type': 'application/json; charset=utf-16' }, json)).status,
    ).toBeLessThan(500);
    expectProblem(
      await send({ 'content-type': 'application/json', 'content-encoding': 'zstd' }, json),
      415,
    );
    expectProblem(
      await send(
        { 'content-type': 'application/json', 'content-encoding': 'gzip' },
        Buffer.from('this is not gzip'),
      ),
      400,
    );
    expectProblem(
      await send(
        { 'content-type': 'application/json', 'content-encoding': 'gzip' },
        zlib.gzipSync(json).subarray(0, 12),
      ),
      400,
    );
    const good = await send(
      { 'content-type': 'application/json', 'content-encoding': 'gzip' },
      zlib.gzipSync(json),
    );
    expect(good.status).toBe(201);
    // a gzip bomb: a small body that inflates past the limit
    const bomb = zlib.gzipSync(JSON.stringify({ name: 'x'.repeat(config.bodyLimit * 4) }));
    expect(bomb.length).toBeLessThan(config.bodyLimit);
    expectProblem(
      await send({ 'content-type': 'application/json', 'content-encoding': 'gzip' }, bomb),
      413,
    );
    // a bare value, a list, nothing at all
    expectProblem(await send({ 'content-type': 'application/json' }, '"just a string"'), 400);
    expectProblem(await send({ 'content-type': 'application/json' }, '[{"name":"x"}]'), 400);
    expectProblem(await send({}), 400);
  } finally {
    server.close();
  }
});

test('JSON responses carry Cache-Control: no-store; HSTS only over HTTPS', async () => {
  for (const path of [
    '/api/v1/me',
    '/api/v1/users',
    `/api/v1/batches/${batchId}`,
    '/api/v1/audit',
  ]) {
    const res = await request(app).get(path).auth(admin, auth);
    expect([path, res.status, res.headers['cache-control']]).toEqual([path, 200, 'no-store']);
    expect(res.headers['strict-transport-security']).toBeUndefined();
  }
  const problem = await request(app).get('/api/v1/nowhere').auth(admin, auth);
  expect(problem.headers['cache-control']).toBe('no-store');
  // a proxy's word is not taken unless TRUST_PROXY says so
  const claimed = await request(app)
    .get('/api/v1/me')
    .set('x-forwarded-proto', 'https')
    .auth(admin, auth);
  expect(claimed.headers['strict-transport-security']).toBeUndefined();
  const saved = config.trustProxy;
  config.trustProxy = 'loopback';
  try {
    const proxied = createApp();
    const https = await request(proxied)
      .get('/api/v1/me')
      .set('x-forwarded-proto', 'https')
      .auth(admin, auth);
    expect(https.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    const plain = await request(proxied).get('/api/v1/me').auth(admin, auth);
    expect(plain.headers['strict-transport-security']).toBeUndefined();
  } finally {
    config.trustProxy = saved;
  }
});
