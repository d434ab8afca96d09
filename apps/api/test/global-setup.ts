/**
 * Starts the local cluster (scripts/pg.js) and gives the tests a fresh, migrated test
 * database. TEST_DATABASE_URL points the tests at another database (it is dropped and made anew).
 * Starts the local S3 fake (scripts/s3.js) in this process too, unless one already answers (the
 * `pg.js run` wrapper's) or AWS_ENDPOINT_URL_S3 names other storage; the teardown stops it.
 */
import { Client } from 'pg';

// eslint-disable-next-line @typescript-eslint/no-require-imports
const pg = require('../scripts/pg.js') as {
  start(): Promise<{ testUrl?: string }>;
};

// eslint-disable-next-line @typescript-eslint/no-require-imports
const s3 = require('../scripts/s3.js') as { start(): Promise<{ stop: () => Promise<void> }> };

/** The fake this setup started, for the teardown (a global: the way Jest hands it over). */
const holder = globalThis as { scarplineS3Stop?: () => Promise<void> };

export default async function globalSetup(): Promise<void> {
  holder.scarplineS3Stop = (await s3.start()).stop;
  let url = process.env.TEST_DATABASE_URL;
  if (!url) {
    const saved = process.env.DATABASE_URL;
    delete process.env.DATABASE_URL;
    const started = await pg.start();
    if (saved !== undefined) process.env.DATABASE_URL = saved;
    if (!started.testUrl) throw new Error('scripts/pg.js started no test database');
    url = started.testUrl;
  }
  const u = new URL(url);
  const name = u.pathname.slice(1);
  const admin = new URL(url);
  admin.pathname = '/postgres';
  const client = new Client({ connectionString: admin.toString() });
  await client.connect();
  await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await client.query(`CREATE DATABASE "${name}"`);
  await client.end();

  process.env.DATABASE_URL = url;
  process.env.NODE_ENV = 'test';
  process.env.JOB_RETRY_DELAY = '1';
  const { sequelize } = await import('../src/db');
  const { migrate } = await import('../src/migrate');
  await migrate(sequelize);
  await sequelize.close();
}
