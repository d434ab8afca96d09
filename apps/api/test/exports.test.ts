import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch, SectionRow } from '../src/models';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';
import { oneCaseCorridor } from './sections';

const app = createApp();
const bearer = { type: 'bearer' as const };
const corridor = oneCaseCorridor();
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
      properties: { station: s.station } as Record<string, unknown>,
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

test('CSV: the core’s results table, a row per station, then review state and job state', async () => {
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
    'chainage',
    'section_id',
    'case',
    'governing_method',
    'fs',
    'required_fs',
    'verdict',
    'warnings',
    'note',
    'caution',
    'review_state',
    'job_state',
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
      s.stationLabel,
      s.key,
      s.input.analysis.case,
      s.result.governing.method,
      s.result.governing.fs.toFixed(3),
      '1.5',
      s.result.verdict,
      expect.stringMatching(/^\d+$/),
      '',
      CAUTION,
      i === 1 ? 'returned' : 'pending',
      'done',
    ]);
  });
  expect(body.map((r) => Number(r[0]))).toEqual([1000, 1020, 1040]);
});

test('GeoJSON from JSON input: features with null geometry and the results table’s properties', async () => {
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
  expect(fc.name).toBe('wcb-export');
  expect(fc.features).toHaveLength(3);
  const one = await request(app)
    .get(`/api/v1/sections/${jsonBatch.sections[0].id}`)
    .auth(viewer, bearer);
  expect(fc.features[0]).toEqual({
    type: 'Feature',
    id: one.body.key,
    geometry: null,
    properties: {
      station: 1000,
      chainage: '1+000',
      section_id: one.body.key,
      case: one.body.input.analysis.case,
      governing_method: one.body.result.governing.method,
      fs: Number(one.body.result.governing.fs.toFixed(3)),
      required_fs: 1.5,
      verdict: one.body.result.verdict,
      warnings: expect.any(Number),
      note: null,
      caution: CAUTION,
      review_state: 'pending',
      job_state: 'done',
    },
  });
  expect(schemaErrors('ResultsGeoJson', fc)).toEqual([]);
  expect(
    fc.features.map((f: { properties: { chainage: string } }) => f.properties.chainage),
  ).toEqual(['1+000', '1+020', '1+040']);
});

test('GeoJSON from a GeoJSON corridor keeps each section line as its geometry', async () => {
  const geo = geoCorridor(2);
  geo.features[1].properties.name = 'XS-1020';
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
  // The feature's own attributes come back first, as the command line gives them.
  expect(Object.keys(fc.features[1].properties).slice(0, 3)).toEqual([
    'station',
    'name',
    'chainage',
  ]);
  expect(fc.features[1].properties.name).toBe('XS-1020');
  // The sections list and the section view give the web app the same line.
  const list = await request(app)
    .get(`/api/v1/batches/${up.body.id}/sections?sort=station`)
    .auth(viewer, bearer);
  expect(list.body.items.map((i: { geometry: unknown }) => i.geometry)).toEqual(
    geo.features.map((f: { geometry: unknown }) => f.geometry),
  );
  const listed = list.body.items.find(
    (i: { key: string }) => i.key === fc.features[1].properties.section_id,
  );
  const one = await request(app).get(`/api/v1/sections/${listed.id}`).auth(viewer, bearer);
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

test('sections without a result: no verdict while queued, no-fs with the reason once failed', async () => {
  const b = await Batch.create({
    projectId,
    submittedBy: users.engineer.id,
    name: 'unfinished',
    title: null,
    status: 'running',
    total: 2,
    source: 'json',
    finishedAt: null,
  });
  // Rows written by hand, without a job: one still queued, one that ran out of retries.
  for (const [i, status, failReason] of [
    [0, 'queued', null],
    [1, 'failed', 'the job ran out of time or retries'],
  ] as const) {
    await SectionRow.create({
      batchId: b.id,
      key: `unfinished@${i * 20}`,
      position: i,
      station: i * 20,
      input: { format: 'scarpline/1' },
      status,
      failReason,
    });
  }
  const res = await request(app).get(`/api/v1/batches/${b.id}/results.csv`).auth(viewer, bearer);
  expect(res.status).toBe(200);
  const [, queued, failed] = parseCsv(res.text);
  expect(queued).toEqual([
    '0',
    '0+000',
    'unfinished@0',
    '',
    '',
    '',
    '',
    '',
    '',
    '',
    CAUTION,
    'pending',
    'queued',
  ]);
  expect(failed.slice(7, 10)).toEqual(['no-fs', '', 'the job ran out of time or retries']);
  expect(failed.slice(-1)).toEqual(['failed']);
  const geo = await request(app)
    .get(`/api/v1/batches/${b.id}/results.geojson`)
    .auth(viewer, bearer);
  const fc = JSON.parse(geo.text);
  expect(schemaErrors('ResultsGeoJson', fc)).toEqual([]);
  expect(
    fc.features.map((f: { properties: { verdict: string | null } }) => f.properties.verdict),
  ).toEqual([null, 'no-fs']);
});
