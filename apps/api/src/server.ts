/** The API process: migrations, the local SMTP fake in development, the HTTP server. */
import path from 'node:path';
import { CAUTION } from '@scarpline/core/caution';
import { createApp } from './app';
import { config } from './config';
import { sequelize } from './db';
import { migrate } from './migrate';
import { hasWebBuild } from './middleware/web';
import { queue } from './queue';
import { seedDemo, DEMO_USERS } from './seed';
import { startSmtpFake } from './services/mail';

const PLACEHOLDER = `<!doctype html><html lang="en"><meta charset="utf-8"><title>Scarpline</title>
<body style="font-family: sans-serif; max-width: 40rem; margin: 3rem auto; line-height: 1.5">
<h1>Scarpline</h1><p>Slope stability along corridors. The web app is not built here yet
(<code>npm run build -w @scarpline/web</code>, or <code>npm start</code>); the REST API is at
<code>/api/v1</code>.</p><p><small>Caution: ${CAUTION}</small></p></body></html>`;

async function main(): Promise<void> {
  await migrate(sequelize);
  await queue();
  if (!config.smtpUrl && config.env !== 'production') {
    const port = await startSmtpFake();
    console.log(`mail: local SMTP fake on 127.0.0.1:${port} (GET /api/v1/mail as admin)`);
  }
  if (process.argv.includes('--seed')) {
    const corridor = path.resolve(__dirname, '../../../examples/corridor/corridor.json');
    const { created } = await seedDemo(corridor);
    console.log(created ? 'seed: demo corridor submitted' : 'seed: demo data present');
    console.log('demo users (e-mail / password):');
    for (const u of DEMO_USERS) {
      console.log(
        `  ${u.role.padEnd(12)} ${u.email.padEnd(32)} ${u.password ?? '(API tokens only)'}`,
      );
    }
  }
  const app = createApp({ homePage: PLACEHOLDER });
  const web = hasWebBuild(config.webDist);
  app.listen(config.port, config.host, () => {
    const base = `http://${config.host}:${config.port}/`;
    console.log(
      web
        ? `Scarpline: web app at ${base} (from ${config.webDist}), API at ${base}api/v1`
        : `Scarpline: ${base} (placeholder: no web build in ${config.webDist}), API at ${base}api/v1`,
    );
  });
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
