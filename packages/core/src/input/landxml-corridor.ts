/**
 * A corridor given as LandXML 1.2 cross-sections (Alignment/CrossSects/CrossSect, each with
 * its CrossSectSurf surfaces as PntList2D or CrossSectPnt offset–elevation pairs), read with
 * fast-xml-parser into a corridor batch.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { BATCH_FORMAT, corridorSectionId } from '../formats';
import type { Point } from '../model/types';
import { Concerns } from './concerns';
import {
  idFromFileName,
  parsePath,
  readHeaderFile,
  type HeaderFile,
  type Source,
} from './geojson-corridor';
import { isRecord } from './guards';
import { JsonIndex } from './json-index';
import { count, INPUT_LIMITS, MAX_SECTIONS } from './limits';
import type { Location } from './locate-in-document';
import { readSections, type ParsedSections } from './parse-sections';
import type { BatchHeader, Message, PathKey, SectionEntry } from './types';
import { pathText } from './words';

export interface ParsedLandXml extends ParsedSections {
  batchId: string;
  /** The alignment whose cross-sections were read; null when none was. */
  alignment: string | null;
}

type XNode = Record<string | symbol, unknown>;

const META = XMLParser.getMetaDataSymbol() as symbol;
/** The elements that may repeat, always read as lists. */
const LISTS = new Set([
  'Alignments',
  'Alignment',
  'CrossSects',
  'CrossSect',
  'CrossSectSurf',
  'DesignCrossSectSurf',
  'PntList2D',
  'CrossSectPnt',
]);

/** Metres in one LandXML linear unit (the Metric and Imperial linearUnit values of LandXML 1.2). */
const LINEAR_UNITS: Record<string, number> = {
  millimeter: 0.001,
  centimeter: 0.01,
  meter: 1,
  kilometer: 1000,
  foot: 0.3048,
  USSurveyFoot: 1200 / 3937,
  inch: 0.0254,
  mile: 1609.344,
};

/**
 * Whether a text is a LandXML document (its root element is LandXML).
 *
 * @example isLandXml('<?xml version="1.0"?>\n<LandXML version="1.2">…') // → true
 */
export function isLandXml(text: string): boolean {
  return /^\uFEFF?\s*(?:<\?xml[^>]*\?>\s*)?(?:<!--[\s\S]*?-->\s*|<!DOCTYPE[^[>]*(?:\[[\s\S]*?\])?\s*>\s*)*<LandXML[\s>/]/.test(
    text.slice(0, 8000),
  );
}

const list = (v: unknown): XNode[] =>
  Array.isArray(v) ? v.filter((x): x is XNode => isRecord(x)) : [];
const textOf = (v: unknown): string | null =>
  typeof v === 'string' ? v : isRecord(v) && typeof v['#text'] === 'string' ? v['#text'] : null;
const nameOf = (n: XNode): string | null => {
  const v = n['@_name'];
  return typeof v === 'string' ? v : null;
};

/** A surface of one cross-section: its name, points (offset, elevation) and where it is. */
interface Surface {
  name: string;
  points: Point[];
  at: Location & { file: string };
  /** Why its points cannot be read, when they cannot. */
  problem: string | null;
}

/**
 * Reads the cross-sections of a LandXML 1.2 file (the CrossSects of its first alignment that
 * has any) into a corridor batch: each CrossSect is a section at its station (`sta`, the
 * chainage), its id `<batch id>@<station>`; the surface that is the ground (`surfaces.ground`
 * of the corridor settings, else the only one, else the one whose name says ground: "Existing
 * Ground", "EG") gives the ground profile (offset, elevation) from left to right; a surface
 * named as a stratum's material (or by `surfaces.strata`) gives that stratum's top, and
 * `surfaces.water` the piezometric line, as elevation polylines (extended level to the ends
 * of the ground where they are shorter, with a warning). Numbers are converted from the file's
 * linear unit (Units/Metric or Imperial) to the corridor's.
 *
 * The settings shared by every section (id, units, template) come from the header file (YAML
 * or JSON: a corridor batch without its sections), as for a GeoJSON corridor. Every message is
 * located in the file it concerns: the LandXML (line of the CrossSect or surface) or the header.
 *
 * @example
 * const { sections, messages } = parseLandXmlCorridor(xml, 'wendlecombe.xml', { text, fileName: 'header.yaml' });
 */
export function parseLandXmlCorridor(
  text: string,
  fileName: string,
  header?: HeaderFile,
): ParsedLandXml {
  const messages: Message[] = [];
  const entries: SectionEntry[] = [];
  const concerns = new Concerns();
  let batch: BatchHeader | null = null;
  let alignment: string | null = null;
  const push = (
    severity: Message['severity'],
    at: Location & { file: string },
    path: string,
    code: string,
    message: string,
    about?: number[],
  ): Message => {
    const m: Message = {
      severity,
      file: at.file,
      line: at.line,
      column: at.column,
      path,
      code,
      message,
      sections: [],
    };
    messages.push(m);
    if (about) concerns.note(m, about);
    return m;
  };
  const done = (batchId: string): ParsedLandXml => {
    const capped = concerns.settle(messages, entries);
    const sections = entries.flatMap((e) => (e.section ? [e.section] : []));
    return { sections, messages: capped, batch, entries, batchId, alignment };
  };

  // --- where an offset of the text is
  const lineStarts = [0];
  for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) lineStarts.push(i + 1);
  const locateOffset = (offset: number): Location => {
    let lo = 0;
    let hi = lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (lineStarts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - lineStarts[lo] + 1 };
  };
  const xml = (n: XNode | null): Location & { file: string } => {
    const meta = n ? (n[META] as { startIndex?: number } | undefined) : undefined;
    return { ...locateOffset(meta?.startIndex ?? 0), file: fileName };
  };

  if (text.length > INPUT_LIMITS.characters) {
    push(
      'error',
      { line: 1, column: 1, file: fileName },
      '',
      'too-large',
      `has ${count(text.length)} characters; a file holds at most ${count(INPUT_LIMITS.characters)}`,
    );
    return done(idFromFileName(fileName));
  }
  const valid = XMLValidator.validate(text);
  if (valid !== true) {
    const e = valid.err;
    push(
      'error',
      { line: e.line, column: e.col, file: fileName },
      '',
      'syntax',
      `XML syntax error: ${e.msg.charAt(0).toLowerCase()}${e.msg.slice(1)}`,
    );
    return done(idFromFileName(fileName));
  }
  let doc: XNode;
  try {
    doc = new XMLParser({
      ignoreAttributes: false,
      attributeNamePrefix: '@_',
      parseTagValue: false,
      parseAttributeValue: false,
      processEntities: false,
      captureMetaData: true,
      removeNSPrefix: true,
      isArray: (name) => LISTS.has(name),
    }).parse(text) as XNode;
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    push('error', { line: 1, column: 1, file: fileName }, '', 'syntax', `XML not read: ${why}`);
    return done(idFromFileName(fileName));
  }
  // (an empty <LandXML/> reads as an empty text: a document without cross-sections)
  const root = isRecord(doc.LandXML) ? (doc.LandXML as XNode) : doc.LandXML === '' ? {} : null;
  if (!root) {
    push(
      'error',
      { line: 1, column: 1, file: fileName },
      '',
      'not-landxml',
      'expected a LandXML document (root element LandXML)',
    );
    return done(idFromFileName(fileName));
  }

  // --- the header: the header file's settings
  let head: Record<string, unknown> = {};
  let headerSource: Source | null = null;
  if (header) {
    const read = readHeaderFile(header);
    if ('refusal' in read) {
      const r = read.refusal;
      push('error', { ...r, file: header.fileName }, pathText(r.path), r.code, r.message);
      return done(idFromFileName(fileName));
    }
    head = read.value;
    headerSource = read.src;
    for (const issue of read.issues)
      push(
        'error',
        { ...read.src.locate(issue.path), file: header.fileName },
        pathText(issue.path),
        issue.code,
        issue.message,
      );
  } else {
    push(
      'warning',
      xml(root),
      '',
      'no-template',
      'no corridor settings: give a header file (YAML or JSON: id, units, template) beside the LandXML',
    );
  }
  const atHeader = (path: PathKey[]): Location & { file: string } =>
    headerSource
      ? { ...headerSource.locate(path), file: headerSource.fileName }
      : { ...xml(root), file: fileName };
  if (head.sections !== undefined) {
    push(
      'error',
      atHeader(['sections']),
      'sections',
      'sections-in-header',
      'the sections of a LandXML corridor come from its cross-sections: leave sections out of the corridor settings',
    );
  }

  // --- the cross-sections: those of the first alignment that has any
  const alignments = list(root.Alignments).flatMap((a) => list(a.Alignment));
  const withSections = alignments.filter((a) =>
    list(a.CrossSects).some((c) => list(c.CrossSect).length > 0),
  );
  const chosen = withSections[0] ?? null;
  alignment = chosen ? nameOf(chosen) : null;
  const fallbackId = alignment
    ? alignment.replace(/[^A-Za-z0-9._+@-]+/g, '-').replace(/^[^A-Za-z0-9]+/, '') ||
      idFromFileName(fileName)
    : idFromFileName(fileName);
  const batchId = typeof head.id === 'string' ? head.id : fallbackId;

  // the file's linear unit → the corridor's
  const unitsNode = isRecord(root.Units) ? (root.Units as XNode) : null;
  const unitSystem = unitsNode
    ? (['Metric', 'Imperial'] as const).find((k) => isRecord(unitsNode[k]))
    : undefined;
  const unitNode = unitSystem && unitsNode ? (unitsNode[unitSystem] as XNode) : null;
  const linearUnit =
    typeof unitNode?.['@_linearUnit'] === 'string' ? unitNode['@_linearUnit'] : null;
  const units =
    head.units === 'us' || head.units === 'si'
      ? head.units
      : unitSystem === 'Imperial'
        ? 'us'
        : 'si';
  batch = {
    id: batchId,
    title: typeof head.title === 'string' ? head.title : null,
    units,
    ...(headerSource ? atHeader(['id']) : xml(root)),
  };
  let metres = units === 'us' ? 0.3048 : 1;
  if (linearUnit !== null) {
    const m = LINEAR_UNITS[linearUnit];
    if (m === undefined) {
      push(
        'error',
        xml(unitNode),
        'Units',
        'unknown-unit',
        `linearUnit "${linearUnit}" is not one of ${Object.keys(LINEAR_UNITS).join(', ')}`,
      );
      return done(batchId);
    }
    metres = m;
  } else if (!unitNode) {
    push(
      'warning',
      xml(root),
      'Units',
      'no-units',
      `the file does not say its linear unit (Units): its numbers are read in the corridor's units (${units === 'us' ? 'ft' : 'm'})`,
    );
  }
  const scale = metres / (units === 'us' ? 0.3048 : 1);

  if (!chosen) {
    push(
      'error',
      xml(root),
      '',
      'no-cross-sections',
      'no cross-sections: expected Alignments/Alignment/CrossSects/CrossSect elements',
    );
    return done(batchId);
  }
  for (const other of withSections.slice(1))
    push(
      'warning',
      xml(other),
      `Alignment[name=${JSON.stringify(nameOf(other) ?? '')}]`,
      'other-alignment',
      `the cross-sections of alignment "${nameOf(other) ?? ''}" are not read: a corridor is the cross-sections of one alignment (${JSON.stringify(alignment ?? '')}); give each alignment in a file of its own`,
    );
  const crossSects = list(chosen.CrossSects).flatMap((c) => list(c.CrossSect));
  if (crossSects.length > MAX_SECTIONS) {
    push(
      'error',
      xml(list(chosen.CrossSects)[0]),
      'CrossSects',
      'too-many',
      `has ${count(crossSects.length)} cross-sections; a corridor holds at most ${count(MAX_SECTIONS)} sections: split it into several files`,
    );
    return done(batchId);
  }

  // --- which surface is what
  const surfaces = isRecord(head.surfaces) ? head.surfaces : {};
  const groundName = typeof surfaces.ground === 'string' ? surfaces.ground : null;
  const waterName = typeof surfaces.water === 'string' ? surfaces.water : null;
  const template = isRecord(head.template) ? head.template : {};
  const strata = Array.isArray(template.strata) ? (template.strata as unknown[]) : [];
  const namedStrata = isRecord(surfaces.strata) ? surfaces.strata : {};
  for (const material of Object.keys(namedStrata)) {
    const known = strata.some((s, j) => j > 0 && isRecord(s) && s.material === material);
    if (!known)
      push(
        'warning',
        atHeader(['surfaces', 'strata', material]),
        pathText(['surfaces', 'strata', material]),
        'not-a-stratum',
        `"${material}" is not the material of a stratum below the first in template.strata: its surface is not read`,
      );
  }
  const same = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();
  /** The surface name that is the top of template stratum j (j ≥ 1), or null. */
  const stratumSurface = (j: number, names: string[]): string | null => {
    const s = strata[j];
    if (!isRecord(s) || typeof s.material !== 'string') return null;
    const named = namedStrata[s.material];
    if (typeof named === 'string') return named;
    return names.find((n) => same(n, s.material as string)) ?? null;
  };

  const readSurface = (n: XNode): Surface => {
    const name = nameOf(n) ?? '';
    const numbers: number[] = [];
    let problem: string | null = null;
    const chunks: unknown[] = [
      ...(Array.isArray(n.PntList2D) ? (n.PntList2D as unknown[]) : []),
      ...(Array.isArray(n.CrossSectPnt) ? (n.CrossSectPnt as unknown[]) : []),
    ];
    for (const chunk of chunks) {
      const t = textOf(chunk);
      if (t === null) continue;
      for (const word of t.trim().split(/[\s,]+/)) {
        if (word === '') continue;
        const v = Number(word);
        if (!Number.isFinite(v)) problem ??= `"${word}" is not a number`;
        numbers.push(v);
      }
    }
    if (!problem && numbers.length % 2 !== 0)
      problem = `${numbers.length} numbers: expected pairs of offset and elevation`;
    if (!problem && numbers.length < 4) problem = 'a surface needs at least two points';
    const points: Point[] = [];
    for (let i = 0; i + 1 < numbers.length; i += 2)
      points.push([numbers[i] * scale, numbers[i + 1] * scale]);
    return { name, points, at: xml(n), problem };
  };
  /** A surface's points spanning the ground's offsets: its ends extended level where short. */
  const spanning = (s: Surface, ground: Point[], k: number): Point[] => {
    const out = s.points.map((p): Point => [p[0], p[1]]);
    const lo = ground[0][0];
    const hi = ground[ground.length - 1][0];
    const short = out[0][0] > lo || out[out.length - 1][0] < hi;
    if (out[0][0] > lo) out.unshift([lo, out[0][1]]);
    if (out[out.length - 1][0] < hi) out.push([hi, out[out.length - 1][1]]);
    if (short)
      push(
        'warning',
        s.at,
        `CrossSect[${k}].CrossSectSurf[name=${JSON.stringify(s.name)}]`,
        'surface-extended',
        `surface "${s.name}" does not span the ground (offsets ${fmt(lo)} to ${fmt(hi)}): extended level to its ends`,
        [k],
      );
    return out;
  };

  const items: Record<string, unknown>[] = [];
  const itemOf: number[] = []; // item → cross-section
  /** Per cross-section: where its ground, strata tops and water are. */
  const where: {
    cs: XNode;
    ground: Surface | null;
    strata: (Surface | null)[];
    water: Surface | null;
  }[] = [];
  const unused = new Map<string, Location & { file: string }>();
  const used = new Set<string>();
  let designAt: (Location & { file: string }) | null = null;
  crossSects.forEach((cs, k) => {
    const sta = Number(cs['@_sta']);
    const hasSta =
      typeof cs['@_sta'] === 'string' && cs['@_sta'].trim() !== '' && Number.isFinite(sta);
    const station = hasSta ? Math.round(sta * scale * 1e9) / 1e9 : null;
    const label = station === null ? `CrossSect[${k}]` : corridorSectionId(batchId, station);
    entries.push({
      id: station === null ? null : label,
      label,
      station,
      batch: batchId,
      ...xml(cs),
      path: `CrossSect[${k}]`,
      section: null,
      messages: [],
    });
    where.push({ cs, ground: null, strata: [], water: null });
    const problem = (
      at: Location & { file: string },
      path: string,
      code: string,
      message: string,
    ) => push('error', at, path, code, message, [k]);
    if (!hasSta)
      return problem(
        xml(cs),
        `CrossSect[${k}]`,
        'missing',
        'the cross-section has no station (sta): its chainage',
      );
    const design = list(cs.DesignCrossSectSurf);
    if (design.length > 0) designAt ??= xml(design[0]);
    const all = list(cs.CrossSectSurf).map(readSurface);
    if (all.length === 0)
      return problem(
        xml(cs),
        `CrossSect[${k}]`,
        'no-surfaces',
        'the cross-section has no surface (CrossSectSurf)',
      );
    const names = all.map((s) => s.name);
    let ground: Surface | undefined;
    if (groundName !== null) {
      ground = all.find((s) => s.name === groundName) ?? all.find((s) => same(s.name, groundName));
      if (!ground)
        return problem(
          xml(cs),
          `CrossSect[${k}]`,
          'no-ground',
          `no surface named "${groundName}" (surfaces.ground) in this cross-section; it has ${names.map((n) => `"${n}"`).join(', ')}`,
        );
    } else {
      ground =
        all.length === 1
          ? all[0]
          : all.find((s) => /\bground\b|^\s*[EO]G\s*$|existing|terrain/i.test(s.name));
      if (!ground)
        return problem(
          xml(cs),
          `CrossSect[${k}]`,
          'no-ground',
          `which of its surfaces (${names.map((n) => `"${n}"`).join(', ')}) is the ground? Name it in the corridor settings: surfaces.ground`,
        );
    }
    where[k].ground = ground;
    used.add(ground.name);
    const surfPath = (s: Surface) =>
      `CrossSect[${k}].CrossSectSurf[name=${JSON.stringify(s.name)}]`;
    if (ground.problem) return problem(ground.at, surfPath(ground), 'bad-points', ground.problem);
    const item: Record<string, unknown> = { station, ground: ground.points };
    // strata tops from surfaces, where a stratum has one
    if (strata.length > 1) {
      let changed = false;
      const tops = strata.map((s, j) => {
        if (j === 0 || !isRecord(s)) return s;
        const name = stratumSurface(j, names);
        if (name === null) return s;
        const surf = all.find((x) => x.name === name) ?? all.find((x) => same(x.name, name));
        if (!surf) return s;
        used.add(surf.name);
        where[k].strata[j] = surf;
        if (surf.problem) {
          problem(surf.at, surfPath(surf), 'bad-points', surf.problem);
          return s;
        }
        changed = true;
        const { depth: _d, elevation: _e, ...rest } = s;
        return { ...rest, elevation: spanning(surf, ground.points, k) };
      });
      if (changed) item.strata = tops;
    }
    if (waterName !== null) {
      const surf =
        all.find((x) => x.name === waterName) ?? all.find((x) => same(x.name, waterName));
      if (surf) {
        used.add(surf.name);
        where[k].water = surf;
        if (surf.problem) problem(surf.at, surfPath(surf), 'bad-points', surf.problem);
        else {
          const w = isRecord(template.water) ? template.water : {};
          const { depth: _d, elevation: _e, ru: _r, ...rest } = w;
          item.water = { ...rest, elevation: spanning(surf, ground.points, k) };
        }
      }
    }
    for (const s of all) if (!unused.has(s.name)) unused.set(s.name, s.at);
    items.push(item);
    itemOf.push(k);
  });
  for (const [name, at] of unused) {
    if (used.has(name)) continue;
    push(
      'warning',
      at,
      `CrossSectSurf[name=${JSON.stringify(name)}]`,
      'surface-unused',
      `surface "${name}" is not read: name it in the corridor settings (surfaces.ground, surfaces.strata or surfaces.water), or name a stratum's material after it`,
      [],
    );
  }
  if (designAt)
    push(
      'warning',
      designAt,
      'DesignCrossSectSurf',
      'design-surface-unused',
      'design surfaces (DesignCrossSectSurf) are not read: each section is analyzed on its ground surface',
      [],
    );
  if (items.length === 0) {
    push('error', xml(chosen), '', 'no-sections', 'no cross-section gives a usable section');
    return done(batchId);
  }

  // --- the corridor as a batch, read as any batch; its messages moved to where they belong
  const asBatch: Record<string, unknown> = {
    ...head,
    format: head.format ?? BATCH_FORMAT,
    id: batchId,
    units,
    sections: items,
  };
  const synthetic = JSON.stringify(asBatch, null, 1);
  const parsed = readSections(synthetic, 'corridor.json');
  const sindex = new JsonIndex(synthetic);
  const origin = (path: PathKey[]): { at: Location & { file: string }; path: string } => {
    if (path[0] === 'sections' && typeof path[1] === 'number') {
      const k = itemOf[path[1]];
      const w = where[k];
      const [, , key, ...more] = path;
      const tail = pathText(path.slice(2));
      const field = `CrossSect[${k}]${tail && !tail.startsWith('[') ? '.' : ''}${tail}`;
      if (key === 'ground' && w.ground) return { at: w.ground.at, path: field };
      if (key === 'strata' && typeof more[0] === 'number' && w.strata[more[0]])
        return { at: w.strata[more[0]]!.at, path: field };
      if (key === 'water' && w.water) return { at: w.water.at, path: field };
      return { at: xml(w.cs), path: field };
    }
    if (path[0] === 'sections') return { at: xml(chosen), path: 'CrossSects' };
    return { at: atHeader(path), path: pathText(path) };
  };
  parsed.entries.forEach((e, i) => {
    entries[itemOf[i]].section = e.section;
  });
  const about = new Map<Message, number[]>();
  parsed.entries.forEach((e, i) => {
    for (const m of e.messages) about.set(m, [...(about.get(m) ?? []), itemOf[i]]);
  });
  for (const m of parsed.messages) {
    const o = origin(sindex.pathAt(sindex.offsetAt(m)));
    const field = m.path ? origin(parsePath(m.path)).path : '';
    const moved: Message = {
      ...m,
      file: o.at.file,
      line: o.at.line,
      column: o.at.column,
      path: field,
    };
    messages.push(moved);
    concerns.note(moved, about.get(m) ?? []);
  }
  // a cross-section with an error of its own reads as no section
  for (const m of messages)
    if (m.severity === 'error') for (const k of concerns.of(m)) entries[k].section = null;
  return done(batchId);
}

const fmt = (v: number) => String(Math.round(v * 1000) / 1000);
