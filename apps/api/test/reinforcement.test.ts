/**
 * Reinforcement through the service: a corridor batch whose template gives a row of piles that
 * one station keeps and two replace with their own geogrids (the demo corridor's highest fill),
 * analysed by a worker: each method's report carries each element's crossings and forces, the
 * end-of-construction case the required basal force; a re-run edits the geogrids' strength (a
 * merge patch of the list) and the next run's FS rises; an edit that breaks an element is a 422
 * at its field, and nothing is queued.
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
let engineer: string;
let viewer: string;
let batchId: number;
const ids = new Map<number, number>();

interface Element {
  name: string;
  type: string;
  force: number;
  crossings: { counted: boolean; available: number; force: number; mode: string }[];
}
interface CaseBody {
  name: string;
  governing: { fs: number } | null;
  methods: { method: string; reinforcement?: Element[] }[];
  requiredReinforcement?: {
    kind: string;
    reached: boolean;
    value: number | null;
    fs: number | null;
  };
}
const view = async (station: number) =>
  (
    await request(app)
      .get(`/api/v1/sections/${ids.get(station)}`)
      .auth(viewer, bearer)
  ).body as {
    run: number;
    status: string;
    input: { reinforcement: { line: number[][]; strength?: number }[] };
    result: { cases: CaseBody[]; caution: string };
  };

beforeAll(async () => {
  await startWorker();
  const users = await makeUsers('reinforce');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Reinforcement' });
  const corridor = JSON.parse(
    fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'),
  ) as { template: object; sections: { station: number }[] };
  const sections = corridor.sections.filter((s) => [1700, 1720, 1740].includes(s.station));
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send({
      ...corridor,
      id: 'reinforced',
      template: {
        ...corridor.template,
        reinforcement: [{ type: 'pile', name: 'piles', x: 14, bottom: 20, shear: 40 }],
      },
      sections,
    });
  expect(post.status).toBe(201);
  batchId = post.body.id;
  await waitForBatch(app, engineer, batchId, 180000);
  const list = await request(app).get(`/api/v1/batches/${batchId}/sections`).auth(viewer, bearer);
  for (const s of list.body.items as { id: number; station: number }[]) ids.set(s.station, s.id);
}, 240000);

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('each method reports the elements a station has: the template’s, or its own in their place', async () => {
  for (const [station, names] of [
    [1700, ['piles']],
    [1720, ['geogrid at 32.67 m']],
  ] as const) {
    const v = await view(station);
    expect(schemaErrors('Section', v)).toEqual([]);
    expect(v.result.caution).toBe(CAUTION);
    for (const c of v.result.cases) {
      for (const m of c.methods) {
        expect(m.reinforcement!.map((e) => e.name).slice(0, 1)).toEqual(names);
        for (const e of m.reinforcement!) {
          const used = e.crossings.filter((x) => x.counted).reduce((s, x) => s + x.force, 0);
          expect(e.force).toBeCloseTo(used, 9);
        }
      }
    }
  }
  const v = await view(1720);
  const grids = v.result.cases[0].methods[0].reinforcement!;
  expect(grids.every((e) => e.type === 'geosynthetic')).toBe(true);
  expect(grids.some((e) => e.crossings.some((x) => x.counted && x.available > 0))).toBe(true);
});

test('the end-of-construction case gives the basal force that would meet its requirement', async () => {
  const eoc = (await view(1740)).result.cases.find((c) => c.name === 'end of construction')!;
  expect(eoc.requiredReinforcement).toMatchObject({ kind: 'force', reached: true });
  expect(eoc.requiredReinforcement!.fs!).toBeGreaterThanOrEqual(1.3);
  expect(eoc.requiredReinforcement!.value!).toBeGreaterThan(0);
});

test('a re-run that strengthens the geogrids raises the long-term FS; a broken element is a 422 at its field', async () => {
  const before = await view(1740);
  const longTerm = (b: typeof before) => b.result.cases.find((c) => c.name === 'long term')!;
  const fs0 = longTerm(before).governing!.fs;
  // the view gives the section as the solver holds it (a layer by its line); an edit is written
  // as a file writes it (a layer by its points)
  const stronger = before.input.reinforcement.map(({ line, ...e }) => ({
    ...e,
    points: line,
    strength: 70,
  }));
  const bad = await request(app)
    .post(`/api/v1/sections/${ids.get(1740)}/runs`)
    .auth(engineer, bearer)
    .send({ reinforcement: [{ ...stronger[0], strength: -5 }] });
  expectProblem(bad, 422);
  expect(bad.body.errors[0].path).toBe('reinforcement[0].strength');
  const res = await request(app)
    .post(`/api/v1/sections/${ids.get(1740)}/runs`)
    .auth(engineer, bearer)
    .send({ reinforcement: stronger });
  expect(res.status).toBe(202);
  expect(res.body.run).toBe(2);
  await waitForBatch(app, viewer, batchId, 180000);
  const after = await view(1740);
  expect(after.run).toBe(2);
  expect(after.input.reinforcement.every((e) => e.strength === 70)).toBe(true);
  expect(longTerm(after).governing!.fs).toBeGreaterThan(fs0);
}, 240000);
