/** The design cases of a section: the list, and the section as one case sees it. */
import type { DesignCase, DesignCaseKind, Section } from './types';

const KINDS: readonly DesignCaseKind[] = [
  'end-of-construction',
  'long-term',
  'steady-seepage',
  'rapid-drawdown',
  'seismic',
  'surcharge',
];

/** The kind a case name says, when the name is one of the kinds; `other` when it is not. */
export function caseKindOf(name: string | null): DesignCaseKind {
  return KINDS.find((k) => k === name) ?? 'other';
}

/**
 * The design cases of a section: those its file lists or, when it lists none, one case made
 * of the section's own settings (named by analysis.case, `as given` without one).
 *
 * @example designCases(section).map((c) => c.name) // → ['long-term']
 */
export function designCases(section: Section): DesignCase[] {
  if (section.cases && section.cases.length > 0) return section.cases;
  const { analysis } = section;
  return [
    {
      name: analysis.case ?? 'as given',
      kind: caseKindOf(analysis.case),
      requiredFs: analysis.requiredFs,
      governs: null,
      water: section.water,
      materials: section.materials,
      loads: section.loads,
      reinforcement: section.reinforcement,
      seismic: section.seismic,
      crack: section.crack,
      analysis,
      drawdown: null,
      earthquake: null,
    },
  ];
}

/**
 * The section as one of its cases sees it: the case's water, materials, loads, reinforcement, seismic, crack
 * and analysis (its name and requirement in analysis.case and requiredFs), without the list of cases.
 */
export function caseSection(section: Section, c: DesignCase): Section {
  return {
    ...section,
    water: c.water,
    materials: c.materials,
    loads: c.loads,
    reinforcement: c.reinforcement,
    seismic: c.seismic,
    crack: c.crack,
    analysis: { ...c.analysis, case: c.name, requiredFs: c.requiredFs },
    cases: [],
  };
}

/**
 * The section as the named case sees it (caseSection), the first case when none is named or
 * the name is not one of its cases; the section itself when its file lists no cases.
 *
 * @example drawSection(sectionOfCase(section, 'long-term'), caseView(result, 'long-term'))
 */
export function sectionOfCase(section: Section, name?: string): Section {
  if (!section.cases || section.cases.length === 0) return section;
  const c = section.cases.find((k) => k.name === name) ?? section.cases[0];
  return caseSection(section, c);
}
