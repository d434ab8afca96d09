import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import type { AddressInfo } from 'node:net';
import { config } from '../src/config';
import { Batch, SectionRow } from '../src/models';
import { pollerCount } from '../src/services/events';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
let engineer: string;
let viewer: string;
let viewerId: number;
let projectId: number;

interface SseEvent {
  event: string;
  data: unknown;
}

/** Reads a whole text/event-stream response (it ends after `done`) into its events. */
function sse(req: request.Test): Promise<{ res: request.Response; events: SseEvent[] }> {
  return req
    .timeout(40000)
    .buffer(true)
    .parse((res, cb) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c: string) => (text += c));
      res.on('end', () => cb(null, text));
    })
    .then((res) => {
      const events: SseEvent[] = [];
      for (const block of String(res.body).split('\n\n')) {
        const lines = block.split('\n').filter(Boolean);
        const event = lines.find((l) => l.startsWith('event: '))?.slice(7);
        const data = lines.find((l) => l.startsWith('data: '))?.slice(6);
        if (event && data !== undefined) events.push({ event, data: JSON.parse(data) });
      }
      return { res, events };
    });
}

function corridor(n: number, id: string) {
  const c = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));
  return { ...c, id, sections: c.sections.slice(0, n) };
}

beforeAll(async () => {
  await startWorker();
  const users = await makeUsers('events');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  viewerId = users.viewer.id;
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Events (test)' });
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('the event stream reports progress as it changes and ends with done', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(corridor(4, 'wcb-events'));
  expect(post.status).toBe(201);
  const { res, events } = await sse(
    request(app).get(`/api/v1/batches/${post.body.id}/events`).auth(viewer, { type: 'bearer' }),
  );
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^text\/event-stream/);
  expect(res.headers['cache-control']).toMatch(/no-store/);

  const names = events.map((e) => e.event);
  expect(names[names.length - 1]).toBe('done');
  expect(names.filter((n) => n === 'done')).toHaveLength(1);
  const progress = events.filter((e) => e.event === 'progress').map((e) => e.data);
  expect(progress.length).toBeGreaterThanOrEqual(1);
  // Only changes are sent: no two consecutive progress events are equal.
  for (let i = 1; i < progress.length; i++) expect(progress[i]).not.toEqual(progress[i - 1]);
  const settled = (p: unknown) => (p as { done: number; failed: number }).done;
  for (let i = 1; i < progress.length; i++) {
    expect(settled(progress[i])).toBeGreaterThanOrEqual(settled(progress[i - 1]));
  }
  const final = await request(app)
    .get(`/api/v1/batches/${post.body.id}`)
    .auth(viewer, { type: 'bearer' });
  // The last progress event is the same object GET /batches/:id shows, with the caution: every
  // progress event carries it, not only done.
  expect(progress[progress.length - 1]).toEqual({ ...final.body.progress, caution: CAUTION });
  for (const p of progress) expect(p).toMatchObject({ caution: CAUTION });
  expect(final.body.progress).toMatchObject({ total: 4, done: 4, queued: 0, running: 0 });
  expect(events[events.length - 1].data).toMatchObject({
    id: post.body.id,
    status: 'done',
    progress: final.body.progress,
    caution: CAUTION,
  });
});

test('a finished batch streams its progress and done at once; ?access_token= works here only', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(corridor(1, 'wcb-events-token'));
  const first = await sse(
    request(app).get(`/api/v1/batches/${post.body.id}/events`).auth(viewer, { type: 'bearer' }),
  );
  expect(first.events.map((e) => e.event).slice(-1)).toEqual(['done']);

  const { res, events } = await sse(
    request(app).get(`/api/v1/batches/${post.body.id}/events?access_token=${viewer}`),
  );
  expect(res.status).toBe(200);
  expect(events.map((e) => e.event)).toEqual(['progress', 'done']);

  expectProblem(
    await request(app).get(`/api/v1/batches/${post.body.id}?access_token=${viewer}`),
    401,
  );
  expectProblem(
    await request(app).get(`/api/v1/batches/${post.body.id}/events?access_token=nope`),
    401,
  );
  expectProblem(await request(app).get(`/api/v1/batches/${post.body.id}/events`), 401);
});

test('GET /batches/:id has an ETag: 304 while unchanged, a new tag once progress changes', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(corridor(1, 'wcb-events-etag'));
  const { events } = await sse(
    request(app).get(`/api/v1/batches/${post.body.id}/events`).auth(viewer, { type: 'bearer' }),
  );
  expect(events.map((e) => e.event).slice(-1)).toEqual(['done']);

  const a = await request(app)
    .get(`/api/v1/batches/${post.body.id}`)
    .auth(viewer, { type: 'bearer' });
  expect(a.status).toBe(200);
  const tag = a.headers.etag;
  expect(tag).toMatch(/^W\/".+"$/);
  const again = await request(app)
    .get(`/api/v1/batches/${post.body.id}`)
    .auth(viewer, { type: 'bearer' })
    .set('If-None-Match', tag);
  expect(again.status).toBe(304);
  expect(again.text).toBe('');

  // A change in the stored progress gives a new representation and a new tag.
  await SectionRow.update(
    { status: 'failed', failReason: 'test' },
    { where: { batchId: post.body.id } },
  );
  const changed = await request(app)
    .get(`/api/v1/batches/${post.body.id}`)
    .auth(viewer, { type: 'bearer' })
    .set('If-None-Match', tag);
  expect(changed.status).toBe(200);
  expect(changed.headers.etag).not.toBe(tag);
  expect(changed.body.progress.failed).toBe(1);
});

test('streams per user are limited; every stream of a batch shares one poller', async () => {
  const running = await Batch.create({
    projectId,
    submittedBy: viewerId,
    name: 'never-ends',
    title: null,
    status: 'running',
    total: 0,
    source: 'json',
    finishedAt: null,
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as AddressInfo;
  const streams: AbortController[] = [];
  /** Opens a stream and waits for its first event (or the refusal). */
  const open = async (token = viewer): Promise<number> => {
    const stop = new AbortController();
    const res = await fetch(`http://127.0.0.1:${port}/api/v1/batches/${running.id}/events`, {
      headers: { authorization: `Bearer ${token}` },
      signal: stop.signal,
    });
    if (res.status !== 200) {
      await res.text();
      return res.status;
    }
    streams.push(stop);
    const reader = (res.body as ReadableStream<Uint8Array>).getReader();
    let text = '';
    while (!text.includes('event: progress')) {
      const { value } = await reader.read();
      text += Buffer.from(value ?? []).toString();
    }
    return 200;
  };
  try {
    const before = pollerCount();
    for (let i = 0; i < config.streamsPerUser; i++) expect(await open()).toBe(200);
    // one poller for this batch, however many streams follow it
    expect(pollerCount()).toBe(before + 1);
    expect(await open()).toBe(429);
    // another user is not held back by this one's streams
    expect(await open(engineer)).toBe(200);
    streams.pop()?.abort();
    // one closed: another may open
    streams.shift()?.abort();
    const end = Date.now() + 10_000;
    let status = 429;
    while (status === 429 && Date.now() < end) {
      await new Promise((r) => setTimeout(r, 50));
      status = await open();
    }
    expect(status).toBe(200);
  } finally {
    for (const s of streams) s.abort();
    server.close();
  }
  // the last stream gone, the poller stops
  const end = Date.now() + 10_000;
  while (pollerCount() > 0 && Date.now() < end) await new Promise((r) => setTimeout(r, 50));
  expect(pollerCount()).toBe(0);
});
