/** Validation of submitted files: ajv with the shared schemas, located messages from the core. */
import Ajv2020 from 'ajv/dist/2020';
import {
  formatMessage,
  isGeoJsonCorridor,
  parseGeoJsonCorridor,
  parseSections,
  type Message,
  type Section,
} from '@scarpline/core';
import { parse as parseYaml } from 'yaml';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import { invalid } from '../errors';
import { corridorWarnings, fileWarnings, type SectionWarnings } from './input-warnings';

const ajv = new Ajv2020({ allErrors: true, strict: false });
ajv.addSchema(sectionSchema);
const validateBatch = ajv.compile(batchSchema);

export interface InputFile {
  name: string;
  text: string;
}

export interface Parsed {
  sections: Section[];
  warnings: Message[];
  /** The batch id and title when a batch file or corridor was given. */
  name: string;
  title: string | null;
  /** Section id → the line geometry of its GeoJSON corridor feature, when there was one. */
  geometries?: Record<string, object>;
  /** Section id → the warnings that concern it (see input-warnings.ts). */
  sectionWarnings: SectionWarnings;
}

/** A located message as the API gives it: the message and its one-line `text`. */
export function messageView(m: Message) {
  return { ...m, text: formatMessage(m) };
}

function locatedError(messages: Message[]) {
  const errors = messages.filter((m) => m.severity === 'error');
  return invalid(`${errors.length} error(s) in the input.`, { errors: errors.map(messageView) });
}

/** A JSON body that must be a corridor batch: ajv first, then the core for located messages. */
export function parseBatchBody(body: unknown, rawText: string | undefined): Parsed {
  const text = rawText ?? JSON.stringify(body, null, 2);
  const ok = validateBatch(body);
  const parsed = parseSections(text, 'batch.json');
  const errors = parsed.messages.filter((m) => m.severity === 'error');
  if (!ok || errors.length > 0) {
    if (errors.length > 0) throw locatedError(parsed.messages);
    // The schema said no but the core located nothing: report ajv's paths.
    throw invalid('The batch does not match batch.schema.json.', {
      errors: (validateBatch.errors ?? []).map((e) => ({
        severity: 'error',
        file: 'batch.json',
        path: e.instancePath,
        code: e.keyword,
        message: e.message ?? e.keyword,
        text: `batch.json ${e.instancePath} ${e.message ?? ''}`,
      })),
    });
  }
  const b = body as { id: string; title?: string };
  return {
    sections: parsed.sections,
    warnings: parsed.messages,
    name: b.id,
    title: b.title ?? null,
    sectionWarnings: fileWarnings(text, 'batch.json', parsed),
  };
}

/** The id and title of a batch file (YAML or JSON), or null when it is not a batch. */
function batchHeader(text: string): { id: string; title: string | null } | null {
  try {
    const doc: unknown = parseYaml(text);
    if (doc && typeof doc === 'object' && !Array.isArray(doc)) {
      const d = doc as Record<string, unknown>;
      if (d.format === 'scarpline-batch/1' && typeof d.id === 'string') {
        return { id: d.id, title: typeof d.title === 'string' ? d.title : null };
      }
    }
  } catch {
    // several documents or a syntax error: the core has reported it already
  }
  return null;
}

/** Uploaded files: a batch (YAML/JSON), a GeoJSON corridor, or many section files. */
export function parseFiles(files: InputFile[]): Parsed {
  const sections: Section[] = [];
  const messages: Message[] = [];
  let name: string | null = null;
  let title: string | null = null;
  const geometries: Record<string, object> = {};
  const sectionWarnings: SectionWarnings = {};
  for (const f of files) {
    if (isGeoJsonCorridor(f.text)) {
      const c = parseGeoJsonCorridor(f.text, f.name);
      sections.push(...c.sections);
      messages.push(...c.messages);
      Object.assign(sectionWarnings, corridorWarnings(f.text, f.name, c));
      name ??= c.batchId;
      for (const feature of c.features) {
        const g = feature.geometry;
        if (feature.sectionId && g && typeof g === 'object') geometries[feature.sectionId] = g;
      }
    } else {
      const p = parseSections(f.text, f.name);
      sections.push(...p.sections);
      messages.push(...p.messages);
      Object.assign(sectionWarnings, fileWarnings(f.text, f.name, p));
      const head = batchHeader(f.text);
      if (head) {
        name ??= head.id;
        title ??= head.title;
      }
    }
  }
  if (messages.some((m) => m.severity === 'error')) throw locatedError(messages);
  if (sections.length === 0) throw invalid('No sections in the upload.');
  const ids = new Set<string>();
  for (const s of sections) {
    if (ids.has(s.id)) throw invalid(`Section id ${s.id} appears twice in the upload.`);
    ids.add(s.id);
  }
  return {
    sections,
    warnings: messages,
    name: name ?? sections[0].id,
    title,
    geometries,
    sectionWarnings,
  };
}

/** One section document (a re-run with edits), with the warnings of the checks about it. */
export function parseSectionText(
  text: string,
  fileName: string,
): { section: Section; warnings: Message[] } {
  const p = parseSections(text, fileName);
  if (p.messages.some((m) => m.severity === 'error')) throw locatedError(p.messages);
  if (p.sections.length !== 1) throw invalid('Send exactly one section.');
  return { section: p.sections[0], warnings: p.messages.filter((m) => m.severity === 'warning') };
}
