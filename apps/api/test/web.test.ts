/**
 * The web app's build served beside the API (config.webDist, WEB_DIST): its files with the
 * right caching, index.html for pages a browser opens (deep links), problem+json under /api.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { expectProblem, makeUsers, signIn } from './helpers';

const INDEX =
  '<!doctype html><html><head><title>Scarpline (test build)</title></head><body><app-root></app-root><script src="main-7QX2KD4M.js" type="module"></script></body></html>';
const MAIN = 'console.log("test build");\n';
const PLACEHOLDER = '<!doctype html><title>placeholder</title><p>no web build</p>';
const LONG = 'public, max-age=31536000, immutable';
const HTML = 'text/html,application/xhtml+xml,application/xml;q=0.9,*/*;q=0.8';

const saved = config.webDist;
let tmp: string;
let app: ReturnType<typeof createApp>;
let token: string;

beforeAll(async () => {
  tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-web-'));
  const dist = path.join(tmp, 'browser');
  fs.mkdirSync(path.join(dist, 'media'), { recursive: true });
  fs.writeFileSync(path.join(dist, 'index.html'), INDEX);
  fs.writeFileSync(path.join(dist, 'main-7QX2KD4M.js'), MAIN);
  fs.writeFileSync(path.join(dist, 'media', 'fira-sans-latin-400-normal-B2X5RZ6Q.woff2'), 'font');
  fs.writeFileSync(path.join(dist, 'favicon.ico'), 'icon');
  // Beside the build, not in it: must never be served.
  fs.writeFileSync(path.join(tmp, 'secret.txt'), 'NOT-FOR-THE-WEB');
  config.webDist = dist;
  app = createApp({ homePage: PLACEHOLDER });
  const users = await makeUsers('web');
  token = await signIn(app, users.viewer.email);
});

afterAll(async () => {
  config.webDist = saved;
  fs.rmSync(tmp, { recursive: true, force: true });
  await sequelize.close();
});

test('/ and deep links a browser opens get index.html, revalidated on each use', async () => {
  for (const p of ['/', '/batches/12', '/sections/7/review', '/admin/users?page=2']) {
    const res = await request(app).get(p).set('Accept', HTML);
    expect([p, res.status, res.headers['content-type']]).toEqual([
      p,
      200,
      'text/html; charset=utf-8',
    ]);
    expect(res.text).toBe(INDEX);
    expect(res.headers['cache-control']).toBe('no-cache');
    expect(res.text).not.toContain('no web build');
  }
  const direct = await request(app).get('/index.html');
  expect(direct.text).toBe(INDEX);
  expect(direct.headers['cache-control']).toBe('no-cache');
  const head = await request(app).head('/batches/12').set('Accept', HTML);
  expect(head.status).toBe(200);
  expect(head.headers['content-type']).toMatch(/^text\/html/);
});

test("the page's CSP allows no inline script at all (the web build has none)", async () => {
  const res = await request(app).get('/batches/12').set('Accept', HTML);
  const csp = String(res.headers['content-security-policy']);
  const directives = Object.fromEntries(
    csp.split(';').map((d) => {
      const [name, ...values] = d.trim().split(/\s+/);
      return [name, values];
    }),
  );
  expect(directives['script-src-attr']).toEqual(["'none'"]);
  expect(directives['script-src']).toEqual(["'self'"]);
});

test('hashed files are cached for a year; other files are revalidated', async () => {
  const main = await request(app).get('/main-7QX2KD4M.js');
  expect(main.status).toBe(200);
  expect(main.headers['content-type']).toMatch(/^(text|application)\/javascript/);
  expect(main.text).toBe(MAIN);
  expect(main.headers['cache-control']).toBe(LONG);
  const font = await request(app).get('/media/fira-sans-latin-400-normal-B2X5RZ6Q.woff2');
  expect(font.status).toBe(200);
  expect(font.headers['cache-control']).toBe(LONG);
  const icon = await request(app).get('/favicon.ico');
  expect(icon.status).toBe(200);
  expect(icon.headers['cache-control']).toBe('no-cache');
  // An unchanged index.html is answered 304 with its ETag.
  const first = await request(app).get('/').set('Accept', HTML);
  const again = await request(app)
    .get('/')
    .set('Accept', HTML)
    .set('If-None-Match', first.headers.etag);
  expect(again.status).toBe(304);
});

test('what is not a page stays a 404 problem: a missing asset, a POST, a file outside the build', async () => {
  expectProblem(await request(app).get('/main-ZZZZZZZZ.js').set('Accept', '*/*'), 404);
  expectProblem(await request(app).get('/batches/12').set('Accept', 'application/json'), 404);
  expectProblem(await request(app).post('/batches/12').set('Accept', HTML).send({}), 404);
  for (const p of ['/../secret.txt', '/%2e%2e/secret.txt', '/media/..%2f..%2fsecret.txt']) {
    const res = await request(app).get(p).set('Accept', HTML);
    expect([p, res.text.includes('NOT-FOR-THE-WEB')]).toEqual([p, false]);
  }
});

test('under /api nothing falls back to index.html: unknown routes are problem+json', async () => {
  const unknown = await request(app)
    .get('/api/v1/unknown')
    .set('Accept', HTML)
    .auth(token, { type: 'bearer' });
  expectProblem(unknown, 404);
  expect(unknown.body.detail).toBe('No route GET /api/v1/unknown.');
  expectProblem(await request(app).get('/api/v1/unknown').set('Accept', HTML), 401);
  expectProblem(await request(app).get('/api/elsewhere').set('Accept', HTML), 404);
  expectProblem(await request(app).get('/api').set('Accept', HTML), 404);
  expectProblem(await request(app).get('/api/schemas/nothing.json').set('Accept', HTML), 404);
  const me = await request(app)
    .get('/api/v1/me')
    .set('Accept', HTML)
    .auth(token, { type: 'bearer' });
  expect(me.status).toBe(200);
  expect(me.headers['content-type']).toMatch(/^application\/json/);
  const docs = await request(app).get('/api/docs/').set('Accept', HTML);
  expect(docs.status).toBe(200);
  expect(docs.text).toContain('swagger-ui');
  expect(docs.text).not.toBe(INDEX);
  const schema = await request(app).get('/api/schemas/openapi.json');
  expect(schema.body.openapi).toBe('3.1.0');
});

test('without a build, / is the placeholder page and deep links are 404 problems', async () => {
  config.webDist = path.join(tmp, 'not-built');
  try {
    const bare = createApp({ homePage: PLACEHOLDER });
    const home = await request(bare).get('/').set('Accept', HTML);
    expect(home.status).toBe(200);
    expect(home.text).toBe(PLACEHOLDER);
    expectProblem(await request(bare).get('/batches/12').set('Accept', HTML), 404);
    expectProblem(await request(bare).get('/main-7QX2KD4M.js'), 404);
  } finally {
    config.webDist = path.join(tmp, 'browser');
  }
});
