/**
 * Section studies: a probabilistic analysis, a sensitivity or a solve of a section's current
 * run, asked for (engineers, admins), computed by workers, then read with its drawing.
 */
import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { getStudy, listStudies, requestStudy, studyPlot } from '../services/studies';
import { API_LIMITS } from '../limits';
import { idParam, objectBody, queryName } from './params';

export const studyRoutes = Router();

studyRoutes.post('/sections/:id/studies', allow('admin', 'engineer'), async (req, res) => {
  const study = await requestStudy(principal(req), idParam(req.params.id), objectBody(req.body));
  res.status(202).location(`/api/v1/studies/${study.id}`).json(study);
});

studyRoutes.get('/sections/:id/studies', allow(...ALL), async (req, res) => {
  res.json(await listStudies(principal(req), idParam(req.params.id)));
});

studyRoutes.get('/studies/:id', allow(...ALL), async (req, res) => {
  res.json(await getStudy(principal(req), idParam(req.params.id)));
});

studyRoutes.get('/studies/:id/plot.svg', allow(...ALL), async (req, res) => {
  const { svg, fileName } = await studyPlot(principal(req), idParam(req.params.id), {
    case: queryName(req.query.case, 'case', API_LIMITS.caseName),
    view: queryName(req.query.view, 'view', 10),
  });
  res.type('image/svg+xml').set('Content-Disposition', `inline; filename="${fileName}"`).send(svg);
});
