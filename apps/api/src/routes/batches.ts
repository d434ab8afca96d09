import { Router, type Request } from 'express';
import multer from 'multer';
import { config } from '../config';
import { badRequest } from '../errors';
import { ALL, allow, principal } from '../middleware/auth';
import {
  batchView,
  listBatches,
  listSections,
  loadBatch,
  submitBatch,
  type SectionQuery,
} from '../services/batches';
import { assertProject } from '../services/auth';
import { etagOf, followBatch } from '../services/events';
import { rerunSection, sectionRuns } from '../services/rerun';
import { sectionView } from '../services/sections';
import { createProject, getProject, listProjects } from '../services/users';
import { parseBatchBody, parseFiles } from '../services/validate';
import { idParam, str } from './params';

export const batchRoutes = Router();
const submitters = allow('admin', 'engineer', 'integration');
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: config.uploadLimit, files: config.uploadFiles },
});

batchRoutes.get('/projects', allow(...ALL), async (req, res) => {
  res.json(await listProjects(principal(req)));
});

batchRoutes.post('/projects', allow('admin', 'engineer'), async (req, res) => {
  const body = req.body as { description?: unknown };
  res.status(201).json(
    await createProject(principal(req), {
      name: str(req.body, 'name'),
      description: typeof body.description === 'string' ? body.description : undefined,
    }),
  );
});

batchRoutes.get('/projects/:id', allow(...ALL), async (req, res) => {
  res.json(await getProject(principal(req), idParam(req.params.id)));
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

/** Live progress as server-sent events; also takes ?access_token= (see middleware/auth). */
batchRoutes.get('/batches/:id/events', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  res.write('retry: 2000\n\n');
  const stop = new AbortController();
  res.on('close', () => stop.abort());
  await followBatch(
    b.id,
    (e) => void res.write(`event: ${e.event}\ndata: ${JSON.stringify(e.data)}\n\n`),
    stop.signal,
  );
  res.end();
});

batchRoutes.get('/batches/:id/sections', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res.json(await listSections(b, req.query as SectionQuery));
});

batchRoutes.get('/sections/:id', allow(...ALL), async (req, res) => {
  res.json(await sectionView(principal(req), idParam(req.params.id)));
});

batchRoutes.post('/sections/:id/runs', allow('admin', 'engineer'), async (req, res) => {
  if (!req.is('application/json')) throw badRequest('Send the changes as application/json.');
  res.status(202).json(await rerunSection(principal(req), idParam(req.params.id), req.body));
});

batchRoutes.get('/sections/:id/runs', allow(...ALL), async (req, res) => {
  res.json(await sectionRuns(principal(req), idParam(req.params.id)));
});
