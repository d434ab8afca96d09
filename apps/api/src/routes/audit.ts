import { Router } from 'express';
import { allow } from '../middleware/auth';
import { listAudit } from '../services/audit';

export const auditRoutes = Router();

auditRoutes.get('/audit', allow('admin'), async (_req, res) => {
  res.json(await listAudit());
});
