/**
 * The warnings of the input checks, kept with the sections they concern: which section each
 * warning of a batch, a corridor or several files goes to, and what GET /sections/:id gives
 * back, before and after a re-run with edits.
 */
import fs from 'node:fs';
import path from 'node:path';
import request from 'supertest';
import { stringify } from 'yaml';
import type { Message } from '@scarpline/core';
import { createApp } from '../src/app';
import { sequelize } from '../src/db';
import { stopQueue } from '../src/queue';
import { parseBatchBody, parseFiles } from '../src/services/validate';
import { startWorker } from '../src/worker';
import { makeUsers, schemaErrors, signIn, waitForBatch } from './helpers';

const EXAMPLES = path.resolve(__dirname, '../../../examples');
const app = createApp();
const bearer = { type: 'bearer' as const };
const corridor = JSON.parse(fs.readFileSync(path.join(EXAMPLES, 'corridor/corridor.json'), 'utf8'));

const clone = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

/** The first n stations of the demo corridor, with a template material of its own. */
function batch(id: string, n: number) {
  const b = clone({ ...corridor, id, sections: corridor.sections.slice(0, n) });
  b.template.materials['spare-clay'] = {
    unitWeight: 19,
    strength: { model: 'mohr-coulomb', cohesion: 4, frictionAngle: 24 },
  };
  return b;
}

/** Strata that use the spare clay instead of the weathered mudstone. */
const SPARE_STRATA = [{ material: 'spare-clay' }, { material: 'mudstone', depth: 6 }];

/** An item's own weathered mudstone, with a unit weight out of the usual range. */
const HEAVY = {
  'weathered-mudstone': {
    unitWeight: 45,
    saturatedUnitWeight: 46,
    strength: { model: 'mohr-coulomb', cohesion: 5, frictionAngle: 26 },
  },
};

/** Section id → the codes and paths of its warnings. */
function byId(sectionWarnings: Record<string, Message[]>, ids: string[]) {
  return Object.fromEntries(
    ids.map((id) => [id, (sectionWarnings[id] ?? []).map((m) => `${m.code} ${m.path}`)]),
  );
}

const UNUSED_SPARE = 'material-unused template.materials.spare-clay';
const UNUSED_MUDSTONE = 'material-unused template.materials.weathered-mudstone';

test('a batch: item warnings go to their section, template warnings to the stations they hold at', () => {
  // Eight stations: the spare clay is unused at seven of them (more than the core lists by
  // station), the weathered mudstone at the one whose strata use the spare clay instead.
  const b = batch('wcb-warn-map', 8);
  b.sections[7].strata = SPARE_STRATA;
  b.sections[2].materials = HEAVY;
  const parsed = parseBatchBody(JSON.stringify(b, null, 2));
  const ids = parsed.sections.map((s) => s.id);
  expect(ids).toHaveLength(8);
  // The core says the spare clay's warning at some stations, and not all of them by name.
  expect(parsed.warnings.map((m) => m.message)).toContainEqual(
    expect.stringMatching(/^at stations .* and 2 more: /),
  );
  const expected = Object.fromEntries(ids.map((id) => [id, [UNUSED_SPARE]]));
  expected[ids[2]] = [
    UNUSED_SPARE,
    'unit-weight-unusual sections[2].materials.weathered-mudstone.unitWeight',
    'unit-weight-unusual sections[2].materials.weathered-mudstone.saturatedUnitWeight',
  ].sort();
  expected[ids[7]] = [UNUSED_MUDSTONE];
  const got = byId(parsed.sectionWarnings, ids);
  for (const id of ids) got[id].sort();
  expect(got).toEqual(expected);
  // Every warning of the file is kept by at least one section.
  const kept = new Set(Object.values(parsed.sectionWarnings).flat());
  expect(parsed.warnings.filter((m) => !kept.has(m))).toEqual([]);
});

test('a template warning that holds at every station goes to every section', () => {
  const b = batch('wcb-warn-all', 3);
  const parsed = parseBatchBody(JSON.stringify(b, null, 2));
  const ids = parsed.sections.map((s) => s.id);
  expect(byId(parsed.sectionWarnings, ids)).toEqual(
    Object.fromEntries(ids.map((id) => [id, [UNUSED_SPARE]])),
  );
});

test('several files and documents: a warning stays with the file and document it is in', () => {
  const sand = fs.readFileSync(path.join(EXAMPLES, 'fill-clean-sand.yaml'), 'utf8');
  const cut = fs.readFileSync(path.join(EXAMPLES, 'cut-homogeneous.yaml'), 'utf8');
  // A second document in the cut's file: a section of its own, with an unusual unit weight.
  const second = {
    format: 'scarpline/1',
    id: 'heavy-cut',
    units: 'si',
    ground: corridor.sections[0].ground,
    materials: { 'weathered-mudstone': HEAVY['weathered-mudstone'] },
    strata: [{ material: 'weathered-mudstone' }],
  };
  const cutFile = `${cut}\n---\n${stringify(second)}`;
  const b = batch('wcb-warn-files', 2);
  b.sections[1].materials = HEAVY;
  const parsed = parseFiles([
    { name: 'fill-clean-sand.yaml', text: sand },
    { name: 'cuts.yaml', text: cutFile },
    { name: 'corridor.yaml', text: stringify(b) },
  ]);
  const ids = parsed.sections.map((s) => s.id);
  expect(ids).toHaveLength(5);
  const heavyLine = cutFile.split('\n').findIndex((l) => l.startsWith('    unitWeight: 45')) + 1;
  expect(heavyLine).toBeGreaterThan(cut.split('\n').length);
  expect(parsed.sectionWarnings['heavy-cut']).toEqual([
    expect.objectContaining({
      file: 'cuts.yaml',
      line: heavyLine,
      path: 'materials.weathered-mudstone.unitWeight',
      code: 'unit-weight-unusual',
    }),
    expect.objectContaining({
      file: 'cuts.yaml',
      path: 'materials.weathered-mudstone.saturatedUnitWeight',
    }),
  ]);
  const [first, other] = b.sections.map((s: { station: number }) => `wcb-warn-files@${s.station}`);
  expect(byId(parsed.sectionWarnings, [...ids.slice(0, 2), first, other])).toEqual({
    [ids[0]]: [],
    [ids[1]]: [],
    [first]: [UNUSED_SPARE],
    [other]: [
      UNUSED_SPARE,
      'unit-weight-unusual sections[1].materials.weathered-mudstone.unitWeight',
      'unit-weight-unusual sections[1].materials.weathered-mudstone.saturatedUnitWeight',
    ],
  });
  expect(parsed.sectionWarnings[other].every((m) => m.file === 'corridor.yaml')).toBe(true);
});

test('a GeoJSON corridor: feature warnings go to the feature’s section, header ones by station', () => {
  const { sections, ...header } = batch('wcb-warn-geo', 7);
  const features = sections.map((s: { station: number; ground: number[][] }) => ({
    type: 'Feature',
    properties: { station: s.station } as Record<string, unknown>,
    geometry: {
      type: 'LineString',
      coordinates: s.ground.map(([o, z]) => [451200 + o, 102300 + s.station, z]),
    },
  }));
  features[6].properties.strata = SPARE_STRATA;
  features[3].properties.materials = HEAVY;
  const text = JSON.stringify({ type: 'FeatureCollection', scarpline: header, features }, null, 2);
  const parsed = parseFiles([{ name: 'corridor.geojson', text }]);
  const ids = sections.map((s: { station: number }) => `wcb-warn-geo@${s.station}`);
  expect(parsed.sections.map((s) => s.id)).toEqual(ids);
  const spare = 'material-unused scarpline.template.materials.spare-clay';
  const expected = Object.fromEntries(ids.map((id: string) => [id, [spare]]));
  expected[ids[3]] = [
    spare,
    'unit-weight-unusual features[3].properties.materials.weathered-mudstone.unitWeight',
    'unit-weight-unusual features[3].properties.materials.weathered-mudstone.saturatedUnitWeight',
  ].sort();
  expected[ids[6]] = ['material-unused scarpline.template.materials.weathered-mudstone'];
  const got = byId(parsed.sectionWarnings, ids);
  for (const id of ids) got[id].sort();
  expect(got).toEqual(expected);
});

describe('through the API', () => {
  let engineer: string;
  let viewer: string;
  let projectId: number;

  beforeAll(async () => {
    await startWorker();
    const users = await makeUsers('inwarn');
    engineer = await signIn(app, users.engineer.email);
    viewer = await signIn(app, users.viewer.email);
    const p = await request(app)
      .post('/api/v1/projects')
      .auth(engineer, bearer)
      .send({ name: 'Input warnings (test)' });
    projectId = p.body.id;
  });

  afterAll(async () => {
    await stopQueue();
    await sequelize.close();
  });

  test('GET /sections/:id gives the warnings about that section; a re-run with edits replaces them', async () => {
    const b = clone({ ...corridor, id: 'wcb-inwarn', sections: corridor.sections.slice(0, 2) });
    b.sections[1].materials = HEAVY;
    const text = JSON.stringify(b, null, 2);
    const post = await request(app)
      .post(`/api/v1/projects/${projectId}/batches`)
      .auth(engineer, bearer)
      .set('content-type', 'application/json')
      .send(text);
    expect(post.status).toBe(201);
    await waitForBatch(app, viewer, post.body.id);
    const list = await request(app)
      .get(`/api/v1/batches/${post.body.id}/sections?sort=position`)
      .auth(viewer, bearer);
    const [plain, heavy] = list.body.items as { id: number; station: number }[];
    expect(heavy.station).toBe(b.sections[1].station);

    const line = text.split('\n').findIndex((l) => l.includes('"unitWeight": 45')) + 1;
    const one = await request(app).get(`/api/v1/sections/${heavy.id}`).auth(viewer, bearer);
    expect(one.status).toBe(200);
    expect(schemaErrors('Section', one.body)).toEqual([]);
    const weight = one.body.inputWarnings.find(
      (w: { path: string }) => w.path === 'sections[1].materials.weathered-mudstone.unitWeight',
    );
    expect(weight).toEqual({
      severity: 'warning',
      file: 'batch.json',
      line,
      column: expect.any(Number),
      path: 'sections[1].materials.weathered-mudstone.unitWeight',
      code: 'unit-weight-unusual',
      message: expect.stringMatching(/^45 kN\/m³ is unusual/),
      text: expect.stringMatching(
        new RegExp(`^batch\\.json:${line}:\\d+ warning: sections\\[1\\]\\.materials\\.`),
      ),
    });
    expect(one.body.inputWarnings.map((w: { code: string }) => w.code)).toEqual([
      'unit-weight-unusual',
      'unit-weight-unusual',
    ]);
    const other = await request(app).get(`/api/v1/sections/${plain.id}`).auth(viewer, bearer);
    expect(other.body.inputWarnings).toEqual([]);

    // The edit brings the unit weights back into range, the saturated one below the bulk one.
    const rerun = await request(app)
      .post(`/api/v1/sections/${heavy.id}/runs`)
      .auth(engineer, bearer)
      .send({ materials: { 'weathered-mudstone': { unitWeight: 20, saturatedUnitWeight: 19 } } });
    expect(rerun.status).toBe(202);
    const expected = [
      expect.objectContaining({
        severity: 'warning',
        file: 'edited-section.json',
        line: expect.any(Number),
        path: 'materials.weathered-mudstone.saturatedUnitWeight',
        code: 'saturated-below-bulk',
        text: expect.stringMatching(/^edited-section\.json:\d+:\d+ warning: materials\./),
      }),
    ];
    expect(rerun.body.inputWarnings).toEqual(expected);
    await waitForBatch(app, viewer, post.body.id);
    const after = await request(app).get(`/api/v1/sections/${heavy.id}`).auth(viewer, bearer);
    expect(after.body.run).toBe(2);
    expect(after.body.inputWarnings).toEqual(expected);
    expect(schemaErrors('Section', after.body)).toEqual([]);
  });
});
