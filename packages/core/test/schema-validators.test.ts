import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseAllDocuments } from 'yaml';
import Ajv2020, { type ErrorObject, type ValidateFunction } from 'ajv/dist/2020';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import { AJV_OPTIONS, schemaFingerprint } from '../src/input/validate-against-schema';

// The build compiles the schemas ahead of time (scripts/compile-validators.js) so that a
// command need not compile them at every start. These checks hold the built validators to
// the schemas: same fingerprint, and the same verdict and errors as ajv compiling the schemas
// now, on every fixture and example.
const BUILT = join(__dirname, '..', 'dist', 'input', 'schema-validators.js');

interface Built {
  section: ValidateFunction;
  batch: ValidateFunction;
  fingerprint: string;
}

function load(): Built {
  if (!existsSync(BUILT)) throw new Error(`${BUILT} is missing: run npm run build first`);
  // eslint-disable-next-line @typescript-eslint/no-require-imports -- the built module itself
  return require(BUILT) as Built;
}

const ajv = new Ajv2020({ ...AJV_OPTIONS });
ajv.addSchema(sectionSchema);
const now = { section: ajv.getSchema(sectionSchema.$id)!, batch: ajv.compile(batchSchema) };

/** Every document of the fixtures and the examples. */
function documents(): [string, unknown][] {
  const dirs = [join(__dirname, 'in'), join(__dirname, '..', '..', '..', 'examples')];
  const out: [string, unknown][] = [];
  for (const dir of dirs) {
    for (const f of readdirSync(dir).filter((n) => /\.(ya?ml|json)$/.test(n))) {
      const docs = parseAllDocuments(readFileSync(join(dir, f), 'utf8'));
      if (!Array.isArray(docs)) continue;
      docs.forEach((d, i) => {
        if (d.errors.length === 0) out.push([`${f}#${i}`, d.toJS()]);
      });
    }
  }
  out.push([
    'corridor.json',
    JSON.parse(readFileSync(join(dirs[1], 'corridor', 'corridor.json'), 'utf8')),
  ]);
  return out;
}

const summary = (errors: ErrorObject[] | null | undefined) =>
  (errors ?? []).map((e) => [e.instancePath, e.schemaPath, e.keyword, JSON.stringify(e.params)]);

describe('the validators compiled by the build', () => {
  test('were compiled from the schemas as they are', () => {
    expect(load().fingerprint).toBe(schemaFingerprint());
  });
  const docs = documents();
  test('there are documents of both kinds, valid and not', () => {
    expect(docs.length).toBeGreaterThan(20);
  });
  test.each(docs)('%s: the same verdict and errors as compiling now', (_name, data) => {
    const built = load();
    const kind =
      data &&
      typeof data === 'object' &&
      (data as { format?: unknown }).format === 'scarpline-batch/1'
        ? 'batch'
        : 'section';
    expect(built[kind](data)).toBe(now[kind](data));
    expect(summary(built[kind].errors)).toEqual(summary(now[kind].errors));
  });
});
