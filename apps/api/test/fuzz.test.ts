/**
 * What no request may do to the service, tried with a seeded generator of malformed and
 * pathological requests against the real API (over its own socket) on the real database:
 * random and mutated bodies, charsets and encodings, paths, ids and queries, multipart forms
 * whole and broken, headers and tokens of every kind, and raw bytes that are hardly HTTP.
 * For each: no 5xx, an answer within a generous bound (a hang detector, not a speed test),
 * and a problem+json body for every error the API itself gives. For a tenth of the run the
 * database is away (the API reaches it through a relay that is cut): then 503 is the one 5xx
 * allowed. After all of them: every row written has its audit entry (no half-written writes),
 * and the process still answers.
 *
 * FUZZ_REQUESTS (default 3000) sets how many, FUZZ_SEED (default 13) which ones, and
 * FUZZ_CONCURRENCY (default 4) how many at once (1 repeats a failure in the same order).
 */
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import path from 'node:path';
import zlib from 'node:zlib';
import type { Express } from 'express';
import { QueryTypes } from 'sequelize';
import { seededRandom } from '@scarpline/core';
import { dbRelay, type DbRelay } from './db-relay';

const REQUESTS = Number(process.env.FUZZ_REQUESTS ?? 3000);
const SEED = Number(process.env.FUZZ_SEED ?? 13);
const CONCURRENCY = Number(process.env.FUZZ_CONCURRENCY ?? 4);
/** Longer than any request may take: a hang detector, not a measurement. */
const BOUND_MS = 10_000;

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const corridor = JSON.parse(
  fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
) as Record<string, unknown> & { sections: unknown[] };
const sectionYaml = fs.readFileSync(path.join(EXAMPLES, 'cut-homogeneous.yaml'), 'utf8');

/** The API's modules, loaded once DATABASE_URL points at the relay (they read it once). */
type Mods = {
  app: Express;
  sequelize: typeof import('../src/db').sequelize;
  intake: typeof import('../src/intake/pool');
  models: typeof import('../src/models');
  queue: typeof import('../src/queue');
  routes: typeof import('../src/routes');
  helpers: typeof import('./helpers');
};
let m: Mods;
let relay: DbRelay;
const savedUrl = process.env.DATABASE_URL;
let server: http.Server;
let port: number;
let startedAt: Date;
const tokens: Record<string, string> = {};
const ids: Record<string, number> = {};
/**
 * What the requests that disable users, revoke tokens and end sessions act on: users and tokens
 * of their own, so that the tokens the run sends keep working (a 401 for them would hide what
 * the rest of the run tries).
 */
const victims = { users: [] as number[], tokens: [] as number[], session: '' };

/** One request as the generator makes it. */
interface Spec {
  kind: string;
  method: string;
  path: string;
  headers: Record<string, string>;
  body?: Buffer;
  /** Bytes sent as they are over a socket (not HTTP the client would send). */
  raw?: Buffer;
}

interface Answer {
  status: number;
  type: string;
  body: string;
  /** The answer came from Node's HTTP parser (a request it could not read), not the API. */
  fromNode: boolean;
}

// ---------------------------------------------------------------- the generator

type Rand = () => number;
const pick = <T>(r: Rand, xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
const chance = (r: Rand, p: number) => r() < p;
const int = (r: Rand, lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1));

/** Texts that have broken services: control characters, lone surrogates, long, odd Unicode. */
function nastyText(r: Rand): string {
  const kinds = [
    () => 'a\u0000b',
    () => '\ud800',
    () => 'x\udc00y',
    () => '\u0000'.repeat(int(r, 1, 5)),
    () => 'x'.repeat(pick(r, [199, 200, 201, 255, 256, 5000, 10_001, 60_000])),
    () => '\u202e\ufeff\u200b' + 'ünïcödé ✓ 𝔰𝔩𝔬𝔭𝔢',
    () => "'; DROP TABLE users; --",
    () => '<script>alert(1)</script>',
    () => '${7*7}{{7*7}}%s%n',
    () => '../../../../etc/passwd',
    () => ' ',
    () => '',
    () => '%00%zz%',
    () => String(r()),
    () => 'a@b',
  ];
  return pick(r, kinds)();
}

/** A random JSON value of depth at most `depth`. */
function jsonValue(r: Rand, depth: number): unknown {
  const k = int(r, 0, depth > 0 ? 9 : 5);
  switch (k) {
    case 0:
      return null;
    case 1:
      return chance(r, 0.5);
    case 2:
      return pick(r, [0, -1, 1e308, -1e-308, 2 ** 53 + 1, 0.1, 1e20, 2147483648, -0]);
    case 3:
    case 4:
      return nastyText(r);
    case 5:
      return pick(r, ['approved', 'returned', 'admin', 'engineer', 'viewer', 'si', 'us']);
    case 6:
    case 7: {
      const n = int(r, 0, 6);
      return Array.from({ length: n }, () => jsonValue(r, depth - 1));
    }
    default: {
      const o: Record<string, unknown> = {};
      for (let i = int(r, 0, 6); i > 0; i--) {
        const key = chance(r, 0.7)
          ? pick(r, [
              'name',
              'email',
              'password',
              'role',
              'active',
              'description',
              'decision',
              'comment',
              'userId',
              'projectIds',
              'days',
              'title',
              'materials',
              'analysis',
              'requiredFs',
              'token',
              'currentPassword',
              'newPassword',
              '__proto__',
              'constructor',
              'access_token',
            ])
          : nastyText(r);
        o[key] = jsonValue(r, depth - 1);
      }
      return o;
    }
  }
}

/** Every byte of a text's UTF-8 as %XX (a lone surrogate too, as U+FFFD's bytes). */
const percent = (text: string) =>
  [...Buffer.from(text, 'utf8')].map((b) => `%${b.toString(16).padStart(2, '0')}`).join('');

/** Nested lists or groups, `n` deep (past the core's limit of 64, or far past it). */
const deep = (n: number, group: boolean) =>
  group ? '{"a":'.repeat(n) + '1' + '}'.repeat(n) : '['.repeat(n) + ']'.repeat(n);

/** A JSON text: valid, broken, huge, deep, or not JSON at all. */
function jsonText(r: Rand, base?: unknown): string {
  const valid = JSON.stringify(base ?? jsonValue(r, 4)) ?? 'null';
  switch (int(r, 0, 11)) {
    case 0:
      return valid.slice(0, int(r, 0, valid.length)); // cut off
    case 1:
      return deep(pick(r, [65, 200, 5000, 40_000]), chance(r, 0.5));
    case 2:
      return `[${'1,'.repeat(int(r, 2001, 60_000))}1]`;
    case 3:
      return '{"name":"a","name":"b","email":"x@y"}';
    case 4:
      return '\ufeff' + valid;
    case 5:
      return pick(r, ['', 'null', 'true', '"x"', '[]', 'NaN', 'undefined', '{', '}', 'Infinity']);
    case 6:
      return valid.replace(/"/g, "'");
    default:
      return valid;
  }
}

/** A body's bytes in an encoding, and the header that says so (or that lies). */
function encode(r: Rand, text: string): { body: Buffer; headers: Record<string, string> } {
  const raw = Buffer.from(text, 'utf8');
  switch (int(r, 0, 14)) {
    case 0:
      return { body: zlib.gzipSync(raw), headers: { 'content-encoding': 'gzip' } };
    case 1:
      return { body: zlib.gzipSync(raw).subarray(0, 10), headers: { 'content-encoding': 'gzip' } };
    case 2:
      return { body: raw, headers: { 'content-encoding': 'gzip' } };
    case 3:
      return { body: zlib.deflateSync(raw), headers: { 'content-encoding': 'deflate' } };
    case 4:
      return { body: zlib.brotliCompressSync(raw), headers: { 'content-encoding': 'br' } };
    case 5:
      return {
        body: raw,
        headers: { 'content-encoding': pick(r, ['zstd', 'compress', 'gzip, gzip', 'x']) },
      };
    case 6:
      // a gzip bomb: small on the wire, past every limit inflated
      return {
        body: zlib.gzipSync(Buffer.alloc(int(r, 1, 8) * 1024 * 1024, 0x20)),
        headers: { 'content-encoding': 'gzip' },
      };
    default:
      return { body: raw, headers: {} };
  }
}

function contentType(r: Rand): string {
  return pick(r, [
    'application/json',
    'application/json',
    'application/json',
    'application/json; charset=utf-8',
    'application/json; charset=utf-16',
    'application/json; charset=latin1',
    'application/json; charset=klingon',
    'application/json; charset=',
    'application/merge-patch+json',
    'text/plain',
    'application/x-www-form-urlencoded',
    'multipart/form-data',
    '',
    'application/json;;;',
  ]);
}

/**
 * Ids as a path holds them: real ones (of `own` when given), missing ones, and what only looks
 * like an id.
 */
function idText(r: Rand, own?: number[]): string {
  if (chance(r, 0.55)) return String(pick(r, own ?? Object.values(ids)));
  return pick(r, [
    '0',
    '-1',
    '0x1',
    '1e0',
    '1e20',
    '01',
    '1.0',
    '99999999999',
    '2147483648',
    '2147483647',
    'abc',
    '%00',
    '%zz',
    '%F0%9F%92%A9',
    '١',
    ' 1',
    '1%20',
    'null',
    'undefined',
    'x'.repeat(3000),
    '..',
    '%2e%2e',
    '1;2',
    '[1]',
  ]);
}

/** The routes the app registers, as `[method, path with :params]`. */
function routes(): [string, string][] {
  const out: [string, string][] = [];
  for (const router of [...m.routes.publicRoutes, ...m.routes.authenticatedRoutes]) {
    for (const layer of router.stack as { route?: { path: string; methods: object } }[]) {
      if (!layer.route) continue;
      for (const m of Object.keys(layer.route.methods))
        out.push([m.toUpperCase(), layer.route.path]);
    }
  }
  return out;
}

function auth(r: Rand): Record<string, string> {
  const roles = Object.keys(tokens).filter((k) => k !== 'revoked');
  switch (int(r, 0, 9)) {
    case 0:
      return {};
    case 1:
      return {
        authorization: pick(r, [
          'Bearer',
          'Bearer ',
          'Basic YTpi',
          'bearer x',
          `Bearer ${'a'.repeat(5000)}`,
          'Bearer sls_\u00e9',
        ]),
      };
    case 2:
      return { authorization: `Bearer ${tokens.revoked}` };
    default:
      return { authorization: `Bearer ${tokens[pick(r, roles)]}` };
  }
}

/** A query string of sorts. */
function query(r: Rand): string {
  if (chance(r, 0.6)) return '';
  const params = [
    ['page', pick(r, ['1', '2', '1e20', '0', '-1', '2.5', '100001', '', 'x', '١'])],
    ['pageSize', pick(r, ['10', '500', '501', '1e9', '0'])],
    ['sort', pick(r, ['station', 'fs', 'ratio', 'position', 'x', ''])],
    ['order', pick(r, ['asc', 'desc', 'up'])],
    ['status', pick(r, ['queued', 'done', 'failed', 'nope', '%00'])],
    ['verdict', pick(r, ['meets', 'below', 'fail', ''])],
    ['case', pick(r, ['long-term', "a'b", 'as given', 'x'.repeat(101), '%00', ''])],
    ['access_token', tokens[pick(r, Object.keys(tokens))]],
    ['page[a]', '1'],
    ['%zz', '%zz'],
  ];
  const n = int(r, 1, 4);
  const parts: string[] = [];
  for (let i = 0; i < n; i++) {
    const [k, v] = pick(r, params);
    parts.push(`${k}=${v.startsWith('%') || k.startsWith('%') ? v : percent(v)}`);
  }
  return `?${parts.join('&')}`;
}

/** A valid body for a route, the way its client would send it (then, often, one field spoilt). */
function validBody(r: Rand, method: string, route: string): unknown {
  const key = `${method} ${route}`;
  const word = () => `fuzz-${Math.floor(r() * 1e9)}`;
  const bodies: Record<string, () => unknown> = {
    'POST /auth/login': () => ({
      email: pick(r, ['nobody@x.example', 'fuzz-admin@test.scarpline.example']),
      password: word(),
    }),
    'POST /projects': () => ({ name: word(), description: 'made by the fuzz test' }),
    'POST /users': () => ({
      email: `${word()}@fuzz.example`,
      name: word(),
      role: pick(r, ['viewer', 'integration', 'engineer']),
    }),
    'PATCH /users/:id': () => ({ name: word() }),
    'POST /tokens': () => ({
      userId: ids.integrationUser,
      name: word(),
      projectIds: [ids.project],
      days: 5,
    }),
    'POST /sections/:id/reviews': () => ({
      decision: pick(r, ['approved', 'returned']),
      comment: word(),
    }),
    'POST /batches/:id/reviews': () => ({
      decision: pick(r, ['approved', 'returned']),
      comment: word(),
    }),
    'POST /batches/:id/review-requests': () => ({ comment: word() }),
    'POST /sections/:id/runs': () => ({
      requiredFs: pick(r, [1.3, 1.5, 0, -1, 'x']),
      title: word(),
      cases: pick(r, [
        undefined,
        { 'long-term': { requiredFs: 1.4 } },
        { [word()]: null },
        { [word()]: { kind: 'other' } },
        [],
        5,
      ]),
    }),
    'POST /projects/:id/batches': () => ({
      ...corridor,
      id: word(),
      sections: corridor.sections.slice(0, int(r, 0, 3)),
    }),
    'POST /me/password': () => ({ currentPassword: word(), newPassword: word() }),
    'POST /password-resets': () => ({
      email: pick(r, ['nobody@x.example', `${word()}@fuzz.example`]),
    }),
    'POST /password-resets/confirm': () => ({ token: `slr_${word()}`, password: word() }),
  };
  const make = bodies[key] ?? (() => jsonValue(r, 3));
  const body = make();
  if (chance(r, 0.6) && body && typeof body === 'object' && !Array.isArray(body)) {
    const o = body as Record<string, unknown>;
    const keys = Object.keys(o);
    const k = keys.length > 0 && chance(r, 0.8) ? pick(r, keys) : nastyText(r);
    if (chance(r, 0.15)) delete o[k];
    else o[k] = chance(r, 0.5) ? nastyText(r) : jsonValue(r, 2);
  }
  return body;
}

/** A multipart form: whole, or broken in one of the ways clients and attackers break them. */
function multipart(r: Rand): { body: Buffer; headers: Record<string, string> } {
  const boundary = `----fuzz${Math.floor(r() * 1e9)}`;
  const files: [string, string][] = [];
  for (let i = int(r, 0, 4); i > 0; i--) {
    const name = chance(r, 0.8)
      ? pick(r, ['a.json', 'corridor.geojson', 'cut.yaml', 'x.yml', 'noext', '.json'])
      : nastyText(r);
    const content = pick(r, [
      () =>
        JSON.stringify({ ...corridor, id: `fuzz-${i}`, sections: corridor.sections.slice(0, 2) }),
      () => sectionYaml,
      () => sectionYaml.slice(0, int(r, 0, sectionYaml.length)),
      () => sectionYaml.replace(/\d/g, () => pick(r, ['x', '\u0000', '9e999', '-'])),
      () => deep(pick(r, [100, 10_000]), false),
      () => jsonText(r),
      () => '&a [*a, *a, *a]\n'.repeat(50),
      () => '',
    ])();
    files.push([name, content]);
  }
  const parts = files.map(([name, content]) => {
    const disposition = chance(r, 0.9)
      ? `form-data; name="${chance(r, 0.9) ? 'files' : pick(r, ['file', 'other', ''])}"; filename="${name.replace(/"/g, '')}"`
      : `form-data; name="files"; filename*=utf-8''${percent(name)}`;
    return `--${boundary}\r\nContent-Disposition: ${disposition}\r\nContent-Type: application/octet-stream\r\n\r\n${content}\r\n`;
  });
  let text = parts.join('') + `--${boundary}--\r\n`;
  let type = `multipart/form-data; boundary=${boundary}`;
  switch (int(r, 0, 9)) {
    case 0:
      type = 'multipart/form-data';
      break;
    case 1:
      type = 'multipart/form-data; boundary=other';
      break;
    case 2:
      text = text.slice(0, int(r, 0, text.length)); // cut off
      break;
    case 3:
      text = `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="a\u0000.json"\r\n\r\n{}\r\n--${boundary}--\r\n`;
      break;
    case 4:
      text =
        Array.from(
          { length: 600 },
          () =>
            `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="s.json"\r\n\r\n{}\r\n`,
        ).join('') + `--${boundary}--\r\n`;
      break;
    case 5:
      text = `--${boundary}\r\n${'X-Header: y\r\n'.repeat(300)}\r\n{}\r\n--${boundary}--\r\n`;
      break;
    default:
  }
  return { body: Buffer.from(text, 'utf8'), headers: { 'content-type': type } };
}

/** Bytes over a socket that a well-behaved client would never send. */
function rawRequest(r: Rand): Buffer {
  const token = tokens[pick(r, Object.keys(tokens))];
  const lines = pick(r, [
    () => `GET /api/v1/me HTTP/1.1\r\nHost: x\r\nAuthorization: Bearer ${token}\r\n\r\n`,
    () => 'GARBAGE\r\n\r\n',
    () => `GET /api/v1/${'a'.repeat(20_000)} HTTP/1.1\r\nHost: x\r\n\r\n`,
    () => `GET /api/v1/me HTTP/1.1\r\nHost: x\r\nX-Long: ${'b'.repeat(20_000)}\r\n\r\n`,
    () =>
      `POST /api/v1/projects HTTP/1.1\r\nHost: x\r\nAuthorization: Bearer ${token}\r\nContent-Type: application/json\r\nContent-Length: 100\r\n\r\n{"name":`,
    () =>
      `POST /api/v1/projects HTTP/1.1\r\nHost: x\r\nAuthorization: Bearer ${token}\r\nContent-Type: application/json\r\nContent-Length: 5\r\nTransfer-Encoding: chunked\r\n\r\n0\r\n\r\n`,
    () =>
      `POST /api/v1/projects HTTP/1.1\r\nHost: x\r\nAuthorization: Bearer ${token}\r\nContent-Type: application/json\r\nTransfer-Encoding: chunked\r\n\r\nzz\r\n{}\r\n0\r\n\r\n`,
    () => `GET /api/v1/me HTTP/1.0\r\n\r\n`,
    () => `GET /api/v1/me\r\n\r\n`,
    () => `GET /api/v1/me HTTP/1.1\r\nHost: x\r\nAuthorization: Bearer \u0000\r\n\r\n`,
    () =>
      `GET /api/v1/me HTTP/1.1\r\nHost: x\r\n\r\nGET /api/v1/projects HTTP/1.1\r\nHost: x\r\n\r\n`,
    () => `PRI * HTTP/2.0\r\n\r\nSM\r\n\r\n`,
    () => `GET /%zz%00 HTTP/1.1\r\nHost: x\r\nAccept: text/html\r\n\r\n`,
  ])();
  return Buffer.from(lines, 'latin1');
}

/** The next request of the seeded sequence. */
function generate(r: Rand, table: [string, string][]): Spec {
  const kind = pick(r, [
    'route',
    'route',
    'route',
    'mutate',
    'mutate',
    'mutate',
    'body',
    'multipart',
    'query',
    'raw',
  ]);
  if (kind === 'raw') return { kind, method: '', path: '', headers: {}, raw: rawRequest(r) };
  const [method0, route] = pick(r, table);
  const method = chance(r, 0.1)
    ? pick(r, ['PUT', 'DELETE', 'PATCH', 'OPTIONS', 'HEAD', 'TRACE'])
    : method0;
  // a client percent-encodes what a path cannot hold; escapes written here stay as they are
  const own = route.startsWith('/users/')
    ? victims.users
    : route.startsWith('/tokens/')
      ? victims.tokens
      : null;
  const filled = route.replace(/:id/g, () => {
    const id = idText(r, own ?? undefined);
    return id.startsWith('%') ? id : /^[\w.-]*$/.test(id) ? id : percent(id);
  });
  const url = `/api/v1${filled}${kind === 'query' || chance(r, 0.15) ? query(r) : ''}`;
  const headers: Record<string, string> =
    route === '/auth/logout' ? { authorization: `Bearer ${victims.session}` } : { ...auth(r) };
  if (chance(r, 0.05)) headers['x-forwarded-proto'] = 'https';
  if (chance(r, 0.05))
    headers['if-none-match'] = pick(r, ['*', 'W/"x"', '"\u00e9"', 'x'.repeat(4000)]);
  if (chance(r, 0.05)) headers.accept = pick(r, ['text/html', '*/*', 'application/xml', '']);
  if (kind === 'multipart' || (route.endsWith('/uploads') && chance(r, 0.7))) {
    const form = multipart(r);
    return {
      kind: 'multipart',
      method,
      path: `/api/v1${filled}`,
      headers: { ...headers, ...form.headers },
      body: form.body,
    };
  }
  if (method === 'GET' || method === 'HEAD' || (kind === 'route' && chance(r, 0.3))) {
    return { kind, method, path: url, headers };
  }
  const text =
    kind === 'mutate'
      ? JSON.stringify(validBody(r, method, route))
      : jsonText(r, validBody(r, method, route));
  const enc = kind === 'body' ? encode(r, text) : { body: Buffer.from(text, 'utf8'), headers: {} };
  return {
    kind,
    method,
    path: url,
    headers: {
      ...headers,
      'content-type': kind === 'body' ? contentType(r) : 'application/json',
      ...enc.headers,
    },
    body: enc.body,
  };
}

// ---------------------------------------------------------------- sending

function send(spec: Spec): Promise<Answer> {
  return spec.raw ? sendRaw(spec.raw) : sendHttp(spec);
}

function sendHttp(spec: Spec): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        method: spec.method,
        path: spec.path,
        headers: spec.body
          ? { ...spec.headers, 'content-length': String(spec.body.length) }
          : spec.headers,
        agent: false,
      },
      (res) => {
        const type = String(res.headers['content-type'] ?? '');
        const chunks: Buffer[] = [];
        let size = 0;
        const done = () => {
          clearTimeout(timer);
          resolve({
            status: res.statusCode ?? 0,
            type,
            body: Buffer.concat(chunks).toString('utf8'),
            fromNode: false,
          });
        };
        // a live-progress stream stays open: its answer is its head
        if (type.startsWith('text/event-stream')) {
          res.destroy();
          return done();
        }
        res.on('data', (c: Buffer) => {
          size += c.length;
          if (size <= 2_000_000) chunks.push(c);
        });
        res.on('end', done);
        res.on('error', done);
      },
    );
    // (the response's callbacks run later, when this is set)
    const timer = setTimeout(() => {
      req.destroy();
      reject(new Error(`no answer within ${BOUND_MS} ms`));
    }, BOUND_MS);
    req.on('error', (e) => {
      clearTimeout(timer);
      // the server may close a connection whose body it refused before reading it all
      if (/ECONNRESET|EPIPE|socket hang up/.test(e.message)) {
        resolve({ status: 0, type: '', body: e.message, fromNode: true });
      } else reject(e);
    });
    req.end(spec.body);
  });
}

function sendRaw(bytes: Buffer): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const socket = net.connect(port, '127.0.0.1');
    const chunks: Buffer[] = [];
    const timer = setTimeout(() => {
      socket.destroy();
      reject(new Error(`no answer within ${BOUND_MS} ms`));
    }, BOUND_MS);
    socket.on('data', (c: Buffer) => chunks.push(c));
    socket.on('error', () => undefined);
    socket.on('close', () => {
      clearTimeout(timer);
      const text = Buffer.concat(chunks).toString('latin1');
      const statuses = [...text.matchAll(/^HTTP\/1\.[01] (\d{3})/gm)].map((m) => Number(m[1]));
      const worst = statuses.length > 0 ? Math.max(...statuses) : 0;
      const fromNode = !/application\/problem\+json|application\/json/.test(text);
      resolve({
        status: worst,
        type: /content-type: ([^\r\n]+)/i.exec(text)?.[1] ?? '',
        body: text.slice(0, 500),
        fromNode,
      });
    });
    socket.write(bytes);
    // ends its side once sent: the server reads what it got and answers or closes
    socket.end();
  });
}

// ---------------------------------------------------------------- the test

beforeAll(async () => {
  relay = await dbRelay(process.env.DATABASE_URL as string);
  process.env.DATABASE_URL = relay.url;
  const { createApp } = await import('../src/app');
  m = {
    app: createApp(),
    sequelize: (await import('../src/db')).sequelize,
    intake: await import('../src/intake/pool'),
    models: await import('../src/models'),
    queue: await import('../src/queue'),
    routes: await import('../src/routes'),
    helpers: await import('./helpers'),
  };
  const { Batch, Project, SectionRow } = m.models;
  const { makeUsers, signIn } = m.helpers;
  const app = m.app;
  await m.queue.queue();
  const users = await makeUsers('fuzz');
  for (const role of ['admin', 'engineer', 'reviewer', 'viewer'] as const) {
    tokens[role] = await signIn(app, users[role].email);
  }
  const project = await Project.create({
    name: 'Fuzz A',
    description: null,
    createdBy: users.admin.id,
  });
  const other = await Project.create({
    name: 'Fuzz B',
    description: null,
    createdBy: users.admin.id,
  });
  server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  port = (server.address() as net.AddressInfo).port;
  const post = async (p: string, body: unknown, token = tokens.admin) => {
    const res = await fetch(`http://127.0.0.1:${port}/api/v1${p}`, {
      method: 'POST',
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    return (await res.json()) as Record<string, unknown>;
  };
  tokens.integration = (
    await post('/tokens', { userId: users.integration.id, name: 'fuzz', projectIds: [project.id] })
  ).token as string;
  const revoked = await post('/tokens', {
    userId: users.integration.id,
    name: 'fuzz-revoked',
    projectIds: [project.id],
  });
  await fetch(`http://127.0.0.1:${port}/api/v1/tokens/${revoked.id as number}`, {
    method: 'DELETE',
    headers: { authorization: `Bearer ${tokens.admin}` },
  });
  tokens.revoked = revoked.token as string;
  // a finished batch with a section that reads (re-runs, reviews, exports), and others
  const submitted = await post(
    `/projects/${project.id}/batches`,
    { ...corridor, id: 'fuzz-done', sections: corridor.sections.slice(0, 2) },
    tokens.engineer,
  );
  const done = await Batch.findByPk(submitted.id as number);
  await done?.update({ status: 'done', finishedAt: new Date() });
  const sections = await SectionRow.findAll({ where: { batchId: done?.id } });
  for (const s of sections)
    await s.update({ status: 'failed', failReason: 'set by the fuzz test' });
  const running = await post(
    `/projects/${project.id}/batches`,
    { ...corridor, id: 'fuzz-running', sections: corridor.sections.slice(0, 1) },
    tokens.engineer,
  );
  const elsewhere = await Batch.create({
    projectId: other.id,
    submittedBy: users.engineer.id,
    name: 'b',
    title: null,
    status: 'done',
    total: 0,
    source: 'json',
    finishedAt: new Date(),
  });
  for (let i = 0; i < 3; i++) {
    const u = await post('/users', {
      email: `fuzz-victim-${i}@test.scarpline.example`,
      name: `Victim ${i}`,
      role: 'viewer',
      password: 'victim-password-1',
    });
    victims.users.push(u.id as number);
    const t = await post('/tokens', {
      userId: users.integration.id,
      name: `victim-${i}`,
      projectIds: [],
    });
    victims.tokens.push(t.id as number);
  }
  victims.session = await signIn(app, 'fuzz-victim-0@test.scarpline.example', 'victim-password-1');
  Object.assign(ids, {
    project: project.id,
    otherProject: other.id,
    doneBatch: done?.id,
    runningBatch: running.id,
    otherBatch: elsewhere.id,
    section: sections[0].id,
    section2: sections[1].id,
    integrationUser: users.integration.id,
    token: revoked.id,
    missing: 987654,
  });
  startedAt = new Date();
});

afterAll(async () => {
  server?.close();
  await m.intake.closeIntake();
  await m.queue.stopQueue();
  await m.sequelize.close();
  await relay.close();
  process.env.DATABASE_URL = savedUrl;
});

test(`${REQUESTS} malformed and pathological requests (seed ${SEED}): no 5xx, no hang, no half-written rows`, async () => {
  // the API logs what it refuses and Sequelize what it rolls back while the database is away
  const silence = jest.spyOn(console, 'error').mockImplementation(() => undefined);
  const quiet = jest.spyOn(console, 'warn').mockImplementation(() => undefined);
  const r = seededRandom(SEED);
  const table = routes();
  const specs = Array.from({ length: REQUESTS }, () => generate(r, table));
  const failures: string[] = [];
  const statuses: Record<string, number> = {};
  const kinds: Record<string, number> = {};
  let next = 0;
  // The database is away from the request at 40 % of the run to the one at 50 %, then back;
  // a request in flight at any time of that (until the API answers again) may answer 503.
  const cutAt = Math.floor(REQUESTS * 0.4);
  const backAt = Math.floor(REQUESTS * 0.5);
  let away = false;
  let outages = 0;
  let during503 = 0;
  const outage = async (i: number) => {
    if (i === cutAt) {
      away = true;
      outages++;
      await relay.down();
    } else if (i === backAt) {
      await relay.up();
      // back once the API answers from the database again (a bound, not a measurement)
      const end = Date.now() + 30_000;
      for (;;) {
        const me = await fetch(`http://127.0.0.1:${port}/api/v1/me`, {
          headers: { authorization: `Bearer ${tokens.viewer}` },
        });
        if (me.status === 200) break;
        if (Date.now() > end)
          throw new Error('the API did not answer after the database came back');
        await new Promise((res) => setTimeout(res, 100));
      }
      away = false;
    }
  };
  const describe = (s: Spec, why: string) =>
    `${why}\n  kind ${s.kind}: ${s.raw ? JSON.stringify(s.raw.toString('latin1').slice(0, 300)) : `${s.method} ${s.path.slice(0, 200)}`}\n  headers ${JSON.stringify(s.headers).slice(0, 300)}\n  body ${JSON.stringify(s.body?.toString('utf8').slice(0, 300) ?? null)}`;
  const workerLoop = async () => {
    while (next < specs.length && failures.length < 10) {
      const i = next++;
      const spec = specs[i];
      await outage(i);
      kinds[spec.kind] = (kinds[spec.kind] ?? 0) + 1;
      const before = { away, outages };
      let answer: Answer;
      try {
        answer = await send(spec);
      } catch (e) {
        failures.push(describe(spec, (e as Error).message));
        continue;
      }
      statuses[answer.status] = (statuses[answer.status] ?? 0) + 1;
      const touched = before.away || away || outages !== before.outages;
      if (answer.status === 503 && touched) {
        during503++;
        if (!/^application\/problem\+json/.test(answer.type)) {
          failures.push(describe(spec, `answered 503 as ${answer.type}, not problem+json`));
        }
      } else if (answer.status >= 500) {
        failures.push(describe(spec, `answered ${answer.status}: ${answer.body.slice(0, 300)}`));
      } else if (
        answer.status >= 400 &&
        !answer.fromNode &&
        spec.method !== 'HEAD' &&
        !/^application\/problem\+json/.test(answer.type)
      ) {
        failures.push(
          describe(
            spec,
            `answered ${answer.status} as ${answer.type || 'nothing'}, not problem+json: ${answer.body.slice(0, 200)}`,
          ),
        );
      }
    }
  };
  await Promise.all(Array.from({ length: CONCURRENCY }, workerLoop));
  silence.mockRestore();
  quiet.mockRestore();
  console.log(
    `fuzz: seed ${SEED}, ${next} requests sent (${JSON.stringify(kinds)}); answers by status ${JSON.stringify(statuses)}; 503 while the database was away: ${during503}`,
  );
  expect(failures).toEqual([]);
  // the outage was seen (the check above could fail)
  expect(during503).toBeGreaterThan(0);

  // No half-written rows: every row written during the run has its audit entry, every result its cases.
  const orphans = await m.sequelize.query<{ what: string; id: number }>(
    `SELECT 'project' AS what, p.id FROM projects p WHERE p.created_at >= $1
        AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.entity = 'project' AND a.action = 'create' AND a.entity_id = p.id)
     UNION ALL
     SELECT 'token', t.id FROM api_tokens t WHERE t.kind = 'integration' AND t.created_at >= $1
        AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.entity = 'api_token' AND a.action = 'create' AND a.entity_id = t.id)
     UNION ALL
     SELECT 'user', u.id FROM users u WHERE u.created_at >= $1
        AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.entity = 'user' AND a.action = 'create' AND a.entity_id = u.id)
     UNION ALL
     SELECT 'batch', b.id FROM batches b WHERE b.created_at >= $1
        AND (NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.entity = 'batch' AND a.action = 'submit' AND a.entity_id = b.id)
             OR b.total <> (SELECT count(*) FROM sections s WHERE s.batch_id = b.id))
     UNION ALL
     SELECT 'review', v.id FROM reviews v WHERE v.created_at >= $1
        AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.action = 'review' AND (a.details->>'reviewId')::int = v.id)
     UNION ALL
     SELECT 'rerun', s.id FROM sections s WHERE s.updated_at >= $1 AND s.run > 1
        AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.action = 'rerun' AND a.entity_id = s.id AND (a.details->>'run')::int = s.run)
     UNION ALL
     SELECT 'result', r.id FROM results r WHERE r.created_at >= $1
        AND NOT EXISTS (SELECT 1 FROM case_results c WHERE c.result_id = r.id)`,
    { bind: [startedAt], type: QueryTypes.SELECT },
  );
  expect(orphans).toEqual([]);

  // And the process still answers, with nothing left running in the intake pool.
  const me = await fetch(`http://127.0.0.1:${port}/api/v1/me`, {
    headers: { authorization: `Bearer ${tokens.viewer}` },
  });
  expect(me.status).toBe(200);
  const list = await fetch(`http://127.0.0.1:${port}/api/v1/projects`, {
    headers: { authorization: `Bearer ${tokens.engineer}` },
  });
  expect(list.status).toBe(200);
  expect(m.intake.intakeLoad()).toEqual({ running: 0, waiting: 0 });
}, 600_000);
