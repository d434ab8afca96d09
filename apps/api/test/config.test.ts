/**
 * Without DATABASE_URL the API and the workers use this checkout's own local cluster (its port
 * is the checkout's: scripts/pg.js), not a fixed port; in production the setting is required.
 */
import { setEnv } from './own-database';

// eslint-disable-next-line @typescript-eslint/no-require-imports
const pg = require('../scripts/pg.js') as { urlFor: (database: string) => string };

async function configWith(vars: Record<string, string>) {
  const restore = setEnv(vars);
  try {
    let config: typeof import('../src/config').config | undefined;
    await jest.isolateModulesAsync(async () => {
      config = (await import('../src/config')).config;
    });
    return config!;
  } finally {
    restore();
  }
}

test('DATABASE_URL unset: the checkout’s local cluster, on its own port', async () => {
  const c = await configWith({ DATABASE_URL: '', NODE_ENV: 'development' });
  expect(c.databaseUrl).toBe(pg.urlFor('scarpline'));
  expect(c.databaseUrl).not.toContain(':54329/');
});

test('DATABASE_URL set: used as it is', async () => {
  const url = 'postgres://scarpline@db.internal:5432/scarpline';
  expect((await configWith({ DATABASE_URL: url })).databaseUrl).toBe(url);
});

test('in production DATABASE_URL is required', async () => {
  await expect(configWith({ DATABASE_URL: '', NODE_ENV: 'production' })).rejects.toThrow(
    'DATABASE_URL must be set in production',
  );
});
