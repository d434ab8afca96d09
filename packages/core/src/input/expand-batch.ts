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
 * name, seismic and analysis setting by setting; the template's cases each merged with the
 * item's case of the same name, by the same rules, with drawdown and earthquake setting by
 * setting, and the item's other cases added after them), strata and water (a case's, and a
 * drawdown's water after it) given by depth turned into polylines that follow the section's
 * ground, and the id `<batch id>@<station>`. Items without a number station or a ground
 * polyline are left out (the batch schema reports them).
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

    /** The item's value if it has one, else the template's, put at `at` with its origin. */
    const pick = (
      tv: unknown,
      iv: unknown,
      tBase: PathKey[] | null,
      iBase: PathKey[] | null,
      at: PathKey[],
    ): unknown => {
      if (iv !== undefined && iBase) {
        map(at, iBase);
        return iv;
      }
      if (tv !== undefined && tBase) {
        map(at, tBase);
        return tv;
      }
      return undefined;
    };
    /** Two groups of settings merged setting by setting (or name by name), the item's over the template's. */
    const merge = (
      tv: unknown,
      iv: unknown,
      tBase: PathKey[] | null,
      iBase: PathKey[] | null,
      at: PathKey[],
    ): unknown => {
      const t = isRecord(tv) && tBase ? tv : null;
      const i = isRecord(iv) && iBase ? iv : null;
      if (!t && !i) return pick(tv, iv, tBase, iBase, at);
      map(at, i && iBase ? iBase : (tBase as PathKey[]));
      if (t && tBase) for (const k of Object.keys(t)) map([...at, k], [...tBase, k]);
      if (i && iBase) for (const k of Object.keys(i)) map([...at, k], [...iBase, k]);
      return { ...t, ...i };
    };
    /** Water of the batch (depth below this section's ground, elevation, or ru) as a section's. */
    const water = (value: unknown, base: PathKey[], at: PathKey[]): unknown => {
      map(at, base);
      if (!isRecord(value)) return value;
      const w: Record<string, unknown> = {};
      if (value.depth !== undefined) {
        w.piezometric = isNumber(value.depth) ? below(ground, value.depth) : value.depth;
        if (isNumber(value.depth)) fromGround.push([...at, 'piezometric']);
        map([...at, 'piezometric'], [...base, 'depth'], true);
      } else if (value.elevation !== undefined) {
        w.piezometric = value.elevation;
        map([...at, 'piezometric'], [...base, 'elevation']);
      }
      for (const k of ['ru', 'unitWeight']) {
        if (value[k] === undefined) continue;
        w[k] = value[k];
        map([...at, k], [...base, k]);
      }
      return w;
    };

    for (const key of ['offset', 'loads', 'reinforcement', 'crack', 'probability']) {
      const v = pick(template[key], item[key], [...T, key], [...S, key], [key]);
      if (v !== undefined) data[key] = v;
    }
    // Materials merge by name; seismic and analysis setting by setting.
    for (const key of ['materials', 'seismic', 'analysis']) {
      const v = merge(template[key], item[key], [...T, key], [...S, key], [key]);
      if (v !== undefined) data[key] = v;
    }

    // Strata: depth below this section's ground or elevation.
    const strata = pick(
      template.strata,
      item.strata,
      [...T, 'strata'],
      [...S, 'strata'],
      ['strata'],
    );
    if (strata !== undefined) {
      const base: PathKey[] = item.strata !== undefined ? [...S, 'strata'] : [...T, 'strata'];
      if (Array.isArray(strata)) {
        data.strata = strata.map((s: unknown, k: number) => {
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
      } else data.strata = strata;
    }

    // Water: depth below this section's ground, elevation, or ru.
    if (item.water !== undefined) data.water = water(item.water, [...S, 'water'], ['water']);
    else if (template.water !== undefined)
      data.water = water(template.water, [...T, 'water'], ['water']);

    // Cases: the template's, each merged with the item's case of the same name, then the item's others.
    const designCase = (
      tv: unknown,
      iv: unknown,
      tBase: PathKey[] | null,
      iBase: PathKey[] | null,
      at: PathKey[],
    ): unknown => {
      const t = isRecord(tv) && tBase ? tv : null;
      const i = isRecord(iv) && iBase ? iv : null;
      if (!t || !i) {
        const [one, base] = t && tBase ? [t, tBase] : [iv, iBase as PathKey[]];
        return isRecord(one)
          ? caseSettings(one, null, base, null, at)
          : pick(tv, iv, tBase, iBase, at);
      }
      return caseSettings(t, i, tBase as PathKey[], iBase, at);
    };
    const caseSettings = (
      t: Record<string, unknown>,
      i: Record<string, unknown> | null,
      tBase: PathKey[],
      iBase: PathKey[] | null,
      at: PathKey[],
    ): Record<string, unknown> => {
      map(at, i && iBase ? iBase : tBase);
      const out: Record<string, unknown> = {};
      for (const key of new Set([...Object.keys(t), ...Object.keys(i ?? {})])) {
        const tv = t[key];
        const iv = i?.[key];
        const tk = [...tBase, key];
        const ik = iBase && [...iBase, key];
        const dk = [...at, key];
        let v: unknown;
        if (['materials', 'seismic', 'analysis', 'earthquake'].includes(key))
          v = merge(tv, iv, tk, ik, dk);
        else if (key === 'water')
          v = iv !== undefined && ik ? water(iv, ik, dk) : water(tv, tk, dk);
        else if (key === 'drawdown') v = drawdown(tv, iv, tk, ik, dk);
        else v = pick(tv, iv, tk, ik, dk);
        if (v !== undefined) out[key] = v;
      }
      return out;
    };
    /** A drawdown: setting by setting, its materials by name, the water after it as a section's. */
    const drawdown = (
      tv: unknown,
      iv: unknown,
      tBase: PathKey[],
      iBase: PathKey[] | null,
      at: PathKey[],
    ): unknown => {
      const merged = merge(tv, iv, tBase, iBase, at);
      if (!isRecord(merged)) return merged;
      const t = isRecord(tv) ? tv : {};
      const i = isRecord(iv) && iBase ? iv : {};
      const ib = (k: string) => (iBase ? [...iBase, k] : null);
      const materials = merge(t.materials, i.materials, [...tBase, 'materials'], ib('materials'), [
        ...at,
        'materials',
      ]);
      if (materials !== undefined) merged.materials = materials;
      if (i.after !== undefined && iBase)
        merged.after = water(i.after, [...iBase, 'after'], [...at, 'after']);
      else if (t.after !== undefined)
        merged.after = water(t.after, [...tBase, 'after'], [...at, 'after']);
      return merged;
    };
    const templateCases: unknown[] = Array.isArray(template.cases) ? template.cases : [];
    const itemCases: unknown[] = Array.isArray(item.cases) ? item.cases : [];
    if (template.cases !== undefined || item.cases !== undefined) {
      map(['cases'], item.cases !== undefined ? [...S, 'cases'] : [...T, 'cases']);
      const nameOf = (c: unknown): string | null =>
        isRecord(c) && typeof c.name === 'string' ? c.name : null;
      const merged = new Set<number>();
      const cases: unknown[] = [];
      templateCases.forEach((tc, j) => {
        const name = nameOf(tc);
        const m =
          name === null ? -1 : itemCases.findIndex((c, k) => !merged.has(k) && nameOf(c) === name);
        if (m >= 0) merged.add(m);
        cases.push(
          designCase(
            tc,
            m >= 0 ? itemCases[m] : undefined,
            [...T, 'cases', j],
            m >= 0 ? [...S, 'cases', m] : null,
            ['cases', cases.length],
          ),
        );
      });
      itemCases.forEach((ic, m) => {
        if (!merged.has(m))
          cases.push(designCase(undefined, ic, null, [...S, 'cases', m], ['cases', cases.length]));
      });
      data.cases =
        Array.isArray(template.cases) || Array.isArray(item.cases)
          ? cases
          : (item.cases ?? template.cases);
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
