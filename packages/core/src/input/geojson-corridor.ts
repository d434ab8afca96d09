import { isMap, isScalar, isSeq, LineCounter, parseDocument, type Document } from 'yaml';
import { BATCH_FORMAT, corridorSectionId } from '../formats';
import type { Point } from '../model/types';
import { Concerns } from './concerns';
import { isNumber, isRecord } from './guards';
import { locateInDocument, type Location } from './locate-in-document';
import { parseSections, type ParsedSections } from './parse-sections';
import type { BatchHeader, Message, PathKey, SectionEntry } from './types';
import { pathText } from './words';

/** A LineString feature of a corridor, as given, with the id of the section made from it. */
export interface CorridorFeature {
  /** Index in the FeatureCollection's `features`. */
  index: number;
  station: number | null;
  /** `<batch id>@<station>`: the id of the section (and result) made from this feature. */
  sectionId: string | null;
  geometry: unknown;
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
  try {
    const data: unknown = JSON.parse(text);
    return isRecord(data) && data.type === 'FeatureCollection';
  } catch {
    return /"type"\s*:\s*"FeatureCollection"/.test(text.slice(0, 2000));
  }
}

interface Source {
  doc: Document;
  counter: LineCounter;
  fileName: string;
}

function read(text: string, fileName: string, json: boolean): Source {
  const counter = new LineCounter();
  const doc = parseDocument(text, {
    lineCounter: counter,
    prettyErrors: false,
    ...(json ? { schema: 'json' as const } : {}),
  });
  return { doc, counter, fileName };
}

/** The path of the deepest node of a document at a text offset (a key names its property). */
function pathAt(doc: Document, offset: number): PathKey[] {
  const path: PathKey[] = [];
  let node: unknown = doc.contents;
  const within = (n: unknown): boolean => {
    const r = (n as { range?: [number, number, number] | null } | null)?.range;
    return !!r && offset >= r[0] && offset <= r[2];
  };
  for (;;) {
    if (isMap(node)) {
      const pair = node.items.find((p) => within(p.key) || within(p.value));
      if (!pair || !isScalar(pair.key)) return path;
      path.push(String(pair.key.value));
      if (within(pair.key)) return path;
      node = pair.value;
    } else if (isSeq(node)) {
      const i = node.items.findIndex((item) => within(item));
      if (i < 0) return path;
      path.push(i);
      node = node.items[i];
    } else return path;
  }
}

/** The keys of a path as written by pathText: `a.b[2]["c.d"]` → ['a', 'b', 2, 'c.d']. */
function parsePath(text: string): PathKey[] {
  const keys: PathKey[] = [];
  const re = /(?:^|\.)([A-Za-z0-9_][A-Za-z0-9_+@-]*)|\[(\d+)\]|\[("(?:[^"\\]|\\.)*")\]/g;
  for (const m of text.matchAll(re)) {
    if (m[1] !== undefined) keys.push(m[1]);
    else if (m[2] !== undefined) keys.push(Number(m[2]));
    else keys.push(JSON.parse(m[3]) as string);
  }
  return keys;
}

function offsetOf(text: string, line: number, column: number): number {
  let offset = 0;
  for (let l = 1; l < line; l++) {
    const next = text.indexOf('\n', offset);
    if (next < 0) break;
    offset = next + 1;
  }
  return offset + column - 1;
}

function idFromFileName(fileName: string): string {
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
 * Reads a corridor given as a GeoJSON FeatureCollection (RFC 7946) of LineString features,
 * one per cross-section. Each feature's coordinates are [x, y, z] in a projected coordinate
 * system in the corridor's units (m or ft), the section line drawn across the corridor; its
 * `station` property is the chainage. The section's ground profile is z along the line's
 * horizontal length: the first vertex is at offset 0, each next one at the horizontal
 * distance walked so far. Properties named like the settings of a batch section (title,
 * offset, materials, strata, water, loads, seismic, crack, analysis) apply to that section;
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
    messages.sort((a, b) =>
      a.file === b.file ? a.line - b.line || a.column - b.column : a.file < b.file ? -1 : 1,
    );
    concerns.resolve(messages, entries);
    return { sections: [], messages, batch, entries, batchId, features };
  };

  const syntax = jsonSyntax(text);
  if (syntax) {
    push('error', { ...syntax, file: fileName }, [], 'syntax', syntax.message);
    return done(idFromFileName(fileName));
  }
  const geo = read(text, fileName, true);
  const at = (src: Source, path: PathKey[]) => ({
    ...locateInDocument(src.doc, src.counter, path),
    file: src.fileName,
  });
  const data: unknown = JSON.parse(text);
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
    const json = /\.json$/i.test(header.fileName);
    const hs = json ? jsonSyntax(header.text) : null;
    const src = read(header.text, header.fileName, json);
    if (hs || src.doc.errors.length) {
      const e = src.doc.errors[0];
      const lc = e ? src.counter.linePos(e.pos[0]) : { line: hs?.line ?? 1, col: hs?.column ?? 1 };
      const words =
        hs?.message ??
        `YAML syntax error: ${e.message.charAt(0).toLowerCase()}${e.message.slice(1)}`;
      push('error', { line: lc.line, column: lc.col, file: header.fileName }, [], 'syntax', words);
      return done(idFromFileName(fileName));
    }
    const value: unknown = src.doc.toJS();
    if (!isRecord(value)) {
      push(
        'error',
        at(src, []),
        [],
        'not-a-header',
        'expected the corridor settings: id, units and template (a corridor batch without its sections)',
      );
      return done(idFromFileName(fileName));
    }
    head = value;
    headerSource = src;
    headerBase = [];
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
    const coords = g.coordinates as number[][];
    const ground: Point[] = [];
    let run = 0;
    coords.forEach((c, k) => {
      if (k > 0) run += Math.hypot(c[0] - coords[k - 1][0], c[1] - coords[k - 1][1]);
      ground.push([run, c[2]]);
    });
    const degrees = coords.every((c) => Math.abs(c[0]) <= 180 && Math.abs(c[1]) <= 90);
    if (degrees && run < 0.05)
      concerns.note(
        push(
          'warning',
          at(geo, [...fp, 'geometry', 'coordinates']),
          [...fp, 'geometry', 'coordinates'],
          'looks-like-degrees',
          `the line is ${run.toPrecision(2)} long: are these longitude and latitude? Give projected x and y in the corridor's units`,
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
  const parsed = parseSections(synthetic, 'corridor.json');
  const sdoc = read(synthetic, 'corridor.json', true).doc;

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
    for (const m of e.messages) about.set(m, [...(about.get(m) ?? []), itemFeature[k]]);
    entries[itemFeature[k]].section = e.section;
  });
  for (const m of parsed.messages) {
    const path = pathAt(sdoc, offsetOf(synthetic, m.line, m.column));
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
  result.sections = parsed.sections;
  return result;
}
