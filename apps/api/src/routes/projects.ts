import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { createProject, getProject, listProjects } from '../services/projects';
import { idParam, str } from './params';

export const projectRoutes = Router();

projectRoutes.get('/projects', allow(...ALL), async (req, res) => {
  res.json(await listProjects(principal(req)));
});

projectRoutes.post('/projects', allow('admin', 'engineer'), async (req, res) => {
  const body = req.body as { description?: unknown };
  res.status(201).json(
    await createProject(principal(req), {
      name: str(req.body, 'name'),
      description: typeof body.description === 'string' ? body.description : undefined,
    }),
  );
});

projectRoutes.get('/projects/:id', allow(...ALL), async (req, res) => {
  res.json(await getProject(principal(req), idParam(req.params.id)));
});
