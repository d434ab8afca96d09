/**
 * What people submit is read off the main thread, bounded before any parser, and refused in a
 * few words: the uploads and bodies that once aborted the process, froze it for everyone, or
 * answered with megabytes of messages (issue 13, items 1, 4 and 10).
 */
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { closeIntake, intakeLoad } from '../src/intake/pool';
import { queue, stopQueue } from '../src/queue';
import { expectProblem, makeUsers, signIn } from './helpers';

const app = createApp();
const auth = { type: 'bearer' as const };
let engineer: string;
let engineerId: number;
let projectId: number;
const corridor = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../examples/corridor/corridor.json'), 'utf8'),
);

/** Rows a submission to the project could write, and the engineer's audit entries. */
async function counts(): Promise<Record<string, number>> {
  const [row] = await sequelize.query<Record<string, string>>(
    `SELECT (SELECT count(*) FROM batches WHERE project_id = $1) AS batches,
            (SELECT count(*) FROM audit_log WHERE user_id = $2) AS audit`,
    { bind: [projectId, engineerId], type: QueryTypes.SELECT },
  );
  return { batches: Number(row.batches), audit: Number(row.audit) };
}

const upload = (files: [string, string | Buffer][]) => {
  let r = request(app).post(`/api/v1/projects/${projectId}/uploads`).auth(engineer, auth);
  for (const [name, text] of files) r = r.attach('files', Buffer.from(text), name);
  return r;
};

const postBatch = (text: string) =>
  request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, auth)
    .set('content-type', 'application/json')
    .send(text);

/** The codes of a 422's located errors. */
const codes = (res: request.Response): string[] =>
  (res.body.errors as { code: string }[]).map((e) => e.code);

beforeAll(async () => {
  await queue();
  const users = await makeUsers('intake');
  engineerId = users.engineer.id;
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Intake (test)' });
  projectId = p.body.id;
});

afterAll(async () => {
  await closeIntake();
  await stopQueue();
  await sequelize.close();
});

test('10 000 nested lists in a 20 kB upload: refused as too deep, and the API answers on', async () => {
  const before = await counts();
  const deep = '['.repeat(10000) + ']'.repeat(10000);
  for (const name of ['deep.yaml', 'deep.json']) {
    const res = await upload([[name, deep]]);
    expectProblem(res, 422);
    expect(codes(res)).toEqual(['too-deep']);
    expect(res.body.errors[0]).toMatchObject({ file: name, line: 1 });
  }
  expect((await request(app).get('/api/v1/me').auth(engineer, auth)).status).toBe(200);
  expect(await counts()).toEqual(before);
});

test('a 10 MB JSON file of five million numbers (under the per-file limit): refused unread', async () => {
  const text = `[${'1,'.repeat(4_999_999)}1]`;
  expect(text.length).toBeLessThan(config.uploadLimit);
  const res = await upload([['numbers.json', text]]);
  expectProblem(res, 422);
  expect(codes(res)).toEqual(['too-large']);
  expect((await request(app).get('/api/v1/me').auth(engineer, auth)).status).toBe(200);
});

test('files × size: an upload larger in all than UPLOAD_TOTAL is refused before it is read', async () => {
  const before = await counts();
  const file = Buffer.alloc(config.uploadLimit - 1024, 0x20);
  const n = Math.floor(config.uploadTotal / file.length) + 1;
  const res = await upload(Array.from({ length: n }, (_, i) => [`part-${i}.yaml`, file]));
  expectProblem(res, 413);
  expect(res.body.detail).toMatch(/at most \d+ bytes in all/);
  expect(await counts()).toEqual(before);
});

test('an upload that does not say its length (chunked) is refused: 411', async () => {
  const server = http.createServer(app).listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as AddressInfo;
  const status = await new Promise<number>((resolve, reject) => {
    const req = http.request(
      {
        port,
        host: '127.0.0.1',
        method: 'POST',
        path: `/api/v1/projects/${projectId}/uploads`,
        headers: {
          authorization: `Bearer ${engineer}`,
          'content-type': 'multipart/form-data; boundary=zzz',
          'transfer-encoding': 'chunked',
        },
      },
      (res) => {
        res.resume();
        resolve(res.statusCode ?? 0);
      },
    );
    req.on('error', reject);
    req.write('--zzz\r\nContent-Disposition: form-data; name="files"; filename="a.json"\r\n\r\n');
    req.end('{}\r\n--zzz--\r\n');
  });
  server.close();
  expect(status).toBe(411);
});

test('the messages of many files together are capped, with a count of the rest', async () => {
  // 300 small section files, each with a few errors: about 900 messages uncapped.
  const broken = (i: number) =>
    JSON.stringify({ format: 'scarpline/1', id: `b${i}`, units: 'si', ground: [[0, 'x']] });
  const files = Array.from({ length: 300 }, (_, i): [string, string] => [`s${i}.json`, broken(i)]);
  const res = await upload(files);
  expectProblem(res, 422);
  const errors = res.body.errors as { code: string; message: string }[];
  expect(errors.length).toBeLessThanOrEqual(201);
  expect(errors[errors.length - 1].code).toBe('more-messages');
  expect(errors[errors.length - 1].message).toMatch(/^[\d ]+ more messages not shown/);
  expect(JSON.stringify(res.body).length).toBeLessThan(200_000);
});

test('a 1 MB method name, a 2.4-million-item list and 20 000 sections in a batch body: refused by the core', async () => {
  const before = await counts();
  const method = await postBatch(
    JSON.stringify({
      ...corridor,
      template: {
        ...corridor.template,
        analysis: { ...corridor.template.analysis, methods: ['x'.repeat(1_000_000)] },
      },
    }),
  );
  expectProblem(method, 422);
  expect(codes(method)).toEqual(['too-long']);

  const list = await postBatch(
    `{"format":"scarpline-batch/1","sections":[${'1,'.repeat(2_399_999)}1]}`,
  );
  expectProblem(list, 422);
  expect(codes(list)).toEqual([expect.stringMatching(/^too-(many|large)$/)]);

  const many = await postBatch(
    JSON.stringify({
      ...corridor,
      sections: Array.from({ length: 20000 }, (_, i) => ({
        station: i,
        ground: [
          [0, 0],
          [10, 5],
        ],
      })),
    }),
  );
  expectProblem(many, 422);
  expect(codes(many)).toContain('too-many');
  expect(await counts()).toEqual(before);
});

test('a body that is not JSON is 400 with the place; one that is not a batch 422', async () => {
  const broken = await postBatch('{"format": "scarpline-batch/1", ');
  expectProblem(broken, 400);
  expect(broken.body.title).toBe('Malformed JSON');
  expect(broken.body.errors[0]).toMatchObject({ file: 'batch.json', line: 1, code: 'syntax' });
  const section = await postBatch(
    fs.readFileSync(path.resolve(__dirname, '../../../examples/cut-homogeneous.yaml'), 'utf8'),
  );
  expectProblem(section, 400);
  const one = await postBatch(JSON.stringify({ format: 'scarpline/1', id: 'x' }));
  expectProblem(one, 422);
});

test('broken multipart: no boundary, a wrong one, cut off, compressed, a NUL in a file name → 4xx', async () => {
  const before = await counts();
  const raw = (type: string, body: string, headers: Record<string, string> = {}) =>
    request(app)
      .post(`/api/v1/projects/${projectId}/uploads`)
      .auth(engineer, auth)
      .set({ 'content-type': type, ...headers })
      .send(body);
  const part = (boundary: string, name: string) =>
    `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\n\r\n{}\r\n`;
  expectProblem(await raw('multipart/form-data', part('zzz', 'a.json') + '--zzz--\r\n'), 400);
  expectProblem(
    await raw('multipart/form-data; boundary=yyy', part('zzz', 'a.json') + '--zzz--\r\n'),
    400,
  );
  expectProblem(await raw('multipart/form-data; boundary=zzz', part('zzz', 'a.json')), 400);
  expectProblem(
    await raw('multipart/form-data; boundary=zzz', part('zzz', 'a\u0000b.json') + '--zzz--\r\n'),
    400,
  );
  const encoded = await raw(
    'multipart/form-data; boundary=zzz',
    `--zzz\r\nContent-Disposition: form-data; name="files"; filename*=utf-8''a%00b.json\r\n\r\n{}\r\n--zzz--\r\n`,
  );
  expectProblem(encoded, 422);
  expect(encoded.body.detail).toMatch(/U\+0000/);
  expectProblem(
    await raw('multipart/form-data; boundary=zzz', part('zzz', 'a.json') + '--zzz--\r\n', {
      'content-encoding': 'gzip',
    }),
    415,
  );
  expect(await counts()).toEqual(before);
});

test('a heavy upload of allowed size does not hold up cheap requests sent meanwhile', async () => {
  // YAML of 199 000 numbers in lists of 2 000: within every limit, about a second to read each.
  const rows = Array.from({ length: 99 }, () => `- [${'1.5, '.repeat(1999)}1.5]`).join('\n');
  const files = Array.from({ length: 3 }, (_, i): [string, string] => [`values-${i}.yaml`, rows]);
  let settled = false;
  const heavy = upload(files).then((r) => {
    settled = true;
    return r;
  });
  // Wait until a thread of the intake pool is reading it (a bound, not a measurement).
  const end = Date.now() + 30_000;
  while (intakeLoad().running === 0) {
    if (settled || Date.now() > end) throw new Error('the upload never reached the intake pool');
    await new Promise((r) => setTimeout(r, 5));
  }
  // Cheap requests one after another for as long as the heavy one is read: each is answered
  // before it ends. Were the reading on the main thread, none would be.
  let answered = 0;
  while (!settled) {
    const cheap = await request(app).get('/api/v1/me').auth(engineer, auth);
    expect(cheap.status).toBe(200);
    if (!settled) answered++;
  }
  expect(answered).toBeGreaterThanOrEqual(3);
  const h = await heavy;
  expectProblem(h, 422);
  expect(intakeLoad()).toEqual({ running: 0, waiting: 0 });
});
