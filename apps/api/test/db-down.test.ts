/**
 * While PostgreSQL cannot be reached the API answers 503 problem+json (with Retry-After), never
 * 500, and answers as before once it is back; the process stays up throughout. The API reaches
 * the test database through a TCP relay of this test's own, which is cut (every connection
 * dropped, new ones refused) and restored, set before the app's modules are loaded.
 */
import net from 'node:net';
import type { Express } from 'express';
import request from 'supertest';

const target = new URL(process.env.DATABASE_URL as string);
const sockets = new Set<net.Socket>();
let relay: net.Server;
let port = 0;

/** Starts relaying (again) on the same port. */
function up(): Promise<void> {
  relay = net.createServer((client) => {
    const server = net.connect(Number(target.port || 5432), target.hostname);
    for (const s of [client, server]) {
      sockets.add(s);
      s.on('close', () => sockets.delete(s));
      s.on('error', () => undefined);
    }
    client.pipe(server).pipe(client);
  });
  return new Promise((resolve) =>
    relay.listen(port, '127.0.0.1', () => {
      port = (relay.address() as net.AddressInfo).port;
      resolve();
    }),
  );
}

/** Drops every connection and refuses new ones. */
function down(): Promise<void> {
  for (const s of sockets) s.destroy();
  return new Promise((resolve) => relay.close(() => resolve()));
}

type Mods = {
  app: Express;
  sequelize: typeof import('../src/db').sequelize;
  helpers: typeof import('./helpers');
};
let m: Mods;
const saved = process.env.DATABASE_URL;
let token: string;
let email: string;

beforeAll(async () => {
  await up();
  const url = new URL(target.toString());
  url.port = String(port);
  process.env.DATABASE_URL = url.toString();
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
  await new Promise((r) => relay.close(r));
  process.env.DATABASE_URL = saved;
});

test('database away: 503 problem+json with Retry-After; back: answers as before', async () => {
  const auth = { type: 'bearer' as const };
  expect((await request(m.app).get('/api/v1/projects').auth(token, auth)).status).toBe(200);
  const silence = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  await down();
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
    await up();
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
