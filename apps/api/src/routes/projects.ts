import { Router } from 'express';
import { API_LIMITS } from '../limits';
import { ALL, allow, principal } from '../middleware/auth';
import { createProject, getProject, listProjects } from '../services/projects';
import { idParam, objectBody, text } from './params';

export const projectRoutes = Router();

projectRoutes.get('/projects', allow(...ALL), async (req, res) => {
  res.json(await listProjects(principal(req)));
});

projectRoutes.post('/projects', allow('admin', 'engineer'), async (req, res) => {
  const body = objectBody(req.body);
  const description = text(body, 'description', API_LIMITS.description, { optional: true });
  res.status(201).json(
    await createProject(principal(req), {
      name: text(body, 'name', API_LIMITS.name),
      description: description || undefined,
    }),
  );
});

projectRoutes.get('/projects/:id', allow(...ALL), async (req, res) => {
  res.json(await getProject(principal(req), idParam(req.params.id)));
});
