import type { Alignment } from './alignment';
import { fail, TerrainError, type TerrainMessage } from './errors';
import { sample, type Raster } from './raster';

/** The stations of a cut: every `every` from `from` (default: the alignment's start) to `to` (its end), or a list. */
export type Stations = { every: number; from?: number; to?: number } | number[];

/** Where the sections are cut and how finely they are sampled (lengths in the corridor's units). */
export interface CutSettings {
  stations: Stations;
  /** Half-widths of the section left and right of the alignment (looking along increasing chainage). */
  left: number;
  right: number;
  /** Horizontal distance between samples along a section. */
  spacing: number;
  /** A section with a sample of no data: refuse the cut ('error', the default) or leave the station out with a warning ('skip'). */
  noData?: 'error' | 'skip';
}

/** A stratum below the first: its top from a raster of elevations or at a constant depth below the ground. */
export interface StratumTop {
  material: string;
  raster?: Raster;
  depth?: number;
}

/** The groundwater level: a raster of elevations, or a constant depth below the ground. */
export interface WaterLevel {
  raster?: Raster;
  depth?: number;
}

/** The corridor settings the sections share (a batch without its sections: schemas/batch.schema.json). */
export interface BatchHeader {
  id: string;
  title?: string;
  description?: string;
  units: 'si' | 'us';
  template: Record<string, unknown>;
  [setting: string]: unknown;
}

export interface CutInput {
  ground: Raster;
  alignment: Alignment;
  settings: CutSettings;
  header: BatchHeader;
  /** The strata from top to bottom: the first (its top is the ground) by its material, the others with their tops. Default: the template's. */
  strata?: [{ material: string }, ...StratumTop[]];
  water?: WaterLevel;
}

/** A GeoJSON corridor: section lines [x, y, z] with the batch header in its member "scarpline". */
export interface TerrainCorridor {
  type: 'FeatureCollection';
  scarpline: BatchHeader;
  features: {
    type: 'Feature';
    properties: Record<string, unknown>;
    geometry: { type: 'LineString'; coordinates: [number, number, number][] };
  }[];
}

/** At most this many sections (a batch's limit). */
export const MAX_SECTIONS = 1000;
/** At most this many located messages of samples without a value. */
const MAX_MESSAGES = 50;

const round = (v: number, digits = 4) => {
  const f = 10 ** digits;
  return Math.round(v * f) / f;
};

/** The chainages of the stations, checked against the alignment. */
export function stationList(stations: Stations, alignment: Alignment): number[] {
  if (Array.isArray(stations)) {
    stations.forEach((s, i) => {
      if (alignment.at(s) === null)
        throw fail({
          file: 'stations',
          path: `stations[${i}]`,
          code: 'off-alignment',
          message: `station ${s} is off the alignment (chainage ${round(alignment.start, 3)} to ${round(alignment.end, 3)})`,
        });
    });
    return [...stations];
  }
  const { every } = stations;
  if (!(every > 0))
    throw fail({
      file: 'stations',
      path: 'stations.every',
      code: 'interval',
      message: 'the interval must be above 0',
    });
  const from = stations.from ?? alignment.start;
  const to = stations.to ?? alignment.end;
  for (const [key, v] of [
    ['from', from],
    ['to', to],
  ] as const) {
    if (alignment.at(v) === null)
      throw fail({
        file: 'stations',
        path: `stations.${key}`,
        code: 'off-alignment',
        message: `chainage ${v} is off the alignment (${round(alignment.start, 3)} to ${round(alignment.end, 3)})`,
      });
  }
  const count = Math.floor((to - from) / every + 1e-9) + 1;
  if (count > MAX_SECTIONS)
    throw fail({
      file: 'stations',
      path: 'stations.every',
      code: 'too-many-sections',
      message: `${count} stations; a batch holds at most ${MAX_SECTIONS} (a longer interval, or split the chainage)`,
    });
  return Array.from({ length: Math.max(count, 0) }, (_, k) => round(from + k * every, 6));
}

/** The offsets of the samples across a section: from -left to +right, `spacing` apart, both ends included. */
export function sampleOffsets(left: number, right: number, spacing: number): number[] {
  const offsets: number[] = [];
  for (let k = 0; ; k++) {
    const o = -left + k * spacing;
    if (o > right - spacing * 1e-3) break;
    offsets.push(round(o, 9));
  }
  offsets.push(right);
  return offsets;
}

/**
 * Cuts cross-sections from a terrain raster along an alignment: at each station a section
 * perpendicular to the alignment (at a bend's vertex, along the bisector), from `left` on the
 * left to `right` on the right, sampled every `spacing`; the ground, the tops of the strata and
 * the groundwater level at each sample by bilinear interpolation in their rasters. The result
 * is a GeoJSON corridor (the batch's sections as lines [x, y, z], the header in its member
 * "scarpline"): each section's x is the distance from its left end, the alignment at x = left
 * (the `offset` of each section). Strata and water given by raster are written into each
 * section, by depth into the template.
 *
 * A sample outside a raster or on a pixel of no data is located (station, offset, map
 * position): the cut fails with every such message, or (noData 'skip') leaves the station out
 * with a warning. A stratum top above the ground is put on the ground, with a warning.
 *
 * @example const { corridor, messages } = cutCorridor({ ground, alignment, settings, header });
 */
export function cutCorridor(input: CutInput): {
  corridor: TerrainCorridor;
  messages: TerrainMessage[];
} {
  const { ground, alignment, settings, header } = input;
  for (const key of ['left', 'right', 'spacing'] as const) {
    const v = settings[key];
    if (!Number.isFinite(v) || v < 0 || (key === 'spacing' && v === 0))
      throw fail({
        file: 'settings',
        path: key,
        code: 'not-a-length',
        message: `${key} must be a length above 0`,
      });
  }
  if (settings.left + settings.right <= 0)
    throw fail({
      file: 'settings',
      path: 'left',
      code: 'no-width',
      message: 'the section has no width: give left or right above 0',
    });
  const stations = stationList(settings.stations, alignment);
  const offsets = sampleOffsets(settings.left, settings.right, settings.spacing);
  const errors: TerrainMessage[] = [];
  const warnings: TerrainMessage[] = [];
  const strata = input.strata;
  const below: StratumTop[] = strata ? strata.slice(1) : [];
  const byRaster = below.some((s) => s.raster);
  const template = { ...header.template };
  if (strata && !byRaster) template.strata = strata.map(stratumSetting);
  if (input.water && !input.water.raster) template.water = { depth: input.water.depth ?? 0 };
  const features: TerrainCorridor['features'] = [];

  for (const station of stations) {
    const p = alignment.at(station);
    if (!p) continue; // checked by stationList
    // the right-hand normal: offsets grow to the right looking along the alignment
    const nx = p.ty;
    const ny = -p.tx;
    const own: TerrainMessage[] = [];
    const at = (raster: Raster, o: number, x: number, y: number): number => {
      const v = sample(raster, x, y);
      if (typeof v === 'number') return v;
      if (own.length < MAX_MESSAGES)
        own.push({
          severity: settings.noData === 'skip' ? 'warning' : 'error',
          file: raster.name,
          station,
          offset: o,
          x,
          y,
          code: v,
          message:
            v === 'outside'
              ? 'the sample is outside the raster'
              : 'no data at the sample (a pixel of no data next to it)',
        });
      return NaN;
    };
    const coordinates: [number, number, number][] = [];
    const tops: number[][] = below.map(() => []);
    const water: number[] = [];
    let clipped = 0;
    for (const o of offsets) {
      const x = p.x + o * nx;
      const y = p.y + o * ny;
      const z = at(ground, o, x, y);
      coordinates.push([round(x), round(y), round(z)]);
      below.forEach((s, i) => {
        if (!s.raster) return;
        let top = at(s.raster, o, x, y);
        if (top > z) {
          top = z;
          clipped++;
        }
        tops[i].push(round(top));
      });
      if (input.water?.raster) water.push(round(at(input.water.raster, o, x, y)));
    }
    if (own.length) {
      if (settings.noData === 'skip') {
        warnings.push(...own, {
          severity: 'warning',
          file: ground.name,
          station,
          code: 'station-left-out',
          message: 'the station is left out: some of its samples have no value',
        });
        continue;
      }
      errors.push(...own);
      continue;
    }
    if (clipped)
      warnings.push({
        severity: 'warning',
        file: ground.name,
        station,
        code: 'stratum-above-ground',
        message: `${clipped} ${clipped === 1 ? 'sample of a stratum top' : 'samples of stratum tops'} above the ground put on the ground`,
      });
    // x along the section as a corridor's reader measures it: the horizontal distance walked
    // along the written (rounded) line, so that the strata and the water span the ground exactly
    const xs: number[] = [];
    let run = 0;
    coordinates.forEach((c, k) => {
      if (k > 0) run += Math.hypot(c[0] - coordinates[k - 1][0], c[1] - coordinates[k - 1][1]);
      xs.push(run);
    });
    const along = (zs: number[]) => zs.map((z, k) => [xs[k], z]);
    const properties: Record<string, unknown> = {
      station,
      offset: settings.left,
      alignment_x: round(p.x, 3),
      alignment_y: round(p.y, 3),
      bearing: round(((Math.atan2(p.tx, p.ty) * 180) / Math.PI + 360) % 360, 3),
    };
    if (strata && byRaster)
      properties.strata = strata.map((s, i) =>
        i > 0 && 'raster' in s && s.raster
          ? { material: s.material, elevation: along(tops[i - 1]) }
          : stratumSetting(s),
      );
    if (input.water?.raster) properties.water = { elevation: along(water) };
    features.push({ type: 'Feature', properties, geometry: { type: 'LineString', coordinates } });
  }
  if (errors.length) {
    const shown = errors.slice(0, MAX_MESSAGES);
    if (errors.length > shown.length)
      shown.push({
        severity: 'error',
        file: ground.name,
        code: 'more',
        message: `and ${errors.length - shown.length} more samples without a value`,
      });
    throw new TerrainError(shown);
  }
  if (features.length === 0)
    throw new TerrainError([
      ...warnings,
      {
        severity: 'error',
        file: ground.name,
        code: 'no-section',
        message: 'no station could be cut',
      },
    ]);
  return {
    corridor: { type: 'FeatureCollection', scarpline: { ...header, template }, features },
    messages: warnings,
  };
}

function stratumSetting(s: { material: string; depth?: number }): Record<string, unknown> {
  return s.depth !== undefined
    ? { material: s.material, depth: s.depth }
    : { material: s.material };
}
