import request from 'supertest';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { ApiToken } from '../src/models';
import { expectProblem, makeUsers, PASSWORD, signIn } from './helpers';

const app = createApp();
let users: Awaited<ReturnType<typeof makeUsers>>;

beforeAll(async () => {
  users = await makeUsers('auth');
});
afterAll(async () => {
  await sequelize.close();
});

test('sign-in returns a bearer token that /me accepts; the token is stored hashed', async () => {
  const res = await request(app)
    .post('/api/v1/auth/login')
    .send({ email: users.engineer.email, password: PASSWORD });
  expect(res.status).toBe(200);
  expect(res.body.token).toMatch(/^sls_[\w-]{40,}$/);
  expect(new Date(res.body.expiresAt).getTime()).toBeGreaterThan(Date.now());
  const me = await request(app).get('/api/v1/me').auth(res.body.token, { type: 'bearer' });
  expect(me.status).toBe(200);
  expect(me.body).toMatchObject({ email: users.engineer.email, role: 'engineer' });
  const stored = await ApiToken.findAll({ where: { userId: users.engineer.id } });
  expect(stored.map((t) => t.tokenHash)).not.toContain(res.body.token);
  expect(stored.every((t) => /^[0-9a-f]{64}$/.test(t.tokenHash))).toBe(true);
});

test('wrong password, no token, a made-up token → 401 problem+json', async () => {
  expectProblem(
    await request(app)
      .post('/api/v1/auth/login')
      .send({ email: users.viewer.email, password: 'nope-nope' }),
    401,
  );
  expectProblem(await request(app).get('/api/v1/me'), 401);
  expectProblem(await request(app).get('/api/v1/me').auth('sls_madeup', { type: 'bearer' }), 401);
});

test('integration users cannot sign in with a password', async () => {
  expectProblem(
    await request(app)
      .post('/api/v1/auth/login')
      .send({ email: users.integration.email, password: PASSWORD }),
    401,
  );
});

test('logout revokes the token; an expired token is refused', async () => {
  const token = await signIn(app, users.viewer.email);
  expect(
    (await request(app).post('/api/v1/auth/logout').auth(token, { type: 'bearer' })).status,
  ).toBe(204);
  expectProblem(await request(app).get('/api/v1/me').auth(token, { type: 'bearer' }), 401);

  const other = await signIn(app, users.reviewer.email);
  await ApiToken.update(
    { expiresAt: new Date(Date.now() - 1000) },
    { where: { userId: users.reviewer.id, revokedAt: null } },
  );
  expectProblem(await request(app).get('/api/v1/me').auth(other, { type: 'bearer' }), 401);
});

test('unknown route and malformed JSON are problem+json too', async () => {
  const token = await signIn(app, users.admin.email);
  expectProblem(await request(app).get('/api/v1/nowhere').auth(token, { type: 'bearer' }), 404);
  const bad = await request(app)
    .post('/api/v1/auth/login')
    .set('content-type', 'application/json')
    .send('{"email": ');
  expectProblem(bad, 400);
});

// Last: it uses up this address's sign-in allowance for the window.
test('sign-in is rate-limited', async () => {
  const statuses: number[] = [];
  for (let i = 0; i < 12; i++) {
    const res = await request(app)
      .post('/api/v1/auth/login')
      .send({ email: users.admin.email, password: 'wrong-password' });
    statuses.push(res.status);
  }
  expect(statuses).toContain(429);
  expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
});
