import { LineCounter, parseAllDocuments } from 'yaml';
import { normaliseSection } from '../model/normalise-section';
import type { RawSection } from '../model/raw-section';
import type { Section, UnitSystem } from '../model/types';
import { rawSectionToSi } from '../model/units';
import { BATCH_FORMAT, corridorSectionId, SECTION_FORMAT } from '../formats';
import { capMessages } from './cap-messages';
import { checkBatch } from './check-batch';
import { Concerns } from './concerns';
import { checkSection } from './check-section';
import { expandSections } from './expand-batch';
import { isRecord } from './guards';
import { JsonIndex } from './json-index';
import { count, INPUT_LIMITS, MAX_SECTIONS } from './limits';
import { locateInDocument, type Location } from './locate-in-document';
import type { BatchHeader, Issue, Message, PathKey, SectionEntry } from './types';
import { validateAgainstSchema } from './validate-against-schema';
import { countValues, screenData } from './screen-data';
import { screenText } from './screen-text';
import { readValuesWithUnits } from './values-with-units';
import { pathText, quote } from './words';

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
  /**
   * Whether the file has as many errors as are read (INPUT_LIMITS.errors): then nothing more
   * is checked or reported, and `stop` notes where the reading stopped.
   */
  full(): boolean;
  stop(location: Location, entries?: readonly number[]): void;
  /** Counts an error found but said once with others (a template's, at many stations). */
  tally(): void;
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
  const parsed = readSections(text, fileName);
  parsed.messages = capMessages(parsed.messages);
  for (const e of parsed.entries) e.messages = capMessages(e.messages);
  return parsed;
}

/**
 * parseSections without the cap on messages: for a reader that moves the messages elsewhere
 * (a GeoJSON corridor) and caps them there.
 */
export function readSections(text: string, fileName: string): ParsedSections {
  const isJson = /\.json$/i.test(fileName);
  const counter = new LineCounter();
  const messages: Message[] = [];
  const concerns = new Concerns();
  const entries: SectionEntry[] = [];
  const batches: BatchHeader[] = [];
  let errors = 0;
  let stopped: { location: Location; entries: number[] } | null = null;
  const push: Push = (severity, location, path, code, message) => {
    if (severity === 'error') errors++;
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
  const reading: Reading = {
    fileName,
    push,
    concerns,
    entries,
    batches,
    checked: new Set(),
    full: () => errors >= INPUT_LIMITS.errors,
    tally: () => void errors++,
    stop: (location, unread = []) => {
      stopped ??= { location, entries: [] };
      stopped.entries.push(...unread);
    },
  };
  const syntaxWords = isJson ? 'JSON syntax error' : 'YAML syntax error';

  // A text too large, too deep or too long to read at all is refused before any parser runs.
  const screen = screenText(text, isJson);
  const refusal = screen.refusal;
  if (refusal) {
    push('error', refusal, '', refusal.code, refusal.message);
    return { sections: [], messages, batch: null, entries: [] };
  }

  let syntaxErrors = 0;
  let documents = 0;
  /** One document's data: screened, then read as a section or a batch. */
  const readData = (data: unknown, locate: Locate): void => {
    documents++;
    // Data larger or deeper than any section file is refused before the schema sees it.
    const screened = screenData(data);
    if (screened.refusal) {
      const r = screened.refusal;
      push('error', locate(r.path, r.key), pathText(r.path), r.code, r.message);
      return;
    }
    readDocument(locate, data, reading, screened.issues);
  };

  // Valid JSON is read by JSON.parse and located by an index of its text; anything else (YAML,
  // and JSON that is broken or names a setting twice) by the YAML parser, which says what is
  // wrong with it.
  const json = isJson ? readJson(text, screen.values) : null;
  if (json) {
    if (json.data !== null) readData(json.data, (path, atKey) => json.index.locate(path, atKey));
  } else {
    // A JSON file must be JSON: YAML would accept more (comments, trailing commas).
    const jsonError = isJson ? jsonSyntaxError(text) : null;
    const docs = parseAllDocuments(text, {
      lineCounter: counter,
      prettyErrors: false,
      ...(isJson ? { schema: 'json' as const } : { merge: true }),
    });
    for (const doc of docs) {
      if (reading.full()) {
        reading.stop(locateInDocument(doc, counter, []));
        break;
      }
      // The parser's messages about a document concern the sections it gives.
      const before = messages.length;
      const first = entries.length;
      for (const e of doc.errors) {
        syntaxErrors++;
        const { line, col } = counter.linePos(e.pos[0]);
        if (e.code === 'DUPLICATE_KEY') {
          const written = (/^[^:\n]*/.exec(text.slice(e.pos[0], e.pos[0] + 200))?.[0] ?? '').trim();
          const key = written.length > 60 ? `${written.slice(0, 40)}…` : written;
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
      if (data !== null && data !== undefined) {
        readData(data, (path, atKey) => locateInDocument(doc, counter, path, atKey));
      }
      own();
    }
    if (jsonError && syntaxErrors === 0) {
      syntaxErrors++;
      push('error', jsonError.location, '', 'syntax', jsonError.message);
    }
  }
  if (stopped) {
    const { location, entries: unread } = stopped;
    const message = `more than ${count(INPUT_LIMITS.errors)} errors: the rest of the file is not read; correct those above and read it again`;
    concerns.note(push('error', location, '', 'not-read', message), unread);
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
        `the id ${quote(e.id)} is already used at line ${first.line}`,
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

/** Where a path into a document's data is written (see locateInDocument). */
type Locate = (path: readonly PathKey[], atKey?: boolean) => Location;

/**
 * A valid JSON text that names no setting twice in a group, read, with the index that locates
 * its parts; null for any other text. `values`: the entries screenText counted in the text
 * (more than the data holds when a group names a setting twice: JSON.parse keeps the last).
 */
function readJson(text: string, values: number): { data: unknown; index: JsonIndex } | null {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    return null;
  }
  return countValues(data) === values ? { data, index: new JsonIndex(text) } : null;
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

/** A value as a message shows it: as written, texts shortened, lists and groups by name. */
const written = (value: unknown): string =>
  typeof value === 'string' || (value !== null && typeof value === 'object')
    ? quote(value)
    : JSON.stringify(value);

/** Whether a list of issues says that a part is larger than its schema allows. */
const tooLarge = (issues: readonly Issue[]): boolean =>
  issues.some((i) => i.severity === 'error' && (i.code === 'too-many' || i.code === 'too-long'));

/**
 * One document (YAML or JSON): a section or a batch. `screened`: the errors the screen of its data
 * found (characters no text may hold).
 */
function readDocument(locate: Locate, data: unknown, reading: Reading, screened: Issue[]): void {
  const { push, concerns, entries } = reading;
  // A section document's messages concern its section (noted once its entry exists).
  const reported: Message[] = [];
  const report = (issue: Issue): void => {
    if (reading.full()) return reading.stop(locate(issue.path, issue.key));
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
    const what = written(data);
    report({
      severity: 'error',
      path: [],
      code: 'not-a-section',
      message: `expected a section (a group of settings starting with format: ${SECTION_FORMAT}), got ${what}`,
    });
    return;
  }
  if (data.format === BATCH_FORMAT) {
    readBatch(data, locate, reading, screened);
    return;
  }

  // Values written with their unit (`cohesion: 250 psf`) become numbers in the file's units.
  const withUnits = readValuesWithUnits(data, 'section', unitsOf(data));
  const issues: Issue[] = [...screened, ...withUnits.issues];
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
      message: `${written(data.format)} is not a format Scarpline reads: use ${SECTION_FORMAT} (a section) or ${BATCH_FORMAT} (a corridor batch)`,
    });
  }
  // The format is reported above in words of its own; validate the rest as a section.
  const read = withUnits.data;
  const schemaIssues = validateAgainstSchema(
    { ...read, format: SECTION_FORMAT },
    'section',
    unitsOf(read),
  );
  issues.push(...schemaIssues);
  // The checks of a section's geometry wait until it is no larger than the schema allows.
  if (!tooLarge(schemaIssues)) issues.push(...checkSection(read));
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

/**
 * The values a batch's sections hold once each is given the template, and the strata and water
 * (cases' water too) given by depth a copy of its ground each: counted before any section is
 * made.
 */
function expandedValues(batch: Record<string, unknown>, items: readonly unknown[]): number {
  const template = isRecord(batch.template) ? batch.template : {};
  const shared = countValues(template);
  const byDepth = (water: unknown): number =>
    isRecord(water) && water.depth !== undefined ? 1 : 0;
  /** The water levels of cases given by depth (a case's water, the water after a drawdown). */
  const caseLayers = (cases: unknown): number =>
    Array.isArray(cases)
      ? cases.reduce(
          (n: number, c: unknown) =>
            isRecord(c)
              ? n + byDepth(c.water) + (isRecord(c.drawdown) ? byDepth(c.drawdown.after) : 0)
              : n,
          0,
        )
      : 0;
  const templateCaseLayers = caseLayers(template.cases);
  let total = 0;
  for (const item of items) {
    if (!isRecord(item)) continue;
    const strata = Array.isArray(item.strata) ? item.strata : template.strata;
    const water = item.water !== undefined ? item.water : template.water;
    const layers =
      (Array.isArray(strata)
        ? strata.filter((s) => isRecord(s) && s.depth !== undefined).length
        : 0) +
      byDepth(water) +
      templateCaseLayers +
      caseLayers(item.cases);
    total += shared + countValues(item) + layers * countValues(item.ground);
  }
  return total;
}

/** A corridor batch: its own schema and checks, then every expanded section. */
function readBatch(
  document: Record<string, unknown>,
  locate: Locate,
  reading: Reading,
  screened: Issue[],
): void {
  const { push, concerns, entries } = reading;
  const units = unitsOf(document);
  const batchId = typeof document.id === 'string' ? document.id : String(document.id);
  reading.batches.push({
    id: batchId,
    title: typeof document.title === 'string' ? document.title : null,
    units,
    file: reading.fileName,
    ...locate(['id']),
  });

  // The number of sections first: a batch of too many is read no further.
  const items = Array.isArray(document.sections) ? (document.sections as unknown[]) : [];
  if (items.length > MAX_SECTIONS) {
    const message = `has ${count(items.length)} sections; a batch holds at most ${count(MAX_SECTIONS)}: split the corridor into several batches`;
    push('error', locate(['sections']), 'sections', 'too-many', message);
    return;
  }
  const size = expandedValues(document, items);
  if (size > INPUT_LIMITS.expandedValues) {
    const message = `the sections hold ${count(size)} values once each is given the template (and each stratum or water level given by depth a copy of its ground); at most ${count(INPUT_LIMITS.expandedValues)} are read: split the corridor into several batches, or give fewer points`;
    push('error', locate(['sections']), 'sections', 'too-many-values', message);
    return;
  }

  // Values written with their unit (`depth: 12 ft`) become numbers in the batch's units.
  const { data: batch, issues: unitIssues } = readValuesWithUnits(document, 'batch', units);
  const sections = Array.isArray(batch.sections) ? (batch.sections as unknown[]) : [];

  // An entry per item of the batch, in order: its id when it gives a number station.
  const entryOf: number[] = sections.map((item, i) => {
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
    ...screened,
    ...unitIssues,
    ...validateAgainstSchema(batch, 'batch', units),
    ...checkBatch(batch),
  ];
  const reported = new Map<string, Message>();
  /** Reports an issue (`always`: even past the errors read, for a template's). */
  const report = (
    issue: Issue,
    about: readonly number[],
    path: PathKey[] = issue.path,
    prefix = '',
    always = false,
  ): void => {
    const location = locate(path, issue.key);
    if (reading.full() && !always) return reading.stop(location, about);
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
  const errorAt = new Set(errorPaths.map((e) => JSON.stringify(e)));
  const under = (path: PathKey[]): boolean => {
    for (let n = 0; n <= path.length; n++) {
      if (errorAt.has(JSON.stringify(path.slice(0, n)))) return true;
    }
    return false;
  };
  // A batch error spoils the sections it concerns: one item, or all of them.
  const spoilsAll = errorPaths.some((e) => e[0] !== 'sections' || e.length < 2);
  const spoiled = new Set(errorPaths.map((e) => e[1]));
  const spoils = (index: number): boolean => spoilsAll || spoiled.has(index);
  // A part larger than the schema allows is not made into sections: the template (then none
  // is), or one item.
  const oversized = batchIssues.filter(
    (i) => i.severity === 'error' && (i.code === 'too-many' || i.code === 'too-long'),
  );
  const skipAll = oversized.some((i) => i.path[0] !== 'sections' || typeof i.path[1] !== 'number');
  const skipped = new Set(oversized.map((i) => i.path[1]));
  const expanded = skipAll
    ? []
    : expandSections({
        ...batch,
        sections: sections.map((item, i) => (skipped.has(i) ? null : item)),
      });
  // Messages that come from the template are said once when they hold for every section, and
  // with the stations they concern otherwise.
  const fromTemplate = new Map<
    string,
    { issue: Issue; path: PathKey[]; stations: number[]; about: number[] }
  >();
  let made = 0;
  let stopped = false;
  for (const section of expanded) {
    const own = entryOf[section.index];
    if (reading.full()) {
      stopped = true;
      // this section and every later one stay unread
      const later = entryOf.filter((_, i) => i >= section.index && !skipped.has(i));
      reading.stop(entries[own], later);
      break;
    }
    made++;
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
        if (issue.severity === 'error') reading.tally();
      } else report(issue, [own], path);
    }
    const valid = !spoils(section.index) && !issues.some((i) => i.severity === 'error');
    entries[own].section = valid
      ? normaliseSection(rawSectionToSi(section.data as unknown as RawSection))
      : null;
  }
  // (said however many errors came before: each is one message for many sections)
  for (const { issue, path, stations, about } of fromTemplate.values()) {
    if (stations.length === made && !stopped) report(issue, about, path, '', true);
    else {
      const shown = stations.slice(0, 5).join(', ');
      const more = stations.length > 5 ? ` and ${stations.length - 5} more` : '';
      const word = stations.length === 1 ? 'station' : 'stations';
      report(issue, about, path, `at ${word} ${shown}${more}: `, true);
    }
  }
}
