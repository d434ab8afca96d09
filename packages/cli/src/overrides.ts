import { METHOD_IDS, RENAMED_METHODS, type MethodId, type Section } from '@scarpline/core';
import { UserError } from './read-input';

/** Settings given on the command line that replace the file's. */
export interface Overrides {
  method?: string[];
  slices?: number;
  requiredFs?: number;
}

/** `--method bishop,spencer` (or the option given twice) → the method ids, checked. */
export function parseMethods(values: string[] | undefined): MethodId[] | undefined {
  if (!values) return undefined;
  const ids = values
    .flatMap((v) => v.split(','))
    .map((v) => v.trim())
    .filter(Boolean);
  for (const id of ids) {
    const renamed = RENAMED_METHODS[id];
    if (renamed) throw new UserError(`--method: ${id} is now called ${renamed}; write ${renamed}`);
    if (!(METHOD_IDS as readonly string[]).includes(id))
      throw new UserError(
        `--method: ${JSON.stringify(id)} is not a method; use ${METHOD_IDS.join(', ')}`,
      );
  }
  return ids as MethodId[];
}

/** Checks `--slices` and `--required-fs` (commander gives them as text). */
export function checkOverrides(o: {
  slices?: string;
  requiredFs?: string;
  method?: string[];
}): Overrides {
  const out: Overrides = {};
  const methods = parseMethods(o.method);
  if (methods) out.method = methods;
  if (o.slices !== undefined) {
    const n = Number(o.slices);
    if (!Number.isInteger(n) || n < 3 || n > 500)
      throw new UserError(`--slices: ${o.slices} is not a whole number from 3 to 500`);
    out.slices = n;
  }
  if (o.requiredFs !== undefined) {
    const f = Number(o.requiredFs);
    if (!Number.isFinite(f) || f <= 0)
      throw new UserError(`--required-fs: ${o.requiredFs} is not a positive number`);
    out.requiredFs = f;
  }
  return out;
}

/**
 * A section with the command line's settings in place of its own, in every design case (--method
 * also makes every method asked govern).
 *
 * @example applyOverrides(section, { method: ['bishop'], slices: 50 }).analysis.slices // → 50
 */
export function applyOverrides(section: Section, o: Overrides): Section {
  if (!o.method && o.slices === undefined && o.requiredFs === undefined) return section;
  const analysis = (a: Section['analysis']): Section['analysis'] => ({
    ...a,
    ...(o.method ? { methods: [...(o.method as MethodId[])] } : {}),
    ...(o.slices !== undefined ? { slices: o.slices } : {}),
    ...(o.requiredFs !== undefined ? { requiredFs: o.requiredFs } : {}),
  });
  return {
    ...section,
    analysis: analysis(section.analysis),
    // every design case the file lists takes the same overrides
    ...(section.cases
      ? {
          cases: section.cases.map((c) => ({
            ...c,
            analysis: analysis(c.analysis),
            ...(o.requiredFs !== undefined ? { requiredFs: o.requiredFs } : {}),
            ...(o.method ? { governs: null } : {}),
          })),
        }
      : {}),
  };
}
