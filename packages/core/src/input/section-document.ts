import { SECTION_FORMAT } from '../formats';
import type { RawMaterial, RawSection } from '../model/raw-section';
import type { Section, UnitSystem } from '../model/types';
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

/**
 * A normalised section written back as a section document (schemas/section.schema.json) in SI
 * units: the inverse of reading one. Every default is written out (methods, slices, the search,
 * water's unit weight, seismic coefficients) and every stratum's top as the polyline it was
 * clipped to, so that reading the document gives the same section again, all but `units`: the
 * document says `si`, and readSectionDocument gives back the units to report results in. What
 * reading drops (the section's description) is not in the section and not written.
 *
 * @example sectionDocument(section).materials.clay.strength // → { model: 'mohr-coulomb', … }
 */
export function sectionDocument(s: Section): RawSection {
  const materials: Record<string, RawMaterial> = {};
  for (const [name, m] of Object.entries(s.materials)) {
    const strength = strengthDocument(m.strength);
    const description = m.description ? { description: m.description } : {};
    materials[name] =
      isRigid(m.strength) && m.unitWeight === 0
        ? { ...description, strength }
        : {
            ...description,
            unitWeight: m.unitWeight,
            saturatedUnitWeight: m.saturatedUnitWeight,
            strength,
          };
  }
  const w = s.water;
  const water =
    w.kind === 'piezometric'
      ? { piezometric: w.line, unitWeight: w.unitWeight }
      : w.kind === 'ru'
        ? { ru: w.ru, unitWeight: w.unitWeight }
        : { unitWeight: w.unitWeight };
  const a = s.analysis;
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
    seismic: s.seismic,
    ...(s.crack ? { crack: s.crack } : {}),
    analysis: defined({
      methods: a.methods,
      slices: a.slices,
      surface: a.surface,
      infiniteSlope: a.infiniteSlope,
      interslice: a.interslice,
      trialBand: a.trialBand,
      searchEachMethod: a.searchEachMethod,
      case: a.case,
      requiredFs: a.requiredFs,
    }),
  };
  // A plain copy: the document shares nothing with the section.
  return JSON.parse(JSON.stringify(doc)) as RawSection;
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
