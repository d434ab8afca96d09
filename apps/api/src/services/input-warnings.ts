/**
 * Which sections each warning of the input checks concerns. The core reports the messages of a
 * file together, located in that file; a section keeps the warnings about it:
 *
 * - a section document: every message located in that document;
 * - a corridor batch: a message at `sections[i]…` concerns the section made from item i; any
 *   other message of the batch (its template, its units, the document itself) concerns every
 *   section of the batch, unless the core says it holds at some stations only (`at stations
 *   1000, 1020 and 3 more: …`). Those are given to the sections whose item, checked alone with
 *   the rest of the batch, gives the same message (the core names five stations at most);
 * - a GeoJSON corridor: the same, with `features[k]…` for the section made from feature k;
 * - a message located in no document of its file concerns every section of the file.
 */
import { LineCounter, parseAllDocuments, stringify } from 'yaml';
import {
  parseGeoJsonCorridor,
  parseSections,
  type Message,
  type ParsedSections,
} from '@scarpline/core';

/** Section id → the warnings about it, in the order of the file. */
export type SectionWarnings = Record<string, Message[]>;

type ParsedCorridor = ReturnType<typeof parseGeoJsonCorridor>;

const BATCH_FORMAT = 'scarpline-batch/1';
/** How the core starts a message from a batch's template that holds at some stations only. */
const SOME_STATIONS = /^at stations? /;

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** A part of a file that gives sections: a section document, a corridor batch, a corridor. */
interface Part {
  ids: string[];
  /** The section of the item a message's path names (`sections[3]…`); undefined for none. */
  item(path: string): string | undefined;
  /** The messages of the part cut down to the one item of section `id`. */
  alone(id: string): Message[];
}

function add(out: SectionWarnings, id: string, m: Message): void {
  (out[id] ??= []).push(m);
}

/** The same message as the one of an item checked alone, where the core said its stations. */
function sameAtStations(m: Message, alone: Message): boolean {
  return (
    alone.severity === m.severity &&
    alone.code === m.code &&
    alone.path === m.path &&
    m.message.endsWith(`: ${alone.message}`)
  );
}

function assign(out: SectionWarnings, part: Part, m: Message): void {
  const own = part.item(m.path);
  if (own !== undefined && part.ids.includes(own)) return add(out, own, m);
  let ids = part.ids;
  if (ids.length > 1 && SOME_STATIONS.test(m.message)) {
    const some = ids.filter((id) => part.alone(id).some((a) => sameAtStations(m, a)));
    // Never lose a warning: when no item alone gives it, it stays with the whole part.
    if (some.length > 0) ids = some;
  }
  for (const id of ids) add(out, id, m);
}

/** A list of items, each giving one section (`idOf(index)`, null for none). */
function itemsPart(
  count: number,
  pathPattern: RegExp,
  idOf: (index: number) => string | null,
  valid: Set<string>,
  aloneMessages: (index: number) => Message[],
): Part {
  const indexOf = new Map<string, number>();
  for (let i = 0; i < count; i++) {
    const id = idOf(i);
    if (id !== null && valid.has(id)) indexOf.set(id, i);
  }
  const cache = new Map<number, Message[]>();
  return {
    ids: [...indexOf.keys()],
    item(path) {
      const m = pathPattern.exec(path);
      return m ? (idOf(Number(m[1])) ?? undefined) : undefined;
    },
    alone(id) {
      const i = indexOf.get(id);
      if (i === undefined) return [];
      if (!cache.has(i)) cache.set(i, aloneMessages(i));
      return cache.get(i) ?? [];
    },
  };
}

function batchPart(batch: Record<string, unknown>, valid: Set<string>): Part {
  const items = Array.isArray(batch.sections) ? (batch.sections as unknown[]) : [];
  const idOf = (i: number): string | null => {
    const item = items[i];
    return isRecord(item) && typeof item.station === 'number'
      ? `${String(batch.id)}@${item.station}`
      : null;
  };
  return itemsPart(
    items.length,
    /^sections\[(\d+)\]/,
    idOf,
    valid,
    (i) => parseSections(stringify({ ...batch, sections: [items[i]] }), 'alone.yaml').messages,
  );
}

/**
 * The warnings of a file read by parseSections (section documents and corridor batches, YAML
 * or JSON), given to the sections they concern.
 */
export function fileWarnings(text: string, fileName: string, parsed: ParsedSections) {
  const out: SectionWarnings = {};
  const warnings = parsed.messages.filter((m) => m.severity === 'warning');
  if (warnings.length === 0) return out;
  const valid = new Set(parsed.sections.map((s) => s.id));
  // Read as the core reads it, so that the documents and their data are the same.
  const counter = new LineCounter();
  const docs = parseAllDocuments(text, {
    lineCounter: counter,
    prettyErrors: false,
    ...(/\.json$/i.test(fileName) ? { schema: 'json' as const } : { merge: true }),
  });
  const parts: { start: number; end: number; part: Part }[] = [];
  for (const doc of Array.from(docs)) {
    let data: unknown;
    try {
      data = doc.toJS({ maxAliasCount: 1000 });
    } catch {
      continue;
    }
    if (!isRecord(data) || !doc.range) continue;
    let part: Part | null = null;
    if (data.format === BATCH_FORMAT) part = batchPart(data, valid);
    else if (typeof data.id === 'string' && valid.has(data.id)) {
      part = { ids: [data.id], item: () => undefined, alone: () => [] };
    }
    if (part) parts.push({ start: doc.range[0], end: doc.range[2], part });
  }
  const every = parts.flatMap((p) => p.part.ids);
  for (const m of warnings) {
    const offset = (counter.lineStarts[m.line - 1] ?? 0) + m.column - 1;
    const at = parts.find((p) => offset >= p.start && offset <= p.end);
    if (at) assign(out, at.part, m);
    else for (const id of every) add(out, id, m);
  }
  return out;
}

/** The warnings of a GeoJSON corridor (without a header file), given to their sections. */
export function corridorWarnings(text: string, fileName: string, parsed: ParsedCorridor) {
  const out: SectionWarnings = {};
  const warnings = parsed.messages.filter((m) => m.severity === 'warning');
  if (warnings.length === 0) return out;
  const valid = new Set(parsed.sections.map((s) => s.id));
  const data = JSON.parse(text) as Record<string, unknown>;
  const features = Array.isArray(data.features) ? (data.features as unknown[]) : [];
  const sectionOf = new Map(parsed.features.map((f) => [f.index, f.sectionId]));
  const idOf = (i: number): string | null => sectionOf.get(i) ?? null;
  const part = itemsPart(
    features.length,
    /^features\[(\d+)\]/,
    idOf,
    valid,
    (i) =>
      parseGeoJsonCorridor(JSON.stringify({ ...data, features: [features[i]] }), fileName).messages,
  );
  for (const m of warnings) assign(out, part, m);
  return out;
}
