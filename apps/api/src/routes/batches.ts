import { Router, type Request } from 'express';
import multer from 'multer';
import { config } from '../config';
import { badRequest } from '../errors';
import { ALL, allow, principal } from '../middleware/auth';
import { assertProject } from '../services/auth';
import { batchView, listBatches, loadBatch, submitBatch } from '../services/batches';
import { etagOf } from '../services/events';
import { parseBatchBody, parseFiles } from '../services/validate';
import { idParam } from './params';

export const batchRoutes = Router();
const submitters = allow('admin', 'engineer', 'integration');
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: config.uploadLimit, files: config.uploadFiles },
});

batchRoutes.get('/projects/:id/batches', allow(...ALL), async (req, res) => {
  res.json(await listBatches(principal(req), idParam(req.params.id)));
});

batchRoutes.post('/projects/:id/batches', submitters, async (req, res) => {
  const projectId = idParam(req.params.id);
  assertProject(principal(req), projectId);
  if (!req.is('application/json')) throw badRequest('Send the batch as application/json.');
  const parsed = parseBatchBody(req.body, (req as Request & { rawBody?: string }).rawBody);
  res.status(201).json(await submitBatch(principal(req), projectId, parsed, 'json'));
});

batchRoutes.post('/projects/:id/uploads', submitters, upload.array('files'), async (req, res) => {
  const projectId = idParam(req.params.id);
  assertProject(principal(req), projectId);
  const files = (req.files as Express.Multer.File[] | undefined) ?? [];
  if (files.length === 0) throw badRequest('Attach one or more files in the field "files".');
  const parsed = parseFiles(
    files.map((f) => ({ name: f.originalname, text: f.buffer.toString('utf8') })),
  );
  res.status(201).json(await submitBatch(principal(req), projectId, parsed, 'upload'));
});

batchRoutes.get('/batches/:id', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  const view = await batchView(b.id);
  // Express answers 304 itself when If-None-Match matches the ETag set here.
  res.set('ETag', etagOf(view)).set('Cache-Control', 'private, no-cache').json(view);
});
