import type { ErrorObject } from 'ajv/dist/2020';
import type { UnitSystem } from '../model/types';
import { UNIT_LABELS, type QuantityKind } from '../model/units';
import { isValueWithUnit, quantityWords } from '../model/value-with-unit';
import { isFormerIntersliceSetting, renamedWords } from '../model/renamed';
import type { Issue, PathKey } from './types';
import { closest, listWords, num, quote, quoteText, unitSuffix } from './words';

/** The path of a JSON pointer, with array indices as numbers (decided from the data). */
function pointerToPath(pointer: string, root: unknown): PathKey[] {
  if (pointer === '') return [];
  const path: PathKey[] = [];
  let at: unknown = root;
  for (const raw of pointer.slice(1).split('/')) {
    const key = raw.replace(/~1/g, '/').replace(/~0/g, '~');
    if (Array.isArray(at)) {
      const index = Number(key);
      path.push(index);
      at = at[index];
    } else {
      path.push(key);
      at = at !== null && typeof at === 'object' ? (at as Record<string, unknown>)[key] : undefined;
    }
  }
  return path;
}

const TYPE_WORDS: Record<string, string> = {
  number: 'a number',
  integer: 'a whole number',
  string: 'text',
  array: 'a list',
  object: 'a group of settings',
  boolean: 'true or false',
  null: 'nothing',
};

/** What a value is, for "expected …, got …". */
function describeValue(value: unknown): string {
  if (value === null || value === undefined) return 'nothing';
  if (typeof value === 'string') return `the text ${quoteText(value)}`;
  if (typeof value === 'number') {
    return Number.isFinite(value) ? num(value) : `${String(value)} (not a finite number)`;
  }
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a group of settings';
  // eslint-disable-next-line @typescript-eslint/no-base-to-string -- a boolean: all that is left of YAML or JSON data
  return String(value);
}

/** What the schema wanted, in words, by the title of the schema (a point, a polyline…). */
function expectedWords(types: string[], title: unknown): string {
  if (title === 'point') return 'a point [x, y]';
  if (title === 'polyline') return 'a polyline [[x, y], ...]';
  if (title === 'boundary') return 'an elevation or a polyline [[x, y], ...]';
  return listWords(types.map((t) => TYPE_WORDS[t] ?? t)).replace(/ and (?=[^,]*$)/, ' or ');
}

/** What a quantity setting takes: a number in the file's unit or a value with its unit. */
function quantityExpected(kind: QuantityKind, units: UnitSystem): string {
  const { noun, examples } = quantityWords(kind);
  return `${noun} (a number in ${UNIT_LABELS[units][kind]}, or a value with its unit such as ${examples})`;
}

/** Hints that make a "missing" message useful. */
const MISSING_HINTS: Record<string, string> = {
  top: 'every stratum below the first gives its top boundary',
  unitWeight: 'every material except a rigid one needs its unit weight',
  strength: 'every material needs a strength model',
  model: 'one of mohr-coulomb, undrained or rigid',
  units: 'si (m, kN, kPa, kN/m³) or us (ft, lbf, psf, pcf)',
  ground: 'the ground surface [[x, y], ...] from left to right',
  strata: 'the strata from top to bottom',
  name: 'every design case has a name, unique in the section',
  kind: 'end-of-construction, long-term, steady-seepage, rapid-drawdown, seismic, surcharge or other',
  drawdown:
    'a rapid-drawdown case gives the water after drawdown and how each material drains: drawdown: { after: { piezometric: … }, materials: … }',
  after: 'the water after drawdown: after: { piezometric: … }',
  piezometric: 'the piezometric line after drawdown, an elevation or a polyline',
  drains: 'free or slow',
  dR: 'a slowly draining material gives its undrained strength envelope: dR and psiR',
  psiR: 'a slowly draining material gives its undrained strength envelope: dR and psiR',
};

/** Why a setting is refused where it is written (a `false` schema), by its name. */
const NOT_ALLOWED_HINTS: Record<string, string> = {
  drawdown: 'only a rapid-drawdown case gives drawdown',
  earthquake: 'only a seismic case gives earthquake',
  case: "a case is named by its name (analysis.case names a section's own case)",
  requiredFs: "a case's requirement is its requiredFs, beside its name and kind",
};

const NAME_RULE = 'use letters, digits and . _ - + @, starting with a letter or digit, no spaces';

/**
 * One ajv error (draft 2020-12, allErrors, verbose) in plain words, or null for the errors that
 * only repeat another one (`if`, the summary of `propertyNames`). `units` gives the unit names
 * in messages; `root` is the validated data (to tell array indices from names); `quantityAt`
 * says which kind of quantity the schema puts at a path (those take a value with its unit).
 *
 * @example
 * translateSchemaError(maximumError, data, 'si').message // → '95 is above 90°'
 */
export function translateSchemaError(
  error: ErrorObject,
  root: unknown,
  units: UnitSystem,
  quantityAt: (path: readonly PathKey[]) => QuantityKind | undefined = () => undefined,
): Issue | null {
  const path = pointerToPath(error.instancePath, root);
  const field = path[path.length - 1];
  const value: unknown = error.data;
  const params = error.params as Record<string, unknown>;
  const parent = (error.parentSchema ?? {}) as Record<string, unknown>;
  const u = unitSuffix(field, units);
  // a setting that takes a number or a value with its unit (a boundary says so in its own words)
  const quantity = parent.title === 'boundary' ? undefined : quantityAt(path);
  const issue = (code: string, message: string, at: PathKey[] = path, key = false): Issue => ({
    severity: 'error',
    path: at,
    code,
    message,
    ...(key ? { key } : {}),
  });

  // An error about a property's name (propertyNames) comes again as the propertyNames error.
  if (error.propertyName !== undefined && error.keyword !== 'propertyNames') return null;
  // A missing setting is shown at the name of the group that lacks it.
  const atGroup = path.length > 0;

  switch (error.keyword) {
    case 'if':
      return null;
    case 'required': {
      const missing = String(params.missingProperty);
      const hint = MISSING_HINTS[missing];
      return issue('missing', `${missing} is missing${hint ? ` (${hint})` : ''}`, path, atGroup);
    }
    case 'additionalProperties': {
      const extra = String(params.additionalProperty);
      // a setting of a former interslice shape: the shape's message says what to write
      if (isFormerIntersliceSetting(path, extra, root)) return null;
      const allowed = Object.keys(parent.properties ?? {});
      const near = closest(extra, allowed);
      const where = typeof parent.title === 'string' ? ` in ${parent.title}` : '';
      const tail = near
        ? `; did you mean ${near}?`
        : `; the settings here are ${listWords(allowed)}`;
      return issue('unknown-setting', `unknown setting${where}${tail}`, [...path, extra], true);
    }
    case 'type': {
      const types = Array.isArray(params.type) ? params.type.map(String) : [String(params.type)];
      if (types.length === 1 && types[0] === 'integer' && typeof value === 'number') {
        return issue('wrong-type', `expected a whole number, got ${num(value)}`);
      }
      if (quantity) {
        return issue(
          'wrong-type',
          `expected ${quantityExpected(quantity, units)}, got ${describeValue(value)}`,
        );
      }
      // a unit on a plain number: an angle, a ratio, a count, the station, a point
      const plain =
        typeof value === 'string' && isValueWithUnit(value) ? ': a plain number here' : '';
      return issue(
        'wrong-type',
        `expected ${expectedWords(types, parent.title)}, got ${describeValue(value)}${plain}`,
      );
    }
    case 'enum': {
      // a word of an earlier version: what to write instead
      const renamed = renamedWords(path, value, root);
      if (renamed) return issue('renamed', renamed);
      const allowed = (params.allowedValues as unknown[]).map(String);
      const near = typeof value === 'string' ? closest(value, allowed) : null;
      return issue(
        'unknown-value',
        `${quote(value)} is not one of ${allowed.join(', ')}${near ? `; did you mean ${near}?` : ''}`,
      );
    }
    case 'const':
      // A number-or-word setting (crack.depth: a number or "auto") given another word.
      if (error.schemaPath.endsWith('/then/const')) {
        return issue(
          'wrong-value',
          `expected a number or ${quote(params.allowedValue)}, got ${describeValue(value)}`,
        );
      }
      return issue('wrong-value', `must be ${quote(params.allowedValue)}, not ${quote(value)}`);
    case 'minimum':
      return issue('below-minimum', `${quote(value)} is below ${num(Number(params.limit))}${u}`);
    case 'exclusiveMinimum': {
      const limit = Number(params.limit);
      return Number(value) < limit
        ? issue('below-minimum', `${quote(value)} is below ${num(limit)}${u}`)
        : issue('below-minimum', `${quote(value)} must be more than ${num(limit)}${u}`);
    }
    case 'maximum':
      return issue('above-maximum', `${quote(value)} is above ${num(Number(params.limit))}${u}`);
    case 'exclusiveMaximum': {
      const limit = Number(params.limit);
      return Number(value) > limit
        ? issue('above-maximum', `${quote(value)} is above ${num(limit)}${u}`)
        : issue('above-maximum', `${quote(value)} must be less than ${num(limit)}${u}`);
    }
    case 'minItems':
    case 'maxItems': {
      const limit = Number(params.limit);
      const count = Array.isArray(value) ? value.length : 0;
      if (parent.title === 'point') {
        return issue('wrong-length', `a point is [x, y]: 2 numbers, not ${count}`);
      }
      const noun = parent.title === 'polyline' || parent.title === 'boundary' ? 'point' : 'entry';
      const plural = (n: number) => (n === 1 ? noun : noun === 'entry' ? 'entries' : `${noun}s`);
      return error.keyword === 'minItems'
        ? issue('too-few', `needs at least ${limit} ${plural(limit)}, has ${count}`)
        : issue('too-many', `has ${count} ${plural(count)}, at most ${limit} allowed`);
    }
    case 'uniqueItems': {
      const i = Number(params.i);
      const j = Number(params.j);
      const later = Math.max(i, j);
      const item: unknown = Array.isArray(value) ? value[later] : undefined;
      return issue('duplicate', `${quote(item)} is listed twice`, [...path, later]);
    }
    case 'minLength':
      return issue('empty', 'must not be empty');
    case 'maxLength':
      return issue('too-long', `is longer than ${num(Number(params.limit))} characters`);
    case 'pattern':
      if (error.schemaPath.includes('/propertyNames/')) return null;
      // text where a number or a value with its unit belongs
      if (quantity) {
        return issue(
          'wrong-type',
          `expected ${quantityExpected(quantity, units)}, got ${describeValue(value)}`,
        );
      }
      if (parent.title === 'boundary') {
        return issue(
          'wrong-type',
          `expected ${expectedWords([], 'boundary')}, got ${describeValue(value)}`,
        );
      }
      return issue('bad-name', `${quote(value)} is not a valid identifier: ${NAME_RULE}`);
    case 'propertyNames': {
      const name = String(params.propertyName);
      return issue(
        'bad-name',
        `${quote(name)} is not a valid name: ${NAME_RULE}`,
        [...path, name],
        true,
      );
    }
    case 'minProperties':
      return issue('empty', `is empty; it needs at least ${num(Number(params.limit))} entry`);
    case 'maxProperties': {
      const limit = Number(params.limit);
      const count = value !== null && typeof value === 'object' ? Object.keys(value).length : 0;
      return issue('too-many', `has ${count} entries, at most ${limit} allowed`);
    }
    case 'dependentRequired': {
      const property = String(params.property);
      const missing = String(params.missingProperty);
      const hint =
        missing === 'suDatum' ? ' (the elevation at which Su equals su, below which it grows)' : '';
      return issue('missing', `${property} needs ${missing} as well${hint}`, path, atGroup);
    }
    case 'false schema': {
      const hint = typeof field === 'string' ? NOT_ALLOWED_HINTS[field] : undefined;
      return issue('not-allowed', `is not allowed here${hint ? `: ${hint}` : ''}`);
    }
    default:
      return issue('schema', error.message ?? `fails the ${error.keyword} rule of the schema`);
  }
}
