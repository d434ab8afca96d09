/**
 * A database of a test file's own, in the same cluster as the others (DATABASE_URL as the global
 * setup left it), made afresh: for tests whose workers, heartbeats or queue must not meet those
 * of the other files running beside them. Set DATABASE_URL to the URL it returns (setEnv) before
 * the file imports anything from src/ (dynamic imports: src/config reads the environment once),
 * migrate it, and drop it at the end.
 */
import { Client } from 'pg';

async function admin(clusterUrl: string, sql: string): Promise<void> {
  const a = new URL(clusterUrl);
  a.pathname = '/postgres';
  const client = new Client({ connectionString: a.toString() });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** Makes `<test database>_<suffix>` anew; returns its URL. */
export async function ownDatabase(suffix: string): Promise<string> {
  const url = new URL(process.env.DATABASE_URL ?? '');
  const name = `${url.pathname.slice(1)}_${suffix}`;
  await admin(url.toString(), `DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  await admin(url.toString(), `CREATE DATABASE "${name}"`);
  url.pathname = `/${name}`;
  return url.toString();
}

export async function dropDatabase(url: string): Promise<void> {
  await admin(url, `DROP DATABASE IF EXISTS "${new URL(url).pathname.slice(1)}" WITH (FORCE)`);
}

/** Sets environment variables; returns what puts them back as they were. */
export function setEnv(vars: Record<string, string>): () => void {
  const saved = Object.fromEntries(Object.keys(vars).map((k) => [k, process.env[k]]));
  Object.assign(process.env, vars);
  return () => {
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  };
}

/** The service on a database of its own, as ownService gives it. */
export interface OwnService {
  app: import('express').Express;
  sequelize: typeof import('../src/db').sequelize;
  queue: typeof import('../src/queue');
  helpers: typeof import('./helpers');
  /** Stops the queue, closes the database, drops it and puts the environment back. */
  close(): Promise<void>;
}

/**
 * The API on a database of its own (`suffix`, see ownDatabase), with `env` set before anything
 * from src/ is imported, migrated: what a test file whose workers, heartbeats or queue must
 * stay apart needs first. Import the rest of src/ dynamically after it.
 */
export async function ownService(
  suffix: string,
  env: Record<string, string> = {},
): Promise<OwnService> {
  const url = await ownDatabase(suffix);
  const restore = setEnv({ DATABASE_URL: url, ...env });
  const app = (await import('../src/app')).createApp();
  const { sequelize } = await import('../src/db');
  const queue = await import('../src/queue');
  const helpers = await import('./helpers');
  await (await import('../src/migrate')).migrate(sequelize);
  return {
    app,
    sequelize,
    queue,
    helpers,
    async close() {
      await queue.stopQueue();
      await sequelize.close();
      await dropDatabase(url);
      restore();
    },
  };
}
