/**
 * The inverse of reading a section: a normalised section written back as an SI document reads
 * as the same section again (the round trip a re-run with edits relies on).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseSections, readSectionDocument, sectionDocument, type Section } from '@scarpline/core';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');

/** Every section of the examples: the section files (SI and US) and the demo corridor. */
function exampleSections(): { file: string; section: Section }[] {
  const files = [
    ...readdirSync(EXAMPLES)
      .filter((f) => /\.ya?ml$/.test(f))
      .map((f) => join(EXAMPLES, f)),
    join(EXAMPLES, 'corridor', 'corridor.json'),
  ];
  return files.flatMap((file) => {
    const parsed = parseSections(readFileSync(file, 'utf8'), file);
    expect(parsed.messages.filter((m) => m.severity === 'error')).toEqual([]);
    return parsed.sections.map((section) => ({ file, section }));
  });
}

describe('sectionDocument and readSectionDocument', () => {
  const all = exampleSections();

  test('cover SI and US files, given surfaces and searches, every water kind', () => {
    expect(all.length).toBeGreaterThan(60);
    expect(new Set(all.map((s) => s.section.units))).toEqual(new Set(['si', 'us']));
    expect(new Set(all.map((s) => s.section.water.kind))).toEqual(
      new Set(['none', 'piezometric', 'ru']),
    );
  });

  test.each(all.map((s) => [s.section.id, s] as const))(
    '%s: the document is SI, schema-valid, and reads as the same section',
    (_id, { section }) => {
      const doc = sectionDocument(section);
      expect(doc.units).toBe('si');
      const back = readSectionDocument(doc, 'edited-section.json', section.units);
      expect(back.messages.filter((m) => m.severity === 'error')).toEqual([]);
      expect(back.section).toEqual(section);
    },
  );

  test('the document shares nothing with the section', () => {
    const { section } = all[0];
    const doc = sectionDocument(section);
    doc.ground[0][1] += 1;
    expect(doc.ground[0][1]).not.toBe(section.ground[0][1]);
  });

  test('an edit that breaks the section gives located errors and no section', () => {
    const { section } = all[0];
    const doc = sectionDocument(section);
    const name = Object.keys(doc.materials)[0];
    doc.materials[name].unitWeight = -1;
    const back = readSectionDocument(doc, 'edited-section.json', section.units);
    expect(back.section).toBeNull();
    const error = back.messages.find((m) => m.severity === 'error')!;
    expect(error).toMatchObject({
      file: 'edited-section.json',
      path: `materials.${name}.unitWeight`,
    });
    expect(back.text.split('\n')[error.line - 1]).toContain('"unitWeight": -1');
  });
});

describe("a design case's materials in the document", () => {
  const text = `
format: scarpline/1
id: case-materials
units: si
ground: [[0, 0], [10, 0], [20, 5], [30, 5]]
materials:
  clay: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 8, frictionAngle: 26 } }
strata: [{ material: clay }]
cases:
  - name: long term
    kind: long-term
  - name: end of construction
    kind: end-of-construction
    materials:
      clay: { strength: { model: undrained, su: 30 } }
`;
  const section = parseSections(text, 'case-materials.yaml').sections[0];

  test('a case writes only the properties it changes, so an edit of the section reaches the rest', () => {
    const doc = sectionDocument(section);
    expect(doc.cases![1].materials).toEqual({ clay: { strength: { model: 'undrained', su: 30 } } });
    doc.materials.clay.unitWeight = 21;
    doc.materials.clay.saturatedUnitWeight = 21;
    const back = readSectionDocument(doc, 'edited-section.json', 'si').section!;
    const eoc = back.cases!.find((c) => c.name === 'end of construction')!;
    expect(eoc.materials.clay).toMatchObject({
      unitWeight: 21,
      strength: { model: 'undrained', su: 30 },
    });
  });
});

describe('a reinforced section', () => {
  // Invented demo data (Wendlecombe corridor); every kind of element, its defaults left out,
  // a case with its own reinforcement and the required reinforcement to find.
  const text = `
format: scarpline/1
id: wcb-1240-N
title: nailed cut
units: us
ground: [[0, 200], [60, 200], [95, 235], [230, 242]]
materials:
  till: { unitWeight: 128, strength: { model: mohr-coulomb, cohesion: 120, frictionAngle: 29 } }
strata: [{ material: till }]
reinforcement:
  - { type: nail, name: nail 1, head: [66, 206], inclination: 15, length: 33, spacing: 5, tensileCapacity: 33000, bond: 2000 }
  - { type: anchor, name: anchor A, head: [86, 226], inclination: 20, freeLength: 20, bondLength: 16, spacing: 6.5, capacity: 67000 }
  - { type: geosynthetic, name: crest grid, elevation: 238, from: 130, to: 200, strength: 2700, interaction: 0.8 }
  - { type: geosynthetic, name: bent grid, points: [[120, 236], [160, 237.5]], strength: 2700, interaction: 0.7, coverage: 0.8, dividedByF: false }
  - { type: pile, name: toe piles, x: 52, bottom: 180, shear: 3400 }
analysis:
  methods: [bishop]
  surface: { type: circle, center: [60, 275], radius: 75 }
  requiredFs: 1.5
  requiredReinforcement: { level: 204, product: { strength: 2700, interaction: 0.8 }, spacing: 2 }
cases:
  - { name: long term, kind: long-term }
  - name: no anchor
    kind: long-term
    reinforcement:
      - { type: pile, name: toe piles, x: 52, top: 199, bottom: 180, shear: 3400 }
`;
  const parsed = parseSections(text, 'reinforced.yaml');

  test('its elements, its cases and the required reinforcement read back the same', () => {
    expect(parsed.messages.filter((m) => m.severity === 'error')).toEqual([]);
    const section = parsed.sections[0];
    expect(section.reinforcement).toHaveLength(5);
    const doc = sectionDocument(section);
    expect(doc.reinforcement).toHaveLength(5);
    expect(doc.cases![1].reinforcement).toHaveLength(1);
    const back = readSectionDocument(doc, 'edited-section.json', section.units);
    expect(back.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(back.section).toEqual(section);
  });
});
