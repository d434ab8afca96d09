import { parse } from 'yaml';
import { parseCrs } from '@scarpline/core';
import { readAlignment, type Projection } from './alignment';
import {
  cutCorridor,
  type BatchHeader,
  type CutSettings,
  type StratumTop,
  type TerrainCorridor,
} from './cut';
import { fail, TerrainError, type TerrainMessage } from './errors';
import { readRaster, DEFAULT_RASTER_LIMITS, type Raster, type RasterLimits } from './raster';

export const TERRAIN_FORMAT = 'scarpline-terrain/1';

/**
 * A terrain job: what to cut and how, the files named by their paths (or upload names).
 *
 * ```yaml
 * format: scarpline-terrain/1
 * terrain: dem.tif              # the ground: a GeoTIFF elevation raster
 * alignment: alignment.geojson  # a GeoJSON LineString in the raster's coordinate system
 * start: 1000                   # chainage at its first position (default: its property, or 0)
 * stations: { every: 20 }       # or { every, from, to }, or a list [1000, 1050]
 * left: 40                      # half-widths of each section (m or ft)
 * right: 40
 * spacing: 1                    # between samples along a section
 * template: settings.yaml       # the batch header: id, title, units, template (or written here)
 * strata:                       # optional: the template's strata with their tops
 *   - material: weathered-mudstone
 *   - { material: mudstone, raster: rock-top.tif }   # or depth: 6
 * water: { raster: groundwater.tif }                 # or depth: 2.5
 * noData: error                 # or skip: leave out a station with a sample of no data
 * ```
 */
export interface TerrainJob {
  terrain: string;
  alignment: string;
  start?: number;
  stations: CutSettings['stations'];
  left: number;
  right: number;
  spacing: number;
  template: string | BatchHeader;
  strata?: { material: string; raster?: string; depth?: number }[];
  water?: { raster?: string; depth?: number };
  noData?: 'error' | 'skip';
}

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** Whether a text is a terrain job (its format line), without reading it further. */
export function isTerrainJob(text: string): boolean {
  return /^\s*["']?format["']?\s*:\s*["']?scarpline-terrain\/1\b/m.test(text.slice(0, 4000));
}

const KEYS = [
  'format',
  'terrain',
  'alignment',
  'start',
  'stations',
  'left',
  'right',
  'spacing',
  'template',
  'strata',
  'water',
  'noData',
];

/**
 * Reads and checks a terrain job (YAML or JSON), every problem located by its setting.
 *
 * @example readTerrainJob(readFileSync('wendlecombe.terrain.yaml', 'utf8'), 'wendlecombe.terrain.yaml')
 */
export function readTerrainJob(text: string, fileName: string): TerrainJob {
  let data: unknown;
  try {
    data = parse(text, { maxAliasCount: 100 });
  } catch (e) {
    throw fail({
      file: fileName,
      code: 'syntax',
      message: `YAML syntax error: ${e instanceof Error ? e.message : String(e)}`,
    });
  }
  const problems: TerrainMessage[] = [];
  const problem = (path: string, message: string, code = 'invalid') =>
    problems.push({ severity: 'error', file: fileName, path, code, message });
  if (!isRecord(data))
    throw fail({
      file: fileName,
      code: 'not-a-job',
      message: `expected a terrain job (format: ${TERRAIN_FORMAT})`,
    });
  if (data.format !== TERRAIN_FORMAT) problem('format', `expected "${TERRAIN_FORMAT}"`);
  for (const key of Object.keys(data))
    if (!KEYS.includes(key)) problem(key, `unknown setting (known: ${KEYS.join(', ')})`, 'unknown');
  const file = (key: string, v: unknown) => {
    if (typeof v !== 'string' || v === '') problem(key, 'expected a file name');
  };
  const positive = (key: string, v: unknown, zero = false) => {
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0 || (!zero && v === 0))
      problem(key, `expected a number${zero ? ' of 0 or more' : ' above 0'}`);
  };
  file('terrain', data.terrain);
  file('alignment', data.alignment);
  if (data.start !== undefined && (typeof data.start !== 'number' || !Number.isFinite(data.start)))
    problem('start', 'expected a chainage (a number)');
  positive('left', data.left, true);
  positive('right', data.right, true);
  positive('spacing', data.spacing);
  const st = data.stations;
  if (Array.isArray(st)) {
    if (st.length === 0) problem('stations', 'expected at least one station');
    st.forEach((s, i) => {
      if (typeof s !== 'number' || !Number.isFinite(s))
        problem(`stations[${i}]`, 'expected a chainage (a number)');
    });
    if (new Set(st).size !== st.length) problem('stations', 'a station is given twice');
  } else if (isRecord(st)) {
    positive('stations.every', st.every);
    for (const k of ['from', 'to'])
      if (st[k] !== undefined && (typeof st[k] !== 'number' || !Number.isFinite(st[k])))
        problem(`stations.${k}`, 'expected a chainage (a number)');
    for (const k of Object.keys(st))
      if (!['every', 'from', 'to'].includes(k))
        problem(`stations.${k}`, 'unknown setting (known: every, from, to)', 'unknown');
  } else
    problem(
      'stations',
      'expected { every: <interval> } (with from and to if wanted) or a list of chainages',
    );
  if (typeof data.template !== 'string' && !isRecord(data.template))
    problem(
      'template',
      'expected the file of the corridor settings (id, units, template), or those settings here',
    );
  if (data.strata !== undefined) {
    if (!Array.isArray(data.strata) || data.strata.length === 0)
      problem('strata', 'expected a list of strata, top first');
    else
      data.strata.forEach((s: unknown, i) => {
        const at = `strata[${i}]`;
        if (!isRecord(s) || typeof s.material !== 'string')
          return problem(at, 'expected { material } (and below the first: raster or depth)');
        const given = ['raster', 'depth'].filter((k) => s[k] !== undefined);
        if (i === 0 && given.length)
          problem(at, "the first stratum's top is the ground: give only its material");
        if (i > 0 && given.length !== 1)
          problem(at, 'give its top by one of raster (a file) and depth');
        if (s.raster !== undefined) file(`${at}.raster`, s.raster);
        if (s.depth !== undefined) positive(`${at}.depth`, s.depth);
      });
  }
  if (data.water !== undefined) {
    const w = data.water;
    if (!isRecord(w) || [w.raster, w.depth].filter((v) => v !== undefined).length !== 1)
      problem('water', 'give one of raster (a file) and depth');
    else if (w.raster !== undefined) file('water.raster', w.raster);
    else positive('water.depth', w.depth, true);
  }
  if (data.noData !== undefined && data.noData !== 'error' && data.noData !== 'skip')
    problem('noData', 'expected error or skip');
  if (problems.length) throw new TerrainError(problems);
  return data as unknown as TerrainJob;
}

/** The files a job names, in the order they are read. */
export function jobFiles(job: TerrainJob): string[] {
  return [
    job.terrain,
    job.alignment,
    ...(typeof job.template === 'string' ? [job.template] : []),
    ...(job.strata ?? []).flatMap((s) => (s.raster ? [s.raster] : [])),
    ...(job.water?.raster ? [job.water.raster] : []),
  ];
}

/** Reads a file a job names: its bytes, or null when there is none of that name. */
export type ReadFile = (name: string) => Promise<Uint8Array | null>;

export interface RunOptions {
  limits?: RasterLimits;
  /** Projects an alignment given in longitude and latitude to the raster's system (see Projection). */
  project?: Projection;
}

/**
 * Runs a terrain job: reads the files it names through `read`, cuts the sections and returns
 * the GeoJSON corridor with the warnings. Throws a TerrainError with located messages.
 */
export async function runTerrainJob(
  job: TerrainJob,
  jobName: string,
  read: ReadFile,
  options: RunOptions = {},
): Promise<{ corridor: TerrainCorridor; messages: TerrainMessage[] }> {
  const bytes = async (name: string, path: string): Promise<Uint8Array> => {
    const b = await read(name);
    if (!b) throw fail({ file: jobName, path, code: 'no-file', message: `${name}: no such file` });
    return b;
  };
  const text = async (name: string, path: string) =>
    Buffer.from(await bytes(name, path)).toString('utf8');
  const limits = options.limits ?? DEFAULT_RASTER_LIMITS;
  const rasters = new Map<string, Raster>();
  const raster = async (name: string, path: string) => {
    const known = rasters.get(name);
    if (known) return known;
    const r = await readRaster(await bytes(name, path), name, limits);
    rasters.set(name, r);
    return r;
  };
  const ground = await raster(job.terrain, 'terrain');
  let header: unknown = job.template;
  if (typeof job.template === 'string') {
    try {
      header = parse(await text(job.template, 'template'), { maxAliasCount: 100 });
    } catch (e) {
      throw fail({
        file: job.template,
        code: 'syntax',
        message: `YAML syntax error: ${e instanceof Error ? e.message : String(e)}`,
      });
    }
  }
  const headerFile = typeof job.template === 'string' ? job.template : jobName;
  if (
    !isRecord(header) ||
    typeof header.id !== 'string' ||
    (header.units !== 'si' && header.units !== 'us') ||
    !isRecord(header.template)
  )
    throw fail({
      file: headerFile,
      ...(typeof job.template === 'string' ? {} : { path: 'template' }),
      code: 'not-a-header',
      message:
        'expected the corridor settings: id, units (si or us) and template (a corridor batch without its sections)',
    });
  if ('sections' in header)
    throw fail({
      file: headerFile,
      path: 'sections',
      code: 'sections',
      message: 'the sections are cut from the terrain: give none here',
    });
  // The corridor's projected system: the settings' crs, else the raster's own EPSG code when it
  // is of the core's built-in set (and in metres, for a corridor in si units). An alignment in longitude and latitude is projected to it, and
  // the cut corridor names it, its positions projected, so its results.geojson is in WGS 84.
  const named = typeof header.crs === 'string' ? header.crs : null;
  const own = ground.epsg !== null ? parseCrs(`EPSG:${ground.epsg}`) : null;
  const parsedCrs =
    named !== null
      ? parseCrs(named)
      : // the raster's own system only where its unit is the corridor's (metres for si)
        own?.crs && own.crs.metresPerUnit === 1 && header.units === 'si'
        ? own
        : null;
  if (named !== null && parsedCrs?.problem)
    throw fail({
      file: headerFile,
      path: typeof job.template === 'string' ? 'crs' : 'template.crs',
      code: parsedCrs.problem.code,
      message: parsedCrs.problem.message,
    });
  const crs = parsedCrs?.crs ?? null;
  const project =
    options.project ?? (crs ? (lon: number, lat: number) => crs.toProjected(lon, lat) : undefined);
  const alignment = readAlignment(await text(job.alignment, 'alignment'), job.alignment, {
    ...(job.start !== undefined ? { start: job.start } : {}),
    ...(project ? { project } : {}),
  });
  if (crs) header = { ...header, crs: crs.name, coordinates: 'projected' };
  let strata: [{ material: string }, ...StratumTop[]] | undefined;
  if (job.strata) {
    const [first, ...rest] = job.strata;
    const below: StratumTop[] = [];
    for (const [i, s] of rest.entries())
      below.push(
        s.raster
          ? { material: s.material, raster: await raster(s.raster, `strata[${i + 1}].raster`) }
          : { material: s.material, depth: s.depth ?? 0 },
      );
    strata = [{ material: first.material }, ...below];
  }
  const water = job.water
    ? job.water.raster
      ? { raster: await raster(job.water.raster, 'water.raster') }
      : { depth: job.water.depth ?? 0 }
    : undefined;
  const messages: TerrainMessage[] = [];
  for (const r of rasters.values())
    if (r !== ground && r.epsg !== null && ground.epsg !== null && r.epsg !== ground.epsg)
      messages.push({
        severity: 'warning',
        file: r.name,
        code: 'other-crs',
        message: `the raster is in EPSG:${r.epsg}, the terrain in EPSG:${ground.epsg}: they are read as if in the same system`,
      });
  const cut = relabel(jobName, () =>
    cutCorridor({
      ground,
      alignment,
      settings: {
        stations: job.stations,
        left: job.left,
        right: job.right,
        spacing: job.spacing,
        noData: job.noData ?? 'error',
      },
      header: header as BatchHeader,
      ...(strata ? { strata } : {}),
      ...(water ? { water } : {}),
    }),
  );
  return { corridor: cut.corridor, messages: [...messages, ...cut.messages] };
}

/** The cut's messages about the settings (stations, widths) located in the job file. */
function relabel<T>(jobName: string, cut: () => T): T {
  try {
    return cut();
  } catch (e) {
    if (!(e instanceof TerrainError)) throw e;
    throw new TerrainError(
      e.messages.map((m) =>
        m.file === 'stations' || m.file === 'settings' ? { ...m, file: jobName } : m,
      ),
    );
  }
}

/** The corridor as the text of a GeoJSON file. */
export const corridorText = (corridor: TerrainCorridor): string => `${JSON.stringify(corridor)}\n`;
