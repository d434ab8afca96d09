/**
 * Sections cut from terrain through the API: a terrain job with its GeoTIFF rasters and its
 * alignment uploaded, cut in an intake thread, solved by the worker; the rasters kept in the
 * object storage; bad input located (no data by station and offset, a missing file, the caps).
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { config } from '../src/config';
import { sequelize } from '../src/db';
import { Batch, Project, StoredFile } from '../src/models';
import { seedDemo } from '../src/seed';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';

const TERRAIN = path.resolve(__dirname, '../../../examples/terrain');
const app = createApp();
let engineer: string;
let viewer: string;
let projectId: number;

/** The demonstration job, every 300 m instead of every 40 (4 sections: the line ends just short of 2+200), with changes. */
const job = (change: (text: string) => string = (t) => t) =>
  Buffer.from(
    change(
      fs
        .readFileSync(path.join(TERRAIN, 'wendlecombe.terrain.yaml'), 'utf8')
        .replace('stations: { every: 40 }', 'stations: { every: 300 }'),
    ),
  );

const post = (jobText: Buffer, names: string[], token = engineer) => {
  let r = request(app)
    .post(`/api/v1/projects/${projectId}/terrain`)
    .auth(token, { type: 'bearer' })
    .attach('job', jobText, 'wendlecombe.terrain.yaml');
  for (const n of names) r = r.attach('files', path.join(TERRAIN, n));
  return r;
};
/** A feature of results.geojson. */
type Feature = { properties: { row: string; station: number } };

const ALL = ['wendlecombe-dem.tif', 'wendlecombe-rock.tif', 'wendlecombe-alignment.geojson'];

beforeAll(async () => {
  await startWorker();
  const users = await makeUsers('terrain');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Wendlecombe terrain (test)' });
  expect(p.status).toBe(201);
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('a terrain job with its rasters and alignment: cut, solved, the section lines in results.geojson', async () => {
  const res = await post(job(), ALL);
  expect(res.status).toBe(201);
  expect(res.body.caution).toBe(CAUTION);
  expect(res.body.progress.total).toBe(4);
  expect(res.body.source).toBe('terrain');
  expect(res.body.terrain.warnings).toEqual([]);
  const done = await waitForBatch(app, viewer, res.body.id);
  expect(done.progress).toMatchObject({ total: 4, done: 4, failed: 0 });

  const geo = await request(app)
    .get(`/api/v1/batches/${res.body.id}/results.geojson`)
    .auth(viewer, { type: 'bearer' });
  expect(geo.status).toBe(200);
  const body = JSON.parse(geo.text);
  const stations = body.features.filter((f: Feature) => f.properties.row === 'station');
  expect(stations.map((f: Feature) => f.properties.station)).toEqual([1000, 1300, 1600, 1900]);
  for (const f of stations) {
    expect(f.geometry.type).toBe('LineString');
    expect(f.geometry.coordinates).toHaveLength(41);
  }

  // the rasters in the object storage as the batch's terrain; the job, the alignment and the
  // corridor cut from them as its inputs
  const stored = await StoredFile.findAll({
    where: { batchId: res.body.id },
    order: [['id', 'ASC']],
  });
  expect(stored.filter((f) => f.kind === 'terrain').map((f) => [f.name, f.size])).toEqual([
    ['wendlecombe-dem.tif', fs.statSync(path.join(TERRAIN, 'wendlecombe-dem.tif')).size],
    ['wendlecombe-rock.tif', fs.statSync(path.join(TERRAIN, 'wendlecombe-rock.tif')).size],
  ]);
  const inputs = await request(app)
    .get(`/api/v1/batches/${res.body.id}/inputs`)
    .auth(viewer, { type: 'bearer' });
  expect(inputs.body.map((f: { name: string }) => f.name)).toEqual([
    'wendlecombe.terrain.yaml',
    'wendlecombe-alignment.geojson',
    'wendlecombe.terrain.geojson',
  ]);
});

test('no data at a sample: 422 with each located by station and offset', async () => {
  const res = await post(
    job((t) => t.replace('left: 40', 'left: 90')),
    ALL,
  );
  expectProblem(res, 422);
  expect(res.body.errors[0]).toMatchObject({
    file: 'wendlecombe-dem.tif',
    station: 1000,
    offset: -90,
    code: 'no-data',
  });
  expect(res.body.errors[0].text).toMatch(
    /^wendlecombe-dem\.tif: station 1000, offset -90 \(x [\d.]+, y [\d.]+\): error: no data/,
  );
});

test('a file the job names is missing, a job missing, a viewer: located 422, 400, 403', async () => {
  const missing = await post(job(), ['wendlecombe-dem.tif', 'wendlecombe-alignment.geojson']);
  expectProblem(missing, 422);
  expect(missing.body.errors[0]).toMatchObject({
    file: 'wendlecombe.terrain.yaml',
    path: 'strata[1].raster',
    message: 'wendlecombe-rock.tif: no such file',
  });
  const noJob = await request(app)
    .post(`/api/v1/projects/${projectId}/terrain`)
    .auth(engineer, { type: 'bearer' })
    .attach('files', path.join(TERRAIN, 'wendlecombe-dem.tif'));
  expectProblem(noJob, 400);
  const bad = await post(
    job((t) => t.replace('spacing: 2', 'spacing: -2')),
    ALL,
  );
  expectProblem(bad, 422);
  expect(bad.body.errors[0]).toMatchObject({
    path: 'spacing',
    message: 'expected a number above 0',
  });
  // the job alone: the role is refused before the files are read, and a client still writing a
  // large upload then meets a closed connection (EPIPE) instead of the answer
  expectProblem(await post(job(), [], viewer), 403);
});

test('the caps: a raster of more pixels than TERRAIN_PIXELS, an upload above TERRAIN_TOTAL', async () => {
  const { terrainPixels, terrainTotal } = config;
  try {
    config.terrainPixels = 10_000;
    const many = await post(job(), ALL);
    expectProblem(many, 422);
    expect(many.body.errors[0]).toMatchObject({
      file: 'wendlecombe-dem.tif',
      code: 'too-many-pixels',
    });
    config.terrainPixels = terrainPixels;
    // the job alone (a few kB: sent whole before the answer) over a total of 1000 bytes
    config.terrainTotal = 1000;
    const total = await post(job(), []);
    expectProblem(total, 413);
    expect(total.body.detail).toMatch(/at most 1000 bytes in all \(TERRAIN_TOTAL\)/);
  } finally {
    config.terrainPixels = terrainPixels;
    config.terrainTotal = terrainTotal;
  }
});

test('the demo seed cuts the Wendlecombe terrain beside the demo corridors, and adds only what is missing', async () => {
  const examples = path.resolve(TERRAIN, '..');
  const main = path.join(examples, 'corridor/corridor.json');
  const uncertain = path.join(examples, 'corridor/wendlecombe-uncertain.json');
  const terrainJob = path.join(TERRAIN, 'wendlecombe.terrain.yaml');
  // a database seeded before the uncertain corridor and the terrain were demo batches
  expect(await seedDemo({ corridors: [main] })).toEqual({ submitted: ['wcb-main'] });
  expect(await seedDemo({ corridors: [main, uncertain], terrainJob })).toEqual({
    submitted: ['wcb-uncertain', 'wcb-terrain'],
  });
  expect(await seedDemo({ corridors: [main, uncertain], terrainJob })).toEqual({ submitted: [] });
  const project = await Project.findOne({ where: { name: 'Wendlecombe bypass' } });
  const batches = await Batch.findAll({
    where: { projectId: project!.id },
    order: [['id', 'ASC']],
  });
  expect(batches.map((b) => [b.name, b.source, b.total])).toEqual([
    ['wcb-main', 'seed', 61],
    ['wcb-uncertain', 'seed', 61],
    ['wcb-terrain', 'terrain', 30],
  ]);
  expect(await Project.count({ where: { name: 'Wendlecombe bypass' } })).toBe(1);
  const rasters = await StoredFile.count({ where: { batchId: batches[2].id, kind: 'terrain' } });
  expect(rasters).toBe(2);
});
