/**
 * One results table: the demo corridor run through the command line (`scarpline batch`) and
 * through the API gives the same CSV, the same GeoJSON and the same results sheet of the
 * spreadsheet (values and number formats), apart from what only the service knows (the review state and the job state, its own columns at the end). The command is the
 * built one (`npm test` builds first), as its own tests run it.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { Workbook } from 'exceljs';
import { EXPORT_COLUMNS } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { stopQueue } from '../src/queue';
import { SERVICE_COLUMNS } from '../src/services/exports';
import { startWorker } from '../src/worker';
import { makeUsers, signIn, waitForBatch } from './helpers';

const ROOT = path.resolve(__dirname, '../../..');
const CLI = path.join(ROOT, 'packages/cli/dist/main.js');
const CORRIDOR = path.join(ROOT, 'examples/corridor/corridor.json');
const app = createApp();
const bearer = { type: 'bearer' as const };
let engineer: string;
let projectId: number;

/** A results sheet read back: each row's cells (caution, names, units, then the records) and each column's number format. */
interface Sheet {
  rows: unknown[][];
  formats: string[];
}

async function resultsSheet(bytes: Buffer): Promise<Sheet> {
  const wb = new Workbook();
  await wb.xlsx.load(new Uint8Array(bytes).buffer);
  const ws = wb.getWorksheet('results')!;
  const width = ws.getRow(2).cellCount;
  const rows: unknown[][] = [];
  ws.eachRow({ includeEmpty: true }, (row) =>
    rows.push(Array.from({ length: width }, (_, i) => row.getCell(i + 1).value)),
  );
  const formats = Array.from({ length: width }, (_, i) => ws.getColumn(i + 1).numFmt ?? '');
  return { rows, formats };
}

interface Collection {
  type: string;
  name: string;
  caution: string;
  features: { id: string; geometry: unknown; properties: Record<string, unknown> }[];
}

beforeAll(async () => {
  await startWorker();
  const users = await makeUsers('equal');
  engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Exports agree' });
  projectId = p.body.id;
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

/** `scarpline batch FILE --out DIR`: results.csv, results.geojson and results.xlsx as written. */
async function cliExports(
  file: string,
): Promise<{ csv: string; geojson: Collection; xlsx: Sheet }> {
  const out = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-equal-'));
  const r = spawnSync(process.execPath, [CLI, 'batch', file, '--out', out, '--no-svg'], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  // 0 or 2 (some stations below their required FS): every station read and was analysed
  expect([0, 2]).toContain(r.status);
  expect(r.stderr).not.toMatch(/error|warning/i);
  return {
    csv: fs.readFileSync(path.join(out, 'results.csv'), 'utf8'),
    geojson: JSON.parse(fs.readFileSync(path.join(out, 'results.geojson'), 'utf8')) as Collection,
    xlsx: await resultsSheet(fs.readFileSync(path.join(out, 'results.xlsx'))),
  };
}

/** The API's three exports of a finished batch. */
async function apiExports(
  batchId: number,
): Promise<{ csv: string; geojson: Collection; xlsx: Sheet }> {
  await waitForBatch(app, engineer, batchId, 120000);
  const csv = await request(app)
    .get(`/api/v1/batches/${batchId}/results.csv`)
    .auth(engineer, bearer);
  const geo = await request(app)
    .get(`/api/v1/batches/${batchId}/results.geojson`)
    .auth(engineer, bearer);
  const xlsx = await request(app)
    .get(`/api/v1/batches/${batchId}/results.xlsx`)
    .auth(engineer, bearer)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });
  expect([csv.status, geo.status, xlsx.status]).toEqual([200, 200, 200]);
  return {
    csv: csv.text,
    geojson: JSON.parse(geo.text) as Collection,
    xlsx: await resultsSheet(xlsx.body as Buffer),
  };
}

/** The two exports agree, the API's own columns (at the end of each row) set aside. */
function expectEqual(
  cli: { csv: string; geojson: Collection; xlsx: Sheet },
  api: typeof cli,
): void {
  const cliLines = cli.csv.split('\r\n');
  const apiLines = api.csv.split('\r\n');
  expect(cliLines[0]).toBe(EXPORT_COLUMNS.join(','));
  expect(apiLines[0]).toBe([...EXPORT_COLUMNS, ...SERVICE_COLUMNS].join(','));
  expect(apiLines).toHaveLength(cliLines.length);
  // Byte for byte, row by row: each API row is the command's row and two cells of its own.
  // (No cell of these rows holds a comma: the note is empty, the caution has none.)
  const own = /,(approved|returned|pending),(queued|running|done|failed)$/;
  for (let i = 1; i < apiLines.length - 1; i++) {
    expect(apiLines[i]).toMatch(own);
    expect(apiLines[i].replace(own, '')).toBe(cliLines[i]);
  }
  expect(apiLines.at(-1)).toBe('');

  const { features, ...head } = api.geojson;
  const { features: cliFeatures, ...cliHead } = cli.geojson;
  expect(head).toEqual(cliHead);
  const stripped = features.map((f) => {
    const properties = { ...f.properties };
    for (const c of SERVICE_COLUMNS) {
      expect(properties).toHaveProperty(c);
      delete properties[c];
    }
    return { ...f, properties };
  });
  expect(stripped).toEqual(cliFeatures);
  // the same keys in the same order, not only the same values
  expect(stripped.map((f) => Object.keys(f.properties))).toEqual(
    cliFeatures.map((f) => Object.keys(f.properties)),
  );

  // the results sheet: the same cells (the service's two columns at the end set aside, their
  // names in row 2), the same number formats, a row per CSV record below the caution, names and units
  const n = EXPORT_COLUMNS.length;
  expect(cli.xlsx.rows[1]).toEqual([...EXPORT_COLUMNS]);
  expect(api.xlsx.rows[1]).toEqual([...EXPORT_COLUMNS, ...SERVICE_COLUMNS]);
  expect(api.xlsx.rows.map((r) => r.slice(0, n))).toEqual(cli.xlsx.rows);
  expect(api.xlsx.formats.slice(0, n)).toEqual(cli.xlsx.formats);
  expect(cli.xlsx.rows).toHaveLength(3 + cliLines.length - 2);
}

test('the demo corridor: the CSV, GeoJSON and results sheet of the command and of the API are the same', async () => {
  const cli = await cliExports(CORRIDOR);
  const corridor = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8')) as { sections: unknown[] };
  const post = await request(app)
    .post(`/api/v1/projects/${projectId}/batches`)
    .auth(engineer, bearer)
    .send(corridor);
  expect(post.status).toBe(201);
  const api = await apiExports(post.body.id);
  // per station a feature per case, then the station's
  const stations = cli.geojson.features.filter((f) => f.properties.row === 'station');
  expect(stations).toHaveLength(corridor.sections.length);
  expect(cli.geojson.features.length).toBeGreaterThan(stations.length);
  // both verdicts occur: the comparison covers stations that meet and stations below
  const verdicts = new Set(cli.geojson.features.map((f) => f.properties.verdict));
  expect([...verdicts].sort()).toEqual(['below', 'meets']);
  expectEqual(cli, api);
}, 180000);

test('a GeoJSON corridor: the lines and their attributes come back the same from both', async () => {
  const { sections, ...header } = JSON.parse(fs.readFileSync(CORRIDOR, 'utf8')) as {
    sections: { station: number; ground: number[][] }[];
  };
  const features = sections.slice(0, 8).map((s) => ({
    type: 'Feature',
    properties: { station: s.station, name: `XS-${s.station}`, surveyed: 2026 },
    geometry: {
      type: 'LineString',
      coordinates: s.ground.map(([o, z]) => [451200 + 0.8 * o, 102300 + s.station + 0.6 * o, z]),
    },
  }));
  const text = JSON.stringify({ type: 'FeatureCollection', scarpline: header, features }, null, 2);
  const file = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-geo-')), 'lines.geojson');
  fs.writeFileSync(file, text);
  const cli = await cliExports(file);
  const up = await request(app)
    .post(`/api/v1/projects/${projectId}/uploads`)
    .auth(engineer, bearer)
    .attach('files', Buffer.from(text), 'lines.geojson');
  expect(up.status).toBe(201);
  const api = await apiExports(up.body.id);
  const stations = cli.geojson.features.filter((f) => f.properties.row === 'station');
  expect(stations.map((f) => f.properties.name)).toEqual(features.map((f) => f.properties.name));
  expect(stations.map((f) => f.geometry)).toEqual(features.map((f) => f.geometry));
  expectEqual(cli, api);
}, 180000);
