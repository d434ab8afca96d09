import { SECTION_FORMAT } from '../formats';
import type { RawProbability } from '../probability/normalise-probability';
import type { ProbabilitySpec } from '../probability/types';
import type {
  RawAnalysis,
  RawCase,
  RawMaterial,
  RawMaterialOverride,
  RawSection,
  RawWater,
} from '../model/raw-section';
import type { Analysis, DesignCase, Material, Section, UnitSystem, Water } from '../model/types';
import {
  reinforcementDocument,
  requiredReinforcementDocument,
} from '../model/reinforcement-document';
import { fromSi } from '../model/units';
import { isRigid, strengthDocument } from '../strength/registry';
import { parseSections } from './parse-sections';
import { screenData } from './screen-data';
import type { Message } from './types';
import { pathText } from './words';

/** An object without its null and undefined members. */
function defined<T extends object>(o: T): { [K in keyof T]?: Exclude<T[K], null> } {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== null && v !== undefined)) as {
    [K in keyof T]?: Exclude<T[K], null>;
  };
}

/** A section's random variables as its file writes them (SI: the document's units). */
function probabilityDocument(p: ProbabilitySpec): RawProbability {
  return {
    variables: p.variables.map(({ name, target, distribution: d }) => {
      const { kind, ...values } = d;
      return { name, target, distribution: kind, ...values };
    }),
    ...(p.correlations.length > 0 ? { correlations: p.correlations } : {}),
    seed: p.seed,
    method: p.method,
    realisations: p.realisations,
    surface: p.surface,
  };
}

/**
 * A normalised section written back as a section document (schemas/section.schema.json) in SI
 * units: the inverse of reading one. Every default is written out (methods, slices, the search,
 * water's unit weight, seismic coefficients) and every stratum's top as the polyline it was
 * clipped to, so that reading the document gives the same section again, all but `units`: the
 * document says `si`, and readSectionDocument gives back the units to report results in. What
 * reading drops (the section's description) is not in the section and not written. Each design
 * case is written as what it changes in the section's settings.
 *
 * @example sectionDocument(section).materials.clay.strength // → { model: 'mohr-coulomb', … }
 */
export function sectionDocument(s: Section): RawSection {
  const materials: Record<string, RawMaterial> = {};
  for (const [name, m] of Object.entries(s.materials)) materials[name] = materialDocument(m);
  const water = waterDocument(s.water);
  const doc: RawSection = {
    format: SECTION_FORMAT,
    id: s.id,
    title: s.title,
    ...defined({ station: s.station, offset: s.offset }),
    units: 'si',
    ground: s.ground,
    materials,
    strata: s.strata.map((st, i) => (i === 0 ? { material: st.material } : st)),
    water,
    loads: s.loads,
    ...(s.reinforcement.length > 0
      ? { reinforcement: s.reinforcement.map(reinforcementDocument) }
      : {}),
    seismic: s.seismic,
    ...(s.crack ? { crack: s.crack } : {}),
    analysis: defined({
      ...analysisDocument(s.analysis),
      case: s.analysis.case,
      requiredFs: s.analysis.requiredFs,
    }),
    ...(s.cases && s.cases.length > 0 ? { cases: s.cases.map((c) => caseDocument(c, s)) } : {}),
    ...(s.probability ? { probability: probabilityDocument(s.probability) } : {}),
  };
  // A plain copy: the document shares nothing with the section.
  return JSON.parse(JSON.stringify(doc)) as RawSection;
}

function materialDocument(m: Material): RawMaterial {
  const strength = strengthDocument(m.strength);
  const description = m.description ? { description: m.description } : {};
  return isRigid(m.strength) && m.unitWeight === 0
    ? { ...description, strength }
    : {
        ...description,
        unitWeight: m.unitWeight,
        saturatedUnitWeight: m.saturatedUnitWeight,
        strength,
      };
}

function waterDocument(w: Water): RawWater {
  return w.kind === 'piezometric'
    ? { piezometric: w.line, unitWeight: w.unitWeight }
    : w.kind === 'ru'
      ? { ru: w.ru, unitWeight: w.unitWeight }
      : { unitWeight: w.unitWeight };
}

/** The analysis settings but the case's name and requirement. */
function analysisDocument(a: Analysis): Omit<RawAnalysis, 'case' | 'requiredFs'> {
  return defined({
    methods: a.methods,
    slices: a.slices,
    surface: a.surface,
    infiniteSlope: a.infiniteSlope,
    interslice: a.interslice,
    trialBand: a.trialBand,
    searchEachMethod: a.searchEachMethod,
    requiredReinforcement: a.requiredReinforcement
      ? requiredReinforcementDocument(a.requiredReinforcement)
      : null,
  });
}

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

/**
 * A design case written back as the case of a section document: what differs from the
 * section's own settings (a material that differs written whole, the analysis setting by
 * setting), so that merging it into the section gives the case again.
 */
function caseDocument(c: DesignCase, s: Section): RawCase {
  const doc: RawCase = { name: c.name, kind: c.kind };
  if (c.requiredFs !== null && c.requiredFs !== s.analysis.requiredFs)
    doc.requiredFs = c.requiredFs;
  if (c.governs) doc.governs = c.governs;
  const water = waterDocument(c.water);
  if (!same(water, waterDocument(s.water))) doc.water = water;
  // a case's material writes only the properties it changes, so that an edit of the section's
  // material (a re-run) still reaches the properties the case takes from it
  const materials: Record<string, RawMaterialOverride> = {};
  for (const [name, m] of Object.entries(c.materials)) {
    const written = materialDocument(m);
    const own = materialDocument(s.materials[name]);
    const changed: RawMaterialOverride = {};
    for (const key of Object.keys(written) as (keyof RawMaterial)[]) {
      if (!same(written[key], own[key])) Object.assign(changed, { [key]: written[key] });
    }
    if (Object.keys(changed).length > 0) materials[name] = changed;
  }
  if (Object.keys(materials).length > 0) doc.materials = materials;
  if (!same(c.loads, s.loads)) doc.loads = c.loads;
  if (!same(c.reinforcement, s.reinforcement))
    doc.reinforcement = c.reinforcement.map(reinforcementDocument);
  if (!same(c.seismic, s.seismic)) doc.seismic = c.seismic;
  if (c.crack && !same(c.crack, s.crack)) doc.crack = c.crack;
  const own = analysisDocument(s.analysis) as Record<string, unknown>;
  const analysis = Object.fromEntries(
    Object.entries(analysisDocument(c.analysis)).filter(([k, v]) => !same(v, own[k])),
  );
  if (Object.keys(analysis).length > 0) doc.analysis = analysis;
  if (c.drawdown) {
    const after = c.drawdown.after;
    const slow = Object.entries(c.drawdown.materials).filter(([, d]) => d.drains === 'slow');
    doc.drawdown = {
      after: { piezometric: after.kind === 'piezometric' ? after.line : [] },
      ...(slow.length > 0 ? { materials: Object.fromEntries(slow) } : {}),
    };
  }
  const e = c.earthquake;
  if (e && (e.pga !== null || e.magnitude !== null || e.allowableDisplacement !== null)) {
    doc.earthquake = defined({
      pga: e.pga,
      magnitude: e.magnitude,
      // a displacement is written in mm in an si document
      allowableDisplacement:
        e.allowableDisplacement === null
          ? null
          : fromSi(e.allowableDisplacement, 'displacement', 'si'),
    });
  }
  return doc;
}

/**
 * Reads a section document in SI units (one written by sectionDocument, edited or not) as a
 * section whose results are reported in `units`, the units of the file it first came from.
 * The document is written out as JSON under `fileName`, and the messages are located in that
 * text (line, column and path).
 *
 * @example readSectionDocument(sectionDocument(s), 'edited-section.json', s.units).section // → s
 */
export function readSectionDocument(
  doc: unknown,
  fileName: string,
  units: UnitSystem,
): { section: Section | null; messages: Message[]; text: string } {
  // Data too large or too deep to write out is refused as it is (its text would be too).
  const { refusal } = screenData(doc);
  if (refusal) {
    const message: Message = {
      severity: 'error',
      file: fileName,
      line: 1,
      column: 1,
      path: pathText(refusal.path),
      code: refusal.code,
      message: refusal.message,
      sections: [],
    };
    return { section: null, messages: [message], text: '' };
  }
  const text = JSON.stringify(doc, null, 2);
  const parsed = parseSections(text, fileName);
  const section = parsed.sections.length === 1 ? { ...parsed.sections[0], units } : null;
  return { section, messages: parsed.messages, text };
}
