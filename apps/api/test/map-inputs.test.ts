/**
 * The GIS team's inputs through the API: a GeoJSON corridor in longitude and latitude (RFC 7946)
 * with its crs, and LandXML cross-sections with their corridor settings. Both run to verdicts;
 * results.geojson is WGS 84 with the projected positions kept, as the command writes it.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';

const ROOT = path.resolve(__dirname, '../../..');
const CLI = path.join(ROOT, 'packages/cli/dist/main.js');
const EXAMPLES = path.join(ROOT, 'examples/corridor');
const LONLAT = path.join(EXAMPLES, 'wendlecombe-lonlat.geojson');
const XML = path.join(EXAMPLES, 'wendlecombe-cut.xml');
const SETTINGS = path.join(EXAMPLES, 'wendlecombe-cut.yaml');
const read = (file: string) => fs.readFileSync(file);
const app = createApp();
const bearer = { type: 'bearer' as const };
let engineer: string;
let projectId: number;

interface Collection {
  type: string;
  crs?: unknown;
  features: {
    id: string;
    geometry: { type: string; coordinates: number[][] } | null;
    properties: Record<string, unknown>;
  }[];
}

beforeAll(async () => {
  await startWorker();
  const users = await makeUsers('mapin');
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Map inputs' });
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

/** Station → the station row's verdict and FS of a results.geojson. */
const verdicts = (c: Collection) =>
  Object.fromEntries(
    c.features
      .filter((f) => f.properties.row === 'station')
      .map((f) => [f.properties.station, [f.properties.verdict, f.properties.fs]]),
  );

async function results(batchId: number): Promise<Collection> {
  await waitForBatch(app, engineer, batchId, 120000);
  const res = await request(app)
    .get(`/api/v1/batches/${batchId}/results.geojson`)
    .auth(engineer, bearer);
  expect(res.status).toBe(200);
  return JSON.parse(res.text) as Collection;
}

let lonLatVerdicts: Record<string, unknown>;

test('a lon/lat GeoJSON corridor runs; results.geojson is WGS 84 with the projected positions, as the command writes it', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', read(LONLAT), 'wendlecombe-lonlat.geojson');
  expect(post.status).toBe(201);
  const api = await results(post.body.id as number);
  expect(api.crs).toBeUndefined();
  const out = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-map-'));
  const r = spawnSync(process.execPath, [CLI, 'batch', LONLAT, '--out', out, '--no-svg'], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  expect([0, 2]).toContain(r.status);
  const cli = JSON.parse(fs.readFileSync(path.join(out, 'results.geojson'), 'utf8')) as Collection;
  expect(api.features.map((f) => f.id)).toEqual(cli.features.map((f) => f.id));
  api.features.forEach((f, i) => {
    // one export module: the same WGS 84 line, the same projected positions and system
    expect(f.geometry).toEqual(cli.features[i].geometry);
    expect(f.properties.crs).toBe('EPSG:32630');
    expect(f.properties.projected_coordinates).toEqual(
      cli.features[i].properties.projected_coordinates,
    );
    const [lon, lat] = f.geometry!.coordinates[0];
    expect(lon).toBeGreaterThan(-3);
    expect(lon).toBeLessThan(-2);
    expect(lat).toBeGreaterThan(51);
    expect(lat).toBeLessThan(52);
  });
  lonLatVerdicts = verdicts(api);
  expect(Object.keys(lonLatVerdicts)).toHaveLength(6);
});

test('LandXML cross-sections with their corridor settings run to the verdicts of their lon/lat twin', async () => {
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', read(XML), 'wendlecombe-cut.xml')
    .attach('files', read(SETTINGS), 'wendlecombe-cut.yaml');
  expect(post.status).toBe(201);
  expect(post.body.progress.total).toBe(6);
  const api = await results(post.body.id as number);
  expect(api.features.every((f) => f.geometry === null)).toBe(true);
  expect(verdicts(api)).toEqual(lonLatVerdicts);
  // the LandXML is kept as submitted, as XML
  const inputs = await request(app)
    .get(`/api/v1/batches/${post.body.id}/inputs`)
    .auth(engineer, bearer);
  expect(JSON.stringify(inputs.body)).toContain('application/xml');
});

test('LandXML that cannot be used → 422 located in the file (line of the cross-section)', async () => {
  const text = read(XML).toString('utf8').replace('<CrossSect sta="1320"', '<CrossSect');
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', Buffer.from(text), 'cut.xml')
    .attach('files', read(SETTINGS), 'wendlecombe-cut.yaml');
  expectProblem(res, 422);
  const err = (res.body.errors as { file: string; line: number; path: string }[]).find(
    (e) => e.file === 'cut.xml',
  );
  expect(err).toMatchObject({ file: 'cut.xml', line: 22, path: 'CrossSect[1]' });

  const two = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', read(XML), 'wendlecombe-cut.xml')
    .attach('files', read(SETTINGS), 'a.yaml')
    .attach('files', read(SETTINGS), 'b.yaml');
  expectProblem(two, 422);
  expect(two.body.detail).toMatch(/one file of corridor settings/);
});

test('a lon/lat corridor naming an unknown system → 422 located at its crs', async () => {
  const text = read(LONLAT).toString('utf8').replace('"EPSG:32630"', '"EPSG:3857"');
  const res = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', Buffer.from(text), 'map.geojson');
  expectProblem(res, 422);
  expect(res.body.errors[0]).toMatchObject({
    file: 'map.geojson',
    path: 'scarpline.crs',
    code: 'unknown-crs',
  });
});
