import { batchSchema, sectionSchema } from '@scarpline/schemas';
import type { UnitSystem } from '../model/types';
import type { QuantityKind } from '../model/units';
import { isValueWithUnit, readValueWithUnit } from '../model/value-with-unit';
import { isRecord } from './guards';
import { INPUT_LIMITS } from './limits';
import type { Issue, PathKey } from './types';

/**
 * The definitions of schemas/section.schema.json whose numbers are quantities, by the kind of
 * quantity. A setting is a quantity when its schema refers to one of them; a boundary is an
 * elevation (its polyline form holds plain numbers).
 */
const QUANTITY_DEFS: Record<string, QuantityKind> = {
  length: 'length',
  pressure: 'pressure',
  unitWeight: 'unitWeight',
  force: 'force',
  forcePerLength: 'forcePerLength',
  pressurePerLength: 'pressurePerLength',
  displacement: 'displacement',
  boundary: 'length',
};

/** Where in a document the quantities are: a tree of settings, read from a schema. */
interface QuantityTree {
  kind?: QuantityKind;
  /** Named settings (`properties`). */
  keys: Map<string, QuantityTree>;
  /** Any other name (`additionalProperties`). */
  otherKeys?: QuantityTree;
  /** Leading list entries (`prefixItems`). */
  firstItems: Map<number, QuantityTree>;
  /** The other list entries (`items`). */
  items?: QuantityTree;
}

type Schema = Record<string, unknown>;
const SECTION_FILE = 'section.schema.json';
const emptyTree = (): QuantityTree => ({ keys: new Map(), firstItems: new Map() });

/** The schema a `$ref` points to (within the schema or into the section schema), and its name. */
function resolve(
  ref: string,
  document: Schema,
): { schema: Schema; document: Schema; name: string } {
  const [file, pointer = ''] = ref.split('#');
  const target = file === '' ? document : file === SECTION_FILE ? sectionSchema : null;
  if (!target) throw new Error(`unknown schema reference ${ref}`);
  let at: unknown = target;
  const steps = pointer.split('/').filter(Boolean);
  for (const step of steps) at = isRecord(at) ? at[step] : undefined;
  if (!isRecord(at)) throw new Error(`schema reference ${ref} leads nowhere`);
  return { schema: at, document: target, name: steps[steps.length - 1] ?? '' };
}

/** Adds what a schema (and everything it refers to) says about quantities to a tree. */
function grow(schema: unknown, document: Schema, tree: QuantityTree, depth = 0): void {
  if (!isRecord(schema) || depth > 40) return;
  if (typeof schema.$ref === 'string') {
    const target = resolve(schema.$ref, document);
    if (target.document === sectionSchema && QUANTITY_DEFS[target.name]) {
      tree.kind = QUANTITY_DEFS[target.name];
    }
    grow(target.schema, target.document, tree, depth + 1);
  }
  if (isRecord(schema.properties)) {
    for (const [key, sub] of Object.entries(schema.properties)) {
      const child = tree.keys.get(key) ?? emptyTree();
      tree.keys.set(key, child);
      grow(sub, document, child, depth + 1);
    }
  }
  if (isRecord(schema.additionalProperties)) {
    tree.otherKeys ??= emptyTree();
    grow(schema.additionalProperties, document, tree.otherKeys, depth + 1);
  }
  if (Array.isArray(schema.prefixItems)) {
    schema.prefixItems.forEach((sub: unknown, i: number) => {
      const child = tree.firstItems.get(i) ?? emptyTree();
      tree.firstItems.set(i, child);
      grow(sub, document, child, depth + 1);
    });
  }
  if (isRecord(schema.items)) {
    tree.items ??= emptyTree();
    grow(schema.items, document, tree.items, depth + 1);
  }
  for (const key of ['allOf', 'anyOf', 'oneOf']) {
    const list = schema[key];
    if (Array.isArray(list)) for (const sub of list) grow(sub, document, tree, depth + 1);
  }
  grow(schema.then, document, tree, depth + 1);
  grow(schema.else, document, tree, depth + 1);
}

const trees: Partial<Record<'section' | 'batch', QuantityTree>> = {};

/** The quantities of a schema, read from it on first use (a few milliseconds) and kept. */
function treeOf(schema: 'section' | 'batch'): QuantityTree {
  let tree = trees[schema];
  if (!tree) {
    const document = (schema === 'section' ? sectionSchema : batchSchema) as Schema;
    tree = emptyTree();
    grow(document, document, tree);
    trees[schema] = tree;
  }
  return tree;
}

/**
 * Whether a text may be a value with its unit: short enough (INPUT_LIMITS.valueWithUnit; a
 * longer one is for the schema to refuse, and reading it would cost time) and shaped like one.
 */
const maybeValueWithUnit = (text: string): boolean =>
  text.length <= INPUT_LIMITS.valueWithUnit && isValueWithUnit(text);

/** Whether any text in a document looks like a value with its unit (most files have none). */
function hasValueWithUnit(value: unknown): boolean {
  if (typeof value === 'string') return maybeValueWithUnit(value);
  if (Array.isArray(value)) return value.some(hasValueWithUnit);
  return isRecord(value) && Object.values(value).some(hasValueWithUnit);
}

function childOf(tree: QuantityTree, key: PathKey): QuantityTree | undefined {
  return typeof key === 'number'
    ? (tree.firstItems.get(key) ?? tree.items)
    : (tree.keys.get(key) ?? tree.otherKeys);
}

/**
 * The kind of quantity the section or batch schema puts at a path into a document, if any.
 *
 * @example quantityAt('section', ['materials', 'clay', 'strength', 'cohesion']) // → 'pressure'
 * @example quantityAt('batch', ['sections', 3, 'station']) // → undefined (a plain number)
 */
export function quantityAt(
  schema: 'section' | 'batch',
  path: readonly PathKey[],
): QuantityKind | undefined {
  let tree: QuantityTree | undefined = treeOf(schema);
  for (const key of path) {
    tree = tree && childOf(tree, key);
    if (!tree) return undefined;
  }
  return tree.kind;
}

/** A copy of `root` with the value at `path` replaced, sharing everything off the path. */
function replaced(root: unknown, path: readonly PathKey[], value: unknown): unknown {
  if (path.length === 0) return value;
  const [key, ...rest] = path;
  if (Array.isArray(root) && typeof key === 'number') {
    const copy = [...(root as unknown[])];
    copy[key] = replaced(copy[key], rest, value);
    return copy;
  }
  if (isRecord(root) && typeof key === 'string') {
    return { ...root, [key]: replaced(root[key], rest, value) };
  }
  return root;
}

/**
 * Converts the values written with their unit (`cohesion: 250 psf`, `depth: 12 ft`) of a
 * section or batch document to plain numbers in the document's unit system, where the schema
 * has a quantity; other text is left for the schema to judge. A unit of the wrong kind, or an
 * unknown one, is an error at that value (codes `wrong-dimension`, `unknown-unit`,
 * `unreadable`), and the text stays. A document without such values comes back as it is,
 * and mathjs is not loaded.
 *
 * @example readValuesWithUnits({ …, units: 'us', materials: { clay: { unitWeight: '19 kN/m³', … } } }, 'section', 'us')
 * // → { data: { …, materials: { clay: { unitWeight: 120.95…, … } } }, issues: [] }
 */
export function readValuesWithUnits(
  data: Record<string, unknown>,
  schema: 'section' | 'batch',
  units: UnitSystem,
): { data: Record<string, unknown>; issues: Issue[] } {
  if (!hasValueWithUnit(data)) return { data, issues: [] };
  const found: { path: PathKey[]; kind: QuantityKind; text: string }[] = [];
  const walk = (value: unknown, tree: QuantityTree, path: PathKey[]): void => {
    if (typeof value === 'string') {
      if (tree.kind && maybeValueWithUnit(value))
        found.push({ path, kind: tree.kind, text: value });
    } else if (Array.isArray(value)) {
      value.forEach((item: unknown, i) => {
        const child = childOf(tree, i);
        if (child) walk(item, child, [...path, i]);
      });
    } else if (isRecord(value)) {
      for (const [key, item] of Object.entries(value)) {
        const child = childOf(tree, key);
        if (child) walk(item, child, [...path, key]);
      }
    }
  };
  walk(data, treeOf(schema), []);
  if (found.length === 0) return { data, issues: [] };

  let out: unknown = data;
  const issues: Issue[] = [];
  for (const { path, kind, text } of found) {
    const read = readValueWithUnit(text, kind, units);
    if (read.ok) out = replaced(out, path, read.value);
    else issues.push({ severity: 'error', path, code: read.code, message: read.message });
  }
  return { data: out as Record<string, unknown>, issues };
}
