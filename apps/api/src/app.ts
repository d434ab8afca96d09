/** The Express 5 application: /api/v1, bearer auth, roles, problem+json errors. */
import cors from 'cors';
import express, { type Request } from 'express';
import helmet from 'helmet';
import { config } from './config';
import { authenticate } from './middleware/auth';
import { notFoundRoute, problemHandler } from './middleware/problem';
import { adminRoutes } from './routes/admin';
import { authRoutes } from './routes/auth';
import { batchRoutes } from './routes/batches';

/** homePage: an HTML page served at / (the placeholder until the web app exists). */
export function createApp(options: { homePage?: string } = {}): express.Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', false);
  app.use(helmet());
  app.use(cors({ origin: config.corsOrigin ? config.corsOrigin.split(',') : false }));
  app.use(
    express.json({
      limit: config.jsonLimit,
      verify: (req, _res, buf) => {
        (req as Request & { rawBody?: string }).rawBody = buf.toString('utf8');
      },
    }),
  );

  const v1 = express.Router();
  v1.use(authRoutes);
  v1.use(authenticate);
  v1.use(adminRoutes);
  v1.use(batchRoutes);
  app.use('/api/v1', v1);
  const home = options.homePage;
  if (home) app.get('/', (_req, res) => void res.type('html').send(home));

  app.use(notFoundRoute);
  app.use(problemHandler);
  return app;
}
