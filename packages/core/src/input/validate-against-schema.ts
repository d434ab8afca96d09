import Ajv2020, { type ValidateFunction } from 'ajv/dist/2020';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import type { UnitSystem } from '../model/types';
import { translateSchemaError } from './translate-schema-error';
import type { Issue } from './types';
import { pathText } from './words';

let compiled: { section: ValidateFunction; batch: ValidateFunction } | null = null;

function validators(): { section: ValidateFunction; batch: ValidateFunction } {
  if (!compiled) {
    // Strict, except two ajv-only rules that flag standard 2020-12 idioms used on purpose:
    // `required` inside if/else branches, and prefixItems followed by an open `items`.
    const ajv = new Ajv2020({
      allErrors: true,
      verbose: true,
      strict: true,
      strictRequired: false,
      strictTuples: false,
      allowUnionTypes: true,
      strictNumbers: true,
    });
    ajv.addSchema(sectionSchema);
    const section = ajv.getSchema(sectionSchema.$id);
    if (!section) throw new Error('section schema did not compile');
    compiled = { section, batch: ajv.compile(batchSchema) };
  }
  return compiled;
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
  const validate = validators()[schema];
  if (validate(data)) return [];
  const issues: Issue[] = [];
  for (const error of validate.errors ?? []) {
    const issue = translateSchemaError(error, data, units);
    if (issue) issues.push(issue);
  }
  // A value of the wrong type needs no further words about its range.
  const wrongType = new Set(
    issues.filter((i) => i.code === 'wrong-type').map((i) => pathText(i.path)),
  );
  return issues.filter((i) => i.code === 'wrong-type' || !wrongType.has(pathText(i.path)));
}
