/** Admins manage users: PATCH /users/{id} changes name, role or whether they may sign in. */
import request from 'supertest';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { AuditEntry, Project, User } from '../src/models';
import { expectProblem, makeUsers, PASSWORD, schemaErrors, signIn } from './helpers';

const app = createApp();
const bearer = { type: 'bearer' as const };
let users: Awaited<ReturnType<typeof makeUsers>>;
let admin: string;
let engineer: string;

beforeAll(async () => {
  users = await makeUsers('users');
  admin = await signIn(app, users.admin.email);
  engineer = await signIn(app, users.engineer.email);
});

afterAll(async () => {
  await sequelize.close();
});

const patch = (id: number, token: string, body: unknown) =>
  request(app)
    .patch(`/api/v1/users/${id}`)
    .auth(token, bearer)
    .send(body as object);

const lastAudit = (id: number) =>
  AuditEntry.findOne({
    where: { action: 'update', entity: 'user', entityId: id },
    order: [['id', 'DESC']],
  });

test('a role change is answered with the user, audited, and in force on their next request', async () => {
  const viewer = await signIn(app, users.viewer.email);
  const before = await request(app).get('/api/v1/me').auth(viewer, bearer);
  expect(before.body).toEqual({
    id: users.viewer.id,
    email: users.viewer.email,
    name: 'users viewer',
    role: 'viewer',
    projectIds: null,
    mustChangePassword: false,
  });
  expect(schemaErrors('Me', before.body)).toEqual([]);

  const res = await patch(users.viewer.id, admin, { role: 'reviewer', name: 'Vera Viewer' });
  expect(res.status).toBe(200);
  expect(res.body).toEqual({
    id: users.viewer.id,
    email: users.viewer.email,
    name: 'Vera Viewer',
    role: 'reviewer',
    active: true,
    mustChangePassword: false,
  });
  expect(schemaErrors('User', res.body)).toEqual([]);

  const me = await request(app).get('/api/v1/me').auth(viewer, bearer);
  expect(me.body).toMatchObject({ role: 'reviewer', name: 'Vera Viewer' });
  const list = await request(app).get('/api/v1/users').auth(admin, bearer);
  expect(list.body).toContainEqual(res.body);

  const entry = await lastAudit(users.viewer.id);
  expect(entry?.userId).toBe(users.admin.id);
  expect(entry?.details).toEqual({
    changes: {
      name: { from: 'users viewer', to: 'Vera Viewer' },
      role: { from: 'viewer', to: 'reviewer' },
    },
  });

  // Sending the values a user already has changes nothing and writes no audit entry.
  const again = await patch(users.viewer.id, admin, { role: 'reviewer' });
  expect(again.status).toBe(200);
  expect((await lastAudit(users.viewer.id))?.id).toBe(entry?.id);
});

test('disabling a user: their sign-in fails and their session stops working at once', async () => {
  const session = await signIn(app, users.reviewer.email);
  expect((await request(app).get('/api/v1/me').auth(session, bearer)).status).toBe(200);

  const res = await patch(users.reviewer.id, admin, { active: false });
  expect(res.status).toBe(200);
  expect(res.body).toMatchObject({ id: users.reviewer.id, active: false });
  expect((await User.findByPk(users.reviewer.id))?.active).toBe(false);

  expectProblem(await request(app).get('/api/v1/me').auth(session, bearer), 401);
  expectProblem(
    await request(app)
      .post('/api/v1/auth/login')
      .send({ email: users.reviewer.email, password: PASSWORD }),
    401,
  );
  const entry = await lastAudit(users.reviewer.id);
  expect(entry?.details).toEqual({
    changes: { active: { from: true, to: false } },
    sessionsRevoked: 1,
  });

  // Enabled again: they can sign in, but the session from before stays ended.
  expect((await patch(users.reviewer.id, admin, { active: true })).body.active).toBe(true);
  expectProblem(await request(app).get('/api/v1/me').auth(session, bearer), 401);
  const fresh = await signIn(app, users.reviewer.email);
  expect((await request(app).get('/api/v1/me').auth(fresh, bearer)).status).toBe(200);
});

test('disabling an integration user refuses their API tokens until they are enabled again', async () => {
  const project = await Project.create({
    name: 'Users (test)',
    description: null,
    createdBy: users.admin.id,
  });
  const created = await request(app)
    .post('/api/v1/tokens')
    .auth(admin, bearer)
    .send({ userId: users.integration.id, name: 'feed', projectIds: [project.id] });
  expect(created.status).toBe(201);
  const token = created.body.token as string;
  expect((await request(app).get('/api/v1/projects').auth(token, bearer)).status).toBe(200);

  expect((await patch(users.integration.id, admin, { active: false })).status).toBe(200);
  expectProblem(await request(app).get('/api/v1/projects').auth(token, bearer), 401);
  expectProblem(await request(app).get('/api/v1/me').auth(token, bearer), 401);

  expect((await patch(users.integration.id, admin, { active: true })).status).toBe(200);
  expect((await request(app).get('/api/v1/projects').auth(token, bearer)).status).toBe(200);
});

test('an admin may not disable or demote themselves (409), but may rename themselves', async () => {
  const off = await patch(users.admin.id, admin, { active: false });
  expectProblem(off, 409);
  expect(off.body.detail).toBe('You cannot disable your own account; ask another admin to do it.');
  const down = await patch(users.admin.id, admin, { role: 'engineer' });
  expectProblem(down, 409);
  expect(down.body.detail).toMatch(/cannot take the admin role from yourself/);
  const both = await patch(users.admin.id, admin, { role: 'viewer', active: false });
  expectProblem(both, 409);

  const me = await User.findByPk(users.admin.id);
  expect([me?.role, me?.active]).toEqual(['admin', true]);
  expect(
    await AuditEntry.count({ where: { action: 'update', entity: 'user', entityId: me?.id } }),
  ).toBe(0);

  const renamed = await patch(users.admin.id, admin, { name: 'Ursula Admin', role: 'admin' });
  expect(renamed.status).toBe(200);
  expect(renamed.body).toMatchObject({ name: 'Ursula Admin', role: 'admin', active: true });
  // What an admin cannot do to themselves they can do to another admin.
  const other = await User.create({
    email: 'users-second-admin@test.scarpline.example',
    name: 'Second admin',
    role: 'admin',
    passwordHash: null,
  });
  const res = await patch(other.id, admin, { role: 'engineer', active: false });
  expect(res.status).toBe(200);
  expect(res.body).toMatchObject({ role: 'engineer', active: false });
});

test('only admins may change users: 403 for the other roles, 401 without a token', async () => {
  const res = await patch(users.viewer.id, engineer, { role: 'admin' });
  expectProblem(res, 403);
  expectProblem(await request(app).patch(`/api/v1/users/${users.viewer.id}`).send({}), 401);
  expect((await User.findByPk(users.viewer.id))?.role).toBe('reviewer');
});

test('bad changes are refused with a plain message naming the field', async () => {
  const id = users.engineer.id;
  const cases: [unknown, number, RegExp][] = [
    [{}, 422, /Send one or more of name, role, active/],
    [{ email: 'x@y.example' }, 422, /cannot be changed here: email/],
    [{ password: 'new-password-1' }, 422, /cannot be changed here: password/],
    [{ role: 'boss' }, 422, /role is one of admin, engineer, reviewer, viewer, integration/],
    [{ active: 'no' }, 422, /active is true or false/],
    [{ name: '   ' }, 422, /name is a string of 1 to 200 characters/],
    [{ name: 'x'.repeat(201) }, 422, /name is a string of 1 to 200 characters/],
    [[{ role: 'viewer' }], 422, /Send the changes as a JSON object/],
    [{ role: 'integration' }, 409, /cannot change between integration and the other roles/],
  ];
  for (const [body, status, detail] of cases) {
    const res = await patch(id, admin, body);
    expectProblem(res, status);
    expect([JSON.stringify(body).slice(0, 40), res.body.detail]).toEqual([
      JSON.stringify(body).slice(0, 40),
      expect.stringMatching(detail),
    ]);
  }
  expectProblem(await patch(users.integration.id, admin, { role: 'engineer' }), 409);
  expectProblem(await patch(999999, admin, { name: 'Nobody' }), 404);
  expectProblem(
    await request(app).patch('/api/v1/users/abc').auth(admin, bearer).send({ name: 'X' }),
    400,
  );
  const unchanged = await User.findByPk(id);
  expect([unchanged?.role, unchanged?.name, unchanged?.active]).toEqual([
    'engineer',
    'users engineer',
    true,
  ]);
});
