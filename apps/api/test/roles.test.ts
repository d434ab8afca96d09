import request from 'supertest';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch, Project, SectionRow, type Role } from '../src/models';
import { stopQueue } from '../src/queue';
import { expectProblem, makeUsers, signIn } from './helpers';

const app = createApp();
const tokens = {} as Record<Role, string>;
let users: Awaited<ReturnType<typeof makeUsers>>;
let projectId: number;
let otherProjectId: number;
let batchId: number;
let sectionId: number;
let otherBatchId: number;
let otherSectionId: number;
let doneBatchId: number;

beforeAll(async () => {
  users = await makeUsers('roles');
  for (const role of ['admin', 'engineer', 'reviewer', 'viewer'] as Role[]) {
    tokens[role] = await signIn(app, users[role].email);
  }
  const project = await Project.create({
    name: 'Roles A',
    description: null,
    createdBy: users.admin.id,
  });
  const other = await Project.create({
    name: 'Roles B',
    description: null,
    createdBy: users.admin.id,
  });
  projectId = project.id;
  otherProjectId = other.id;
  const mk = async (pid: number, status: 'running' | 'done' = 'running') => {
    const b = await Batch.create({
      projectId: pid,
      submittedBy: users.engineer.id,
      name: 'roles',
      title: null,
      status,
      total: 1,
      source: 'json',
      finishedAt: null,
    });
    const s = await SectionRow.create({
      batchId: b.id,
      key: `roles-${pid}`,
      position: 0,
      station: 0,
      input: { format: 'scarpline/1' },
      status: status === 'done' ? 'failed' : 'queued',
      failReason: null,
    });
    return { b, s };
  };
  const a = await mk(projectId);
  batchId = a.b.id;
  sectionId = a.s.id;
  const elsewhere = await mk(otherProjectId);
  otherBatchId = elsewhere.b.id;
  otherSectionId = elsewhere.s.id;
  // A finished batch, so its event stream ends at once.
  doneBatchId = (await mk(projectId, 'done')).b.id;
  const t = await request(app)
    .post('/api/v1/tokens')
    .auth(tokens.admin, { type: 'bearer' })
    .send({ userId: users.integration.id, name: 'GIS feed', projectIds: [projectId] });
  expect(t.status).toBe(201);
  tokens.integration = t.body.token;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

/** [method, path, body, roles allowed]; a POST with an invalid body still shows the role check passed (4xx ≠ 401/403). */
const routes = (): [string, string, object | undefined, Role[]][] => [
  ['get', '/api/v1/me', undefined, ['admin', 'engineer', 'reviewer', 'viewer', 'integration']],
  ['post', '/api/v1/me/password', {}, ['admin', 'engineer', 'reviewer', 'viewer']],
  ['get', '/api/v1/users', undefined, ['admin']],
  ['post', '/api/v1/users', {}, ['admin']],
  ['patch', '/api/v1/users/999999', {}, ['admin']],
  ['get', '/api/v1/tokens', undefined, ['admin']],
  ['post', '/api/v1/tokens', {}, ['admin']],
  ['delete', '/api/v1/tokens/999999', undefined, ['admin']],
  ['get', '/api/v1/audit', undefined, ['admin']],
  ['get', '/api/v1/mail', undefined, ['admin']],
  [
    'get',
    '/api/v1/projects',
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  ['post', '/api/v1/projects', {}, ['admin', 'engineer']],
  [
    'get',
    `/api/v1/projects/${projectId}`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/projects/${projectId}/batches`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  ['post', `/api/v1/projects/${projectId}/batches`, {}, ['admin', 'engineer', 'integration']],
  [
    'post',
    `/api/v1/projects/${projectId}/uploads`,
    undefined,
    ['admin', 'engineer', 'integration'],
  ],
  [
    'get',
    `/api/v1/batches/${batchId}`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/batches/${doneBatchId}/events`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  ['post', `/api/v1/batches/${doneBatchId}/review-requests`, {}, ['admin', 'engineer']],
  [
    'get',
    `/api/v1/batches/${batchId}/sections`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/sections/${sectionId}`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  ['post', `/api/v1/sections/${sectionId}/reviews`, {}, ['admin', 'reviewer']],
  ['post', `/api/v1/batches/${batchId}/reviews`, {}, ['admin', 'reviewer']],
  ['post', `/api/v1/sections/${sectionId}/runs`, {}, ['admin', 'engineer']],
  [
    'get',
    `/api/v1/sections/${sectionId}/runs`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/batches/${batchId}/results.csv`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/batches/${batchId}/results.geojson`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
  [
    'get',
    `/api/v1/sections/${sectionId}/plot.svg`,
    undefined,
    ['admin', 'engineer', 'reviewer', 'viewer', 'integration'],
  ],
];

const ROLE_LIST: Role[] = ['admin', 'engineer', 'reviewer', 'viewer', 'integration'];

test('every route × every role: allowed roles pass the check, others get 403, nobody 401', async () => {
  for (const [method, path, body, allowed] of routes()) {
    const anon = await (request(app) as unknown as Record<string, (p: string) => request.Test>)[
      method
    ](path);
    expectProblem(anon, 401);
    for (const role of ROLE_LIST) {
      let req = (request(app) as unknown as Record<string, (p: string) => request.Test>)
        [method](path)
        .auth(tokens[role], { type: 'bearer' });
      if (body) req = req.send(body);
      const res = await req;
      const label = `${role} ${method.toUpperCase()} ${path} → ${res.status}`;
      if (allowed.includes(role)) {
        expect([label, [401, 403].includes(res.status)]).toEqual([label, false]);
      } else {
        expect([label, res.status]).toEqual([label, 403]);
      }
    }
  }
});

test('an integration token sees only its projects; others answer as if they did not exist', async () => {
  const auth = { type: 'bearer' as const };
  const list = await request(app).get('/api/v1/projects').auth(tokens.integration, auth);
  expect(list.body.map((p: { id: number }) => p.id)).toEqual([projectId]);
  const MISSING = 2_000_000_000;
  /** The answer to a resource of another project, and to one that does not exist: the same. */
  const same = async (other: string, missing: string, send?: object) => {
    const ask = (url: string) => {
      const r = url.endsWith('/batches') ? request(app).post(url) : request(app).get(url);
      const authed = r.auth(tokens.integration, auth);
      return send ? authed.send(send) : authed;
    };
    const a = await ask(other);
    const b = await ask(missing);
    expectProblem(a, 404);
    expectProblem(b, 404);
    const strip = (body: Record<string, unknown>) => ({
      ...body,
      instance: undefined,
      requestId: undefined,
    });
    expect(strip(a.body)).toEqual(strip(b.body));
  };
  await same(`/api/v1/projects/${otherProjectId}`, `/api/v1/projects/${MISSING}`);
  await same(`/api/v1/projects/${otherProjectId}/batches`, `/api/v1/projects/${MISSING}/batches`);
  await same(`/api/v1/batches/${otherBatchId}`, `/api/v1/batches/${MISSING}`);
  await same(`/api/v1/batches/${otherBatchId}/events`, `/api/v1/batches/${MISSING}/events`);
  await same(`/api/v1/batches/${otherBatchId}/sections`, `/api/v1/batches/${MISSING}/sections`);
  await same(`/api/v1/sections/${otherSectionId}`, `/api/v1/sections/${MISSING}`);
  await same(`/api/v1/sections/${otherSectionId}/plot.svg`, `/api/v1/sections/${MISSING}/plot.svg`);
  await same(
    `/api/v1/projects/${otherProjectId}/batches`,
    `/api/v1/projects/${MISSING}/batches`,
    {},
  );
  expectProblem(
    await request(app).get(
      `/api/v1/batches/${otherBatchId}/events?access_token=${tokens.integration}`,
    ),
    404,
  );
});

test('a revoked integration token is refused', async () => {
  const t = await request(app)
    .post('/api/v1/tokens')
    .auth(tokens.admin, { type: 'bearer' })
    .send({ userId: users.integration.id, name: 'short-lived', projectIds: [projectId] });
  expect((await request(app).get('/api/v1/me').auth(t.body.token, { type: 'bearer' })).status).toBe(
    200,
  );
  const del = await request(app)
    .delete(`/api/v1/tokens/${t.body.id}`)
    .auth(tokens.admin, { type: 'bearer' });
  expect(del.status).toBe(200);
  expectProblem(await request(app).get('/api/v1/me').auth(t.body.token, { type: 'bearer' }), 401);
});

test('a token lives 1 to 3650 whole days, and the list says when each was made', async () => {
  for (const days of [0, -5, 2.5, 3651]) {
    const res = await request(app)
      .post('/api/v1/tokens')
      .auth(tokens.admin, { type: 'bearer' })
      .send({ userId: users.integration.id, name: `bad-${days}`, projectIds: [projectId], days });
    expectProblem(res, 422);
    expect(res.body.detail).toBe('days is a whole number of days from 1 to 3650.');
  }
  const ok = await request(app)
    .post('/api/v1/tokens')
    .auth(tokens.admin, { type: 'bearer' })
    .send({ userId: users.integration.id, name: 'a-week', projectIds: [projectId], days: 7 });
  expect(ok.status).toBe(201);
  const week = new Date(ok.body.expiresAt).getTime() - new Date(ok.body.createdAt).getTime();
  expect(Math.round(week / 3600_000)).toBe(7 * 24);
  const list = await request(app).get('/api/v1/tokens').auth(tokens.admin, { type: 'bearer' });
  const row = (list.body as { id: number; createdAt: string }[]).find((t) => t.id === ok.body.id);
  expect(row?.createdAt).toBe(ok.body.createdAt);
});

test('the routes of signing in and of a forgotten password answer without a token', async () => {
  for (const [path, body] of [
    ['/api/v1/auth/login', { email: 'nobody@test.scarpline.example', password: 'not-this-one' }],
    ['/api/v1/password-resets', { email: 'nobody@test.scarpline.example' }],
    ['/api/v1/password-resets/confirm', { token: 'slr_nothing', password: 'a-new-password' }],
  ] as const) {
    const res = await request(app).post(path).send(body);
    expect([path, [401, 403].includes(res.status) && path !== '/api/v1/auth/login']).toEqual([
      path,
      false,
    ]);
    expect(res.status).toBeLessThan(500);
  }
});
