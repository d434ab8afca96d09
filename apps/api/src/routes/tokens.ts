import { Router } from 'express';
import { badRequest } from '../errors';
import { API_LIMITS } from '../limits';
import { allow, principal } from '../middleware/auth';
import { createIntegrationToken, listIntegrationTokens, revokeToken } from '../services/tokens';
import { idParam, objectBody, text } from './params';

export const tokenRoutes = Router();
const admin = allow('admin');

tokenRoutes.get('/tokens', admin, async (_req, res) => {
  res.json(await listIntegrationTokens());
});

tokenRoutes.post('/tokens', admin, async (req, res) => {
  const body = objectBody(req.body);
  if (body.projectIds !== undefined && !Array.isArray(body.projectIds)) {
    throw badRequest('projectIds is a list of project ids.');
  }
  const list = (body.projectIds as unknown[] | undefined) ?? [];
  if (list.length > 1000) throw badRequest('projectIds lists at most 1000 projects.');
  const projectIds = [...new Set(list.map((v) => idParam(v, 'projectIds[]')))];
  const created = await createIntegrationToken(principal(req), {
    userId: idParam(body.userId, 'userId'),
    name: text(body, 'name', API_LIMITS.name),
    projectIds,
    days: body.days === undefined ? undefined : (body.days as number),
  });
  res.status(201).json(created);
});

tokenRoutes.delete('/tokens/:id', admin, async (req, res) => {
  res.json(await revokeToken(principal(req), idParam(req.params.id)));
});
