/**
 * How a design case's overrides merge into the settings of its section, at the level of the
 * file (before normalisation, in the file's shape): water, loads, reinforcement, seismic and crack given in a
 * case replace the section's; materials merge by name (the properties a case gives replace the
 * section's, so a strength replaces the whole strength); analysis merges setting by setting.
 * The case's name and requirement become analysis.case and analysis.requiredFs (the section's
 * requiredFs when the case gives none). The one home of these rules: normalisation merges with
 * them, and the checks of a file say where a merged value came from with caseOrigin.
 */
import type { RawCase, RawSection } from './raw-section';

type Data = Record<string, unknown>;
type Path = readonly (string | number)[];

const isRecord = (v: unknown): v is Data =>
  v !== null && typeof v === 'object' && !Array.isArray(v);
const has = (o: Data, key: string | number): boolean =>
  Object.prototype.hasOwnProperty.call(o, key);

/** The settings a case replaces whole when it gives them. */
export const CASE_REPLACES = ['water', 'loads', 'reinforcement', 'seismic', 'crack'] as const;

/**
 * The settings of a section as one case sees them, from data that may not have passed the
 * schema (each part merged only where its shape allows; a case's material that the section
 * does not have is left out). The section's own list of cases is not in the result.
 *
 * @example mergeCaseData(section, { name: 'long term', materials: { clay: { strength: drained } } })
 * // → the section with clay's strength replaced and analysis.case 'long term'
 */
export function mergeCaseData(section: Data, c: Data): Data {
  const out: Data = { ...section };
  delete out.cases;
  for (const key of CASE_REPLACES) if (c[key] !== undefined) out[key] = c[key];
  if (isRecord(c.materials) && isRecord(section.materials)) {
    const materials: Data = { ...section.materials };
    for (const [name, m] of Object.entries(c.materials)) {
      const base = materials[name];
      if (has(section.materials, name) && isRecord(base) && isRecord(m))
        materials[name] = { ...base, ...m };
    }
    out.materials = materials;
  }
  const analysis: Data = {
    ...(isRecord(section.analysis) ? section.analysis : {}),
    ...(isRecord(c.analysis) ? c.analysis : {}),
  };
  delete analysis.case;
  if (typeof c.name === 'string') analysis.case = c.name;
  if (c.requiredFs !== undefined) analysis.requiredFs = c.requiredFs;
  else if (isRecord(section.analysis) && section.analysis.requiredFs !== undefined)
    analysis.requiredFs = section.analysis.requiredFs;
  else delete analysis.requiredFs;
  out.analysis = analysis;
  return out;
}

/**
 * A schema-valid section as one of its cases sees it (see mergeCaseData): the section's
 * settings with the case's overrides merged in, still in the file's shape.
 *
 * @example mergeCase(raw, raw.cases[0]).analysis?.case // → 'end of construction'
 */
export function mergeCase(section: RawSection, c: RawCase): RawSection {
  return mergeCaseData(section as unknown as Data, c as unknown as Data) as unknown as RawSection;
}

/**
 * Where the value at a path of a merged section (mergeCaseData) came from: its path inside the
 * case (e.g. ['water', 'piezometric', 2]), or null when the case did not give it (it is the
 * section's own).
 *
 * @example caseOrigin({ name: 'x', water: { ru: 0.2 } }, ['water', 'ru']) // → ['water', 'ru']
 * @example caseOrigin({ name: 'x' }, ['materials', 'clay', 'unitWeight']) // → null
 */
export function caseOrigin(c: Data, path: Path): (string | number)[] | null {
  const [key, sub] = path;
  if ((CASE_REPLACES as readonly unknown[]).includes(key))
    return c[key as string] !== undefined ? [...path] : null;
  if (key === 'materials') {
    if (!isRecord(c.materials) || typeof sub !== 'string') return null;
    const m = c.materials[sub];
    if (!isRecord(m)) return null;
    return path.length === 2 || has(m, path[2]) ? [...path] : null;
  }
  if (key === 'analysis') {
    if (sub === 'case') return typeof c.name === 'string' ? ['name'] : null;
    if (sub === 'requiredFs') return c.requiredFs !== undefined ? ['requiredFs'] : null;
    if (!isRecord(c.analysis)) return null;
    return path.length === 1 || has(c.analysis, sub) ? [...path] : null;
  }
  return null;
}
