/**
 * Sections cut from terrain: a terrain job (scarpline-terrain/1) with the files it names — the
 * elevation rasters, the alignment, the corridor settings — made into a GeoJSON corridor by
 * @scarpline/terrain and read as any uploaded corridor (validate.ts parseFiles). Runs in an
 * intake thread (intake/thread.ts), under the pool's time and memory limits; the raster caps
 * (bytes, pixels) are the job's own.
 */
import {
  corridorText,
  messageLine,
  readTerrainJob,
  runTerrainJob,
  TerrainError,
  type RasterLimits,
  type TerrainMessage,
} from '@scarpline/terrain';
import { invalid } from '../errors';
import { parseFiles, type Parsed } from './validate';

/** An uploaded file, its bytes. */
export interface UploadedFile {
  name: string;
  body: Uint8Array;
}

export interface TerrainUpload {
  job: { name: string; text: string };
  files: UploadedFile[];
  limits: RasterLimits;
}

/** What a cut made: the corridor read as an upload, its text (the batch's input) and the cut's warnings. */
export interface TerrainCut {
  parsed: Parsed;
  corridor: { name: string; text: string };
  warnings: (TerrainMessage & { text: string })[];
}

const view = (m: TerrainMessage) => ({ ...m, text: messageLine(m) });
const baseName = (name: string) => name.split(/[\\/]/).pop() ?? name;

/**
 * Cuts the sections of an uploaded terrain job: the files it names are the uploaded files of
 * those names (their folders, if the job gives any, ignored). A problem of the job, a file or a
 * sample (no data, located by station and offset) → 422 with every located message.
 */
export async function cutTerrainUpload(u: TerrainUpload): Promise<TerrainCut> {
  const byName = new Map(u.files.map((f) => [baseName(f.name), f.body]));
  try {
    const job = readTerrainJob(u.job.text, u.job.name);
    const { corridor, messages } = await runTerrainJob(
      job,
      u.job.name,
      (name) => Promise.resolve(byName.get(baseName(name)) ?? null),
      { limits: u.limits },
    );
    const name = `${u.job.name.replace(/\.(ya?ml|json)$/i, '')}.geojson`;
    const text = corridorText(corridor);
    return {
      parsed: parseFiles([{ name, text }]),
      corridor: { name, text },
      warnings: messages.map(view),
    };
  } catch (e) {
    if (!(e instanceof TerrainError)) throw e;
    const errors = e.messages.filter((m) => m.severity === 'error');
    const n = errors.length;
    throw invalid(
      `${n} ${n === 1 ? 'error' : 'errors'} in the terrain input. ${messageLine(errors[0] ?? e.messages[0])}`,
      { errors: e.messages.map(view) },
    );
  }
}
