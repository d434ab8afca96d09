/**
 * Reports: a section's PDF (made on request, or the one made before for the same run and
 * review), a corridor's (asked for, made by a worker, then downloaded), and their state.
 */
import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import {
  listReports,
  loadReport,
  reportView,
  requestCorridorReport,
  sectionReport,
  sendReport,
} from '../services/reports';
import { sendStoredFile } from '../services/files';
import { idParam, objectBody, text } from './params';

export const reportRoutes = Router();

reportRoutes.get('/sections/:id/report.pdf', allow(...ALL), async (req, res) => {
  const { file, name } = await sectionReport(principal(req), idParam(req.params.id));
  await sendStoredFile(res, file, name);
});

reportRoutes.post(
  '/batches/:id/reports',
  allow('admin', 'engineer', 'reviewer'),
  async (req, res) => {
    const body = objectBody(req.body ?? {});
    const appendix = text(body, 'appendix', 10, { optional: true }) || 'below';
    const report = await requestCorridorReport(principal(req), idParam(req.params.id), appendix);
    res.status(202).location(`/api/v1/reports/${report.id}`).json(report);
  },
);

reportRoutes.get('/batches/:id/reports', allow(...ALL), async (req, res) => {
  res.json(await listReports(principal(req), idParam(req.params.id)));
});

reportRoutes.get('/reports/:id', allow(...ALL), async (req, res) => {
  res.json(reportView(await loadReport(principal(req), idParam(req.params.id))));
});

reportRoutes.get('/reports/:id/file', allow(...ALL), async (req, res) => {
  await sendReport(principal(req), idParam(req.params.id), res);
});
