import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION, parseSections } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { AuditEntry, ResultRow } from '../src/models';
import { stopQueue } from '../src/queue';
import { editSection } from '../src/services/edits';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
let users: Awaited<ReturnType<typeof makeUsers>>;
let engineer: string;
let viewer: string;
let batchId: number;
let sectionId: number;

beforeAll(async () => {
  await startWorker();
  users = await makeUsers('rerun');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Re-run' });
  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  );
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'rerun-1', sections: corridor.sections.slice(0, 1) });
  batchId = post.body.id;
  await waitForBatch(app, engineer, batchId);
  const list = await request(app).get(`/api/v1/batches/${batchId}/sections`).auth(viewer, bearer);
  sectionId = list.body.items[0].id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('no edits give back the stored section, for every example (SI and US files)', () => {
  const files = fs.readdirSync(EXAMPLES).filter((f) => f.endsWith('.yaml'));
  expect(files.length).toBeGreaterThan(3);
  for (const f of files) {
    const parsed = parseSections(fs.readFileSync(path.join(EXAMPLES, f), 'utf8'), f);
    for (const s of parsed.sections) expect([f, editSection(s, {})]).toEqual([f, s]);
  }
});

test('a re-run with edits: a new result with run 2, run 1 kept, the history of runs', async () => {
  const before = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  type CaseRow = { name: string; requiredFs: number; governing: { fs: number } };
  const longTerm = (r: { cases: CaseRow[] }) => r.cases.find((c) => c.name === 'long term')!;
  const fs1 = before.body.result.governing.fs as number;
  const longTerm1 = longTerm(before.body.result).governing.fs;
  const changes = {
    materials: { 'weathered-mudstone': { strength: { frictionAngle: 32 } } },
    requiredFs: 1.3,
  };
  const res = await request(app)
    .post(`/api/v1/sections/${sectionId}/runs`)
    .auth(engineer, bearer)
    .send(changes);
  expect(res.status).toBe(202);
  expect(res.body).toMatchObject({ run: 2, status: 'queued', caution: CAUTION });
  expect(res.body.input.materials['weathered-mudstone'].strength.frictionAngle).toBe(32);
  expect(res.body.input.analysis.requiredFs).toBe(1.3);
  // Everything not edited is as it was.
  expect(res.body.input.ground).toEqual(before.body.input.ground);
  expect(res.body.input.materials['weathered-mudstone'].strength.cohesion).toBe(
    before.body.input.materials['weathered-mudstone'].strength.cohesion,
  );

  await waitForBatch(app, viewer, batchId);
  const after = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  expect(after.body.run).toBe(2);
  // the long-term case takes the section's required FS; which case governs may change with it
  expect(after.body.result.run).toBe(2);
  expect(longTerm(after.body.result).requiredFs).toBe(1.3);
  expect(longTerm(after.body.result).governing.fs).toBeGreaterThan(longTerm1);
  expect(after.body.previous).toHaveLength(1);
  expect(after.body.previous[0]).toMatchObject({ run: 1, requiredFs: 1.5 });
  expect(after.body.previous[0].governing.fs).toBeCloseTo(fs1, 10);
  // The current result carries its search report for the drawing; older runs leave theirs out.
  expect(after.body.result.search).toEqual(expect.objectContaining({ trials: expect.any(Number) }));
  expect(after.body.previous[0]).not.toHaveProperty('search');
  expect(await ResultRow.count({ where: { sectionId } })).toBe(2);

  const runs = await request(app).get(`/api/v1/sections/${sectionId}/runs`).auth(viewer, bearer);
  expect(runs.status).toBe(200);
  expect(runs.body.caution).toBe(CAUTION);
  expect(runs.body.runs.map((r: { run: number; current: boolean }) => [r.run, r.current])).toEqual([
    [2, true],
    [1, false],
  ]);
  expect(runs.body.runs[0].changes).toEqual(changes);
  expect(runs.body.runs[0].editedBy).toBe(users.engineer.id);
  expect(runs.body.runs[0].editor).toEqual({ id: users.engineer.id, name: 'rerun engineer' });
  expect(runs.body.runs[1].changes).toBeNull();
  expect(runs.body.runs[1].editedBy).toBeNull();
  expect(runs.body.runs[1].editor).toBeNull();
  expect(schemaErrors('SectionRuns', runs.body)).toEqual([]);
  expect(runs.body.runs[1].input.materials['weathered-mudstone'].strength.frictionAngle).toBe(26);
  expect(runs.body.runs[0].input.materials['weathered-mudstone'].strength.frictionAngle).toBe(32);
  expect(
    await AuditEntry.count({ where: { action: 'rerun', entity: 'section', entityId: sectionId } }),
  ).toBe(1);
});

test('edits that break the section → 422 with located errors; nothing queued', async () => {
  const before = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  const bad = await request(app)
    .post(`/api/v1/sections/${sectionId}/runs`)
    .auth(engineer, bearer)
    .send({ materials: { 'weathered-mudstone': { strength: { frictionAngle: 95 } } } });
  expectProblem(bad, 422);
  const err = bad.body.errors.find((e: { path: string }) => /frictionAngle/.test(e.path));
  expect(err).toMatchObject({ severity: 'error', line: expect.any(Number) });
  const notEditable = await request(app)
    .post(`/api/v1/sections/${sectionId}/runs`)
    .auth(engineer, bearer)
    .send({ ground: [[0, 0]] });
  expectProblem(notEditable, 422);
  expect(notEditable.body.errors[0]).toMatchObject({ path: 'ground', code: 'not-editable' });
  const after = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  expect(after.body.run).toBe(before.body.run);
  expect(after.body.status).toBe('done');
});

test('a title or a case name no text may hold, or longer than its limit (even 1 MB): 422, nothing queued', async () => {
  const before = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  const edits: [object, RegExp][] = [
    [{ title: 'a\u0000b' }, /U\+0000/],
    [{ title: 'a\ud800b' }, /half of a character/],
    [{ analysis: { case: 'x\u0000' } }, /U\+0000/],
    [{ title: 'x'.repeat(201) }, /title/],
    [{ title: 'x'.repeat(1_000_000) }, /at most 10 000 are read/],
    [{ materials: JSON.parse('{"a":'.repeat(100) + '1' + '}'.repeat(100)) as object }, /nested/],
  ];
  for (const [changes, words] of edits) {
    const res = await request(app)
      .post(`/api/v1/sections/${sectionId}/runs`)
      .auth(engineer, bearer)
      .send(changes);
    expectProblem(res, 422);
    expect(JSON.stringify(res.body)).toMatch(words);
  }
  const broken = await request(app)
    .post(`/api/v1/sections/${sectionId}/runs`)
    .auth(engineer, bearer)
    .set('content-type', 'application/json')
    .send('{"title": ');
  expectProblem(broken, 400);
  const after = await request(app).get(`/api/v1/sections/${sectionId}`).auth(viewer, bearer);
  expect([after.body.run, after.body.status]).toEqual([before.body.run, 'done']);
});
