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
      properties: { station: s.station } as Record<string, unknown>,
      geometry: {
        type: 'LineString',
        coordinates: s.ground.map(([o, z]) => [451200 + o, 102300 + s.station, z]),
      },
    })),
  };
}

interface CaseBody {
  name: string;
  kind: string;
  requiredFs: number | null;
  governing: { method: string; fs: number } | null;
  ratio: number | null;
  verdict: string;
}
interface SectionBody {
  key: string;
  station: number;
  stationLabel: string;
  result: { verdict: string; governingCase: string | null; cases: CaseBody[] };
}

/** The case a station's row speaks for: its governing case, the first when none governs. */
const shownCase = (s: SectionBody) =>
  s.result.cases.find((c) => c.name === s.result.governingCase) ?? s.result.cases[0];

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

test('CSV: the core’s results table, per station a row per case then the station’s, then review state and job state', async () => {
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
    'row',
    'case',
    'kind',
    'governing_method',
    'fs',
    'required_fs',
    'ratio',
    'verdict',
    'required_force',
    'required_layers',
    'pf',
    'pf_se',
    'beta_normal',
    'beta_lognormal',
    'warnings',
    'note',
    'caution',
    'review_state',
    'job_state',
  ]);
  const sections = await Promise.all(
    jsonBatch.sections.map((s) =>
      request(app).get(`/api/v1/sections/${s.id}`).auth(viewer, bearer),
    ),
  );
  // per station a row per case, then the station's row (its governing case, its verdict)
  const expected = sections.flatMap((res, i) => {
    const s = res.body as SectionBody;
    const row = (c: CaseBody, which: string, verdict: string) => [
      String(s.station),
      s.stationLabel,
      s.key,
      which,
      c.name,
      c.kind,
      c.governing!.method,
      c.governing!.fs.toFixed(3),
      String(c.requiredFs),
      c.ratio === null ? '' : c.ratio.toFixed(3),
      verdict,
      '', // required_force: no station here asks for it
      '', // required_layers
      '', // pf, pf_se, beta_normal, beta_lognormal: no probability block here
      '',
      '',
      '',
      expect.stringMatching(/^\d+$/),
      '',
      CAUTION,
      i === 1 ? 'returned' : 'pending',
      'done',
    ];
    return [
      ...s.result.cases.map((c) => row(c, 'case', c.verdict)),
      row(shownCase(s), 'station', s.result.verdict),
    ];
  });
  expect(body).toEqual(expected);
  expect([...new Set(body.map((r) => Number(r[0])))]).toEqual([1000, 1020, 1040]);
  // every station is analysed in its cases (the corridor's own: long-term at least)
  for (const s of sections) expect(s.body.result.cases.length).toBeGreaterThan(0);
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
  const one = (
    await request(app).get(`/api/v1/sections/${jsonBatch.sections[0].id}`).auth(viewer, bearer)
  ).body as SectionBody;
  const cases = one.result.cases;
  const properties = (c: CaseBody) => ({
    station: 1000,
    chainage: '1+000',
    section_id: one.key,
    row: 'case',
    case: c.name,
    kind: c.kind,
    governing_method: c.governing!.method,
    fs: Number(c.governing!.fs.toFixed(3)),
    required_fs: c.requiredFs,
    ratio: c.ratio === null ? null : Number(c.ratio.toFixed(3)),
    verdict: c.verdict,
    required_force: null,
    required_layers: null,
    pf: null,
    pf_se: null,
    beta_normal: null,
    beta_lognormal: null,
    warnings: expect.any(Number),
    note: null,
    caution: CAUTION,
    review_state: 'pending',
    job_state: 'done',
  });
  // the first station's features: one per case, then the station's
  expect(fc.features.slice(0, cases.length + 1)).toEqual([
    ...cases.map((c) => ({
      type: 'Feature',
      id: `${one.key}#${c.name}`,
      geometry: null,
      properties: properties(c),
    })),
    {
      type: 'Feature',
      id: one.key,
      geometry: null,
      properties: { ...properties(shownCase(one)), row: 'station', verdict: one.result.verdict },
    },
  ]);
  expect(schemaErrors('ResultsGeoJson', fc)).toEqual([]);
  expect(
    fc.features.map((f: { properties: { chainage: string } }) => f.properties.chainage),
  ).toEqual(
    fc.features.map(
      (f: { properties: { station: number } }) =>
        ({ 1000: '1+000', 1020: '1+020', 1040: '1+040' })[f.properties.station],
    ),
  );
  expect(
    fc.features.filter((f: { properties: { row: string } }) => f.properties.row === 'station'),
  ).toHaveLength(3);
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
  const all = JSON.parse(res.text);
  for (const f of all.features) {
    expect(f.properties.fs).toBeGreaterThan(0);
    expect(f.properties.caution).toBe(CAUTION);
  }
  // a feature per case, then the station's, each with the station's line
  const lineOf = new Map(
    geo.features.map((f: { properties: { station: number }; geometry: unknown }) => [
      `wcb-geo@${f.properties.station}`,
      f.geometry,
    ]),
  );
  for (const f of all.features) expect(f.geometry).toEqual(lineOf.get(f.properties.section_id));
  expect(all.features.length).toBeGreaterThan(geo.features.length);
  const fc = {
    ...all,
    features: all.features.filter(
      (f: { properties: { row: string } }) => f.properties.row === 'station',
    ),
  };
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

test('PNG of a section: the same drawing rendered, as an attachment named for it', async () => {
  const s = jsonBatch.sections[0];
  const res = await request(app)
    .get(`/api/v1/sections/${s.id}/plot.png`)
    .auth(viewer, bearer)
    .buffer(true)
    .parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('image/png');
  expect(res.headers['content-disposition']).toMatch(/^attachment; filename=".+-run1\.png"$/);
  const png = res.body as Buffer;
  // the PNG signature and its IHDR size (PNG specification, ISO/IEC 15948 §5.2, §11.2.2)
  expect([...png.subarray(0, 8)]).toEqual([137, 80, 78, 71, 13, 10, 26, 10]);
  const svg = (
    await request(app).get(`/api/v1/sections/${s.id}/plot.svg`).auth(viewer, bearer)
  ).body.toString('utf8') as string;
  const [, w, h] = /width="(\d+)" height="(\d+)"/.exec(svg)!;
  expect([png.readUInt32BE(16), png.readUInt32BE(20)]).toEqual([Number(w), Number(h)]);
  const missing = await request(app)
    .get(`/api/v1/sections/${s.id}/plot.png?case=nope`)
    .auth(viewer, bearer);
  expectProblem(missing, 404);
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
    'station',
    '',
    '',
    '',
    '',
    '',
    '',
    '',
    '', // required_force
    '', // required_layers
    '', // pf, pf_se, beta_normal, beta_lognormal
    '',
    '',
    '',
    '',
    '',
    CAUTION,
    'pending',
    'queued',
  ]);
  expect(failed.slice(10, 19)).toEqual([
    'no-fs',
    '',
    '',
    '',
    '',
    '',
    '',
    '',
    'the job ran out of time or retries',
  ]);
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
