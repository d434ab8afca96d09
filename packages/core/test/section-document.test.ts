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
