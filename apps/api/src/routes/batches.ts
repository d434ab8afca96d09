import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { badCharacter } from '@scarpline/core/input';
import { config } from '../config';
import { badRequest, invalid, Problem } from '../errors';
import { readBatchText, readUploads } from '../intake/pool';
import { ALL, allow, principal } from '../middleware/auth';
import { batchView, listBatches, loadBatch, loadProject, submitBatch } from '../services/batches';
import { etagOf } from '../services/events';
import {
  batchInputs,
  inputContentType,
  inputDownloadName,
  loadBatchInput,
  safeFileName,
  sendStoredFile,
} from '../services/files';
import { idParam } from './params';

export const batchRoutes = Router();
const submitters = allow('admin', 'engineer', 'integration');
const upload = multer({
  storage: multer.memoryStorage(),
  limits: {
    fileSize: config.uploadLimit,
    files: config.uploadFiles,
    fields: 10,
    fieldSize: 1024,
    fieldNameSize: 200,
    parts: config.uploadFiles + 10,
    headerPairs: 200,
  },
});
/** The most characters of an uploaded file's name. */
const FILE_NAME_LENGTH = 255;

/** The project of the path, which the caller may use (404 otherwise), before the body is read. */
const project: RequestHandler = async (req, _res, next) => {
  await loadProject(principal(req), idParam(req.params.id));
  next();
};

/**
 * An upload is read into memory only when it says its length (Content-Length) and that is at
 * most UPLOAD_TOTAL: 411 or 413 at once otherwise. Its parts are not compressed (415).
 */
const uploadSize: RequestHandler = (req, _res, next) => {
  const encoding = (req.get('content-encoding') ?? 'identity').trim().toLowerCase();
  if (encoding !== 'identity') {
    throw new Problem(
      415,
      'Unsupported media type',
      `An upload is not sent compressed (Content-Encoding: ${encoding.slice(0, 40)}).`,
    );
  }
  const length = req.get('content-length');
  if (length === undefined) {
    throw new Problem(411, 'Length required', 'Send an upload with its Content-Length.');
  }
  if (!/^\d{1,15}$/.test(length) || Number(length) > config.uploadTotal) {
    throw new Problem(
      413,
      'Content too large',
      `An upload holds at most ${config.uploadTotal} bytes in all (UPLOAD_TOTAL); this one says ${length.slice(0, 20)}.`,
    );
  }
  next();
};

/** multer, whose parser's own errors (no boundary, a form cut off, a bad part) are the sender's. */
const files: RequestHandler = (req, res, next) => {
  upload.array('files')(req, res, (err?: unknown) => {
    if (!err) return next();
    if (err instanceof Error && err.name !== 'MulterError' && !('status' in err)) {
      return next(
        new Problem(400, 'Bad upload', `The upload is not a readable form: ${err.message}.`),
      );
    }
    next(err);
  });
};

batchRoutes.get('/projects/:id/batches', allow(...ALL), async (req, res) => {
  res.json(await listBatches(principal(req), idParam(req.params.id)));
});

batchRoutes.post('/projects/:id/batches', submitters, project, async (req, res) => {
  const projectId = idParam(req.params.id);
  if (!req.is('application/json') || typeof req.body !== 'string') {
    throw badRequest('Send the batch as application/json.');
  }
  const parsed = await readBatchText(req.body);
  const input = {
    name: `${safeFileName(parsed.name)}.json`,
    contentType: 'application/json',
    body: Buffer.from(req.body, 'utf8'),
  };
  res.status(201).json(await submitBatch(principal(req), projectId, parsed, 'json', [input]));
});

batchRoutes.post(
  '/projects/:id/uploads',
  submitters,
  project,
  uploadSize,
  files,
  async (req, res) => {
    const projectId = idParam(req.params.id);
    const sent = (req.files as Express.Multer.File[] | undefined) ?? [];
    if (sent.length === 0) throw badRequest('Attach one or more files in the field "files".');
    for (const f of sent) {
      const bad = badCharacter(f.originalname);
      if (bad || f.originalname.length > FILE_NAME_LENGTH) {
        throw invalid(
          bad
            ? `A file's name holds ${bad}: rename the file.`
            : `A file's name has ${f.originalname.length} characters; at most ${FILE_NAME_LENGTH} are taken.`,
        );
      }
    }
    const parsed = await readUploads(
      sent.map((f) => ({ name: f.originalname || 'upload', text: f.buffer.toString('utf8') })),
    );
    const inputs = sent.map((f) => ({
      name: f.originalname || 'upload',
      contentType: inputContentType(f.originalname),
      body: f.buffer,
    }));
    res.status(201).json(await submitBatch(principal(req), projectId, parsed, 'upload', inputs));
  },
);

batchRoutes.get('/batches/:id', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  const view = await batchView(b.id);
  // Express answers 304 itself when If-None-Match matches the ETag set here.
  res.set('ETag', etagOf(view)).json(view);
});

batchRoutes.get('/batches/:id/inputs', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res.json(await batchInputs(b.id));
});

batchRoutes.get('/batches/:id/inputs/:fileId', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  const f = await loadBatchInput(b, idParam(req.params.fileId, 'fileId'));
  await sendStoredFile(res, f, inputDownloadName(b, f));
});
