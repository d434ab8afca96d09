import { Router } from 'express';
import { badRequest } from '../errors';
import { ALL, allow, principal } from '../middleware/auth';
import { rerunSection, sectionRuns } from '../services/runs';
import { idParam } from './params';

export const runRoutes = Router();

/** The body is taken as its text (middleware/bodies.ts) and read off the main thread. */
runRoutes.post('/sections/:id/runs', allow('admin', 'engineer'), async (req, res) => {
  if (!req.is('application/json') || typeof req.body !== 'string') {
    throw badRequest('Send the changes as application/json.');
  }
  res.status(202).json(await rerunSection(principal(req), idParam(req.params.id), req.body));
});

runRoutes.get('/sections/:id/runs', allow(...ALL), async (req, res) => {
  res.json(await sectionRuns(principal(req), idParam(req.params.id)));
});
