import { Router } from 'express';
import { allow, principal } from '../middleware/auth';
import { createIntegrationToken, listIntegrationTokens, revokeToken } from '../services/tokens';
import { idParam, str } from './params';

export const tokenRoutes = Router();
const admin = allow('admin');

tokenRoutes.get('/tokens', admin, async (_req, res) => {
  res.json(await listIntegrationTokens());
});

tokenRoutes.post('/tokens', admin, async (req, res) => {
  const body = req.body as { projectIds?: unknown; days?: unknown };
  const projectIds = Array.isArray(body.projectIds)
    ? body.projectIds.map((v) => idParam(v, 'projectIds[]'))
    : [];
  const created = await createIntegrationToken(principal(req), {
    userId: idParam((req.body as { userId?: unknown }).userId, 'userId'),
    name: str(req.body, 'name'),
    projectIds,
    days: typeof body.days === 'number' ? body.days : undefined,
  });
  res.status(201).json(created);
});

tokenRoutes.delete('/tokens/:id', admin, async (req, res) => {
  res.json(await revokeToken(principal(req), idParam(req.params.id)));
});
