/**
 * The API process: migrations, the local SMTP fake in development, the stall watch, the HTTP
 * server. It logs JSON lines (log.ts); SIGTERM stops it gracefully (no new connections, the
 * queue and the database closed). Several of these may run against one database.
 */
import path from 'node:path';
import { CAUTION } from '@scarpline/core/caution';
import { createApp } from './app';
import { config } from './config';
import { sequelize } from './db';
import { log, logAs } from './log';
import { migrate } from './migrate';
import { hasWebBuild } from './middleware/web';
import { queue, stopQueue } from './queue';
import { seedDemo } from './seed';
import { startSmtpFake } from './services/mail';
import { startStallWatch } from './services/workers';

logAs('api');

const PLACEHOLDER = `<!doctype html><html lang="en"><meta charset="utf-8"><title>Scarpline</title>
<body style="font-family: sans-serif; max-width: 40rem; margin: 3rem auto; line-height: 1.5">
<h1>Scarpline</h1><p>Slope stability along corridors. The web app is not built here yet
(<code>npm run build -w @scarpline/web</code>, or <code>npm start</code>); the REST API is at
<code>/api/v1</code>.</p><p><small>Caution: ${CAUTION}</small></p></body></html>`;

/** Logs what would otherwise end the process unheard, then ends it (a supervisor starts it again). */
function fatal(what: string) {
  return (e: unknown) => {
    log.fatal({ err: e }, `${what}: ${e instanceof Error ? e.message : String(e)}`);
    process.exit(1);
  };
}

/**
 * The migrations, one API process at a time: several may start at once against one database.
 * A transaction's advisory lock is held while they run (on the pool's other connections).
 */
async function migrateUnderLock(): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    await sequelize.query("SELECT pg_advisory_xact_lock(hashtext('scarpline:migrate'))", {
      transaction,
    });
    const done = await migrate(sequelize);
    if (done.length > 0) log.info({ migrations: done }, 'database migrated');
  });
}

async function main(): Promise<void> {
  process.on('uncaughtException', fatal('uncaught exception'));
  process.on('unhandledRejection', fatal('unhandled rejection'));
  await migrateUnderLock();
  await queue();
  if (!config.smtpUrl && config.env !== 'production') {
    const port = await startSmtpFake();
    log.info({ port }, `mail: local SMTP fake on 127.0.0.1:${port} (GET /api/v1/mail as admin)`);
  }
  if (process.argv.includes('--seed')) {
    const examples = path.resolve(__dirname, '../../../examples');
    const { submitted } = await seedDemo({
      corridors: [
        path.join(examples, 'corridor/corridor.json'),
        path.join(examples, 'corridor/wendlecombe-uncertain.json'),
      ],
      terrainJob: path.join(examples, 'terrain/wendlecombe.terrain.yaml'),
    });
    log.info(
      submitted.length
        ? `seed: demo batches submitted: ${submitted.join(', ')}`
        : 'seed: demo data present',
    );
  }
  const stopWatch = startStallWatch();
  const app = createApp({ homePage: PLACEHOLDER });
  const web = hasWebBuild(config.webDist);
  const server = app.listen(config.port, config.host, () => {
    const base = `http://${config.host}:${config.port}/`;
    log.info(
      { url: base, web: web ? config.webDist : null },
      web
        ? `Scarpline: web app at ${base} (from ${config.webDist}), API at ${base}api/v1`
        : `Scarpline: ${base} (placeholder: no web build in ${config.webDist}), API at ${base}api/v1`,
    );
  });
  server.on('error', fatal('HTTP server'));

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    log.info(`${signal}: stopping`);
    stopWatch();
    server.close();
    // Event streams stay open until their batch ends: close what is left after a moment.
    setTimeout(() => server.closeAllConnections(), 5000).unref();
    void stopQueue()
      .catch((e: Error) => log.warn({ err: e }, `stopping the queue: ${e.message}`))
      .then(() => sequelize.close())
      .finally(() => process.exit(0));
  };
  process.once('SIGTERM', () => stop('SIGTERM'));
  process.once('SIGINT', () => stop('SIGINT'));
}

main().catch(fatal('start'));
