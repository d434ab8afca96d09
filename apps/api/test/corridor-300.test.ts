import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { CAUTION } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { ResultRow, SectionRow } from '../src/models';
import { stopQueue } from '../src/queue';
import { fakeInbox, startSmtpFake, stopSmtpFake } from '../src/services/mail';
import { startWorker } from '../src/worker';
import { makeUsers, signIn, waitForBatch } from './helpers';

jest.setTimeout(180000);

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();

/** 300 sections: the demo corridor's 61 stations repeated at new chainages, 20 m apart. */
function corridor300() {
  const c = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));
  const first = c.sections[0].station as number;
  const sections = Array.from({ length: 300 }, (_, i) => ({
    ...c.sections[i % c.sections.length],
    station: first + 20 * i,
  }));
  return { ...c, id: 'wcb-e2e-300', sections };
}

beforeAll(async () => {
  await startSmtpFake(0);
  await startWorker();
});

afterAll(async () => {
  await stopQueue();
  await stopSmtpFake();
  await sequelize.close();
});

test('a 300-section corridor end to end: posted, solved, every result stored once, exports right, mail sent', async () => {
  const users = await makeUsers('e2e300');
  const engineer = await signIn(app, users.engineer.email);
  const p = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, { type: 'bearer' })
    .send({ name: 'Wendlecombe bypass (300 stations)' });
  expect(p.status).toBe(201);
  const post = await request(app)
    .post(`/api/v1/projects/${p.body.id}/batches`)
    .auth(engineer, { type: 'bearer' })
    .send(corridor300());
  expect(post.status).toBe(201);
  expect(post.body.progress.total).toBe(300);

  const done = await waitForBatch(app, engineer, post.body.id, 170000);
  expect(done.progress).toMatchObject({ total: 300, done: 300, failed: 0, queued: 0, running: 0 });

  const sections = await SectionRow.findAll({ where: { batchId: post.body.id } });
  expect(sections).toHaveLength(300);
  expect(await ResultRow.count({ where: { sectionId: sections.map((s) => s.id) } })).toBe(300);

  // the CSV export: per station a row per case then the station's, in agreement with the stored results
  const csv = await request(app)
    .get(`/api/v1/batches/${post.body.id}/results.csv`)
    .auth(engineer, { type: 'bearer' });
  expect(csv.status).toBe(200);
  const lines = csv.text.trim().split(/\r?\n/);
  const header = lines[0].split(',');
  const [fsCol, stationCol, rowCol, caseCol] = ['fs', 'station', 'row', 'case'].map((c) =>
    header.indexOf(c),
  );
  expect(Math.min(fsCol, stationCol, rowCol, caseCol)).toBeGreaterThanOrEqual(0);
  const list = await request(app)
    .get(`/api/v1/batches/${post.body.id}/sections?sort=station&order=asc&pageSize=300`)
    .auth(engineer, { type: 'bearer' });
  type Item = {
    station: number;
    result: { governingFs: number; cases: { name: string; governingFs: number }[] };
  };
  const byStation = new Map<number, Item['result']>(
    list.body.items.map((i: Item) => [i.station, i.result]),
  );
  const cases = list.body.items.reduce((n: number, i: Item) => n + i.result.cases.length, 0);
  expect(lines).toHaveLength(1 + cases + 300);
  const rows = lines.slice(1).map((line) => line.split(','));
  expect(rows.filter((r) => r[rowCol] === 'station')).toHaveLength(300);
  for (const cells of rows) {
    const r = byStation.get(Number(cells[stationCol]))!;
    // the CSV gives FS to three decimals: the station's, or its case's
    const fs =
      cells[rowCol] === 'station'
        ? r.governingFs
        : r.cases.find((c) => c.name === cells[caseCol])!.governingFs;
    expect(Number(cells[fsCol])).toBeCloseTo(fs, 3);
  }
  expect(csv.text).toContain(CAUTION);

  // the GeoJSON export: a feature per row of the CSV, each with its FS
  const geo = await request(app)
    .get(`/api/v1/batches/${post.body.id}/results.geojson`)
    .auth(engineer, { type: 'bearer' });
  expect(geo.status).toBe(200);
  const doc = JSON.parse(geo.text);
  expect(doc.type).toBe('FeatureCollection');
  expect(doc.features).toHaveLength(rows.length);
  for (const f of doc.features) expect(f.properties.fs).toBeGreaterThan(0);

  // the completion mail at the local fake
  const end = Date.now() + 15000;
  while (!fakeInbox().some((m) => m.raw.includes('wcb-e2e-300 finished')) && Date.now() < end) {
    await new Promise((r) => setTimeout(r, 100));
  }
  expect(fakeInbox().find((m) => m.raw.includes('wcb-e2e-300 finished'))?.to).toContain(
    users.engineer.email,
  );
});
