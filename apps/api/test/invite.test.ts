/**
 * Inviting a user: POST /users without a password mails them a generated one through the local
 * SMTP fake, and the answer never holds it; without any mail configured the admin gets it instead.
 */
import net from 'node:net';
import request from 'supertest';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { log } from '../src/log';
import { AuditEntry, User } from '../src/models';
import { mailConfigured, startSmtpFake, stopSmtpFake } from '../src/services/mail';
import { expectProblem, makeUsers, schemaErrors, signIn } from './helpers';

const app = createApp();
const bearer = { type: 'bearer' as const };
let users: Awaited<ReturnType<typeof makeUsers>>;
let admin: string;

beforeAll(async () => {
  users = await makeUsers('invite');
  admin = await signIn(app, users.admin.email);
});

afterAll(async () => {
  await stopSmtpFake();
  await sequelize.close();
});

const invite = (body: object) => request(app).post('/api/v1/users').auth(admin, bearer).send(body);

interface Mail {
  to: string[];
  raw: string;
}

/** The fake's messages as an admin reads them, quoted-printable line breaks undone. */
async function mailTo(address: string): Promise<Mail[]> {
  const res = await request(app).get('/api/v1/mail').auth(admin, bearer);
  expect(res.status).toBe(200);
  return (res.body as Mail[])
    .filter((m) => m.to.includes(address))
    .map((m) => ({ ...m, raw: m.raw.replace(/=\r?\n/g, '') }));
}

const login = (email: string, password: string) =>
  request(app).post('/api/v1/auth/login').send({ email, password });

test('with no mail configured at all, the admin is given the generated password', async () => {
  expect(config.smtpUrl).toBe('');
  expect(mailConfigured()).toBe(false);
  const email = 'invite-nomail@test.scarpline.example';
  const res = await invite({ email, name: 'Nina Nomail', role: 'viewer' });
  expect(res.status).toBe(201);
  expect(res.body).toEqual({
    id: expect.any(Number),
    email,
    name: 'Nina Nomail',
    role: 'viewer',
    active: true,
    mustChangePassword: true,
    invited: false,
    password: expect.stringMatching(/^[A-Za-z0-9]{16}$/),
  });
  expect(schemaErrors('CreatedUser', res.body)).toEqual([]);
  const stored = await User.findByPk(res.body.id);
  expect(stored?.passwordHash).toMatch(/^scrypt\$/);
  expect(stored?.passwordHash).not.toContain(res.body.password);
  expect((await login(email, res.body.password)).status).toBe(200);
});

test('an invitation goes to the fake inbox with the sign-in address and a password; the answer has none', async () => {
  await startSmtpFake(0);
  expect(mailConfigured()).toBe(true);
  const email = 'Ivo.Invited@Test.Scarpline.example';
  const res = await invite({ email, name: 'Ivo Invited', role: 'engineer' });
  expect(res.status).toBe(201);
  expect(res.body).toEqual({
    id: expect.any(Number),
    email: email.toLowerCase(),
    name: 'Ivo Invited',
    role: 'engineer',
    active: true,
    mustChangePassword: true,
    invited: true,
  });
  expect(schemaErrors('CreatedUser', res.body)).toEqual([]);

  const mails = await mailTo(email.toLowerCase());
  expect(mails).toHaveLength(1);
  const raw = mails[0].raw;
  expect(raw).toContain(`Sign in at: ${config.publicUrl}`);
  expect(raw).toContain(`E-mail address: ${email.toLowerCase()}`);
  expect(raw).toContain('the role engineer');
  expect(raw).toContain(`invite admin <${users.admin.email}>`);
  const password = /Password: (\S+)/.exec(raw)?.[1] ?? '';
  expect(password.length).toBeGreaterThanOrEqual(12);
  expect(JSON.stringify(res.body)).not.toContain(password);
  expect(JSON.stringify(res.headers)).not.toContain(password);

  expect((await login(email, password)).status).toBe(200);
  expectProblem(await login(email, `${password}x`), 401);

  const entry = await AuditEntry.findOne({
    where: { action: 'create', entity: 'user', entityId: res.body.id },
  });
  expect(entry?.userId).toBe(users.admin.id);
  expect(entry?.details).toEqual({ email: email.toLowerCase(), role: 'engineer', invited: true });
  expect(JSON.stringify(entry?.details)).not.toContain(password);
});

test('two invitations get different passwords', async () => {
  const a = 'invite-a@test.scarpline.example';
  const b = 'invite-b@test.scarpline.example';
  expect((await invite({ email: a, name: 'A', role: 'reviewer' })).status).toBe(201);
  expect((await invite({ email: b, name: 'B', role: 'reviewer' })).status).toBe(201);
  const pa = /Password: (\S+)/.exec((await mailTo(a))[0].raw)?.[1];
  const pb = /Password: (\S+)/.exec((await mailTo(b))[0].raw)?.[1];
  expect(pa).toMatch(/^[A-Za-z0-9]{16}$/);
  expect(pb).toMatch(/^[A-Za-z0-9]{16}$/);
  expect(pa).not.toBe(pb);
});

test('with a password given, or for an integration user, nothing is mailed (as before)', async () => {
  const email = 'invite-pw@test.scarpline.example';
  const res = await invite({
    email,
    name: 'Pat Password',
    role: 'viewer',
    password: 'given-pw-123',
  });
  expect(res.status).toBe(201);
  expect(res.body).toEqual({
    id: expect.any(Number),
    email,
    name: 'Pat Password',
    role: 'viewer',
    active: true,
    mustChangePassword: false,
  });
  expect((await login(email, 'given-pw-123')).status).toBe(200);

  const feed = 'invite-feed@test.scarpline.example';
  const f = await invite({ email: feed, name: 'Feed', role: 'integration' });
  expect(f.status).toBe(201);
  expect(f.body).toEqual({
    id: expect.any(Number),
    email: feed,
    name: 'Feed',
    role: 'integration',
    active: true,
    mustChangePassword: false,
  });
  expect((await User.findByPk(f.body.id))?.passwordHash).toBeNull();

  expect(await mailTo(email)).toEqual([]);
  expect(await mailTo(feed)).toEqual([]);
  expectProblem(
    await invite({
      email: 'invite-short@test.scarpline.example',
      name: 'S',
      role: 'viewer',
      password: 'short',
    }),
    422,
  );
  expectProblem(await invite({ email, name: 'Again', role: 'viewer' }), 409);
  expect(await mailTo(email)).toEqual([]);
});

// Last: it leaves the mail transport pointing at a closed port.
test('when mail is configured but the invitation cannot be sent, no user is created (502)', async () => {
  await stopSmtpFake();
  const closed = await new Promise<number>((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
  const saved = config.smtpUrl;
  config.smtpUrl = `smtp://127.0.0.1:${closed}`;
  const warn = jest.spyOn(log, 'warn');
  try {
    const email = 'invite-unsent@test.scarpline.example';
    const res = await invite({ email, name: 'Una Unsent', role: 'viewer' });
    expectProblem(res, 502);
    expect(res.body.detail).toBe(
      `The invitation to ${email} could not be sent, so the user was not created. Try again later, or create the user with a password.`,
    );
    expect(await User.findOne({ where: { email } })).toBeNull();
    expect(
      await AuditEntry.count({ where: { action: 'create', entity: 'user', details: { email } } }),
    ).toBe(0);
    // The failed send is logged (a JSON line at warn), with whom it was for.
    expect(warn).toHaveBeenCalledWith(
      expect.objectContaining({ to: [email] }),
      expect.stringMatching(/^mail: not sent \(/),
    );
  } finally {
    warn.mockRestore();
    config.smtpUrl = saved;
  }
});
