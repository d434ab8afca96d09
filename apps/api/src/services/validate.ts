/**
 * Validation of submitted files by the core's reading of them — its screens, the shared schemas,
 * its checks: located messages, the batch header, and the sections each message concerns. Pure
 * (no database): the intake pool runs these off the main thread (intake/thread.ts).
 */
import {
  capMessages,
  formatMessage,
  isGeoJsonCorridor,
  isLandXml,
  parseGeoJsonCorridor,
  parseLandXmlCorridor,
  parseSections,
  readSectionDocument,
  type Message,
} from '@scarpline/core/input';
import type { Section, UnitSystem } from '@scarpline/core/model';
import { invalid, Problem } from '../errors';

export interface InputFile {
  name: string;
  text: string;
}

/**
 * A message kept with the one section it concerns: as the core gives it, without the ids of
 * the sections (the section that keeps it is the one).
 */
export type SectionMessage = Omit<Message, 'sections'>;

/** Section id → the warnings of the input checks that concern it, in the order of the file. */
export type SectionWarnings = Record<string, Message[]>;

/** A message as a section keeps it. */
export function sectionMessage(m: Message): SectionMessage {
  const { sections: _ids, ...kept } = m;
  return kept;
}

export interface Parsed {
  sections: Section[];
  warnings: Message[];
  /** The batch id and title when a batch file or corridor was given. */
  name: string;
  title: string | null;
  /** Section id → the line geometry of its GeoJSON corridor feature, when there was one. */
  geometries?: Record<string, object>;
  /** Section id → the properties of its GeoJSON corridor feature, when there was one. */
  featureProperties?: Record<string, Record<string, unknown>>;
  /** Section id → the warnings that concern it (the ids the core gives each message). */
  sectionWarnings: SectionWarnings;
}

/**
 * A located message as the API gives it: the message and its one-line `text` (and, in a
 * submission's answer, the ids of the sections it concerns).
 */
export function messageView(m: Message | SectionMessage) {
  return { ...m, text: formatMessage(m) };
}

function locatedError(messages: Message[]) {
  const errors = messages.filter((m) => m.severity === 'error');
  const n = errors.length;
  return invalid(`${n} ${n === 1 ? 'error' : 'errors'} in the input.`, {
    errors: errors.map(messageView),
  });
}

/** The warnings given to the sections they concern: each message names its sections' ids. */
function warningsBySection(messages: readonly Message[]): SectionWarnings {
  const out: SectionWarnings = {};
  for (const m of messages) {
    if (m.severity !== 'warning') continue;
    for (const id of m.sections) (out[id] ??= []).push(m);
  }
  return out;
}

/**
 * A JSON body that must be a corridor batch, as its text: read by the core alone (its screens
 * of the text and the data, the schema, its checks), so that nothing walks the body before
 * the core has bounded it. A body that is not JSON is 400 (Malformed JSON), with the place.
 */
export function parseBatchBody(text: string): Parsed {
  const parsed = parseSections(text, 'batch.json');
  const errors = parsed.messages.filter((m) => m.severity === 'error');
  if (errors.some((m) => m.code === 'syntax')) {
    throw new Problem(400, 'Malformed JSON', formatMessage(errors[0]), {
      errors: errors.map(messageView),
    });
  }
  if (errors.length > 0) throw locatedError(parsed.messages);
  if (!parsed.batch) {
    throw invalid(
      'Send a corridor batch (format scarpline-batch/1) here; section files are uploaded to /projects/{id}/uploads.',
    );
  }
  return {
    sections: parsed.sections,
    warnings: parsed.messages,
    name: parsed.batch.id,
    title: parsed.batch.title,
    sectionWarnings: warningsBySection(parsed.messages),
  };
}

/** Whether a YAML/JSON file is corridor settings: a corridor batch without its sections. */
function isCorridorSettings(f: InputFile): boolean {
  const p = parseSections(f.text, f.name);
  return (
    p.batch !== null &&
    p.messages.some((m) => m.code === 'missing' && m.path === '' && /^sections\b/.test(m.message))
  );
}

/**
 * Uploaded files: a batch (YAML/JSON), a GeoJSON corridor, LandXML cross-sections with their
 * corridor settings (the one YAML/JSON file of the upload that is a corridor batch without its
 * sections), or many section files.
 */
export function parseFiles(uploaded: InputFile[]): Parsed {
  let files = uploaded;
  let header: { text: string; fileName: string } | undefined;
  if (files.some((f) => isLandXml(f.text))) {
    const settings = files.filter(
      (f) => !isLandXml(f.text) && !isGeoJsonCorridor(f.text) && isCorridorSettings(f),
    );
    if (settings.length > 1)
      throw invalid(
        `LandXML cross-sections take one file of corridor settings (id, units, template, surfaces); this upload has ${settings.length}: ${settings.map((f) => f.name).join(', ')}.`,
      );
    if (settings.length === 1) {
      header = { text: settings[0].text, fileName: settings[0].name };
      files = files.filter((f) => f !== settings[0]);
    }
  }
  const sections: Section[] = [];
  const messages: Message[] = [];
  let name: string | null = null;
  let title: string | null = null;
  const geometries: Record<string, object> = {};
  const featureProperties: Record<string, Record<string, unknown>> = {};
  for (const f of files) {
    const corridor = isGeoJsonCorridor(f.text) ? parseGeoJsonCorridor(f.text, f.name) : null;
    const landXml = isLandXml(f.text) ? parseLandXmlCorridor(f.text, f.name, header) : null;
    const p = corridor ?? landXml ?? parseSections(f.text, f.name);
    sections.push(...p.sections);
    messages.push(...p.messages);
    if (p.batch) {
      name ??= p.batch.id;
      title ??= p.batch.title;
    }
    // A GeoJSON corridor's sections keep their feature's line and attributes for the exports.
    for (const e of corridor?.entries ?? []) {
      if (!e.id) continue;
      const { geometry, line, properties } = e.feature;
      // a line in the corridor's named system is kept with it (the exports write it in WGS 84)
      if (line) geometries[e.id] = line;
      else if (geometry && typeof geometry === 'object') geometries[e.id] = geometry;
      featureProperties[e.id] = properties;
    }
  }
  // Each file's messages are capped by the core; those of many files together are capped here.
  if (messages.some((m) => m.severity === 'error')) throw locatedError(capMessages(messages));
  if (sections.length === 0) throw invalid('No sections in the upload.');
  const ids = new Set<string>();
  for (const s of sections) {
    if (ids.has(s.id)) throw invalid(`Section id ${s.id} appears twice in the upload.`);
    ids.add(s.id);
  }
  return {
    sections,
    warnings: capMessages(messages),
    name: name ?? sections[0].id,
    title,
    geometries,
    featureProperties,
    sectionWarnings: warningsBySection(messages),
  };
}

/**
 * An edited section document (SI, as the core's sectionDocument writes it), read back as a
 * section reported in `units`; with the warnings of the checks about it. Throws 422 with the
 * errors located in the document as written (`edited-section.json`).
 */
export function readEditedSection(
  doc: unknown,
  units: UnitSystem,
): { section: Section; warnings: Message[] } {
  const read = readSectionDocument(doc, 'edited-section.json', units);
  if (read.messages.some((m) => m.severity === 'error')) throw locatedError(read.messages);
  if (!read.section) throw invalid('Send exactly one section.');
  return { section: read.section, warnings: read.messages.filter((m) => m.severity === 'warning') };
}
