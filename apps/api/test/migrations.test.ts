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
