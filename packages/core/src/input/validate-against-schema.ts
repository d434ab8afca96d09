import type { Options, ValidateFunction } from 'ajv/dist/2020';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import type { UnitSystem } from '../model/types';
import { translateSchemaError } from './translate-schema-error';
import type { Issue, PathKey } from './types';
import { quantityAt } from './values-with-units';
import { pathText } from './words';

/**
 * The ajv options of the section and batch validators: strict, except two ajv-only rules that
 * flag standard 2020-12 idioms used on purpose (`required` inside if/else branches, and
 * prefixItems followed by an open `items`). scripts/compile-validators.js compiles the
 * validators ahead of time with these same options.
 */
export const AJV_OPTIONS: Readonly<Options> = Object.freeze({
  allErrors: true,
  verbose: true,
  strict: true,
  strictRequired: false,
  strictTuples: false,
  allowUnionTypes: true,
  strictNumbers: true,
});

/**
 * A fingerprint of the section and batch schemas (32-bit FNV-1a of their JSON, in hex). The
 * validators compiled ahead of time carry the fingerprint of the schemas they were compiled
 * from, so that a build older than the schemas is never used.
 *
 * @example schemaFingerprint() // → 'c3a1f09e'
 */
export function schemaFingerprint(): string {
  const text = JSON.stringify([sectionSchema, batchSchema]);
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash.toString(16).padStart(8, '0');
}

interface Validators {
  section: ValidateFunction;
  batch: ValidateFunction;
}

// The CommonJS build's `require`, declared here so that the core needs no Node types.
declare const require: (id: string) => unknown;

/** Written by scripts/compile-validators.js into dist/input; absent from the sources. */
const BUILT_VALIDATORS = './schema-validators';

/**
 * The validators compiled ahead of time into dist/input/schema-validators.js by the build
 * (scripts/compile-validators.js; about 10 ms to load instead of about 250 ms to compile), or
 * null when they cannot be used: absent (the sources run under Jest, a build without that
 * step, a bundle for the browser) or compiled from other schemas. Then ajv compiles them.
 */
function precompiled(): Validators | null {
  let built: Partial<Validators> & { fingerprint?: string };
  try {
    // a name the bundlers do not follow: the file exists only in the Node build
    built = require(BUILT_VALIDATORS) as typeof built;
  } catch {
    return null;
  }
  if (built.fingerprint !== schemaFingerprint() || !built.section || !built.batch) return null;
  return { section: built.section, batch: built.batch };
}

/** The validator of one schema compiled now with ajv (loaded here, on first use). */
function compileNow(schema: 'section' | 'batch'): ValidateFunction {
  const { default: Ajv2020 } = require('ajv/dist/2020') as typeof import('ajv/dist/2020');
  const ajv = new Ajv2020({ ...AJV_OPTIONS });
  ajv.addSchema(sectionSchema);
  if (schema === 'batch') return ajv.compile(batchSchema);
  const section = ajv.getSchema(sectionSchema.$id);
  if (!section) throw new Error('section schema did not compile');
  return section;
}

let built: Validators | null | undefined;
const compiled: Partial<Validators> = {};

function validator(schema: 'section' | 'batch'): ValidateFunction {
  if (built === undefined) built = precompiled();
  if (built) return built[schema];
  return (compiled[schema] ??= compileNow(schema));
}

/**
 * Validates data against the section or the batch schema and returns every error in plain
 * words (not ajv's), each with its path into the data.
 *
 * @example validateAgainstSchema({ format: 'scarpline/1' }, 'section', 'si')
 * // → [{ path: [], code: 'missing', message: 'id is missing', … }, …]
 */
export function validateAgainstSchema(
  data: unknown,
  schema: 'section' | 'batch',
  units: UnitSystem,
): Issue[] {
  const validate = validator(schema);
  if (validate(data)) return [];
  const issues: Issue[] = [];
  const said = new Set<string>();
  const quantity = (path: readonly PathKey[]) => quantityAt(schema, path);
  for (const error of validate.errors ?? []) {
    const issue = translateSchemaError(error, data, units, quantity);
    // a quantity's type is checked where it is used and in its definition: say it once
    const key = issue && [pathText(issue.path), issue.code, issue.message].join('|');
    if (issue && key && !said.has(key)) {
      said.add(key);
      issues.push(issue);
    }
  }
  // A value of the wrong type needs no further words about its range.
  const wrongType = new Set(
    issues.filter((i) => i.code === 'wrong-type').map((i) => pathText(i.path)),
  );
  return issues.filter((i) => i.code === 'wrong-type' || !wrongType.has(pathText(i.path)));
}
