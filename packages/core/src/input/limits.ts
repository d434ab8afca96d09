import { batchSchema } from '@scarpline/schemas';
import { isRecord } from './guards';

/**
 * The most the core reads of one input file, whatever its shape: what keeps a file from costing
 * more time or memory than a section file can need. The limits of each setting (points of a
 * polyline, sections of a batch, characters of a title…) are in the schemas
 * (schemas/section.schema.json, schemas/batch.schema.json: maxItems, maxLength,
 * maxProperties); these are the ones that hold for every part of a file, and every limit of
 * the schemas lies within them (test/input-limits.test.ts checks it).
 */
export const INPUT_LIMITS = Object.freeze({
  /** Characters of one file. */
  characters: 8_000_000,
  /** Levels of lists and groups inside one another (a section file needs about eight). */
  depth: 64,
  /** Entries of one list, or settings of one group. */
  entries: 2000,
  /** Entries and settings of all the lists and groups of one file together. */
  values: 200_000,
  /**
   * Values of a batch's sections once each is given the template (and a copy of its ground
   * for each stratum or water level given by depth): what the checks of its sections read.
   */
  expandedValues: 2_000_000,
  /** Characters of one text (a value or a name). */
  textLength: 10_000,
  /** Messages a file reports; the rest are counted in one message more. */
  messages: 200,
  /** Errors read in one file: then the rest of it is not checked (one message says so). */
  errors: 1000,
  /** Characters of a word that a "did you mean" suggestion is looked for. */
  suggestion: 32,
  /** Characters of a value with its unit (`250 psf`); a longer text is not read as one. */
  valueWithUnit: 100,
});

/** A number for the messages about limits: digits in groups of three (`200 000`). */
export function count(n: number): string {
  return String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/** A number the schema gives at a path (a limit), read once. */
function schemaNumber(schema: unknown, path: readonly string[]): number {
  let at: unknown = schema;
  for (const key of path) at = isRecord(at) ? at[key] : undefined;
  if (typeof at !== 'number') throw new Error(`the schema has no number at ${path.join('/')}`);
  return at;
}

/** The most sections one batch holds (and features one GeoJSON corridor): batch.schema.json. */
export const MAX_SECTIONS = schemaNumber(batchSchema, ['properties', 'sections', 'maxItems']);
