import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { queue, SECTION_QUEUE, stopQueue } from '../src/queue';
import { expectProblem, makeUsers, signIn } from './helpers';

const app = createApp();
const auth = { type: 'bearer' as const };
let engineer: string;
let projectId: number;
let engineerId: number;
/** A second project for the one submission that succeeds, so its jobs never touch projectId. */
let sanityProjectId: number;
const corridor = JSON.parse(
  fs.readFileSync(path.resolve(__dirname, '../../../examples/corridor/corridor.json'), 'utf8'),
);

/**
 * Rows a submission by this file's engineer could write: its project's batches, sections and
 * results, queued jobs for those sections or for no section at all, and the engineer's audit
 * entries. Scoped so that other test files writing at the same time do not change them.
 */
async function counts(project = projectId): Promise<Record<string, number>> {
  const [row] = await sequelize.query<Record<string, string>>(
    `SELECT
       (SELECT count(*) FROM batches WHERE project_id = $1) AS batches,
       (SELECT count(*) FROM sections s JOIN batches b ON b.id = s.batch_id
         WHERE b.project_id = $1) AS sections,
       (SELECT count(*) FROM results r JOIN sections s ON s.id = r.section_id
         JOIN batches b ON b.id = s.batch_id WHERE b.project_id = $1) AS results,
       (SELECT count(*) FROM pgboss.job j
         LEFT JOIN sections s ON s.id = (j.data->>'sectionId')::int
         LEFT JOIN batches b ON b.id = s.batch_id
         WHERE j.name = $3 AND (s.id IS NULL OR b.project_id = $1)) AS jobs,
       (SELECT count(*) FROM audit_log WHERE user_id = $2) AS audit`,
    { bind: [project, engineerId, SECTION_QUEUE], type: QueryTypes.SELECT },
  );
  return Object.fromEntries(Object.entries(row).map(([k, v]) => [k, Number(v)]));
}

/** The first n stations of the demo corridor as GeoJSON lines, pretty-printed. */
function geoText(n: number, edit?: (features: Record<string, unknown>[]) => void): string {
  const { sections, ...header } = corridor;
  const features = sections.slice(0, n).map((s: { station: number; ground: number[][] }) => ({
    type: 'Feature',
    properties: { station: s.station },
    geometry: {
      type: 'LineString',
      coordinates: s.ground.map(([o, z]) => [451200 + o, 102300 + s.station, z]),
    },
  }));
  edit?.(features);
  return JSON.stringify(
    { type: 'FeatureCollection', scarpline: { ...header, id: 'wcb-broken' }, features },
    null,
    2,
  );
}

beforeAll(async () => {
  await queue(); // the pgboss schema exists even when this file runs alone
  const users = await makeUsers('badin');
  engineerId = users.engineer.id;
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Bad input (test)' });
  projectId = p.body.id;
  const q = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, auth)
    .send({ name: 'Bad input, control (test)' });
  sanityProjectId = q.body.id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('the counts see a real submission (so the comparisons below can fail)', async () => {
  const before = await counts(sanityProjectId);
  const res = await request(app)
    .post(`/api/v1/projects/${sanityProjectId}/uploads`)
    .auth(engineer, auth)
    .attach('files', Buffer.from(geoText(2)), 'corridor.geojson');
  expect(res.status).toBe(201);
  const after = await counts(sanityProjectId);
  expect(after).toEqual({
    ...before,
    batches: before.batches + 1,
    sections: before.sections + 2,
    jobs: before.jobs + 2,
    audit: before.audit + 1,
  });
});

test('a JSON body over the limit → 413 problem+json, nothing written', async () => {
  const before = await counts();
  const huge = { ...corridor, id: 'wcb-huge', title: 'x'.repeat(config.jsonLimit + 1024) };
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, auth)
    .send(huge);
  expectProblem(res, 413);
  expect(res.body.title).toBe('Content too large');
  expect(await counts()).toEqual(before);
});

test('an uploaded file over the limit → 413 problem+json, nothing written', async () => {
  const before = await counts();
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, auth)
    .attach('files', Buffer.alloc(config.uploadLimit + 1024, 0x20), 'big.json');
  expectProblem(res, 413);
  expect(await counts()).toEqual(before);
});

test('a GeoJSON corridor with a broken feature → 422 located at that feature, nothing written', async () => {
  const before = await counts();
  const text = geoText(3, (features) => {
    features[1].geometry = { type: 'Point', coordinates: [451200, 102320] };
  });
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, auth)
    .attach('files', Buffer.from(text), 'corridor.geojson');
  expectProblem(res, 422);
  expect(res.body.errors).toHaveLength(1);
  const err = res.body.errors[0];
  expect(err).toMatchObject({ file: 'corridor.geojson', path: 'features[1].geometry' });
  // The line and column are those of the second feature's "geometry" member.
  const lines = text.split('\n');
  const geometryLines = lines.flatMap((l, i) => (l.includes('"geometry"') ? [i + 1] : []));
  expect(err.line).toBe(geometryLines[1]);
  expect(lines[err.line - 1].indexOf('"geometry"') + 1).toBeLessThanOrEqual(err.column);
  expect(err.text).toMatch(/^corridor\.geojson:\d+:\d+ /);
  expect(await counts()).toEqual(before);
});

test('a truncated GeoJSON corridor → 422 with the syntax error located, nothing written', async () => {
  const before = await counts();
  const text = geoText(2);
  const cut = text.slice(0, Math.floor(text.length / 2));
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, auth)
    .attach('files', Buffer.from(cut), 'corridor.geojson');
  expectProblem(res, 422);
  const err = res.body.errors[0];
  expect(err.file).toBe('corridor.geojson');
  expect(err.line).toBeGreaterThan(1);
  expect(err.line).toBeLessThanOrEqual(cut.split('\n').length);
  expect(await counts()).toEqual(before);
});
