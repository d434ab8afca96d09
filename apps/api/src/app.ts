/** The Express 5 application: /api/v1, bearer auth, roles, problem+json errors. */
import cors from 'cors';
import express from 'express';
import helmet from 'helmet';
import path from 'node:path';
import swaggerUi from 'swagger-ui-express';
import { config } from './config';
import { authenticate } from './middleware/auth';
import { bodies } from './middleware/bodies';
import { hstsOverHttps, noStore } from './middleware/headers';
import { requestLog, requestMetrics } from './middleware/observe';
import { notFoundRoute, problemHandler } from './middleware/problem';
import { hasWebBuild, webRoutes } from './middleware/web';
import { authenticatedRoutes, publicRoutes, rootRoutes } from './routes';

const SCHEMAS_DIR = path.dirname(require.resolve('@scarpline/schemas/package.json'));
const SCHEMA_FILES = [
  'openapi.json',
  'batch.schema.json',
  'section.schema.json',
  'result.schema.json',
  'export-table.schema.json',
];

/**
 * The web app's build in config.webDist (WEB_DIST) is served at / when it exists, with every
 * other page a browser opens outside /api answered by its index.html. Without a build,
 * homePage (an HTML page) is served at / instead.
 */
export function createApp(options: { homePage?: string } = {}): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', config.trustProxy);
  // A request id, a log line and a timing for every request (README: "Logs and metrics").
  app.use(requestLog, requestMetrics);
  app.use(helmet({ strictTransportSecurity: false }), hstsOverHttps);
  app.use(cors({ origin: config.corsOrigin ? config.corsOrigin.split(',') : false }));
  app.use(bodies);

  // The OpenAPI document and the JSON Schemas it references, public, and the UI over them.
  app.get('/api/schemas/:name', (req, res, next) => {
    if (!SCHEMA_FILES.includes(req.params.name)) return next();
    res.type('application/json').sendFile(path.join(SCHEMAS_DIR, req.params.name));
  });
  app.use(
    '/api/docs',
    swaggerUi.serve,
    swaggerUi.setup(undefined, { swaggerOptions: { url: '/api/schemas/openapi.json' } }),
  );

  // Health, readiness and metrics, at the root and without a token.
  for (const r of rootRoutes) app.use(r);

  const v1 = express.Router();
  v1.use(noStore);
  for (const r of publicRoutes) v1.use(r);
  v1.use(authenticate);
  for (const r of authenticatedRoutes) v1.use(r);
  app.use('/api/v1', v1);
  if (hasWebBuild(config.webDist)) {
    app.use(webRoutes(config.webDist));
  } else if (options.homePage) {
    const home = options.homePage;
    app.get('/', (_req, res) => void res.type('html').send(home));
  }

  app.use(notFoundRoute);
  app.use(problemHandler);
  return app;
}
