import { corridorSectionId, SECTION_FORMAT } from '../formats';
import type { Point } from '../model/types';
import { isNumber, isPointList, isRecord } from './guards';
import type { PathKey } from './types';

/** One section of a batch, merged with the template, with where each part came from. */
export interface ExpandedSection {
  /** Index of the section in the batch's `sections`. */
  index: number;
  station: number;
  /** The merged section, in the shape of a section file (schemas/section.schema.json). */
  data: Record<string, unknown>;
  /**
   * The path in the batch file that a path in `data` came from: in the section's item, in the
   * template, or (for a stratum top given as a depth) the depth it was derived from.
   */
  origin(path: readonly PathKey[]): PathKey[];
  /** Whether the value at a path was computed from the section's ground (a depth). */
  derived(path: readonly PathKey[]): boolean;
}

interface Origin {
  from: PathKey[];
  to: PathKey[];
  /** The value was computed from the node at `to`: deeper paths map to `to` itself. */
  derived: boolean;
}

const startsWith = (path: readonly PathKey[], prefix: readonly PathKey[]): boolean =>
  prefix.length <= path.length && prefix.every((k, i) => path[i] === k);

const below = (ground: Point[], depth: number): Point[] => ground.map(([x, y]) => [x, y - depth]);

/**
 * Expands a corridor batch (schemas/batch.schema.json) into sections: each item of `sections`
 * merged with the `template` (the item's value replaces the template's; materials merge by
 * name, seismic and analysis setting by setting), strata and water given by depth turned into
 * polylines that follow the section's ground, and the id `<batch id>@<station>`. Items without
 * a number station or a ground polyline are left out (the batch schema reports them).
 *
 * @example expandBatch(batch)[0].data.id // → 'north-cut@0'
 */
export function expandBatch(batch: Record<string, unknown>): ExpandedSection[] {
  return [...expandSections(batch)];
}

/**
 * The sections of a corridor batch one at a time, as expandBatch gives them: a reader that
 * stops early makes no more of them.
 *
 * @example expandSections(batch).next().value?.data.id // → 'north-cut@0'
 */
export function* expandSections(batch: Record<string, unknown>): Generator<ExpandedSection> {
  const template = isRecord(batch.template) ? batch.template : {};
  const items: unknown[] = Array.isArray(batch.sections) ? batch.sections : [];
  const T: PathKey[] = ['template'];

  for (const [index, item] of items.entries()) {
    if (!isRecord(item) || !isNumber(item.station) || !isPointList(item.ground)) continue;
    const S: PathKey[] = ['sections', index];
    const station = item.station;
    const ground = item.ground;
    const origins: Origin[] = [{ from: [], to: S, derived: true }];
    const map = (from: PathKey[], to: PathKey[], derived = false): void => {
      origins.push({ from, to, derived });
    };
    const data: Record<string, unknown> = {};
    /** Paths of values computed from the ground (strata and water given by depth). */
    const fromGround: PathKey[][] = [];

    data.format = SECTION_FORMAT;
    map(['format'], ['format'], true);
    data.id = corridorSectionId(String(batch.id), station);
    map(['id'], [...S, 'station'], true);
    if (typeof item.title === 'string') {
      data.title = item.title;
      map(['title'], [...S, 'title']);
    } else {
      const name = typeof batch.title === 'string' ? batch.title : String(batch.id);
      data.title = `${name}, station ${station}`;
      map(['title'], [...S, 'station'], true);
    }
    if (item.description !== undefined) {
      data.description = item.description;
      map(['description'], [...S, 'description']);
    }
    data.station = station;
    map(['station'], [...S, 'station']);
    if (batch.units !== undefined) data.units = batch.units;
    map(['units'], ['units']);
    data.ground = ground;
    map(['ground'], [...S, 'ground']);

    /** The item's value if it has one, else the template's; with the base path it came from. */
    const pick = (key: string): [unknown, PathKey[]] | null => {
      if (item[key] !== undefined) return [item[key], [...S, key]];
      if (template[key] !== undefined) return [template[key], [...T, key]];
      return null;
    };
    for (const key of ['offset', 'loads', 'crack']) {
      const picked = pick(key);
      if (!picked) continue;
      data[key] = picked[0];
      map([key], picked[1]);
    }

    // Materials merge by name.
    const tm = isRecord(template.materials) ? template.materials : null;
    const im = isRecord(item.materials) ? item.materials : null;
    if (tm || im) {
      data.materials = { ...tm, ...im };
      map(['materials'], im ? [...S, 'materials'] : [...T, 'materials']);
      for (const name of Object.keys(tm ?? {})) map(['materials', name], [...T, 'materials', name]);
      for (const name of Object.keys(im ?? {})) map(['materials', name], [...S, 'materials', name]);
    } else {
      const picked = pick('materials');
      if (picked) {
        data.materials = picked[0];
        map(['materials'], picked[1]);
      }
    }

    // Seismic and analysis merge setting by setting.
    for (const key of ['seismic', 'analysis']) {
      const tv = isRecord(template[key]) ? template[key] : null;
      const iv = isRecord(item[key]) ? item[key] : null;
      if (tv || iv) {
        data[key] = { ...tv, ...iv };
        map([key], iv ? [...S, key] : [...T, key]);
        for (const k of Object.keys(tv ?? {})) map([key, k], [...T, key, k]);
        for (const k of Object.keys(iv ?? {})) map([key, k], [...S, key, k]);
      } else {
        const picked = pick(key);
        if (picked) {
          data[key] = picked[0];
          map([key], picked[1]);
        }
      }
    }

    // Strata: depth below this section's ground or elevation.
    const strata = pick('strata');
    if (strata) {
      const [value, base] = strata;
      map(['strata'], base);
      if (Array.isArray(value)) {
        data.strata = value.map((s: unknown, k: number) => {
          map(['strata', k], [...base, k]);
          if (!isRecord(s)) return s;
          const stratum: Record<string, unknown> = {};
          if (s.material !== undefined) stratum.material = s.material;
          if (s.depth !== undefined) {
            stratum.top = isNumber(s.depth) ? below(ground, s.depth) : s.depth;
            if (isNumber(s.depth)) fromGround.push(['strata', k, 'top']);
            map(['strata', k, 'top'], [...base, k, 'depth'], true);
          } else if (s.elevation !== undefined) {
            stratum.top = s.elevation;
            map(['strata', k, 'top'], [...base, k, 'elevation']);
          }
          return stratum;
        });
      } else data.strata = value;
    }

    // Water: depth below this section's ground, elevation, or ru.
    const water = pick('water');
    if (water) {
      const [value, base] = water;
      map(['water'], base);
      if (isRecord(value)) {
        const w: Record<string, unknown> = {};
        if (value.depth !== undefined) {
          w.piezometric = isNumber(value.depth) ? below(ground, value.depth) : value.depth;
          if (isNumber(value.depth)) fromGround.push(['water', 'piezometric']);
          map(['water', 'piezometric'], [...base, 'depth'], true);
        } else if (value.elevation !== undefined) {
          w.piezometric = value.elevation;
          map(['water', 'piezometric'], [...base, 'elevation']);
        }
        for (const k of ['ru', 'unitWeight']) {
          if (value[k] === undefined) continue;
          w[k] = value[k];
          map(['water', k], [...base, k]);
        }
        data.water = w;
      } else data.water = value;
    }

    const best = (path: readonly PathKey[]): Origin => {
      let found = origins[0];
      for (const o of origins) {
        if (startsWith(path, o.from) && o.from.length >= found.from.length) found = o;
      }
      return found;
    };
    const origin = (path: readonly PathKey[]): PathKey[] => {
      const o = best(path);
      return o.derived ? [...o.to] : [...o.to, ...path.slice(o.from.length)];
    };
    const derived = (path: readonly PathKey[]): boolean =>
      fromGround.some((p) => startsWith(path, p));
    yield { index, station, data, origin, derived };
  }
}
