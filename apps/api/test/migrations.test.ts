/**
 * Migration 0004: a result's status becomes its verdict in the core's codes, every stored row
 * converted, and back again on the way down. Run in a database of its own, so that the other
 * test files' database stays as it is.
 */
import { Client } from 'pg';
import { QueryTypes, Sequelize } from 'sequelize';
import { config } from '../src/config';
import { migrator } from '../src/migrate';

const NAME = `${new URL(config.databaseUrl).pathname.slice(1)}_migrations`;
const url = new URL(config.databaseUrl);
url.pathname = `/${NAME}`;
let db: Sequelize;

async function admin(sql: string): Promise<void> {
  const a = new URL(config.databaseUrl);
  a.pathname = '/postgres';
  const client = new Client({ connectionString: a.toString() });
  await client.connect();
  await client.query(sql);
  await client.end();
}

beforeAll(async () => {
  await admin(`DROP DATABASE IF EXISTS "${NAME}" WITH (FORCE)`);
  await admin(`CREATE DATABASE "${NAME}"`);
  db = new Sequelize(url.toString(), { dialect: 'postgres', logging: false });
});

afterAll(async () => {
  await db.close();
  await admin(`DROP DATABASE IF EXISTS "${NAME}" WITH (FORCE)`);
});

test('0004: pass, fail, none, failed → meets, below, no-requirement, no-fs, and back', async () => {
  const m = migrator(db);
  await m.up({ to: '0003-section-input-warnings' });
  const now = new Date().toISOString();
  const bind = (sql: string, values: unknown[]) =>
    db.query(sql, { bind: values, type: QueryTypes.INSERT });
  await bind(
    `INSERT INTO users (email, name, role, created_at, updated_at) VALUES ('m@x', 'M', 'engineer', $1, $1)`,
    [now],
  );
  await bind(
    `INSERT INTO projects (name, created_by, created_at, updated_at) VALUES ('P', 1, $1, $1)`,
    [now],
  );
  await bind(
    `INSERT INTO batches (project_id, submitted_by, name, status, total, source, created_at, updated_at)
     VALUES (1, 1, 'b', 'done', 4, 'json', $1, $1)`,
    [now],
  );
  const old = ['pass', 'fail', 'none', 'failed'];
  for (const [i, status] of old.entries()) {
    await bind(
      `INSERT INTO sections (batch_id, key, position, input, status, created_at, updated_at)
       VALUES (1, $2, $3, '{}', 'done', $1, $1)`,
      [now, `b@${i}`, i],
    );
    await bind(
      `INSERT INTO results (section_id, run, status, methods, warnings, solver_version, input_hash,
         started_at, finished_at, duration_ms, attempt, created_at, updated_at)
       VALUES ($2, 1, $3, '[]', '[]', '0', 'h', $1, $1, 1, 1, $1, $1)`,
      [now, i + 1, status],
    );
  }
  const read = async (column: string) =>
    (
      await db.query<Record<string, string>>(`SELECT ${column} AS v FROM results ORDER BY id`, {
        type: QueryTypes.SELECT,
      })
    ).map((r) => r.v);

  await m.up({ to: '0004-verdicts-feature-properties' });
  expect(await read('verdict')).toEqual(['meets', 'below', 'no-requirement', 'no-fs']);
  const columns = await db.getQueryInterface().describeTable('sections');
  expect(columns).toHaveProperty('feature_properties');

  await m.down({ to: '0004-verdicts-feature-properties' });
  expect(await read('status')).toEqual(old);
  expect(await db.getQueryInterface().describeTable('sections')).not.toHaveProperty(
    'feature_properties',
  );
});

/** A result row and its section's input as the 0007 test reads them. */
interface Stored {
  governing_method: string;
  methods: {
    method: string;
    slices: { interslice: { E: number | null; X: number | null; thrust: null } }[];
  }[];
  warnings: { message: string }[];
  search: unknown;
  input: { analysis: unknown };
  sectionInput: { analysis: { methods: string[] } };
}

test('0007: swedish-circle → phi-zero-circle, former interslice shapes → points, interslice forces not computed → null, the ten lowest → the trial band; and back', async () => {
  const m = migrator(db);
  await m.up({ to: '0004-verdicts-feature-properties' });
  const now = new Date().toISOString();
  const input = {
    id: 'old',
    analysis: {
      methods: ['swedish-circle', 'bishop', 'morgenstern-price'],
      interslice: { shape: 'trapezoid', end: 0.2, ramp: 0.25 },
    },
  };
  const slice = (E: number, X: number) => ({ x: 1, interslice: { E, X, thrust: null } });
  const methods = [
    { method: 'swedish-circle', fs: 1.4, slices: [slice(0, 0)], warnings: [] },
    { method: 'bishop', fs: 1.3, slices: [slice(0, 0)], warnings: [] },
    { method: 'janbu', fs: 1.2, slices: [slice(5, 0)], warnings: [] },
    { method: 'spencer', fs: 1.31, slices: [slice(5, 2)], warnings: [] },
  ];
  const lowest = [1.3, 1.33, 1.4].map((fs, i) => ({
    surface: { type: 'circle', center: [i, 0], radius: 5 },
    fs,
  }));
  const warnings = [{ code: 'no-convergence', message: 'swedish-circle: no solution' }];
  await db.query(
    `INSERT INTO sections (batch_id, key, position, input, status, created_at, updated_at)
     VALUES (1, 'b@old', 9, $2::jsonb, 'done', $1, $1)`,
    { bind: [now, JSON.stringify(input)], type: QueryTypes.INSERT },
  );
  const [[{ id: sectionId }]] = (await db.query(`SELECT max(id) AS id FROM sections`)) as [
    { id: number }[],
    unknown,
  ];
  await db.query(
    `INSERT INTO results (section_id, run, verdict, governing_method, methods, warnings, search,
       input, solver_version, input_hash, started_at, finished_at, duration_ms, attempt,
       created_at, updated_at)
     VALUES ($2, 1, 'below', 'swedish-circle', $3::jsonb, $4::jsonb, $5::jsonb, $6::jsonb, '0',
       'h', $1, $1, 1, 1, $1, $1)`,
    {
      bind: [
        now,
        sectionId,
        JSON.stringify(methods),
        JSON.stringify(warnings),
        JSON.stringify({ type: 'auto', lowest }),
        JSON.stringify(input),
      ],
      type: QueryTypes.INSERT,
    },
  );
  const row = async () => {
    const [r] = await db.query<Record<string, unknown>>(
      `SELECT governing_method, methods, warnings, search, input FROM results WHERE section_id = $1`,
      { bind: [sectionId], type: QueryTypes.SELECT },
    );
    const [s] = await db.query<{ input: unknown }>(`SELECT input FROM sections WHERE id = $1`, {
      bind: [sectionId],
      type: QueryTypes.SELECT,
    });
    return { ...r, sectionInput: s.input } as unknown as Stored;
  };

  await m.up({ to: '0007-phi-zero-circle-interslice' });
  const up = await row();
  expect(up.governing_method).toBe('phi-zero-circle');
  expect(up.methods.map((x) => x.method)).toEqual([
    'phi-zero-circle',
    'bishop',
    'janbu',
    'spencer',
  ]);
  expect(up.methods.map((x) => x.slices[0].interslice)).toEqual([
    { E: null, X: null, thrust: null },
    { E: null, X: null, thrust: null },
    { E: 5, X: null, thrust: null },
    { E: 5, X: 2, thrust: null },
  ]);
  expect(up.warnings[0].message).toBe('phi-zero-circle: no solution');
  expect(up.search).toEqual({
    type: 'auto',
    trialBand: { within: 0.05, count: 2, surfaces: lowest.slice(0, 2) },
  });
  for (const i of [up.input, up.sectionInput])
    expect(i.analysis).toEqual({
      methods: ['phi-zero-circle', 'bishop', 'morgenstern-price'],
      interslice: {
        shape: 'piecewise-linear',
        points: [
          [0, 0.2],
          [0.25, 1],
          [0.75, 1],
          [1, 0.2],
        ],
      },
    });

  await m.down({ to: '0007-phi-zero-circle-interslice' });
  const down = await row();
  expect(down.governing_method).toBe('swedish-circle');
  expect(down.methods.map((x) => [x.method, x.slices[0].interslice.E])).toEqual([
    ['swedish-circle', 0],
    ['bishop', 0],
    ['janbu', 5],
    ['spencer', 5],
  ]);
  expect(down.search).toEqual({ type: 'auto', lowest: lowest.slice(0, 2) });
  expect(down.sectionInput.analysis.methods[0]).toBe('swedish-circle');
});

test('0008: every stored result becomes its single case (named by its case or `as given`, of the kind its name says or other); the result row keeps the summary; and back', async () => {
  const m = migrator(db);
  await m.up({ to: '0007-phi-zero-circle-interslice' });
  const now = new Date().toISOString();
  const surface = { type: 'circle', center: [10, 20], radius: 12 };
  const search = { type: 'auto', trials: 40 };
  const old = [
    {
      key: 'c@long',
      input: { id: 'long', analysis: { case: 'long-term', requiredFs: 1.5 } },
      inResult: true,
      verdict: 'below',
      method: 'bishop',
      fs: 1.2,
      required: 1.5,
      methods: [
        { method: 'bishop', fs: 1.2, warnings: [] },
        { method: 'spencer', fs: 1.25, warnings: [] },
      ],
      warnings: [{ code: 'm-alpha-small', message: 'small' }],
    },
    {
      // no case named, and the result kept no input of its own: the section's is read
      key: 'c@plain',
      input: { id: 'plain', analysis: { requiredFs: 1.3 } },
      inResult: false,
      verdict: 'no-fs',
      method: null,
      fs: null,
      required: 1.3,
      methods: [{ method: 'bishop', fs: null, reason: 'no convergence', warnings: [] }],
      warnings: [],
    },
    {
      key: 'c@flood',
      input: { id: 'flood', analysis: { case: 'design flood' } },
      inResult: true,
      verdict: 'no-requirement',
      method: 'spencer',
      fs: 1.8,
      required: null,
      methods: [{ method: 'spencer', fs: 1.8, warnings: [] }],
      warnings: [],
    },
  ];
  const ids: number[] = [];
  for (const [i, o] of old.entries()) {
    const [[{ id: sectionId }]] = (await db.query(
      `INSERT INTO sections (batch_id, key, position, input, status, created_at, updated_at)
       VALUES (1, $2, $3, $4::jsonb, 'done', $1, $1) RETURNING id`,
      { bind: [now, o.key, 20 + i, JSON.stringify(o.input)] },
    )) as [{ id: number }[], unknown];
    const [[{ id }]] = (await db.query(
      `INSERT INTO results (section_id, run, verdict, governing_method, governing_fs, required_fs,
         methods, critical_surface, warnings, search, input, solver_version, input_hash,
         started_at, finished_at, duration_ms, attempt, created_at, updated_at)
       VALUES ($2, 1, $3, $4, $5, $6, $7::jsonb, $8::jsonb, $9::jsonb, $10::jsonb, $11::jsonb,
         '0', 'h', $1, $1, 1, 1, $1, $1) RETURNING id`,
      {
        bind: [
          now,
          sectionId,
          o.verdict,
          o.method,
          o.fs,
          o.required,
          JSON.stringify(o.methods),
          o.fs === null ? null : JSON.stringify(surface),
          JSON.stringify(o.warnings),
          JSON.stringify(search),
          o.inResult ? JSON.stringify(o.input) : null,
        ],
      },
    )) as [{ id: number }[], unknown];
    ids.push(id);
  }
  const results = async (added = '') =>
    db.query<Record<string, unknown>>(
      `SELECT id, verdict, governing_method, governing_fs, required_fs, methods,
              critical_surface, warnings, search ${added}
         FROM results WHERE id = ANY($1::int[]) ORDER BY id`,
      { bind: [ids], type: QueryTypes.SELECT },
    );
  const before = await results();

  await m.up({ to: '0008-case-results' });
  const cases = await db.query<Record<string, unknown>>(
    `SELECT result_id, position, name, kind, verdict, governing_method, governing_fs, required_fs,
            ratio, governs, methods, critical_surface, search, warnings, drawdown, seismic
       FROM case_results WHERE result_id = ANY($1::int[]) ORDER BY result_id`,
    { bind: [ids], type: QueryTypes.SELECT },
  );
  expect(cases.map((c) => [c.result_id, c.position, c.name, c.kind, c.verdict])).toEqual([
    [ids[0], 0, 'long-term', 'long-term', 'below'],
    [ids[1], 0, 'as given', 'other', 'no-fs'],
    [ids[2], 0, 'design flood', 'other', 'no-requirement'],
  ]);
  expect(cases[0]).toMatchObject({
    governing_method: 'bishop',
    governing_fs: 1.2,
    required_fs: 1.5,
    governs: ['bishop', 'spencer'],
    methods: old[0].methods,
    critical_surface: surface,
    search,
    warnings: old[0].warnings,
    drawdown: null,
    seismic: null,
  });
  expect(cases[0].ratio).toBeCloseTo(1.2 / 1.5, 12);
  expect([cases[1].ratio, cases[2].ratio]).toEqual([null, null]);
  // the result row: the station's summary, the case's reports moved to its case
  const after = await results(', governing_case, ratio');
  expect(after.map((r) => [r.governing_case, r.ratio, r.methods, r.search])).toEqual([
    ['long-term', cases[0].ratio, null, null],
    [null, null, null, null],
    ['design flood', null, null, null],
  ]);
  expect((await results()).map((r) => r.warnings)).toEqual([[], [], []]);

  await m.down({ to: '0008-case-results' });
  expect(await results()).toEqual(
    before
      .map((r) => ({ ...r, governing_case: undefined, ratio: undefined }))
      .map((r) => {
        const { governing_case: _c, ratio: _r, ...rest } = r;
        return rest;
      }),
  );
  const tables = await db.getQueryInterface().showAllTables();
  expect(tables).not.toContain('case_results');
});
