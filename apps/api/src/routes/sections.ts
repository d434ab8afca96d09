import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { loadBatch } from '../services/batches';
import { listSections, sectionView } from '../services/sections';
import { idParam } from './params';

export const sectionRoutes = Router();

sectionRoutes.get('/batches/:id/sections', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res.json(await listSections(b, req.query));
});

sectionRoutes.get('/sections/:id', allow(...ALL), async (req, res) => {
  res.json(await sectionView(principal(req), idParam(req.params.id)));
});
