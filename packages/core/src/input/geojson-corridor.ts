import { LineCounter, parseDocument, type Document } from 'yaml';
import { BATCH_FORMAT, corridorSectionId } from '../formats';
import { lineInCrs, parseCrs, type Crs } from '../geo/crs';
import type { ProjectedLine } from '../geo/wgs84-geometry';
import type { Point } from '../model/types';
import { Concerns } from './concerns';
import { isNumber, isRecord } from './guards';
import { JsonIndex } from './json-index';
import { count, MAX_SECTIONS } from './limits';
import { locateInDocument, type Location } from './locate-in-document';
import { readSections, type ParsedSections } from './parse-sections';
import { countValues, screenData } from './screen-data';
import { screenText } from './screen-text';
import type { BatchHeader, Issue, Message, PathKey, SectionEntry } from './types';
import { pathText } from './words';

/** A LineString feature of a corridor, as given, with the id of the section made from it. */
export interface CorridorFeature {
  /** Index in the FeatureCollection's `features`. */
  index: number;
  station: number | null;
  /** `<batch id>@<station>`: the id of the section (and result) made from this feature. */
  sectionId: string | null;
  geometry: unknown;
  /**
   * The section line in the corridor's projected system, when the corridor names one (`crs`):
   * the positions projected from longitude and latitude, or as given when they are projected
   * already. What results.geojson writes in WGS 84.
   */
  line?: ProjectedLine | null;
  properties: Record<string, unknown>;
}

/** A section of a GeoJSON corridor: the entry of its feature. */
export interface CorridorEntry extends SectionEntry {
  feature: CorridorFeature;
}

export interface ParsedCorridor extends ParsedSections {
  batchId: string;
  features: CorridorFeature[];
  /** One entry per feature, in the order of the features. */
  entries: CorridorEntry[];
  /** The projected system the corridor names (`crs`), null when it names none or it is not usable. */
  crs: Crs | null;
}

/** A file read beside the corridor: the batch header (id, units, template) as YAML or JSON. */
export interface HeaderFile {
  text: string;
  fileName: string;
}

/** The settings a feature's properties may give for its own section (as a batch section may). */
const SECTION_KEYS = [
  'title',
  'description',
  'offset',
  'materials',
  'strata',
  'water',
  'loads',
  'seismic',
  'crack',
  'analysis',
  'cases',
];
const HEADER_MEMBER = 'scarpline';

/**
 * Whether a text is a GeoJSON FeatureCollection (a JSON object whose `type` is
 * "FeatureCollection"), without validating it further.
 *
 * @example isGeoJsonCorridor('{"type": "FeatureCollection", "features": []}') // → true
 */
export function isGeoJsonCorridor(text: string): boolean {
  if (!/^\s*\{/.test(text)) return false;
  // a text too large to read is told by its beginning (and refused by its reader)
  if (screenText(text, true).refusal) {
    return /"type"\s*:\s*"FeatureCollection"/.test(text.slice(0, 2000));
  }
  try {
    const data: unknown = JSON.parse(text);
    return isRecord(data) && data.type === 'FeatureCollection';
  } catch {
    return /"type"\s*:\s*"FeatureCollection"/.test(text.slice(0, 2000));
  }
}

/** A file the messages are located in. */
export interface Source {
  fileName: string;
  locate(path: readonly PathKey[]): Location;
}

/** A YAML (or JSON) file read by the YAML parser. */
function read(
  text: string,
  fileName: string,
  json: boolean,
): Source & { doc: Document; counter: LineCounter } {
  const counter = new LineCounter();
  const doc = parseDocument(text, {
    lineCounter: counter,
    prettyErrors: false,
    ...(json ? { schema: 'json' as const } : {}),
  });
  return { doc, counter, fileName, locate: (path) => locateInDocument(doc, counter, path) };
}

/**
 * A valid JSON file, located by an index of its text, or by the YAML parser when it names a
 * setting twice (`data` holds fewer values than the text: JSON.parse keeps the last).
 */
function readJsonFile(text: string, fileName: string, data: unknown, values: number): Source {
  if (countValues(data) !== values) return read(text, fileName, true);
  const index = new JsonIndex(text);
  return { fileName, locate: (path) => index.locate(path) };
}

/** The keys of a path as written by pathText: `a.b[2]["c.d"]` → ['a', 'b', 2, 'c.d']. */
export function parsePath(text: string): PathKey[] {
  const keys: PathKey[] = [];
  const re = /(?:^|\.)([A-Za-z0-9_][A-Za-z0-9_+@-]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]/g;
  for (const m of text.matchAll(re)) {
    if (m[1] !== undefined) keys.push(m[1]);
    else if (m[2] !== undefined) keys.push(Number(m[2]));
    else keys.push(JSON.parse(m[3]) as string);
  }
  return keys;
}

export function idFromFileName(fileName: string): string {
  const base = (fileName.split(/[\\/]/).pop() ?? 'corridor').replace(/\.[^.]*$/, '');
  const id = base.replace(/[^A-Za-z0-9._+@-]+/g, '-').replace(/^[^A-Za-z0-9]+/, '');
  return id || 'corridor';
}

/** A JSON syntax error located in the text, or null. */
function jsonSyntax(text: string): { line: number; column: number; message: string } | null {
  try {
    JSON.parse(text);
    return null;
  } catch (e) {
    const raw = e instanceof Error ? e.message : String(e);
    const m = /position (\d+)/.exec(raw);
    // without a position in the message, where the YAML parser (JSON schema) stops
    const yamlError = m ? undefined : parseDocument(text, { schema: 'json' }).errors[0];
    const offset = m ? Number(m[1]) : (yamlError?.pos[0] ?? text.length);
    const before = text.slice(0, offset).split('\n');
    const words = raw
      .replace(/ in JSON at position \d+.*$/s, '')
      .replace(/, ".*" is not valid JSON$/s, '');
    return {
      line: before.length,
      column: before[before.length - 1].length + 1,
      message: `JSON syntax error: ${words.charAt(0).toLowerCase()}${words.slice(1)}`,
    };
  }
}

/**
 * Whether a FeatureCollection's member "crs" of the 2008 GeoJSON format names a system other
 * than WGS 84 longitude and latitude (`urn:ogc:def:crs:OGC:1.3:CRS84`, `EPSG:4326`): its
 * positions are then projected, not RFC 7946 degrees.
 */
function namesProjectedCrs(member: unknown): boolean {
  if (!isRecord(member) || !isRecord(member.properties)) return false;
  const name = member.properties.name;
  if (typeof name !== 'string') return false;
  return !/CRS84$|(?:EPSG)?:+4326$/i.test(name.trim());
}

/**
 * A corridor's header file (YAML or JSON: a corridor batch without its sections) read and
 * screened: its settings, where they are written and the texts no stored text may hold, or
 * why it cannot be read (located).
 */
export function readHeaderFile(
  header: HeaderFile,
):
  | { src: Source; value: Record<string, unknown>; issues: readonly Issue[] }
  | { refusal: Location & { path: PathKey[]; code: string; message: string } } {
  const json = /\.json$/i.test(header.fileName);
  const headerRefusal = screenText(header.text, json).refusal;
  if (headerRefusal) return { refusal: { ...headerRefusal, path: [] } };
  const hs = json ? jsonSyntax(header.text) : null;
  const src = read(header.text, header.fileName, json);
  if (hs || src.doc.errors.length) {
    const e = src.doc.errors[0];
    const lc = e ? src.counter.linePos(e.pos[0]) : { line: hs?.line ?? 1, col: hs?.column ?? 1 };
    const words =
      hs?.message ?? `YAML syntax error: ${e.message.charAt(0).toLowerCase()}${e.message.slice(1)}`;
    return { refusal: { line: lc.line, column: lc.col, path: [], code: 'syntax', message: words } };
  }
  const value: unknown = src.doc.toJS({ maxAliasCount: 1000 });
  const headerScreened = screenData(value);
  if (headerScreened.refusal) {
    const r = headerScreened.refusal;
    return { refusal: { ...src.locate(r.path), path: r.path, code: r.code, message: r.message } };
  }
  if (!isRecord(value)) {
    return {
      refusal: {
        ...src.locate([]),
        path: [],
        code: 'not-a-header',
        message:
          'expected the corridor settings: id, units and template (a corridor batch without its sections)',
      },
    };
  }
  return { src, value, issues: headerScreened.issues };
}

/**
 * Reads a corridor given as a GeoJSON FeatureCollection (RFC 7946) of LineString features,
 * one per cross-section. When the corridor names its projected system (`crs`: an EPSG code of
 * the built-in set or a proj4 definition, see geo/crs.ts) each feature's coordinates are
 * [longitude, latitude, z] in WGS 84 as RFC 7946 has them (or, with `"coordinates":
 * "projected"`, [x, y, z] in that system), projected to it before any length is measured, and
 * the feature keeps its line in that system (`line`) for results.geojson. Without a `crs`
 * each feature's coordinates are [x, y, z] in a projected coordinate
 * system in the corridor's units (m or ft), the section line drawn across the corridor; its
 * `station` property is the chainage. The section's ground profile is z along the line's
 * horizontal length: the first vertex is at offset 0, each next one at the horizontal
 * distance walked so far. Properties named like the settings of a batch section (title,
 * offset, materials, strata, water, loads, seismic, crack, analysis, cases) apply to that section;
 * other properties are kept for the results but not read.
 *
 * The settings shared by every section come from the batch header: the FeatureCollection's
 * own member `"scarpline": { "id", "title", "units", "template" }` (a corridor batch without
 * its sections, schemas/batch.schema.json), or, when given, a header file (YAML or JSON of
 * the same shape) that replaces that member. The corridor then reads as that batch: every
 * section is validated and normalised as one of a batch, and every message is located in the
 * file it concerns — the GeoJSON (feature, coordinate, property) or the header file.
 *
 * @example
 * const { sections, messages, features } = parseGeoJsonCorridor(text, 'corridor.geojson');
 * sections[0].ground // → [[0, 41.2], [8.0, 41.2], …] (z along the line)
 */
export function parseGeoJsonCorridor(
  text: string,
  fileName: string,
  header?: HeaderFile,
): ParsedCorridor {
  const messages: Message[] = [];
  const features: CorridorFeature[] = [];
  const entries: CorridorEntry[] = [];
  const concerns = new Concerns();
  let batch: BatchHeader | null = null;
  let crs: Crs | null = null;
  const push = (
    severity: Message['severity'],
    at: Location & { file: string },
    path: PathKey[],
    code: string,
    message: string,
  ): Message => {
    const m: Message = {
      severity,
      file: at.file,
      line: at.line,
      column: at.column,
      path: pathText(path),
      code,
      message,
      sections: [],
    };
    messages.push(m);
    return m;
  };
  const done = (batchId: string): ParsedCorridor => {
    const capped = concerns.settle(messages, entries);
    return { sections: [], messages: capped, batch, entries, batchId, features, crs };
  };

  // A text too large, too deep or too long to read at all is refused before any parser runs.
  const screen = screenText(text, true);
  const refusal = screen.refusal;
  if (refusal) {
    push('error', { ...refusal, file: fileName }, [], refusal.code, refusal.message);
    return done(idFromFileName(fileName));
  }
  const syntax = jsonSyntax(text);
  if (syntax) {
    push('error', { ...syntax, file: fileName }, [], 'syntax', syntax.message);
    return done(idFromFileName(fileName));
  }
  const data: unknown = JSON.parse(text);
  const geo = readJsonFile(text, fileName, data, screen.values);
  const at = (src: Source, path: PathKey[]) => ({ ...src.locate(path), file: src.fileName });
  // Texts no stored text may hold are errors where they are; data too large is refused.
  const screened = screenData(data);
  if (screened.refusal) {
    const r = screened.refusal;
    push('error', at(geo, r.path), r.path, r.code, r.message);
    return done(idFromFileName(fileName));
  }
  const characters = (src: Source, issues: readonly Issue[]): void => {
    for (const issue of issues) {
      const m = push('error', at(src, issue.path), issue.path, issue.code, issue.message);
      // (the features they are in: one, or, outside the features, all: a message never
      // noted concerns every entry)
      const f = issue.path[0] === 'features' ? issue.path[1] : undefined;
      if (typeof f === 'number') {
        concerns.note(m, [f]);
        spoiledFeatures.add(f);
      } else allSpoiled = true;
    }
  };
  let allSpoiled = false;
  const spoiledFeatures = new Set<number>();
  if (!isRecord(data) || data.type !== 'FeatureCollection' || !Array.isArray(data.features)) {
    push(
      'error',
      at(geo, []),
      [],
      'not-a-feature-collection',
      'expected a GeoJSON FeatureCollection with a list of features',
    );
    return done(idFromFileName(fileName));
  }

  // --- the batch header: the header file, or the collection's own member
  let headerSource: Source = geo;
  let headerBase: PathKey[] = [HEADER_MEMBER];
  let head: Record<string, unknown> = {};
  if (header) {
    const read = readHeaderFile(header);
    if ('refusal' in read) {
      const r = read.refusal;
      push('error', { ...r, file: header.fileName }, r.path, r.code, r.message);
      return done(idFromFileName(fileName));
    }
    head = read.value;
    headerSource = read.src;
    headerBase = [];
    characters(read.src, read.issues);
  } else if (data[HEADER_MEMBER] !== undefined) {
    if (!isRecord(data[HEADER_MEMBER])) {
      push(
        'error',
        at(geo, [HEADER_MEMBER]),
        [HEADER_MEMBER],
        'not-a-header',
        'expected the corridor settings: id, units and template',
      );
      return done(idFromFileName(fileName));
    }
    head = data[HEADER_MEMBER];
  } else {
    push(
      'warning',
      at(geo, []),
      [],
      'no-template',
      `no corridor settings: give the FeatureCollection a member "${HEADER_MEMBER}": { "id", "units", "template" } or a template file`,
    );
  }
  if (head.sections !== undefined) {
    push(
      'error',
      at(headerSource, [...headerBase, 'sections']),
      [...headerBase, 'sections'],
      'sections-in-header',
      'the sections of a GeoJSON corridor come from its features: leave sections out of the corridor settings',
    );
  }
  const batchId = typeof head.id === 'string' ? head.id : idFromFileName(fileName);
  batch = {
    id: batchId,
    title: typeof head.title === 'string' ? head.title : null,
    units: head.units === 'us' ? 'us' : 'si',
    ...at(headerSource, [...headerBase, 'id']),
  };

  // --- the coordinate system: positions in longitude and latitude (RFC 7946) are projected to
  // the one the corridor names, unless it says they are projected already
  const crsPath: PathKey[] = [...headerBase, 'crs'];
  let lonLat = false;
  if (typeof head.crs === 'string') {
    const read = parseCrs(head.crs);
    if (read.problem) {
      push('error', at(headerSource, crsPath), crsPath, read.problem.code, read.problem.message);
      allSpoiled = true;
    } else {
      crs = read.crs;
      // RFC 7946 positions are longitude and latitude; a file that says otherwise by the old
      // (2008) member "crs" naming a system other than WGS 84 degrees is projected already
      lonLat =
        head.coordinates === 'lon-lat' ||
        (head.coordinates === undefined && !namesProjectedCrs(data.crs));
    }
  }
  if (head.coordinates !== undefined && head.crs === undefined) {
    const path: PathKey[] = [...headerBase, 'coordinates'];
    push(
      'warning',
      at(headerSource, path),
      path,
      'coordinates-without-crs',
      "coordinates applies to a corridor that names its crs: without one the positions are projected x and y in the corridor's units",
    );
  }
  // a length in the system's units → the corridor's (a system in metres for a corridor in feet)
  const scale = crs ? crs.metresPerUnit / (batch.units === 'us' ? 0.3048 : 1) : 1;

  // A corridor of too many sections is read no further.
  if (data.features.length > MAX_SECTIONS) {
    push(
      'error',
      at(geo, ['features']),
      ['features'],
      'too-many',
      `has ${count(data.features.length)} features; a corridor holds at most ${count(MAX_SECTIONS)} sections: split it into several files`,
    );
    return done(batchId);
  }
  characters(geo, screened.issues);

  // --- the features: one section each
  const items: Record<string, unknown>[] = [];
  const itemFeature: number[] = [];
  data.features.forEach((f: unknown, index: number) => {
    const fp: PathKey[] = ['features', index];
    const problem = (path: PathKey[], code: string, message: string) => {
      concerns.note(push('error', at(geo, [...fp, ...path]), [...fp, ...path], code, message), [
        index,
      ]);
    };
    const props = isRecord(f) && isRecord(f.properties) ? f.properties : {};
    const station = isNumber(props.station) ? props.station : null;
    const feature: CorridorFeature = {
      index,
      station,
      sectionId: station === null ? null : corridorSectionId(batchId, station),
      geometry: isRecord(f) ? f.geometry : null,
      line: null,
      properties: { ...props },
    };
    features.push(feature);
    const idPath: PathKey[] = station === null ? fp : [...fp, 'properties', 'station'];
    entries.push({
      id: feature.sectionId,
      label: feature.sectionId ?? pathText(fp),
      station,
      batch: batchId,
      ...at(geo, idPath),
      path: pathText(idPath),
      section: null,
      messages: [],
      feature,
    });
    if (!isRecord(f) || f.type !== 'Feature')
      return problem([], 'not-a-feature', 'expected a GeoJSON Feature');
    const g = f.geometry;
    if (!isRecord(g) || g.type !== 'LineString')
      return problem(
        ['geometry'],
        'not-a-line',
        'expected a LineString geometry: the section line with [x, y, z] coordinates',
      );
    if (!Array.isArray(g.coordinates) || g.coordinates.length < 2)
      return problem(
        ['geometry', 'coordinates'],
        'too-few-points',
        'a section line needs at least two positions',
      );
    for (let k = 0; k < g.coordinates.length; k++) {
      const c: unknown = g.coordinates[k];
      if (!Array.isArray(c) || c.length < 3 || !c.slice(0, 3).every(isNumber))
        return problem(
          ['geometry', 'coordinates', k],
          'no-elevation',
          'expected a position [x, y, z]: the ground profile is z along the line',
        );
    }
    if (!isRecord(f.properties) || f.properties.station === undefined)
      return problem(
        isRecord(f.properties) ? ['properties'] : [],
        'missing',
        'properties.station is missing: the chainage of the section',
      );
    if (station === null)
      return problem(['properties', 'station'], 'not-a-number', 'expected a number (the chainage)');
    if (lonLat) {
      const k = (g.coordinates as number[][]).findIndex(
        (c) => !(Math.abs(c[0]) <= 180 && Math.abs(c[1]) <= 90),
      );
      if (k >= 0)
        return problem(
          ['geometry', 'coordinates', k],
          'not-lon-lat',
          `expected longitude and latitude in degrees (RFC 7946): the corridor names ${crs?.name ?? 'a projected system'} and reads its positions as WGS 84; if they are projected already, give "coordinates": "projected" in the corridor settings`,
        );
    }
    const given = g.coordinates as number[][];
    const coords = lonLat
      ? given.map((c) => [...crs!.toProjected(c[0], c[1]), ...c.slice(2)])
      : given.map((c) => c.slice());
    if (crs)
      feature.line = lineInCrs(coords, crs, lonLat ? given.map((c) => c.slice()) : undefined);
    const ground: Point[] = [];
    let run = 0;
    // (projected from degrees, offsets to a thousandth of the unit: the degrees of a file
    // carry no more, and a line given to 0.1 mm then meets polylines of the same offsets)
    const mm = (v: number) => (lonLat ? Math.round(v * 1000) / 1000 : v);
    coords.forEach((c, k) => {
      if (k > 0) run += Math.hypot(c[0] - coords[k - 1][0], c[1] - coords[k - 1][1]) * scale;
      ground.push([mm(run), c[2]]);
    });
    const degrees = coords.every((c) => Math.abs(c[0]) <= 180 && Math.abs(c[1]) <= 90);
    if (!crs && degrees && run < 0.05)
      concerns.note(
        push(
          'warning',
          at(geo, [...fp, 'geometry', 'coordinates']),
          [...fp, 'geometry', 'coordinates'],
          'looks-like-degrees',
          `the line is ${run.toPrecision(2)} long: are these longitude and latitude? Name the corridor's projected system ("crs": "EPSG:32630" or a proj4 definition) to have them projected, or give projected x and y in the corridor's units`,
        ),
        [index],
      );
    const item: Record<string, unknown> = { station, ground };
    for (const key of SECTION_KEYS) if (props[key] !== undefined) item[key] = props[key];
    items.push(item);
    itemFeature.push(index);
  });
  if (items.length === 0) {
    push(
      'error',
      at(geo, ['features']),
      ['features'],
      'no-sections',
      'no feature gives a usable section',
    );
    return done(batchId);
  }

  const asBatch: Record<string, unknown> = {
    ...head,
    format: head.format ?? BATCH_FORMAT,
    id: batchId,
    units: head.units ?? 'si',
    sections: items,
  };
  const synthetic = JSON.stringify(asBatch, null, 1);
  const parsed = readSections(synthetic, 'corridor.json');
  const sindex = new JsonIndex(synthetic);

  /** A path of the synthetic batch → the file and path it came from. */
  const origin = (path: PathKey[]): { src: Source; path: PathKey[] } => {
    if (path[0] === 'sections' && typeof path[1] === 'number') {
      const f: PathKey[] = ['features', itemFeature[path[1]]];
      const [, , key, ...rest] = path;
      if (key === undefined) return { src: geo, path: f };
      if (key === 'ground') return { src: geo, path: [...f, 'geometry', 'coordinates', ...rest] };
      return { src: geo, path: [...f, 'properties', key, ...rest] };
    }
    if (path[0] === 'sections') return { src: geo, path: ['features'] };
    return { src: headerSource, path: [...headerBase, ...path] };
  };
  // The synthetic batch's item k is feature itemFeature[k]: its messages concern that feature.
  const about = new Map<Message, number[]>();
  parsed.entries.forEach((e, k) => {
    for (const m of e.messages) {
      const list = about.get(m);
      if (list) list.push(itemFeature[k]);
      else about.set(m, [itemFeature[k]]);
    }
    const f = itemFeature[k];
    entries[f].section = allSpoiled || spoiledFeatures.has(f) ? null : e.section;
  });
  for (const m of parsed.messages) {
    // the characters were said where they are written, above
    if (m.code === 'bad-character') continue;
    const path = sindex.pathAt(sindex.offsetAt(m));
    const o = origin(path);
    const loc = at(o.src, o.path);
    const field = m.path ? pathText(origin(parsePath(m.path)).path) : '';
    const moved: Message = {
      ...m,
      file: loc.file,
      line: loc.line,
      column: loc.column,
      path: field,
    };
    messages.push(moved);
    concerns.note(moved, about.get(m) ?? []);
  }
  const result = done(batchId);
  result.sections = result.entries.flatMap((e) => (e.section ? [e.section] : []));
  return result;
}
