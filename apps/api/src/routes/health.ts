import { Router } from 'express';
import { Problem } from '../errors';
import { liveness, readiness } from '../services/health';

/** Liveness and readiness for load balancers and monitors: no token, never cached. */
export const healthRoutes = Router();

healthRoutes.get('/health', (_req, res) => {
  res.set('Cache-Control', 'no-store').json(liveness());
});

healthRoutes.get('/ready', async (_req, res) => {
  const r = await readiness();
  res.set('Cache-Control', 'no-store');
  if (r.ready) {
    res.json(r);
    return;
  }
  const failing = Object.values(r.checks)
    .filter((c) => !c.ok)
    .map((c) => c.detail);
  throw new Problem(503, 'Not ready', failing.join('; '), { ...r });
});
