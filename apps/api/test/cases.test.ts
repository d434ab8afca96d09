/**
 * Design cases in the service: every case of a station stored with its result, the views and
 * the list that give them, the filter by case and verdict, the sort by ratio, the batch's cases
 * and its verdict counts by case, the exports a row per station and case, the drawing of a
 * case, the e-mails that list the stations below by case, and re-runs that edit the cases.
 *
 * The stations get their cases on the normalised section the worker analyses (Section.cases,
 * written into the stored input before any worker runs): three stations of the demo corridor
 * in two cases — long term (required 1.5) and an earthquake case with kh = 0.2 (required 2.22,
 * a requirement set for the test so that some stations fall below it) — and a fourth left as
 * its own one case. Its own database, so that no other file's worker takes its jobs.
 */
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { designCases, type Section } from '@scarpline/core';
import { type OwnService, ownService } from './own-database';
import { corridorBatch } from './sections';

let svc: OwnService;
let mail: typeof import('../src/services/mail');
let worker: Awaited<ReturnType<typeof import('../src/worker').startWorker>>;
const bearer = { type: 'bearer' as const };
let engineer: string;
let viewer: string;
let batchId: number;
let sectionIds: number[];

interface CaseView {
  name: string;
  kind: string;
  requiredFs: number | null;
  governs: string[];
  governing: { method: string; fs: number } | null;
  ratio: number | null;
  verdict: string;
  methods: { method: string }[];
  criticalSurface: unknown;
  search: unknown;
  warnings: unknown[];
}
interface SectionBody {
  id: number;
  key: string;
  station: number;
  result: {
    verdict: string;
    governingCase: string | null;
    governing: { method: string; fs: number } | null;
    requiredFs: number | null;
    methods: unknown[];
    criticalSurface: unknown;
    search: unknown;
    cases: CaseView[];
  };
}
let views: SectionBody[];

const TWO_CASES = 3;

/**
 * The corridor's first four stations, each its own one case named long-term: whatever cases
 * the demo corridor lists are left out, so that the test gives the stations its own.
 */
function singleCaseBatch() {
  const c = corridorBatch('wcb-cases', 4, { case: 'long-term' }) as {
    template: Record<string, unknown>;
    sections: Record<string, unknown>[];
  };
  const { cases: _template, ...template } = c.template;
  return {
    ...c,
    template,
    sections: c.sections.map(({ cases: _own, ...s }) => s),
  };
}

beforeAll(async () => {
  svc = await ownService('cases');
  const { app, helpers, sequelize } = svc;
  mail = await import('../src/services/mail');
  await mail.startSmtpFake(0);
  const users = await helpers.makeUsers('cases');
  engineer = await helpers.signIn(app, users.engineer.email);
  viewer = await helpers.signIn(app, users.viewer.email);
  const project = await request(app)
    .post('/api/v1/projects')
    .auth(engineer, bearer)
    .send({ name: 'Design cases (test)' });
  const post = await request(app)
    .post(`/api/v1/projects/${project.body.id}/batches`)
    .auth(engineer, bearer)
    .send(singleCaseBatch());
  expect(post.status).toBe(201);
  batchId = post.body.id;
  const rows = await sequelize.query<{ id: number; input: Section }>(
    'SELECT id, input FROM sections WHERE batch_id = $1 ORDER BY position',
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  sectionIds = rows.map((r) => r.id);
  // no worker runs yet: the first stations get two cases before any is analysed
  for (const r of rows.slice(0, TWO_CASES)) {
    const [own] = designCases(r.input);
    const cases = [
      { ...own, name: 'long term', kind: 'long-term', requiredFs: 1.5 },
      {
        ...own,
        name: 'earthquake',
        kind: 'seismic',
        requiredFs: 2.22,
        seismic: { kh: 0.2, kv: 0 },
      },
    ];
    await sequelize.query('UPDATE sections SET input = $2::jsonb WHERE id = $1', {
      bind: [r.id, JSON.stringify({ ...r.input, cases })],
    });
  }
  worker = await (await import('../src/worker')).startWorker();
  await helpers.waitForBatch(app, engineer, batchId, 120000);
  views = [];
  for (const id of sectionIds) {
    const res = await request(app).get(`/api/v1/sections/${id}`).auth(viewer, bearer);
    expect(res.status).toBe(200);
    views.push(res.body as SectionBody);
  }
}, 180000);

afterAll(async () => {
  await worker?.stop();
  await mail.stopSmtpFake();
  await svc.close();
});

test('every case is stored with its result and given in the section: the station’s verdict the worst, the governing case the least FS / required FS', async () => {
  for (const [i, v] of views.entries()) {
    expect(svc.helpers.schemaErrors('Section', v)).toEqual([]);
    const r = v.result;
    expect(r.cases.map((c) => [c.name, c.kind])).toEqual(
      i < TWO_CASES
        ? [
            ['long term', 'long-term'],
            ['earthquake', 'seismic'],
          ]
        : [['long-term', 'long-term']],
    );
    for (const c of r.cases) {
      expect(c.governs).toEqual(['bishop', 'spencer']);
      expect(c.methods.map((m) => m.method)).toEqual(['bishop', 'spencer']);
      expect(c.search).not.toBeNull(); // the current result gives each case's search
      if (c.governing && c.requiredFs && c.verdict !== 'no-slope') {
        expect(c.ratio).toBeCloseTo(c.governing.fs / c.requiredFs, 12);
        expect(c.verdict).toBe(c.governing.fs >= c.requiredFs ? 'meets' : 'below');
      } else expect(c.ratio).toBeNull();
    }
    // the earthquake's kh lowers the FS below the long-term case's
    if (i < TWO_CASES) expect(r.cases[1].governing!.fs).toBeLessThan(r.cases[0].governing!.fs);
    const verdicts = r.cases.map((c) => c.verdict);
    const worst = ['below', 'no-fs', 'no-requirement', 'meets', 'no-slope'].find((w) =>
      verdicts.includes(w),
    );
    expect(r.verdict).toBe(worst);
    const rated = r.cases.filter((c) => c.ratio !== null);
    const least = rated.sort((a, b) => a.ratio! - b.ratio!)[0];
    expect(r.governingCase).toBe(least?.name ?? null);
    // the result's own fields are its governing case's (the first case's when none governs)
    const shown = r.cases.find((c) => c.name === r.governingCase) ?? r.cases[0];
    expect(r.governing).toEqual(shown.governing);
    expect(r.requiredFs).toBe(shown.requiredFs);
    expect(r.methods).toEqual(shown.methods);
    expect(r.criticalSurface).toEqual(shown.criticalSurface);
    expect(r.search).toEqual(shown.search);
  }
  // some station falls below its requirement in the earthquake case, and only in it
  const below = views.filter((v) => v.result.verdict === 'below');
  expect(below.length).toBeGreaterThan(0);
  for (const v of below) expect(v.result.governingCase).toBe('earthquake');
  const [{ n }] = await svc.sequelize.query<{ n: string }>(
    `SELECT count(*) AS n FROM case_results c JOIN results r ON r.id = c.result_id
       JOIN sections s ON s.id = r.section_id WHERE s.batch_id = $1`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  expect(Number(n)).toBe(2 * TWO_CASES + 1);
});

test('the batch: progress counts sections; its cases in the order first seen, with verdict counts by case', async () => {
  const res = await request(svc.app).get(`/api/v1/batches/${batchId}`).auth(viewer, bearer);
  expect(svc.helpers.schemaErrors('Batch', res.body)).toEqual([]);
  expect(res.body.progress).toMatchObject({
    total: 4,
    done: 4,
    belowRequiredFs: views.filter((v) => v.result.verdict === 'below').length,
  });
  expect(res.body.cases).toEqual(['long term', 'earthquake', 'long-term']);
  const expected: Record<string, Record<string, number>> = {};
  for (const name of res.body.cases as string[]) {
    expected[name] = { meets: 0, below: 0, 'no-fs': 0, 'no-requirement': 0, 'no-slope': 0 };
    expected[name]['input-error'] = 0;
  }
  for (const v of views) for (const c of v.result.cases) expected[c.name][c.verdict] += 1;
  expect(res.body.caseCounts).toEqual(expected);
});

test('the list: each case in brief; filtered by case and by that case’s verdict; sorted by the station’s ratio', async () => {
  const list = async (query: string) => {
    const res = await request(svc.app)
      .get(`/api/v1/batches/${batchId}/sections?${query}`)
      .auth(viewer, bearer);
    expect(res.status).toBe(200);
    expect(svc.helpers.schemaErrors('SectionList', res.body)).toEqual([]);
    return res.body as {
      total: number;
      items: {
        id: number;
        result: {
          verdict: string;
          governingCase: string | null;
          ratio: number | null;
          cases: { name: string; verdict: string; ratio: number | null }[];
        };
      }[];
    };
  };
  const all = await list('sort=position');
  for (const [i, item] of all.items.entries()) {
    const r = views[i].result;
    expect(item.result.governingCase).toBe(r.governingCase);
    expect(item.result.cases).toEqual(
      r.cases.map((c) => ({
        name: c.name,
        kind: c.kind,
        verdict: c.verdict,
        governingMethod: c.governing?.method ?? null,
        governingFs: c.governing?.fs ?? null,
        requiredFs: c.requiredFs,
        ratio: c.ratio,
      })),
    );
    const shown = r.cases.find((c) => c.name === r.governingCase);
    expect(item.result.ratio).toBe(shown?.ratio ?? null);
  }
  const ids = (b: Awaited<ReturnType<typeof list>>) => b.items.map((i) => i.id);
  const having = (name: string, verdict?: string) =>
    views
      .filter((v) =>
        v.result.cases.some((c) => c.name === name && (!verdict || c.verdict === verdict)),
      )
      .map((v) => v.id);
  expect(ids(await list('case=earthquake&sort=position'))).toEqual(having('earthquake'));
  expect(ids(await list('case=long-term&sort=position'))).toEqual([sectionIds[3]]);
  for (const verdict of ['below', 'meets', 'no-slope']) {
    for (const name of ['long term', 'earthquake']) {
      const got = await list(`case=${encodeURIComponent(name)}&verdict=${verdict}&sort=position`);
      expect(ids(got)).toEqual(having(name, verdict));
      expect(got.total).toBe(having(name, verdict).length);
    }
  }
  // without a case, the verdict is the station's
  expect(ids(await list('verdict=below&sort=position'))).toEqual(
    views.filter((v) => v.result.verdict === 'below').map((v) => v.id),
  );
  expect((await list('case=no%20such%20case')).total).toBe(0);
  // by ratio: the furthest below its requirement first, stations without one last
  const byRatio = await list('sort=ratio&order=asc');
  const ratios = byRatio.items.map((i) => i.result.ratio);
  const known = ratios.filter((x): x is number => x !== null);
  expect(known).toEqual([...known].sort((a, b) => a - b));
  expect(ratios.slice(known.length).every((x) => x === null)).toBe(true);
  // a case name over 100 characters, or holding U+0000, is refused
  const long = await request(svc.app)
    .get(`/api/v1/batches/${batchId}/sections?case=${'x'.repeat(101)}`)
    .auth(viewer, bearer);
  svc.helpers.expectProblem(long, 400);
  const nul = await request(svc.app)
    .get(`/api/v1/batches/${batchId}/sections?case=a%00b`)
    .auth(viewer, bearer);
  svc.helpers.expectProblem(nul, 400);
});

test('the exports: per station a row per case then the station’s; the drawing of a case', async () => {
  const csv = await request(svc.app)
    .get(`/api/v1/batches/${batchId}/results.csv`)
    .auth(viewer, bearer);
  const lines = csv.text.split('\r\n').slice(1, -1);
  expect(lines).toHaveLength(2 * TWO_CASES + 1 + 4);
  const cell = (line: string, i: number) => line.split(',')[i];
  expect(lines.map((l) => [cell(l, 2), cell(l, 3), cell(l, 4)])).toEqual(
    views.flatMap((v) => [
      ...v.result.cases.map((c) => [v.key, 'case', c.name]),
      [v.key, 'station', v.result.governingCase ?? v.result.cases[0].name],
    ]),
  );
  const geo = await request(svc.app)
    .get(`/api/v1/batches/${batchId}/results.geojson`)
    .auth(viewer, bearer);
  const fc = JSON.parse(geo.text);
  expect(svc.helpers.schemaErrors('ResultsGeoJson', fc)).toEqual([]);
  expect(fc.features.slice(0, 3).map((f: { id: string }) => f.id)).toEqual([
    `${views[0].key}#long term`,
    `${views[0].key}#earthquake`,
    views[0].key,
  ]);

  const id = sectionIds[0];
  const svg = (q: string) =>
    request(svc.app).get(`/api/v1/sections/${id}/plot.svg${q}`).auth(viewer, bearer);
  const governing = await svg('');
  const quake = await svg('?case=earthquake');
  const long = await svg('?case=long%20term');
  expect([governing.status, quake.status, long.status]).toEqual([200, 200, 200]);
  expect(long.headers['content-disposition']).toMatch(/-run1-long_term\.svg"$/);
  const text = (r: request.Response) => r.body.toString('utf8') as string;
  const fsOf = (name: string) =>
    views[0].result.cases.find((c) => c.name === name)!.governing!.fs.toFixed(2);
  expect(text(quake)).toContain(fsOf('earthquake'));
  expect(text(long)).toContain(fsOf('long term'));
  // without a case named: the governing one
  const byName = await svg(`?case=${encodeURIComponent(views[0].result.governingCase!)}`);
  expect(text(governing)).toBe(text(byName));
  svc.helpers.expectProblem(await svg('?case=nope'), 404);
});

test('the e-mails: a station below its requirement by the cases it is below in; the batch’s stations below, by case', () => {
  const inbox = mail.fakeInbox();
  const below = views.filter((v) => v.result.verdict === 'below');
  for (const v of below) {
    const m = inbox.find((x) => x.raw.includes(`section ${v.key} is below`));
    expect(m).toBeDefined();
    const q = v.result.cases.find((c) => c.name === 'earthquake')!;
    expect(m!.raw).toContain(
      `- earthquake: FS ${q.governing!.fs.toFixed(3)} against required 2.22`,
    );
    expect(m!.raw).not.toContain('- long term:');
  }
  const done = inbox.find((x) => x.raw.includes('wcb-cases finished'));
  expect(done).toBeDefined();
  // quoted-printable may fold long lines: read the text unfolded
  const body = done!.raw.replace(/=\r?\n/g, '');
  expect(body).toContain('Stations below the required FS, by case:');
  expect(body).toContain(`- earthquake (${below.length}):`);
  for (const v of below) expect(body).toContain(`    ${v.key}: FS `);
  expect(body).not.toContain('- long term (');
});

test('re-runs edit cases by name: an edit that names no case to remove, or is not an object, is refused at its place', async () => {
  const id = sectionIds[0];
  const rerun = (changes: object | string) =>
    request(svc.app).post(`/api/v1/sections/${id}/runs`).auth(engineer, bearer).send(changes);
  const none = await rerun({ cases: { 'no such case': null } });
  svc.helpers.expectProblem(none, 422);
  expect(none.body.errors).toEqual([
    expect.objectContaining({ path: 'cases.no such case', code: 'no-such-case' }),
  ]);
  const bad = await rerun({ cases: { earthquake: 5 } });
  svc.helpers.expectProblem(bad, 422);
  expect(bad.body.errors[0]).toMatchObject({ path: 'cases.earthquake', code: 'cases-edit' });
  const wrong = await rerun({ cases: 'earthquake' });
  svc.helpers.expectProblem(wrong, 422);
  expect(wrong.body.errors[0]).toMatchObject({ path: 'cases', code: 'cases-edit' });
});

test('casesPatch: a list replaces the cases, an object edits them by name (merge patch), null removes one, a new name adds one', async () => {
  const { casesPatch } = await import('../src/services/edits');
  const current = [
    { name: 'long term', kind: 'long-term', requiredFs: 1.5 },
    { name: 'earthquake', kind: 'seismic', requiredFs: 1.1, seismic: { kh: 0.2 } },
  ];
  expect(casesPatch(current, [{ name: 'only', kind: 'other' }])).toEqual([
    { name: 'only', kind: 'other' },
  ]);
  expect(casesPatch(current, null)).toBeNull();
  expect(
    casesPatch(current, {
      earthquake: { requiredFs: 1.0, seismic: { kv: 0.05 } },
      'long term': null,
      'end of construction': { kind: 'end-of-construction', requiredFs: 1.3 },
    }),
  ).toEqual([
    { name: 'earthquake', kind: 'seismic', requiredFs: 1.0, seismic: { kh: 0.2, kv: 0.05 } },
    { name: 'end of construction', kind: 'end-of-construction', requiredFs: 1.3 },
  ]);
  // the list given is left as it was
  expect(current[0].name).toBe('long term');
  // a section that lists no cases: an edit by name starts its list
  expect(casesPatch(undefined, { flood: { kind: 'steady-seepage' } })).toEqual([
    { name: 'flood', kind: 'steady-seepage' },
  ]);
});
