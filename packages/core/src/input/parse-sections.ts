import { LineCounter, parseAllDocuments, type Document } from 'yaml';
import { normaliseSection } from '../model/normalise-section';
import type { RawSection } from '../model/raw-section';
import type { Section, UnitSystem } from '../model/types';
import { rawSectionToSi } from '../model/units';
import { BATCH_FORMAT, corridorSectionId, SECTION_FORMAT } from '../formats';
import { checkBatch } from './check-batch';
import { Concerns } from './concerns';
import { checkSection } from './check-section';
import { expandBatch } from './expand-batch';
import { isRecord } from './guards';
import { locateInDocument, type Location } from './locate-in-document';
import type { BatchHeader, Issue, Message, PathKey, SectionEntry } from './types';
import { validateAgainstSchema } from './validate-against-schema';
import { readValuesWithUnits } from './values-with-units';
import { pathText } from './words';

export interface ParsedSections {
  /** The sections without errors, validated and normalised (SI), in the order of the file. */
  sections: Section[];
  /**
   * Every error and warning of the file, located, in the order of the file; each with the ids
   * of the sections it concerns.
   */
  messages: Message[];
  /** The header of the file's corridor batch (the first, when it holds several); null for none. */
  batch: BatchHeader | null;
  /**
   * Every section of the file, read or not, in the order of the file: each section document
   * with an id and each item of a batch, with its id, where it is given, its section (null
   * when a message stops it) and the messages about it.
   */
  entries: SectionEntry[];
}

/** Line and column of an offset in a text (for errors found before the YAML parser runs). */
function lineColumnOf(text: string, offset: number): Location {
  const before = text.slice(0, Math.max(0, Math.min(offset, text.length)));
  const lines = before.split('\n');
  return { line: lines.length, column: lines[lines.length - 1].length + 1 };
}

/** The JSON.parse error of a text, located and in plain words, or null when it parses. */
function jsonSyntaxError(text: string): { location: Location; message: string } | null {
  try {
    JSON.parse(text);
    return null;
  } catch (e) {
    const raw = e instanceof Error ? e.message : String(e);
    const position = /position (\d+)/.exec(raw);
    const lineCol = /line (\d+) column (\d+)/.exec(raw);
    let location: Location = { line: 1, column: 1 };
    if (lineCol) location = { line: Number(lineCol[1]), column: Number(lineCol[2]) };
    else if (position) location = lineColumnOf(text, Number(position[1]));
    else if (/end of (JSON )?(input|data)/i.test(raw)) location = lineColumnOf(text, text.length);
    const words = raw
      .replace(/^JSON\.parse: /, '')
      .replace(/ in JSON at position \d+.*$/, '')
      .replace(/ at line \d+ column \d+.*$/, '')
      .replace(/, ".*" is not valid JSON$/s, '');
    return {
      location,
      message: `JSON syntax error: ${words.charAt(0).toLowerCase()}${words.slice(1)}`,
    };
  }
}

/** What a document's reader needs: where to put messages, entries, the batch header. */
interface Reading {
  fileName: string;
  push: Push;
  concerns: Concerns;
  entries: SectionEntry[];
  batches: BatchHeader[];
  /** The entries whose input was complete enough to be checked as a section (ids compared). */
  checked: Set<number>;
}

/**
 * Reads the sections of a file: YAML (one or more documents) or JSON, each document a section
 * (format scarpline/1) or a corridor batch (format scarpline-batch/1, expanded into its
 * sections, ids `<batch id>@<station>`). Every document is checked against the schema, then by
 * the checks the schema cannot express, and every error and warning is reported with its line
 * and column in the file — all of them, not only the first — and with the ids of the sections
 * it concerns. The sections without errors are normalised: SI units, defaults filled in, strata
 * tops clipped (see normaliseSection). Besides the sections, the result gives the batch's
 * header and an entry per section, read or not, with its own messages: what a caller needs to
 * report a corridor station by station. Pure: the caller reads the file.
 *
 * @example
 * const { sections, messages } = parseSections(text, 'clay-cut.yaml');
 * messages.map(formatMessage); // → ['clay-cut.yaml:12:34 materials.clay.strength.frictionAngle: 95 is above 90°']
 */
export function parseSections(text: string, fileName: string): ParsedSections {
  const isJson = /\.json$/i.test(fileName);
  const counter = new LineCounter();
  const messages: Message[] = [];
  const concerns = new Concerns();
  const entries: SectionEntry[] = [];
  const batches: BatchHeader[] = [];
  const push: Push = (severity, location, path, code, message) => {
    const m: Message = {
      severity,
      file: fileName,
      line: location.line,
      column: location.column,
      path,
      code,
      message,
      sections: [],
    };
    messages.push(m);
    return m;
  };
  const reading: Reading = { fileName, push, concerns, entries, batches, checked: new Set() };
  const syntaxWords = isJson ? 'JSON syntax error' : 'YAML syntax error';

  // A JSON file must be JSON: YAML would accept more (comments, trailing commas).
  const jsonError = isJson ? jsonSyntaxError(text) : null;

  const docs = parseAllDocuments(text, {
    lineCounter: counter,
    prettyErrors: false,
    ...(isJson ? { schema: 'json' as const } : { merge: true }),
  });
  let syntaxErrors = 0;
  let documents = 0;
  for (const doc of docs) {
    // The parser's messages about a document concern the sections it gives.
    const before = messages.length;
    const first = entries.length;
    for (const e of doc.errors) {
      syntaxErrors++;
      const { line, col } = counter.linePos(e.pos[0]);
      if (e.code === 'DUPLICATE_KEY') {
        const key = (/^[^:\n]*/.exec(text.slice(e.pos[0]))?.[0] ?? '').trim();
        const message = `the key ${key ? `${key} ` : ''}appears twice in the same mapping`;
        push('error', { line, column: col }, '', 'duplicate-key', message);
      } else {
        const words = e.message.charAt(0).toLowerCase() + e.message.slice(1);
        push('error', { line, column: col }, '', 'syntax', `${syntaxWords}: ${words}`);
      }
    }
    for (const w of doc.warnings) {
      const { line, col } = counter.linePos(w.pos[0]);
      push('warning', { line, column: col }, '', 'yaml-warning', w.message);
    }
    const parserMessages = messages.slice(before);
    // (a document that gives none: they concern the file's sections, as a file's own do)
    const own = (): void => {
      const mine = entries.map((_, i) => i).slice(first);
      if (mine.length > 0) for (const m of parserMessages) concerns.note(m, mine);
    };
    if (doc.errors.length > 0 || doc.contents === null || jsonError) {
      own();
      continue;
    }
    let data: unknown;
    try {
      data = doc.toJS({ maxAliasCount: 1000 });
    } catch (e) {
      syntaxErrors++;
      const message = e instanceof Error ? e.message : String(e);
      push('error', locateInDocument(doc, counter, []), '', 'syntax', message);
      own();
      continue;
    }
    // A document of nothing but comments (or a lone null) is empty, not a section.
    if (data === null || data === undefined) {
      own();
      continue;
    }
    documents++;
    readDocument(doc, counter, data, reading);
    own();
  }

  if (jsonError && syntaxErrors === 0) {
    syntaxErrors++;
    push('error', jsonError.location, '', 'syntax', jsonError.message);
  }
  if (documents === 0 && syntaxErrors === 0) {
    push('error', { line: 1, column: 1 }, '', 'empty-file', 'the file holds no section');
  }

  // Ids must be unique across the documents (and the sections of batches) of a file.
  const seen = new Map<string, Location>();
  const sections: Section[] = [];
  entries.forEach((e, i) => {
    if (e.id === null || !reading.checked.has(i)) return;
    const first = seen.get(e.id);
    if (first) {
      const m = push(
        'error',
        e,
        e.path,
        'duplicate-id',
        `the id ${JSON.stringify(e.id)} is already used at line ${first.line}`,
      );
      concerns.note(m, [i]);
      e.section = null;
    } else {
      seen.set(e.id, e);
      if (e.section) sections.push(e.section);
    }
  });

  messages.sort((a, b) => a.line - b.line || a.column - b.column);
  concerns.resolve(messages, entries);
  return { sections, messages, batch: batches[0] ?? null, entries };
}

type Push = (
  severity: Message['severity'],
  location: Location,
  path: string,
  code: string,
  message: string,
) => Message;

function unitsOf(data: Record<string, unknown>): UnitSystem {
  return data.units === 'us' ? 'us' : 'si';
}

/** One YAML document: a section or a batch. */
function readDocument(doc: Document, counter: LineCounter, data: unknown, reading: Reading): void {
  const { push, concerns, entries } = reading;
  const locate = (path: readonly PathKey[], atKey = false): Location =>
    locateInDocument(doc, counter, path, atKey);
  // A section document's messages concern its section (noted once its entry exists).
  const reported: Message[] = [];
  const report = (issue: Issue): void => {
    reported.push(
      push(
        issue.severity,
        locate(issue.path, issue.key),
        pathText(issue.path),
        issue.code,
        issue.message,
      ),
    );
  };
  if (!isRecord(data)) {
    const what = Array.isArray(data) ? 'a list' : JSON.stringify(data);
    report({
      severity: 'error',
      path: [],
      code: 'not-a-section',
      message: `expected a section (a group of settings starting with format: ${SECTION_FORMAT}), got ${what}`,
    });
    return;
  }
  if (data.format === BATCH_FORMAT) {
    readBatch(data, locate, reading);
    return;
  }

  // Values written with their unit (`cohesion: 250 psf`) become numbers in the file's units.
  const withUnits = readValuesWithUnits(data, 'section', unitsOf(data));
  const issues: Issue[] = [...withUnits.issues];
  if (data.format === undefined) {
    issues.push({
      severity: 'error',
      path: [],
      code: 'missing',
      message: `format is missing: a section starts with format: ${SECTION_FORMAT} (a corridor batch with format: ${BATCH_FORMAT})`,
    });
  } else if (data.format !== SECTION_FORMAT) {
    issues.push({
      severity: 'error',
      path: ['format'],
      code: 'unknown-format',
      message: `${JSON.stringify(data.format)} is not a format Scarpline reads: use ${SECTION_FORMAT} (a section) or ${BATCH_FORMAT} (a corridor batch)`,
    });
  }
  // The format is reported above in words of its own; validate the rest as a section.
  const read = withUnits.data;
  issues.push(
    ...validateAgainstSchema({ ...read, format: SECTION_FORMAT }, 'section', unitsOf(read)),
  );
  issues.push(...checkSection(read));
  issues.forEach(report);
  const section = issues.some((i) => i.severity === 'error')
    ? null
    : normaliseSection(rawSectionToSi(read as unknown as RawSection));
  const mine: number[] = [];
  if (typeof data.id === 'string') {
    mine.push(entries.length);
    reading.checked.add(entries.length);
    entries.push({
      id: data.id,
      label: data.id,
      station: typeof data.station === 'number' ? data.station : null,
      batch: null,
      file: reading.fileName,
      ...locate(['id']),
      path: 'id',
      section,
      messages: [],
    });
  }
  for (const m of reported) concerns.note(m, mine);
}

/** A corridor batch: its own schema and checks, then every expanded section. */
function readBatch(
  document: Record<string, unknown>,
  locate: (path: readonly PathKey[], atKey?: boolean) => Location,
  reading: Reading,
): void {
  const { push, concerns, entries } = reading;
  const units = unitsOf(document);
  // Values written with their unit (`depth: 12 ft`) become numbers in the batch's units.
  const { data: batch, issues: unitIssues } = readValuesWithUnits(document, 'batch', units);
  const batchId = typeof batch.id === 'string' ? batch.id : String(batch.id);
  reading.batches.push({
    id: batchId,
    title: typeof batch.title === 'string' ? batch.title : null,
    units,
    file: reading.fileName,
    ...locate(['id']),
  });

  // An entry per item of the batch, in order: its id when it gives a number station.
  const items = Array.isArray(batch.sections) ? (batch.sections as unknown[]) : [];
  const entryOf: number[] = items.map((item, i) => {
    const station = isRecord(item) && typeof item.station === 'number' ? item.station : null;
    const idPath: PathKey[] = station === null ? ['sections', i] : ['sections', i, 'station'];
    const id = station === null ? null : corridorSectionId(batchId, station);
    entries.push({
      id,
      label: id ?? `sections[${i}]`,
      station,
      batch: batchId,
      file: reading.fileName,
      ...locate(idPath),
      path: pathText(idPath),
      section: null,
      messages: [],
    });
    return entries.length - 1;
  });
  /** The entries a path of the batch file concerns: its item's, or all of the batch's. */
  const concerned = (path: readonly PathKey[]): number[] =>
    path[0] === 'sections' && typeof path[1] === 'number'
      ? entryOf[path[1]] === undefined
        ? []
        : [entryOf[path[1]]]
      : entryOf;

  const batchIssues = [
    ...unitIssues,
    ...validateAgainstSchema(batch, 'batch', units),
    ...checkBatch(batch),
  ];
  const reported = new Map<string, Message>();
  const report = (
    issue: Issue,
    about: readonly number[],
    path: PathKey[] = issue.path,
    prefix = '',
  ): void => {
    const location = locate(path, issue.key);
    const text = pathText(path);
    const message = prefix + issue.message;
    const key = [issue.severity, location.line, location.column, text, issue.code, message].join(
      '|',
    );
    const m = reported.get(key) ?? push(issue.severity, location, text, issue.code, message);
    reported.set(key, m);
    concerns.note(m, about);
  };
  batchIssues.forEach((issue) => report(issue, concerned(issue.path)));

  // A section's own messages repeat nothing the batch schema already said: drop those whose
  // place in the file lies at or under a place with a batch error.
  const errorPaths = batchIssues.filter((i) => i.severity === 'error').map((i) => i.path);
  const under = (path: PathKey[]): boolean =>
    errorPaths.some((e) => e.length <= path.length && e.every((k, i) => path[i] === k));
  // A batch error spoils the sections it concerns: one item, or all of them.
  const spoils = (index: number): boolean =>
    errorPaths.some((e) => e[0] !== 'sections' || e.length < 2 || e[1] === index);

  const expanded = expandBatch(batch);
  // Messages that come from the template are said once when they hold for every section, and
  // with the stations they concern otherwise.
  const fromTemplate = new Map<
    string,
    { issue: Issue; path: PathKey[]; stations: number[]; about: number[] }
  >();
  for (const section of expanded) {
    const own = entryOf[section.index];
    reading.checked.add(own);
    const issues = [
      ...validateAgainstSchema(section.data, 'section', units),
      ...checkSection(section.data),
    ];
    // Boundaries given by depth copy the ground's faults: say them once, at the ground.
    const groundFaulty = issues.some((i) => i.code === 'ground-x-order');
    for (const issue of issues) {
      if (groundFaulty && section.derived(issue.path)) continue;
      const path = section.origin(issue.path);
      if (under(path)) continue;
      if (path[0] === 'template') {
        const key = [issue.severity, issue.code, pathText(path), issue.message].join('|');
        const entry = fromTemplate.get(key) ?? { issue, path, stations: [], about: [] };
        entry.stations.push(section.station);
        entry.about.push(own);
        fromTemplate.set(key, entry);
      } else report(issue, [own], path);
    }
    const valid = !spoils(section.index) && !issues.some((i) => i.severity === 'error');
    entries[own].section = valid
      ? normaliseSection(rawSectionToSi(section.data as unknown as RawSection))
      : null;
  }
  for (const { issue, path, stations, about } of fromTemplate.values()) {
    if (stations.length === expanded.length) report(issue, about, path);
    else {
      const shown = stations.slice(0, 5).join(', ');
      const more = stations.length > 5 ? ` and ${stations.length - 5} more` : '';
      const word = stations.length === 1 ? 'station' : 'stations';
      report(issue, about, path, `at ${word} ${shown}${more}: `);
    }
  }
}
