/**
 * GET /batches/{id}/results.xlsx: the spreadsheet of a batch's results, read back with exceljs.
 * Its results sheet holds the CSV of the same batch cell by cell (the service's own columns
 * too), and with ?slices=true a sheet per section holds each case's governing slices as the
 * section's result JSON has them.
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { Workbook, type Worksheet } from 'exceljs';
import type { MethodReport } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { Batch } from '../src/models';
import { stopQueue } from '../src/queue';
import { startWorker } from '../src/worker';
import { expectProblem, makeUsers, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const XLSX = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
const app = createApp();
const bearer = { type: 'bearer' as const };
const corridor = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));
let engineer: string;
let viewer: string;
let batchId: number;

/** The response body as bytes (supertest buffers only the types it knows). */
function bytes(res: request.Response, done: (e: Error | null, body: Buffer) => void) {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

async function getXlsx(query = '') {
  const res = await request(app)
    .get(`/api/v1/batches/${batchId}/results.xlsx${query}`)
    .auth(viewer, bearer)
    .buffer(true)
    .parse(bytes);
  expect(res.status).toBe(200);
  const wb = new Workbook();
  const body = res.body as Buffer;
  await wb.xlsx.load(new Uint8Array(body).buffer);
  return { res, wb };
}

/** A cell as a spreadsheet shows it: a number in its format (0.000: three decimals), text as it is. */
function shown(ws: Worksheet, row: number, column: number): string {
  const cell = ws.getRow(row).getCell(column);
  const v = cell.value;
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return cell.numFmt === '0.000' ? v.toFixed(3) : String(v);
  if (typeof v === 'string') return v;
  throw new Error(`cell ${cell.address}: not a number or a text: ${JSON.stringify(v)}`);
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
  const users = await makeUsers('xlsx');
  engineer = await signIn(app, users.engineer.email);
  viewer = await signIn(app, users.viewer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Spreadsheets' });
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, bearer)
    .send({ ...corridor, id: 'wcb-sheet', sections: corridor.sections.slice(0, 2) });
  batchId = post.body.id;
  await waitForBatch(app, engineer, batchId);
});

afterAll(async () => {
  await stopQueue();
  await sequelize.close();
});

test('the results sheet is the CSV cell by cell, the service’s columns too; named after the corridor and the day', async () => {
  const day = () => new Date().toISOString().slice(0, 10);
  const before = day();
  const { res, wb } = await getXlsx();
  const days = [before, day()].map((d) => `attachment; filename="wcb-sheet-results-${d}.xlsx"`);
  expect(res.headers['content-type']).toBe(XLSX);
  expect(days).toContain(res.headers['content-disposition']);
  const csv = await request(app).get(`/api/v1/batches/${batchId}/results.csv`).auth(viewer, bearer);
  const [header, ...records] = parseCsv(csv.text);
  expect(header.slice(-2)).toEqual(['review_state', 'job_state']);
  expect(wb.worksheets.map((w) => w.name)).toEqual(['results']);
  const ws = wb.worksheets[0];
  expect(ws.getCell('A1').value).toMatch(/^Caution: .*licensed practice govern/);
  header.forEach((name, i) => expect(ws.getRow(2).getCell(i + 1).value).toBe(name));
  expect(ws.getRow(3).getCell(1).value).toBe('m');
  expect(ws.rowCount).toBe(3 + records.length);
  expect(records.length).toBeGreaterThan(2);
  records.forEach((record, r) =>
    record.forEach((text, c) => {
      expect(shown(ws, r + 4, c + 1)).toBe(text);
      const v = ws.getRow(r + 4).getCell(c + 1).value;
      if (typeof v === 'number') expect(v).toBe(Number(text));
    }),
  );
});

test('?slices=true: a sheet per section with each case’s governing slices as its result has them', async () => {
  const { wb } = await getXlsx('?slices=true');
  const list = await request(app)
    .get(`/api/v1/batches/${batchId}/sections?sort=station`)
    .auth(viewer, bearer);
  const keys = (list.body.items as { key: string }[]).map((s) => s.key);
  expect(wb.worksheets.map((w) => w.name)).toEqual(['results', ...keys]);
  for (const item of list.body.items as { id: number; key: string }[]) {
    const section = await request(app).get(`/api/v1/sections/${item.id}`).auth(viewer, bearer);
    const cases = section.body.result.cases as {
      name: string;
      governing: { method: string } | null;
      methods: MethodReport[];
    }[];
    const ws = wb.getWorksheet(item.key)!;
    expect(ws.getCell('A1').value).toMatch(/^Caution: /);
    const names = (ws.getRow(2).values as unknown[]).slice(1);
    expect(names.slice(0, 6)).toEqual(['case', 'method', '#', 'x', 'b', 'α']);
    const col = (n: string) => names.indexOf(n) + 1;
    let row = 4;
    for (const c of cases) {
      const m = c.methods.find((k) => k.method === c.governing?.method);
      for (const [i, s] of (m?.slices ?? []).entries()) {
        const cells = ws.getRow(row++);
        expect([cells.getCell(1).value, cells.getCell(2).value, cells.getCell(3).value]).toEqual([
          c.name,
          m!.method,
          i + 1,
        ]);
        expect(cells.getCell(col('x')).value).toBe(Number(s.x.toFixed(2)));
        expect(cells.getCell(col('W')).value).toBe(Number(s.weight.toFixed(1)));
        expect(cells.getCell(col('N′')).value).toBe(Number(s.normal.toFixed(1)));
        expect(cells.getCell(col('material')).value).toBe(s.material);
        expect(cells.getCell(col('c′/Su')).value).toBe(Number(s.cohesion!.toFixed(1)));
        expect(cells.getCell(col('φ′')).value).toBe(Number(s.frictionAngle!.toFixed(1)));
      }
    }
    expect(row).toBeGreaterThan(10);
    expect(ws.rowCount).toBe(row - 1);
  }
});

test('an unknown batch is a 404 problem; a slices flag other than true or false a 400', async () => {
  expectProblem(
    await request(app).get('/api/v1/batches/999999/results.xlsx').auth(viewer, bearer),
    404,
  );
  expectProblem(
    await request(app)
      .get(`/api/v1/batches/${batchId}/results.xlsx?slices=yes`)
      .auth(viewer, bearer),
    400,
  );
});

test('slice sheets of a batch beyond the bound: a 422 problem that says how many it takes', async () => {
  const b = (await Batch.findByPk(batchId))!;
  const total = b.total;
  await b.update({ total: 101 });
  try {
    const res = await request(app)
      .get(`/api/v1/batches/${batchId}/results.xlsx?slices=true`)
      .auth(viewer, bearer);
    expectProblem(res, 422);
    expect(res.body.detail).toMatch(/at most 100 sections; this one has 101/);
    // without slice sheets, the same batch downloads
    await getXlsx();
  } finally {
    await b.update({ total });
  }
});
