/**
 * A batch of sections cut from terrain: the terrain job and its files cut in an intake thread
 * (terrain-cut.ts), the corridor submitted as a batch (source 'terrain'), the rasters kept in
 * the object storage as the batch's terrain. Used by POST /projects/:id/terrain and the demo.
 */
import { config } from '../config';
import { readTerrain } from '../intake/pool';
import type { Principal } from './auth';
import { submitBatch } from './batches';
import { inputContentType, storeFile } from './files';
import type { UploadedFile } from './terrain-cut';

const RASTER = /\.tiff?$/i;

export async function submitTerrainBatch(
  p: Principal,
  projectId: number,
  job: { name: string; text: string },
  files: UploadedFile[],
) {
  const cut = await readTerrain({
    job,
    files,
    limits: { maxBytes: config.terrainFileLimit, maxPixels: config.terrainPixels },
  });
  // the batch's inputs: the job, its text files and the corridor cut from them
  const inputs = [
    { name: job.name, contentType: inputContentType(job.name), body: Buffer.from(job.text) },
    ...files
      .filter((f) => !RASTER.test(f.name))
      .map((f) => ({
        name: f.name,
        contentType: inputContentType(f.name),
        body: Buffer.from(f.body),
      })),
    {
      name: cut.corridor.name,
      contentType: 'application/geo+json',
      body: Buffer.from(cut.corridor.text),
    },
  ];
  const batch = await submitBatch(p, projectId, cut.parsed, 'terrain', inputs);
  for (const f of files.filter((f) => RASTER.test(f.name)))
    await storeFile({
      kind: 'terrain',
      name: f.name,
      contentType: 'image/tiff',
      body: Buffer.from(f.body),
      batchId: batch.id,
      createdBy: p.userId,
    });
  return { ...batch, terrain: { warnings: cut.warnings } };
}
