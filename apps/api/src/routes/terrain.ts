/**
 * Sections cut from terrain: POST /projects/:id/terrain takes a terrain job (scarpline-terrain/1,
 * the field `job`, as a file or as text) and the files it names (the field `files`: the
 * elevation rasters as GeoTIFF, the alignment as GeoJSON, the corridor settings if in a file
 * of their own), cuts the sections in an intake thread and submits them as a batch. The rasters
 * are kept in the object storage (kind 'terrain'), the job, the alignment and the corridor cut
 * from them as the batch's inputs.
 */
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { badCharacter } from '@scarpline/core/input';
import { config } from '../config';
import { badRequest, invalid, Problem } from '../errors';
import { allow, principal } from '../middleware/auth';
import { loadProject } from '../services/batches';
import { submitTerrainBatch } from '../services/terrain';
import { idParam } from './params';

export const terrainRoutes = Router();
const submitters = allow('admin', 'engineer', 'integration');
/** The most files besides the job: rasters (ground, strata, water), the alignment, the settings. */
const TERRAIN_FILES = 20;
const upload = multer({
  storage: multer.memoryStorage(),
  limits: {
    fileSize: config.terrainFileLimit,
    files: TERRAIN_FILES + 1,
    fields: 4,
    fieldSize: 256 * 1024,
    fieldNameSize: 100,
    parts: TERRAIN_FILES + 5,
    headerPairs: 200,
  },
});

const project: RequestHandler = async (req, _res, next) => {
  await loadProject(principal(req), idParam(req.params.id));
  next();
};

/** Read into memory only when it says its length and that is at most TERRAIN_TOTAL. */
const uploadSize: RequestHandler = (req, _res, next) => {
  const encoding = (req.get('content-encoding') ?? 'identity').trim().toLowerCase();
  if (encoding !== 'identity')
    throw new Problem(415, 'Unsupported media type', 'An upload is not sent compressed.');
  const length = req.get('content-length');
  if (length === undefined)
    throw new Problem(411, 'Length required', 'Send an upload with its Content-Length.');
  if (!/^\d{1,15}$/.test(length) || Number(length) > config.terrainTotal)
    throw new Problem(
      413,
      'Content too large',
      `A terrain upload holds at most ${config.terrainTotal} bytes in all (TERRAIN_TOTAL); this one says ${length.slice(0, 20)}.`,
    );
  next();
};

const files: RequestHandler = (req, res, next) => {
  upload.fields([
    { name: 'job', maxCount: 1 },
    { name: 'files', maxCount: TERRAIN_FILES },
  ])(req, res, (err?: unknown) => {
    if (!err) return next();
    if (err instanceof Error && err.name !== 'MulterError' && !('status' in err))
      return next(
        new Problem(400, 'Bad upload', `The upload is not a readable form: ${err.message}.`),
      );
    next(err);
  });
};

terrainRoutes.post(
  '/projects/:id/terrain',
  submitters,
  project,
  uploadSize,
  files,
  async (req, res) => {
    const projectId = idParam(req.params.id);
    const parts = (req.files ?? {}) as Record<string, Express.Multer.File[] | undefined>;
    const body = (req.body ?? {}) as Record<string, unknown>;
    const jobFile = parts.job?.[0];
    const job = jobFile
      ? { name: jobFile.originalname || 'terrain.yaml', text: jobFile.buffer.toString('utf8') }
      : typeof body.job === 'string'
        ? { name: 'terrain.yaml', text: body.job }
        : null;
    if (!job)
      throw badRequest(
        'Send the terrain job (format scarpline-terrain/1) in the field "job" and the files it names in "files".',
      );
    const sent = parts.files ?? [];
    for (const f of [...sent, ...(jobFile ? [jobFile] : [])]) {
      const bad = badCharacter(f.originalname);
      if (bad || f.originalname.length > 255)
        throw invalid(
          bad ? `A file's name holds ${bad}: rename the file.` : `A file's name is too long.`,
        );
    }
    const batch = await submitTerrainBatch(
      principal(req),
      projectId,
      job,
      sent.map((f) => ({ name: f.originalname, body: f.buffer })),
    );
    res.status(201).json(batch);
  },
);
