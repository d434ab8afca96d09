import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch, SectionRow } from '../src/models';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
const corridor = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));
let users: Awaited<ReturnType<typeof makeUsers>>;
let engineer: string;
let reviewer: string;
let viewer: string;
let projectId: number;
let jsonBatch: { id: number; sections: { id: number; key: string; station: number }[] };

/** The first n stations of the demo corridor as GeoJSON lines (invented easting/northing). */
function geoCorridor(n: number) {
  const { sections, ...header } = corridor;
  return {
    type: 'FeatureCollection',
    scarpline: { ...header, id: 'wcb-geo' },
    features: sections.slice(0, n).map((s: { station: number; ground: number[][] }) => ({
      type: 'Feature',
      properties: { station: s.station },
      geometry: {
        type: 'LineString',
        coordinates: s.ground.map(([o, z]) => [451200 + o, 102300 + s.station, z]),
      },
    })),
  };
}

/** Splits CSV text into rows of cells (quoted cells may hold commas and quotes). */
function parseCsv(text: string): string[][] {
  return text
    .trim()
    .split('\r\n')
    .map((line) => {
      const out: string[] = [];
      const re = /("(?:[^"]|"")*"|[^,]*)(,|$)/g;
      let m: RegExpExecArray | null;
      while ((m = re.exec(line)) && m[0] !== '') {
        const v = m[1];
        out.push(v.startsWith('"') ? v.slice(1, -1).replace(/""/g, '"') : v);
        if (m[2] === '') break;
      }
      return out;
    });
}

beforeAll(async () => {
  await startWorker();
  users = await makeUsers('export');
  engineer = await signIn(app, users.engineer.email);
  reviewer = await signIn(app, users.reviewer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Exports' });
  projectId = p.body.id;
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'wcb-export', sections: corridor.sections.slice(0, 3) });
  await waitForBatch(app, engineer, post.body.id);
  const list = await request(app)
    .get(`/api/v1/batches/${post.body.id}/sections?sort=station`)
    .auth(viewer, bearer);
  jsonBatch = { id: post.body.id, sections: list.body.items };
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('CSV: one row per station with FS, requirement, pass, status, review state and the caution', async () => {
  await request(app)
    .post(`/api/v1/sections/${jsonBatch.sections[1].id}/reviews`)
    .auth(reviewer, bearer)
    .send({ decision: 'returned', comment: 'Recheck the cut at this station.' })
    .expect(201);
  const res = await request(app)
    .get(`/api/v1/batches/${jsonBatch.id}/results.csv`)
    .auth(viewer, bearer);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
  expect(res.headers['content-disposition']).toBe('attachment; filename="wcb-export-results.csv"');
  const [head, ...body] = parseCsv(res.text);
  expect(head).toEqual([
    'station',
    'id',
    'governing_method',
    'fs',
    'required_fs',
    'passes',
    'status',
    'review_state',
    'caution',
  ]);
  expect(body).toHaveLength(3);
  const sections = await Promise.all(
    jsonBatch.sections.map((s) =>
      request(app).get(`/api/v1/sections/${s.id}`).auth(viewer, bearer),
    ),
  );
  body.forEach((row, i) => {
    const s = sections[i].body;
    expect(row).toEqual([
      String(s.station),
      s.key,
      s.result.governing.method,
      s.result.governing.fs.toFixed(3),
      '1.5',
      s.result.passes ? 'yes' : 'no',
      'done',
      i === 1 ? 'returned' : 'pending',
      CAUTION,
    ]);
  });
  expect(body.map((r) => Number(r[0]))).toEqual([1000, 1020, 1040]);
});

test('GeoJSON from JSON input: features with null geometry and the result properties', async () => {
  const res = await request(app)
    .get(`/api/v1/batches/${jsonBatch.id}/results.geojson`)
    .auth(viewer, bearer);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^application\/geo\+json/);
  expect(res.headers['content-disposition']).toBe(
    'attachment; filename="wcb-export-results.geojson"',
  );
  const fc = JSON.parse(res.text);
  expect(fc.type).toBe('FeatureCollection');
  expect(fc.features).toHaveLength(3);
  const one = await request(app)
    .get(`/api/v1/sections/${jsonBatch.sections[0].id}`)
    .auth(viewer, bearer);
  expect(fc.features[0]).toEqual({
    type: 'Feature',
    id: one.body.key,
    geometry: null,
    properties: {
      id: one.body.key,
      sectionId: one.body.id,
      station: 1000,
      stationLabel: '1+000',
      status: 'done',
      fs: one.body.result.governing.fs,
      method: one.body.result.governing.method,
      required: 1.5,
      passes: one.body.result.passes,
      warningCount: one.body.result.warnings.length,
      reviewState: 'pending',
      caution: CAUTION,
    },
  });
  expect(schemaErrors('ResultsGeoJson', fc)).toEqual([]);
  expect(
    fc.features.map((f: { properties: { stationLabel: string } }) => f.properties.stationLabel),
  ).toEqual(['1+000', '1+020', '1+040']);
});

test('GeoJSON from a GeoJSON corridor keeps each section line as its geometry', async () => {
  const geo = geoCorridor(2);
  const up = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', Buffer.from(JSON.stringify(geo)), 'corridor.geojson');
  expect(up.status).toBe(201);
  await waitForBatch(app, engineer, up.body.id);
  const res = await request(app)
    .get(`/api/v1/batches/${up.body.id}/results.geojson`)
    .auth(viewer, bearer);
  const fc = JSON.parse(res.text);
  expect(fc.features.map((f: { geometry: unknown }) => f.geometry)).toEqual(
    geo.features.map((f: { geometry: unknown }) => f.geometry),
  );
  for (const f of fc.features) {
    expect(f.properties.fs).toBeGreaterThan(0);
    expect(f.properties.caution).toBe(CAUTION);
  }
  // The sections list and the section view give the web app the same line.
  const list = await request(app)
    .get(`/api/v1/batches/${up.body.id}/sections?sort=station`)
    .auth(viewer, bearer);
  expect(list.body.items.map((i: { geometry: unknown }) => i.geometry)).toEqual(
    geo.features.map((f: { geometry: unknown }) => f.geometry),
  );
  const one = await request(app)
    .get(`/api/v1/sections/${fc.features[1].properties.sectionId}`)
    .auth(viewer, bearer);
  expect(one.body.geometry).toEqual(geo.features[1].geometry);
  expect(one.body.key).toBe(fc.features[1].id);
});

test('SVG of a section: the drawing of its current result, with the caution', async () => {
  const s = jsonBatch.sections[0];
  const res = await request(app).get(`/api/v1/sections/${s.id}/plot.svg`).auth(viewer, bearer);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toMatch(/^image\/svg\+xml/);
  expect(res.headers['content-disposition']).toMatch(/^inline; filename=".+-run1\.svg"$/);
  const svg = res.body.toString('utf8');
  expect(svg.startsWith('<svg')).toBe(true);
  const text = [...svg.matchAll(/<(?:text|tspan)[^>]*>([^<]*)</g)]
    .map((m) => m[1])
    .join(' ')
    .replace(/\s+/g, ' ');
  expect(text).toContain(CAUTION.split(' ').slice(0, 6).join(' '));
  const one = await request(app).get(`/api/v1/sections/${s.id}`).auth(viewer, bearer);
  expect(text).toContain(one.body.result.governing.fs.toFixed(2));
});

test('an SVG before any result is a 409 problem', async () => {
  // A section written without a job stays queued: it has no result.
  const b = await Batch.create({
    projectId,
    submittedBy: users.engineer.id,
    name: 'no-result',
    title: null,
    status: 'running',
    total: 1,
    source: 'json',
    finishedAt: null,
  });
  const s = await SectionRow.create({
    batchId: b.id,
    key: 'no-result@0',
    position: 0,
    station: 0,
    input: { format: 'scarpline/1' },
    status: 'queued',
    failReason: null,
  });
  const res = await request(app).get(`/api/v1/sections/${s.id}/plot.svg`).auth(viewer, bearer);
  expectProblem(res, 409);
  expect(res.body.detail).toMatch(/no result/);
});
