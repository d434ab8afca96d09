import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { loadBatch } from '../services/batches';
import {
  batchCsv,
  batchGeoJson,
  batchXlsx,
  fileName,
  sectionSvg,
  xlsxFileName,
} from '../services/exports';
import { XLSX_TYPE } from '@scarpline/report';
import { sectionPng } from '../services/plot-png';
import { API_LIMITS } from '../limits';
import { idParam, queryFlag, queryName } from './params';

export const exportRoutes = Router();
const attachment = (name: string) => `attachment; filename="${name}"`;

exportRoutes.get('/batches/:id/results.csv', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res
    .type('text/csv; charset=utf-8')
    .set('Content-Disposition', attachment(fileName(b, 'csv')))
    .send(await batchCsv(b));
});

exportRoutes.get('/batches/:id/results.geojson', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res
    .type('application/geo+json')
    .set('Content-Disposition', attachment(fileName(b, 'geojson')))
    .send(JSON.stringify(await batchGeoJson(b)));
});

exportRoutes.get('/batches/:id/results.xlsx', allow(...ALL), async (req, res) => {
  const slices = queryFlag(req.query.slices, 'slices');
  const b = await loadBatch(principal(req), idParam(req.params.id));
  const xlsx = await batchXlsx(b, { slices });
  res
    .type(XLSX_TYPE)
    .set('Content-Disposition', attachment(xlsxFileName(b, new Date())))
    .send(xlsx);
});

exportRoutes.get('/sections/:id/plot.svg', allow(...ALL), async (req, res) => {
  const caseName = queryName(req.query.case, 'case', API_LIMITS.caseName);
  const { svg, fileName: name } = await sectionSvg(
    principal(req),
    idParam(req.params.id),
    caseName,
  );
  res.type('image/svg+xml').set('Content-Disposition', `inline; filename="${name}"`).send(svg);
});

exportRoutes.get('/sections/:id/plot.png', allow(...ALL), async (req, res) => {
  const caseName = queryName(req.query.case, 'case', API_LIMITS.caseName);
  const { png, fileName: name } = await sectionPng(
    principal(req),
    idParam(req.params.id),
    caseName,
  );
  res.type('image/png').set('Content-Disposition', attachment(name)).send(png);
});
