import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { loadBatch } from '../services/batches';
import { listSections, sectionView } from '../services/sections';
import { API_LIMITS } from '../limits';
import { idParam, queryInt, queryName, queryText } from './params';

export const sectionRoutes = Router();

sectionRoutes.get('/batches/:id/sections', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  const q = req.query as Record<string, unknown>;
  res.json(
    await listSections(b, {
      status: queryText(q.status, 'status'),
      verdict: queryText(q.verdict, 'verdict'),
      case: queryName(q.case, 'case', API_LIMITS.caseName),
      sort: queryText(q.sort, 'sort'),
      order: queryText(q.order, 'order'),
      page: queryInt(q.page, 'page', 1, API_LIMITS.page),
      pageSize: queryInt(q.pageSize, 'pageSize', 50, API_LIMITS.pageSize),
    }),
  );
});

sectionRoutes.get('/sections/:id', allow(...ALL), async (req, res) => {
  res.json(await sectionView(principal(req), idParam(req.params.id)));
});
