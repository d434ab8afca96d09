/**
 * While PostgreSQL cannot be reached the API answers 503 problem+json (with Retry-After), never
 * 500, and answers as before once it is back; the process stays up throughout. The API reaches
 * the test database through a TCP relay of this test's own (db-relay.ts), which is cut (every
 * connection dropped, new ones refused) and restored, set before the app's modules are loaded.
 */
import type { Express } from 'express';
import request from 'supertest';
import { dbRelay, type DbRelay } from './db-relay';

type Mods = {
  app: Express;
  sequelize: typeof import('../src/db').sequelize;
  helpers: typeof import('./helpers');
};
let m: Mods;
let relay: DbRelay;
const saved = process.env.DATABASE_URL;
let token: string;
let email: string;

beforeAll(async () => {
  relay = await dbRelay(process.env.DATABASE_URL as string);
  process.env.DATABASE_URL = relay.url;
  const { createApp } = await import('../src/app');
  const { sequelize } = await import('../src/db');
  const helpers = await import('./helpers');
  m = { app: createApp(), sequelize, helpers };
  const users = await helpers.makeUsers('dbdown');
  email = users.viewer.email;
  token = await helpers.signIn(m.app, email);
});

afterAll(async () => {
  await m.sequelize.close();
  await relay.close();
  process.env.DATABASE_URL = saved;
});

test('database away: 503 problem+json with Retry-After; back: answers as before', async () => {
  const auth = { type: 'bearer' as const };
  expect((await request(m.app).get('/api/v1/projects').auth(token, auth)).status).toBe(200);
  const silence = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  await relay.down();
  try {
    for (let round = 0; round < 2; round++) {
      for (const res of [
        await request(m.app).get('/api/v1/projects').auth(token, auth),
        await request(m.app).get('/api/v1/me').auth(token, auth),
        await request(m.app).post('/api/v1/projects').auth(token, auth).send({ name: 'x' }),
        await request(m.app)
          .post('/api/v1/auth/login')
          .send({ email, password: m.helpers.PASSWORD }),
      ]) {
        m.helpers.expectProblem(res, 503);
        expect(res.headers['retry-after']).toBe('5');
        expect(res.body.detail).toMatch(/database cannot be reached/);
      }
    }
  } finally {
    await relay.up();
    silence.mockRestore();
  }
  // Back: the pool makes new connections as they are needed.
  const end = Date.now() + 20_000;
  let status = 0;
  while (status !== 200 && Date.now() < end) {
    status = (await request(m.app).get('/api/v1/projects').auth(token, auth)).status;
    if (status !== 200) await new Promise((r) => setTimeout(r, 200));
  }
  expect(status).toBe(200);
  expect((await request(m.app).get('/api/v1/me').auth(token, auth)).status).toBe(200);
});
