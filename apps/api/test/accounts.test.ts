/**
 * Signing in and passwords (issue 13, item 7): the same work for an unknown address as for a
 * known one, a limit per account as well as per address, OWASP's scrypt cost with older hashes
 * replaced at sign-in, a longest password, a person changing their own password, an invited
 * person replacing the mailed one before anything else, and a reset by mail (single use,
 * expiring). The limits are set before the app's modules are loaded (they read them once).
 */
import crypto from 'node:crypto';
import type { Express } from 'express';
import request from 'supertest';

const saved = { ...process.env };
process.env.LOGIN_LIMIT = '1000';
process.env.LOGIN_ACCOUNT_LIMIT = '3';

type Mods = {
  app: Express;
  sequelize: typeof import('../src/db').sequelize;
  models: typeof import('../src/models');
  passwords: typeof import('../src/services/passwords');
  mail: typeof import('../src/services/mail');
  helpers: typeof import('./helpers');
};
let m: Mods;
const auth = { type: 'bearer' as const };
let users: Awaited<ReturnType<typeof import('./helpers').makeUsers>>;
let admin: string;

const login = (email: string, password: string) =>
  request(m.app).post('/api/v1/auth/login').send({ email, password });

/** The mails the fake received for an address, newest last. */
const mailsTo = (email: string) => m.mail.fakeInbox().filter((x) => x.to.includes(email));

/** Waits for a mail to the address beyond the first `seen` (a bound, not an assertion on time). */
async function nextMail(email: string, seen: number): Promise<string> {
  const end = Date.now() + 10_000;
  for (;;) {
    const all = mailsTo(email);
    if (all.length > seen) return all[all.length - 1].raw;
    if (Date.now() > end) throw new Error(`no mail to ${email}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The token in a reset mail's link (quoted-printable soft breaks undone). */
const tokenIn = (raw: string): string => {
  const text = raw.replace(/=\r?\n/g, '').replace(/=3D/g, '=');
  const link = /reset-password#token=(slr_[\w-]+)/.exec(text);
  if (!link) throw new Error(`no link in\n${raw}`);
  return link[1];
};

beforeAll(async () => {
  const { createApp } = await import('../src/app');
  const { sequelize } = await import('../src/db');
  m = {
    app: createApp(),
    sequelize,
    models: await import('../src/models'),
    passwords: await import('../src/services/passwords'),
    mail: await import('../src/services/mail'),
    helpers: await import('./helpers'),
  };
  await m.mail.startSmtpFake(0);
  users = await m.helpers.makeUsers('acct');
  admin = await m.helpers.signIn(m.app, users.admin.email);
});

afterAll(async () => {
  await m.mail.stopSmtpFake();
  await m.sequelize.close();
  process.env = saved;
});

test('an unknown address costs the same work as a known one: one scrypt of the current cost', async () => {
  const spy = jest.spyOn(crypto, 'scrypt');
  try {
    const work = async (email: string) => {
      spy.mockClear();
      const res = await login(email, 'not-the-password');
      m.helpers.expectProblem(res, 401);
      return {
        detail: res.body.detail as string,
        calls: spy.mock.calls.map((c) => c[3].N),
      };
    };
    const known = await work(users.reviewer.email);
    const unknown = await work('nobody-at-all@test.scarpline.example');
    const integration = await work(users.integration.email);
    expect(known).toEqual({ detail: 'Wrong e-mail or password.', calls: [2 ** 17] });
    expect(unknown).toEqual(known);
    expect(integration).toEqual(known);
  } finally {
    spy.mockRestore();
  }
});

test('failed sign-ins are limited per account, from any address; other accounts are not', async () => {
  const email = users.viewer.email;
  const statuses: number[] = [];
  for (let i = 0; i < 4; i++) statuses.push((await login(email, `wrong-${i}-password`)).status);
  expect(statuses).toEqual([401, 401, 401, 429]);
  // the right password does not get through either until the window ends
  m.helpers.expectProblem(await login(email, m.helpers.PASSWORD), 429);
  // the same address, another account: not limited (the per-address limit is 1000 here)
  expect((await login(users.engineer.email, m.helpers.PASSWORD)).status).toBe(200);
  expect((await login(` ${email.toUpperCase()} `, 'x-wrong-pw')).status).toBe(429);
});

test('hashes of OWASP scrypt cost; an older hash is replaced at the next sign-in', async () => {
  const { SCRYPT, hashPassword, needsRehash } = m.passwords;
  // OWASP Password Storage Cheat Sheet: scrypt N = 2^17, r = 8, p = 1 at the least
  expect(SCRYPT).toEqual({ N: 2 ** 17, r: 8, p: 1 });
  const fresh = await hashPassword('a-fresh-password');
  expect(fresh.split('$').slice(0, 4)).toEqual(['scrypt', '131072', '8', '1']);
  expect(needsRehash(fresh)).toBe(false);

  // a hash as the earlier code made it: N = 2^14
  const salt = crypto.randomBytes(16);
  const key = crypto.scryptSync(m.helpers.PASSWORD, salt, 32, { N: 16384, r: 8, p: 1 });
  const old = ['scrypt', 16384, 8, 1, salt.toString('base64url'), key.toString('base64url')].join(
    '$',
  );
  expect(needsRehash(old)).toBe(true);
  await m.models.User.update({ passwordHash: old }, { where: { id: users.reviewer.id } });
  expect((await login(users.reviewer.email, m.helpers.PASSWORD)).status).toBe(200);
  const now = (await m.models.User.findByPk(users.reviewer.id))?.passwordHash ?? '';
  expect(now).not.toBe(old);
  expect(now.split('$').slice(1, 4)).toEqual(['131072', '8', '1']);
  expect((await login(users.reviewer.email, m.helpers.PASSWORD)).status).toBe(200);
  const entry = await m.models.AuditEntry.findOne({
    where: { action: 'login', userId: users.reviewer.id },
    order: [['id', 'ASC']],
  });
  expect(entry?.details).toEqual({ rehashed: true });
});

test('a password is at most 256 characters: longer is refused, never cut', async () => {
  const long = 'p'.repeat(257);
  m.helpers.expectProblem(await login(users.admin.email, long), 422);
  const create = await request(m.app)
    .post('/api/v1/users')
    .auth(admin, auth)
    .send({ email: 'long-pw@test.scarpline.example', name: 'L', role: 'viewer', password: long });
  m.helpers.expectProblem(create, 422);
  expect(create.body.detail).toMatch(/at most 256 are taken/);
  // a megabyte: over the body limit before anything reads it
  const huge = await login(users.admin.email, 'p'.repeat(1_000_000));
  m.helpers.expectProblem(huge, 413);
});

test('a person changes their own password: the current one first; other sessions end', async () => {
  const email = 'changer@test.scarpline.example';
  await request(m.app)
    .post('/api/v1/users')
    .auth(admin, auth)
    .send({ email, name: 'Cora Changer', role: 'engineer', password: 'first-password-1' });
  const here = (await login(email, 'first-password-1')).body.token as string;
  const elsewhere = (await login(email, 'first-password-1')).body.token as string;
  const change = (token: string, body: object) =>
    request(m.app).post('/api/v1/me/password').auth(token, auth).send(body);

  const wrong = await change(here, { currentPassword: 'nope-nope-1', newPassword: 'second-pw-22' });
  m.helpers.expectProblem(wrong, 403);
  expect(wrong.body.detail).toBe('The current password is wrong.');
  m.helpers.expectProblem(
    await change(here, { currentPassword: 'first-password-1', newPassword: 'short' }),
    422,
  );
  m.helpers.expectProblem(
    await change(here, { currentPassword: 'first-password-1', newPassword: 'first-password-1' }),
    422,
  );
  const ok = await change(here, {
    currentPassword: 'first-password-1',
    newPassword: 'second-password-22',
  });
  expect(ok.status).toBe(200);
  expect(ok.body).toMatchObject({ email, mustChangePassword: false });
  expect((await request(m.app).get('/api/v1/me').auth(here, auth)).status).toBe(200);
  m.helpers.expectProblem(await request(m.app).get('/api/v1/me').auth(elsewhere, auth), 401);
  m.helpers.expectProblem(await login(email, 'first-password-1'), 401);
  expect((await login(email, 'second-password-22')).status).toBe(200);
  // an integration token has no password to change
  const token = await request(m.app)
    .post('/api/v1/tokens')
    .auth(admin, auth)
    .send({ userId: users.integration.id, name: 'acct', projectIds: [] });
  m.helpers.expectProblem(
    await change(token.body.token as string, { currentPassword: 'a', newPassword: 'b' }),
    403,
  );
});

test('an invited person replaces the mailed password before anything else', async () => {
  const email = 'invitee@test.scarpline.example';
  const seen = mailsTo(email).length;
  const invite = await request(m.app)
    .post('/api/v1/users')
    .auth(admin, auth)
    .send({ email, name: 'Ines Invitee', role: 'engineer' });
  expect(invite.body).toMatchObject({ invited: true, mustChangePassword: true });
  const mailed = /Password: (\S+)/.exec(await nextMail(email, seen))?.[1] ?? '';
  const signedIn = await login(email, mailed);
  expect(signedIn.status).toBe(200);
  expect(signedIn.body.user.mustChangePassword).toBe(true);
  const token = signedIn.body.token as string;
  const blocked = await request(m.app).get('/api/v1/projects').auth(token, auth);
  m.helpers.expectProblem(blocked, 403);
  expect(blocked.body.title).toBe('Password change required');
  const me = await request(m.app).get('/api/v1/me').auth(token, auth);
  expect(me.body.mustChangePassword).toBe(true);
  const changed = await request(m.app)
    .post('/api/v1/me/password')
    .auth(token, auth)
    .send({ currentPassword: mailed, newPassword: 'my-own-password-9' });
  expect(changed.body.mustChangePassword).toBe(false);
  expect((await request(m.app).get('/api/v1/projects').auth(token, auth)).status).toBe(200);
});

test('a reset by mail: a link that works once, before it expires; nothing said of unknown addresses', async () => {
  const email = users.engineer.email;
  const ask = (address: string) =>
    request(m.app).post('/api/v1/password-resets').send({ email: address });
  const session = (await login(email, m.helpers.PASSWORD)).body.token as string;

  const seen = mailsTo(email).length;
  const asked = await ask(email.toUpperCase());
  const unknown = await ask('nobody-here@test.scarpline.example');
  expect(asked.status).toBe(202);
  expect(unknown.status).toBe(202);
  expect(unknown.body).toEqual(asked.body);
  const token = tokenIn(await nextMail(email, seen));
  expect(mailsTo('nobody-here@test.scarpline.example')).toEqual([]);
  // the token is stored as its hash only
  const row = await m.models.PasswordReset.findOne({
    where: { userId: users.engineer.id, usedAt: null },
  });
  expect(row?.tokenHash).toMatch(/^[0-9a-f]{64}$/);
  expect(JSON.stringify(row)).not.toContain(token);

  const set = (t: string, password: string) =>
    request(m.app).post('/api/v1/password-resets/confirm').send({ token: t, password });
  m.helpers.expectProblem(await set(token, 'short'), 422);
  const done = await set(token, 'reset-password-77');
  expect(done.status).toBe(200);
  expect(done.body).toEqual({ email });
  m.helpers.expectProblem(await set(token, 'again-password-88'), 400);
  expect((await login(email, 'reset-password-77')).status).toBe(200);
  m.helpers.expectProblem(await login(email, m.helpers.PASSWORD), 401);
  // every session of before ends
  m.helpers.expectProblem(await request(m.app).get('/api/v1/me').auth(session, auth), 401);

  // a link past its time, and one replaced by a newer link, do not work
  const seen2 = mailsTo(email).length;
  await ask(email);
  const first = tokenIn(await nextMail(email, seen2));
  await ask(email);
  const second = tokenIn(await nextMail(email, seen2 + 1));
  m.helpers.expectProblem(await set(first, 'replaced-password-1'), 400);
  await m.models.PasswordReset.update(
    { expiresAt: new Date(Date.now() - 1000) },
    { where: { userId: users.engineer.id, usedAt: null } },
  );
  const expired = await set(second, 'expired-password-1');
  m.helpers.expectProblem(expired, 400);
  expect(expired.body.detail).toMatch(/not valid: it was used already, has expired/);
  m.helpers.expectProblem(await set('slr_made-up', 'made-up-password-1'), 400);
  expect((await login(email, 'reset-password-77')).status).toBe(200);
});
