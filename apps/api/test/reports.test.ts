/**
 * Reports from the service: a section's PDF (made on request, kept, made again only when its
 * run or its review changes) and a corridor's (asked for, laid out by the worker with its
 * progress, stored, downloaded). Their text, read back with poppler's pdftotext, holds the FS
 * values of the stored result, the review record, and the caution on every page.
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { countedText, type StationProbability } from '@scarpline/core';
import { CAUTION } from '@scarpline/core/caution';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch, ReportRow, StoredFile } from '../src/models';
import { REPORT_QUEUE, stopQueue } from '../src/queue';
import { failOrphanedReports } from '../src/services/reports';
import { deleteObject } from '../src/storage';
import { startWorker } from '../src/worker';
import { pageTexts, pdfFile, requirePoppler } from '../../../packages/report/test/poppler';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';
import { corridorBatch, uncertainVariables } from './sections';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
const corridor = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));
let users: Awaited<ReturnType<typeof makeUsers>>;
let engineer: string;
let reviewer: string;
let viewer: string;
let outsider: string;
let batchId: number;
let projectId: number;

/** The response body as bytes (supertest buffers only the types it knows). */
function bytes(res: request.Response, done: (e: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

function getPdf(url: string, token: string) {
  return request(app).get(url).auth(token, bearer).buffer(true).parse(bytes);
}

/** The text of each page of a PDF (poppler's pdftotext). */
const pdfPages = (pdf: Buffer) => pageTexts(pdfFile(pdf));

/**
 * A page's text as one line of words, whatever the line breaks, without its page number (which
 * the layout of pdftotext may set inside the footer's caution).
 */
const words = (t: string) =>
  t
    .replace(/\s+/g, ' ')
    .replace(/page \d+ of \d+ /, '')
    .trim();

/** Polls a report until it is done or failed (a bound, not an assertion on time). */
async function waitForReport(id: number, limitMs = 60_000) {
  const end = Date.now() + limitMs;
  const seen: { done: number; total: number }[] = [];
  for (;;) {
    const res = await request(app).get(`/api/v1/reports/${id}`).auth(viewer, bearer);
    expect(res.status).toBe(200);
    seen.push(res.body.progress);
    if (res.body.status === 'done' || res.body.status === 'failed') return { ...res.body, seen };
    if (Date.now() > end) throw new Error(`report ${id} not made: ${JSON.stringify(res.body)}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

beforeAll(async () => {
  requirePoppler();
  await startWorker();
  users = await makeUsers('reports');
  engineer = await signIn(app, users.engineer.email);
  reviewer = await signIn(app, users.reviewer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Reports' });
  // A token of another project sees no batch of this one.
  const elsewhere = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Elsewhere' });
  const admin = await signIn(app, users.admin.email);
  const t = await request(app)
    .post('/api/v1/tokens')
    .auth(admin, bearer)
    .send({ userId: users.integration.id, name: 'GIS feed', projectIds: [elsewhere.body.id] });
  outsider = t.body.token as string;
  projectId = p.body.id as number;
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'wcb-report', sections: corridor.sections.slice(0, 3) });
  expect(post.status).toBe(201);
  batchId = post.body.id;
  await waitForBatch(app, engineer, batchId);
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('a section report: the stored FS values, the review record once signed, the caution on every page; kept until its review changes', async () => {
  const list = await request(app)
    .get(`/api/v1/batches/${batchId}/sections?sort=station`)
    .auth(viewer, bearer);
  const item = (list.body.items as { id: number; key: string }[])[0];
  const section = await request(app).get(`/api/v1/sections/${item.id}`).auth(viewer, bearer);
  const result = section.body.result as {
    cases: { name: string; methods: { method: string; fs: number | null }[] }[];
  };

  const first = await getPdf(`/api/v1/sections/${item.id}/report.pdf`, viewer);
  expect(first.status).toBe(200);
  expect(first.headers['content-type']).toBe('application/pdf');
  expect(first.headers['content-disposition']).toMatch(
    /^attachment; filename="?wcb-report-\d\+\d{3}-run1-report-\d{4}-\d{2}-\d{2}\.pdf"?$/,
  );
  const pages = pdfPages(first.body as Buffer);
  const all = pages.join('\n');
  pages.forEach((page, i) => {
    expect(words(page)).toContain(words(CAUTION));
    expect(page).toContain(`${i + 1} of ${pages.length}`);
  });
  for (const c of result.cases) {
    expect(all).toContain(c.name);
    for (const m of c.methods) if (m.fs !== null) expect(all).toContain(m.fs.toFixed(3));
  }
  expect(all).toMatch(/not reviewed/i);

  // Asked again with nothing changed: the same stored file.
  const files = await StoredFile.count({ where: { kind: 'report' } });
  const again = await getPdf(`/api/v1/sections/${item.id}/report.pdf`, viewer);
  expect(Buffer.compare(again.body as Buffer, first.body as Buffer)).toBe(0);
  expect(await StoredFile.count({ where: { kind: 'report' } })).toBe(files);

  // Signed off: the next report records who, what and why.
  const review = await request(app)
    .post(`/api/v1/sections/${item.id}/reviews`)
    .auth(reviewer, bearer)
    .send({ decision: 'approved', comment: 'Strengths checked against the borehole logs.' });
  expect(review.status).toBe(201);
  const signed = await getPdf(`/api/v1/sections/${item.id}/report.pdf`, viewer);
  const text = words(pdfPages(signed.body as Buffer).join('\n'));
  expect(text).toContain('reports reviewer');
  expect(text).toMatch(/approved/i);
  expect(text).toContain('Strengths checked against the borehole logs.');
  expect(await StoredFile.count({ where: { kind: 'report' } })).toBe(files + 1);
});

test('a corridor report: asked for, made by the worker with its progress, signed by the batch review, downloaded', async () => {
  const review = await request(app)
    .post(`/api/v1/batches/${batchId}/reviews`)
    .auth(reviewer, bearer)
    .send({ decision: 'approved', comment: 'Corridor checked station by station.' });
  expect(review.status).toBe(201);

  expectProblem(
    await request(app).post(`/api/v1/batches/${batchId}/reports`).auth(viewer, bearer).send({}),
    403,
  );
  expectProblem(
    await request(app)
      .post(`/api/v1/batches/${batchId}/reports`)
      .auth(reviewer, bearer)
      .send({ appendix: 'some' }),
    422,
  );
  const asked = await request(app)
    .post(`/api/v1/batches/${batchId}/reports`)
    .auth(reviewer, bearer)
    .send({ appendix: 'all' });
  expect(asked.status).toBe(202);
  expect(asked.headers.location).toBe(`/api/v1/reports/${asked.body.id}`);
  expect(asked.body).toMatchObject({
    kind: 'corridor',
    status: 'queued',
    appendix: 'all',
    reviewId: review.body.id,
    download: null,
  });

  const made = await waitForReport(asked.body.id);
  expect(made.status).toBe('done');
  expect(made.progress.done).toBe(made.progress.total);
  expect(made.download).toBe(`/api/v1/reports/${asked.body.id}/file`);

  const listed = await request(app).get(`/api/v1/batches/${batchId}/reports`).auth(viewer, bearer);
  expect((listed.body.reports as { id: number }[]).map((r) => r.id)).toContain(asked.body.id);

  const pdf = await getPdf(made.download as string, viewer);
  expect(pdf.status).toBe(200);
  expect(pdf.headers['content-type']).toBe('application/pdf');
  expect(pdf.headers['content-disposition']).toMatch(
    /^attachment; filename="?wcb-report-corridor-report-sections-all-\d{4}-\d{2}-\d{2}\.pdf"?$/,
  );
  const pages = pdfPages(pdf.body as Buffer);
  pages.forEach((page, i) => {
    expect(words(page)).toContain(words(CAUTION));
    expect(page).toContain(`${i + 1} of ${pages.length}`);
  });
  const text = words(pages.join('\n'));
  expect(text).toContain('reports reviewer');
  expect(text).toContain('Corridor checked station by station.');
  const sections = await request(app)
    .get(`/api/v1/batches/${batchId}/sections?sort=station`)
    .auth(viewer, bearer);
  const items = sections.body.items as { result: { governingFs: number | null } | null }[];
  expect(items).toHaveLength(3);
  for (const s of items) {
    expect(s.result?.governingFs).toEqual(expect.any(Number));
    expect(text).toContain(s.result!.governingFs!.toFixed(3));
  }

  // Its object gone from storage behind the service's back: a clear 404, not a 500.
  const row = await ReportRow.findByPk(asked.body.id as number);
  const file = await StoredFile.findByPk(row!.fileId!);
  await deleteObject(file!.objectKey);
  expectProblem(
    await request(app)
      .get(made.download as string)
      .auth(viewer, bearer),
    404,
  );
});

test('a probabilistic corridor: its report and its section report give each station’s P(FS < 1) ± SE and β as its result holds them', async () => {
  // two stations of the cutting near its least FS, with uncertain strength of the weathered
  // mudstone (our invented Wendlecombe corridor), few realisations to keep the test short
  const batch = corridorBatch('wcb-pf-report', 14, {}, { oneCase: true });
  batch.sections = batch.sections.slice(12, 14);
  batch.template.probability = {
    seed: 19,
    method: 'latin-hypercube',
    realisations: 200,
    surface: 'critical',
    variables: uncertainVariables(),
  };
  const b = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer)
    .send(batch);
  expect(b.status).toBe(201);
  await waitForBatch(app, engineer, b.body.id as number, 120_000);
  const list = await request(app)
    .get(`/api/v1/batches/${b.body.id}/sections?sort=station`)
    .auth(viewer, bearer);
  const items = list.body.items as {
    id: number;
    key: string;
    probability: StationProbability[] | null;
  }[];
  expect(items).toHaveLength(2);
  /** A summary's numbers as the report writes them, spaces left out (pdftotext drops some). */
  const row = (p: StationProbability) =>
    `${countedText(p.pFailure)}${p.betaNormal!.toFixed(2)}${p.betaLognormal!.toFixed(2)}${p.valid}/${p.realisations}`.replace(
      /\s+/g,
      '',
    );
  for (const s of items) expect(s.probability).toHaveLength(1);
  expect(items.some((s) => s.probability![0].pFailure.p > 0)).toBe(true);

  const asked = await request(app)
    .post(`/api/v1/batches/${b.body.id}/reports`)
    .auth(engineer, bearer)
    .send({ appendix: 'none' });
  expect(asked.status).toBe(202);
  const made = await waitForReport(asked.body.id as number);
  expect(made.status).toBe('done');
  const text = words(
    pdfPages((await getPdf(made.download as string, viewer)).body as Buffer).join('\n'),
  );
  expect(text).toContain('2 of the 2 stations carry a probability of failure');
  expect(text).toContain('2 random variables, Latin hypercube sampling, seed 19, N = 200');
  const squeezed = text.replace(/\s+/g, '');
  for (const s of items) expect(squeezed).toContain(row(s.probability![0]));

  const one = await getPdf(`/api/v1/sections/${items[0].id}/report.pdf`, viewer);
  expect(one.status).toBe(200);
  const page = words(pdfPages(one.body as Buffer).join('\n'));
  const p = items[0].probability![0];
  expect(page).toContain(`P(FS < 1) ${countedText(p.pFailure)} (1 SE)`);
  expect(page).toContain(`realisations with an FS ${p.valid} of ${p.realisations}`);
  expect(page).toContain('lognormal, mean 5 kPa, SD 2 kPa');
}, 240_000);

test('reports are the batch’s: another project’s user gets 404, an unknown report 404; a running batch’s is 409', async () => {
  expectProblem(
    await request(app).get(`/api/v1/batches/${batchId}/reports`).auth(outsider, bearer),
    404,
  );
  const listed = await request(app).get(`/api/v1/batches/${batchId}/reports`).auth(viewer, bearer);
  const id = (listed.body.reports as { id: number }[])[0].id;
  expectProblem(await request(app).get(`/api/v1/reports/${id}`).auth(outsider, bearer), 404);
  expectProblem(await request(app).get(`/api/v1/reports/99999999`).auth(viewer, bearer), 404);
  // A batch still running (set so here: how fast the worker is must not decide the test).
  await Batch.update({ status: 'running' }, { where: { id: batchId } });
  try {
    expectProblem(
      await request(app)
        .post(`/api/v1/batches/${batchId}/reports`)
        .auth(engineer, bearer)
        .send({ appendix: 'none' }),
      409,
    );
  } finally {
    await Batch.update({ status: 'done' }, { where: { id: batchId } });
  }
});

test('a corridor report whose worker stopped on every try (the queue failed its job) is failed by the stall watch with the reason; one with a live job is left alone', async () => {
  const batch = (await Batch.findByPk(batchId))!;
  const row = (status: 'queued' | 'running') =>
    ReportRow.create({
      kind: 'corridor',
      batchId,
      sectionId: null,
      run: null,
      appendix: 'none',
      status,
      total: batch.total,
      reviewId: null,
      fileId: null,
      requestedBy: batch.submittedBy,
    });
  // a report left running: its job was taken back at its expiry, tried again, and failed there
  const orphan = await row('running');
  await sequelize.query(
    `INSERT INTO pgboss.job (name, data, state, retry_count, retry_limit, completed_on)
       VALUES ($1, $2::jsonb, 'failed', 1, 1, now())`,
    { bind: [REPORT_QUEUE, JSON.stringify({ reportId: orphan.id })] },
  );
  // a report whose job a worker holds (active: the in-process worker only takes created jobs)
  const held = await row('queued');
  await sequelize.query(
    `INSERT INTO pgboss.job (name, data, state, started_on) VALUES ($1, $2::jsonb, 'active', now())`,
    { bind: [REPORT_QUEUE, JSON.stringify({ reportId: held.id })] },
  );
  try {
    const failed = await failOrphanedReports();
    expect(failed).toContain(orphan.id);
    expect(failed).not.toContain(held.id);
    const res = await request(app).get(`/api/v1/reports/${orphan.id}`).auth(viewer, bearer);
    expect(res.body.status).toBe('failed');
    expect(res.body.reason).toMatch(/stopped before it finished, on every try/);
    expect((await ReportRow.findByPk(held.id))!.status).toBe('queued');
  } finally {
    await sequelize.query(
      `DELETE FROM pgboss.job WHERE name = $1 AND data->>'reportId' IN ($2, $3)`,
      { bind: [REPORT_QUEUE, String(orphan.id), String(held.id)] },
    );
    await ReportRow.destroy({ where: { id: [orphan.id, held.id] } });
  }
});
