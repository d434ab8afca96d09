import { readFile, writeFile } from 'node:fs/promises';
import { dirname, isAbsolute, join } from 'node:path';
import {
  corridorText,
  isTerrainJob,
  messageLine,
  readTerrainJob,
  runTerrainJob,
  TERRAIN_FORMAT,
  TerrainError,
  type TerrainCorridor,
  type TerrainJob,
} from '@scarpline/terrain';
import { readInput, UserError } from './read-input';

/** The options of `scarpline cut` (each replaces the job file's setting). */
export interface CutOptions {
  terrain?: string;
  alignment?: string;
  start?: string;
  every?: string;
  from?: string;
  to?: string;
  stations?: string;
  left?: string;
  right?: string;
  spacing?: string;
  template?: string;
  stratum?: string[];
  water?: string;
  skipNoData?: boolean;
}

const number = (option: string, v: string): number => {
  const n = Number(v);
  if (v.trim() === '' || !Number.isFinite(n))
    throw new UserError(`--${option}: ${v} is not a number`);
  return n;
};

/** A raster given as a file, or a depth given as a number: `rock.tif` or `6`. */
const rasterOrDepth = (v: string): { raster: string } | { depth: number } =>
  /^\s*[\d.]+\s*$/.test(v) ? { depth: Number(v) } : { raster: v };

/**
 * The terrain job of `scarpline cut`: the job file's (files named in it are relative to it),
 * with each option given on the command line in place of its setting (files relative to the
 * working folder). A file keeps the path it is named by, so that messages name it so.
 */
export function cutJob(
  file: string | undefined,
  o: CutOptions,
): { job: Record<string, unknown>; name: string } {
  let job: Record<string, unknown> = { format: TERRAIN_FORMAT };
  let name = 'command line';
  if (file) {
    const input = readInput(file);
    name = input.name;
    const base = file === '-' ? '.' : dirname(file);
    const read = readTerrainJob(input.text, input.name);
    const at = (p: string) => (isAbsolute(p) ? p : join(base, p));
    job = {
      ...read,
      terrain: at(read.terrain),
      alignment: at(read.alignment),
      template: typeof read.template === 'string' ? at(read.template) : read.template,
      ...(read.strata
        ? { strata: read.strata.map((s) => (s.raster ? { ...s, raster: at(s.raster) } : s)) }
        : {}),
      ...(read.water?.raster ? { water: { raster: at(read.water.raster) } } : {}),
    };
  }
  if (o.terrain) job.terrain = o.terrain;
  if (o.alignment) job.alignment = o.alignment;
  if (o.template) job.template = o.template;
  if (o.start !== undefined) job.start = number('start', o.start);
  for (const key of ['left', 'right', 'spacing'] as const)
    if (o[key] !== undefined) job[key] = number(key, o[key]);
  if (o.stations !== undefined) {
    if (o.every !== undefined) throw new UserError('give one of --every and --stations');
    job.stations = o.stations.split(',').map((s) => number('stations', s));
  } else if (o.every !== undefined) {
    job.stations = {
      every: number('every', o.every),
      ...(o.from !== undefined ? { from: number('from', o.from) } : {}),
      ...(o.to !== undefined ? { to: number('to', o.to) } : {}),
    };
  }
  if (o.stratum?.length)
    job.strata = o.stratum.map((s, i) => {
      const [material, top] = s.split('=');
      if (i === 0 && top !== undefined)
        throw new UserError(
          `--stratum ${s}: the first stratum's top is the ground: give only its material`,
        );
      if (i > 0 && top === undefined)
        throw new UserError(
          `--stratum ${s}: give its top, as material=raster.tif or material=depth`,
        );
      return top === undefined ? { material } : { material, ...rasterOrDepth(top) };
    });
  if (o.water !== undefined) job.water = rasterOrDepth(o.water);
  if (o.skipNoData) job.noData = 'skip';
  return { job, name };
}

/**
 * Cuts the corridor of a terrain job: reads its files, cuts the sections, prints the warnings.
 * A located message for each problem, then a UserError.
 */
export async function cutFromJob(
  file: string | undefined,
  options: CutOptions,
  err: (line: string) => void,
): Promise<{ corridor: TerrainCorridor; name: string }> {
  const { job, name } = cutJob(file, options);
  try {
    // checked as a job file is: the command line's settings located by their names
    const checked: TerrainJob = readTerrainJob(JSON.stringify(job), name);
    const { corridor, messages } = await runTerrainJob(checked, name, async (f) => {
      try {
        return await readFile(f);
      } catch {
        return null;
      }
    });
    for (const m of messages) err(messageLine(m));
    return { corridor, name };
  } catch (e) {
    if (e instanceof TerrainError) {
      for (const m of e.messages) err(messageLine(m));
      throw new UserError(`${name}: the sections could not be cut (see the messages above)`);
    }
    throw e;
  }
}

/** `scarpline cut`: writes the GeoJSON corridor cut from the terrain. Returns the exit code. */
export async function cutTerrain(
  file: string | undefined,
  out: string | undefined,
  options: CutOptions,
  print: (line: string) => void,
  err: (line: string) => void,
): Promise<number> {
  const { corridor } = await cutFromJob(file, options, err);
  const text = corridorText(corridor);
  if (out === undefined || out === '-') process.stdout.write(text);
  else {
    await writeFile(out, text);
    print(
      `${out}: ${corridor.features.length} sections cut from ${options.terrain ?? 'the terrain'}`,
    );
  }
  return 0;
}

/**
 * `scarpline batch` of a terrain job: the corridor cut from it, as the input of the batch (its
 * name the job's with .geojson), or null when the file is not a terrain job.
 */
export async function terrainBatchInput(
  file: string,
  err: (line: string) => void,
): Promise<{ name: string; text: string } | null> {
  if (file === '-') return null;
  const { text } = readInput(file);
  if (!isTerrainJob(text)) return null;
  const { corridor, name } = await cutFromJob(file, {}, err);
  return { name: `${name.replace(/\.(ya?ml|json)$/i, '')}.geojson`, text: corridorText(corridor) };
}
