/**
 * Design cases on the input side: the schema of `cases`, how a case's overrides merge into its
 * section's settings, the DesignCase each normalises to, a corridor's template cases and a
 * station's changes to them, and the located message of every check of a case.
 */
import {
  caseSection,
  designCases,
  formatMessage,
  parseSections,
  readSectionDocument,
  sectionDocument,
  type Message,
  type Section,
} from '@scarpline/core';
import { sectionSchema } from '@scarpline/schemas';
import { METHOD_IDS } from '@scarpline/core';
import { CASE_KINDS } from '../src/result';
import { caseOrigin, mergeCase } from '../src/model/merge-case';
import { estimateCaseWork, estimateWork } from '../src/input/estimate-work';
import type { RawSection } from '../src/model/raw-section';
import { WORK_LIMIT } from '../src/work-limit';

const parse = (text: string, name = 'cases.yaml') => parseSections(text, name);

/** The one section of a text that must read without messages. */
function section(text: string): Section {
  const { sections, messages } = parse(text);
  expect(messages.map(formatMessage)).toEqual([]);
  expect(sections).toHaveLength(1);
  return sections[0];
}

/** Where a text is written: the line of its `nth` occurrence and the column of `token` on it. */
function at(text: string, snippet: string, token = snippet, nth = 0): [number, number] {
  const lines = text.split('\n');
  const found = lines.map((l, i) => (l.includes(snippet) ? i : -1)).filter((i) => i >= 0);
  const i = found[nth];
  if (i === undefined) throw new Error(`${snippet} is not in the text`);
  return [i + 1, lines[i].indexOf(token) + 1];
}

const where = (m: Message): [number, number] => [m.line, m.column];

/** Each message of a text as [path, code], and the message of one path. */
function messagesOf(text: string): Message[] {
  return parse(text).messages;
}
function one(text: string, path: string, code?: string): Message {
  const found = messagesOf(text).filter((m) => m.path === path && (!code || m.code === code));
  expect(found.map(formatMessage)).toHaveLength(1);
  return found[0];
}

const BASE = `format: scarpline/1
id: bank
units: si
ground: [[0, 14], [10, 14], [30, 24], [50, 24]]
materials:
  fill: { unitWeight: 20, strength: { model: mohr-coulomb, cohesion: 2, frictionAngle: 32 } }
  clay:
    description: Soft CLAY
    unitWeight: 16.5
    saturatedUnitWeight: 17
    strength: { model: undrained, su: 15, suRate: 1.5, suDatum: 10 }
  rock: { strength: { model: rigid } }
strata:
  - { material: fill }
  - { material: clay, top: 12 }
  - { material: rock, top: 0 }
water: { piezometric: [[0, 13], [50, 19]] }
loads:
  - { type: strip, from: 35, to: 45, pressure: 10 }
seismic: { kh: 0, kv: 0 }
crack: { depth: 1.5 }
analysis:
  methods: [bishop, spencer]
  slices: 40
  surface: { type: circle, center: [22, 36], radius: 20 }
  requiredFs: 1.4
`;

const CASES = `${BASE}cases:
  - name: end of construction
    kind: end-of-construction
    requiredFs: 1.3
  - name: long term
    kind: long-term
    governs: [spencer]
    materials:
      clay: { strength: { model: mohr-coulomb, cohesion: 2, frictionAngle: 24 } }
    analysis: { methods: [bishop, spencer, morgenstern-price] }
  - name: river falls
    kind: rapid-drawdown
    requiredFs: 1.2
    water: { piezometric: 18 }
    loads: []
    drawdown:
      after: { piezometric: [[0, 9], [50, 12]] }
      materials: { clay: { drains: slow, dR: 8, psiR: 16 } }
  - name: earthquake
    kind: seismic
    requiredFs: 1.1
    seismic: { kh: 0.12 }
    crack: { depth: auto }
    earthquake: { pga: 0.25, magnitude: 6.5, allowableDisplacement: 150 }
`;

describe('a file without cases', () => {
  test('reads as before: no cases in the section, and the section is its own one case', () => {
    const s = section(BASE);
    expect('cases' in s).toBe(false);
    const [only] = designCases(s);
    expect(only).toMatchObject({ name: 'as given', requiredFs: 1.4, governs: null });
    const view = caseSection(s, only);
    expect(view).toEqual({ ...s, analysis: { ...s.analysis, case: 'as given' }, cases: [] });
  });
});

describe('cases: normalised into DesignCases, every default filled', () => {
  const s = section(CASES);
  const [eoc, lt, dd, quake] = s.cases!;

  test('the list, in the order of the file, with names, kinds and requirements', () => {
    expect(designCases(s).map((c) => [c.name, c.kind, c.requiredFs])).toEqual([
      ['end of construction', 'end-of-construction', 1.3],
      // a case without requiredFs takes the section's analysis.requiredFs
      ['long term', 'long-term', 1.4],
      ['river falls', 'rapid-drawdown', 1.2],
      ['earthquake', 'seismic', 1.1],
    ]);
    expect(eoc.governs).toBeNull();
    expect(lt.governs).toEqual(['spencer']);
    // the section's own settings stay as they are
    expect(s.analysis.case).toBeNull();
    expect(s.analysis.requiredFs).toBe(1.4);
  });

  test('a case without overrides sees the section as it is', () => {
    const { cases: _, ...own } = s;
    expect(eoc).toMatchObject({
      water: own.water,
      materials: own.materials,
      loads: own.loads,
      seismic: own.seismic,
      crack: own.crack,
      drawdown: null,
      earthquake: null,
    });
    expect(eoc.analysis).toEqual({ ...own.analysis, case: 'end of construction', requiredFs: 1.3 });
  });

  test('materials merge by name: a given strength replaces the whole strength, the rest stays', () => {
    expect(lt.materials.clay).toEqual({
      name: 'clay',
      description: 'Soft CLAY',
      unitWeight: 16.5,
      saturatedUnitWeight: 17,
      strength: { model: 'mohr-coulomb', cohesion: 2, frictionAngle: 24 },
    });
    expect(lt.materials.fill).toEqual(s.materials.fill);
    expect(lt.materials.rock).toEqual(s.materials.rock);
  });

  test('analysis merges setting by setting', () => {
    expect(lt.analysis).toEqual({
      ...s.analysis,
      methods: ['bishop', 'spencer', 'morgenstern-price'],
      case: 'long term',
      requiredFs: 1.4,
    });
  });

  test('water, loads, seismic and crack replace the section’s (defaults filled as the section’s)', () => {
    expect(dd.water).toEqual({
      kind: 'piezometric',
      line: [
        [0, 18],
        [50, 18],
      ],
      unitWeight: 9.81,
    });
    expect(dd.loads).toEqual([]);
    expect(dd.seismic).toEqual(s.seismic);
    // kv is not inherited: the case's seismic replaces the section's whole
    expect(quake.seismic).toEqual({ kh: 0.12, kv: 0 });
    expect(quake.crack).toEqual({ depth: 'auto', waterDepth: 0 });
    expect(quake.loads).toEqual(s.loads);
  });

  test('a rapid drawdown: the water after it over the ground; every material drains, freely unless listed', () => {
    expect(dd.drawdown).toEqual({
      after: {
        kind: 'piezometric',
        line: [
          [0, 9],
          [50, 12],
        ],
        unitWeight: 9.81,
      },
      materials: {
        fill: { drains: 'free' },
        clay: { drains: 'slow', dR: 8, psiR: 16 },
        rock: { drains: 'free' },
      },
    });
    expect(dd.earthquake).toBeNull();
  });

  test('a seismic case: its earthquake in SI (150 mm → 0.15 m); without one, nulls', () => {
    expect(quake.earthquake).toEqual({ pga: 0.25, magnitude: 6.5, allowableDisplacement: 0.15 });
    const bare = section(
      CASES.replace(
        '    earthquake: { pga: 0.25, magnitude: 6.5, allowableDisplacement: 150 }\n',
        '',
      ),
    );
    expect(bare.cases![3].earthquake).toEqual({
      pga: null,
      magnitude: null,
      allowableDisplacement: null,
    });
  });

  test('caseSection puts a case back into a section', () => {
    const view = caseSection(s, lt);
    expect(view.materials.clay.strength.model).toBe('mohr-coulomb');
    expect(view.analysis).toMatchObject({ case: 'long term', requiredFs: 1.4 });
    expect(view.cases).toEqual([]);
  });

  test('a us file: a case’s values in SI like the section’s', () => {
    const us = section(
      CASES.replace('units: si', 'units: us')
        .replace('unitWeight: 20,', 'unitWeight: 125,')
        .replace('unitWeight: 16.5', 'unitWeight: 105')
        .replace('saturatedUnitWeight: 17', 'saturatedUnitWeight: 108')
        .replace('su: 15, suRate: 1.5', 'su: 300, suRate: 10')
        .replace('pressure: 10 }', 'pressure: 200 }')
        .replace('cohesion: 2, frictionAngle: 24', 'cohesion: 40, frictionAngle: 24')
        .replace('dR: 8', 'dR: 160')
        .replace('allowableDisplacement: 150', 'allowableDisplacement: 6'),
    );
    const ft = 0.3048;
    const psf = (4.4482216152605 / ft ** 2) * 1e-3;
    const [, ltUs, ddUs, quakeUs] = us.cases!;
    expect(ltUs.materials.clay.strength).toEqual({
      model: 'mohr-coulomb',
      cohesion: expect.closeTo(40 * psf, 12) as number,
      frictionAngle: 24,
    });
    expect(ddUs.water).toMatchObject({
      line: [
        [0, 18 * ft],
        [50 * ft, 18 * ft],
      ],
    });
    const clay = ddUs.drawdown!.materials.clay;
    expect(clay.drains === 'slow' && clay.dR).toBeCloseTo(160 * psf, 12);
    expect(quakeUs.earthquake!.allowableDisplacement).toBeCloseTo(6 * 0.0254, 15);
  });

  test('written back as a document (what each case changes) it reads as the same section', () => {
    const doc = sectionDocument(s);
    expect(doc.cases![0]).toEqual({
      name: 'end of construction',
      kind: 'end-of-construction',
      requiredFs: 1.3,
    });
    expect(doc.cases![1]).toMatchObject({
      name: 'long term',
      governs: ['spencer'],
      analysis: { methods: ['bishop', 'spencer', 'morgenstern-price'] },
    });
    expect(Object.keys(doc.cases![1].materials!)).toEqual(['clay']);
    expect(doc.cases![3].earthquake).toEqual({
      pga: 0.25,
      magnitude: 6.5,
      allowableDisplacement: 150,
    });
    const back = readSectionDocument(doc, 'edited.json', 'si');
    expect(back.messages).toEqual([]);
    expect(back.section).toEqual(s);
  });
});

describe('mergeCase and caseOrigin: the rules in one place', () => {
  const raw = {
    format: 'scarpline/1',
    id: 'x',
    units: 'si',
    ground: [
      [0, 0],
      [10, 5],
    ],
    materials: {
      clay: { unitWeight: 18, strength: { model: 'undrained', su: 20, suRate: 2, suDatum: 0 } },
    },
    strata: [{ material: 'clay' }],
    seismic: { kh: 0.1, kv: 0.05 },
    analysis: { methods: ['bishop'], slices: 40, requiredFs: 1.5, case: 'own' },
  } as RawSection;
  test('a strength replaces the whole strength (Su rate and datum are not kept)', () => {
    const m = mergeCase(raw, {
      name: 'a',
      kind: 'other',
      materials: { clay: { strength: { model: 'undrained', su: 30 } } },
    });
    expect(m.materials.clay).toEqual({ unitWeight: 18, strength: { model: 'undrained', su: 30 } });
    expect(raw.materials.clay.strength).toMatchObject({ su: 20, suRate: 2 });
  });
  test('seismic replaces whole; analysis merges; the case names itself and sets its requirement', () => {
    const m = mergeCase(raw, {
      name: 'b',
      kind: 'seismic',
      requiredFs: 1.1,
      seismic: { kh: 0.2 },
      analysis: { slices: 20 },
    });
    expect(m.seismic).toEqual({ kh: 0.2 });
    expect(m.analysis).toEqual({ methods: ['bishop'], slices: 20, requiredFs: 1.1, case: 'b' });
    expect('cases' in m).toBe(false);
  });
  test('caseOrigin: a path of the merged section inside the case, or null for the section’s own', () => {
    const c = {
      name: 'b',
      water: { ru: 0.2 },
      materials: { clay: { unitWeight: 17 } },
      analysis: { slices: 20 },
    };
    expect(caseOrigin(c, ['water', 'ru'])).toEqual(['water', 'ru']);
    expect(caseOrigin(c, ['loads', 0])).toBeNull();
    expect(caseOrigin(c, ['materials', 'clay', 'unitWeight'])).toEqual([
      'materials',
      'clay',
      'unitWeight',
    ]);
    expect(caseOrigin(c, ['materials', 'clay', 'strength'])).toBeNull();
    expect(caseOrigin(c, ['analysis', 'slices'])).toEqual(['analysis', 'slices']);
    expect(caseOrigin(c, ['analysis', 'methods', 0])).toBeNull();
    expect(caseOrigin(c, ['analysis', 'case'])).toEqual(['name']);
    expect(caseOrigin(c, ['analysis', 'requiredFs'])).toBeNull();
    expect(caseOrigin({ ...c, requiredFs: 1.2 }, ['analysis', 'requiredFs'])).toEqual([
      'requiredFs',
    ]);
    expect(caseOrigin(c, ['strata', 1, 'top'])).toBeNull();
  });
});

describe('the schema of cases: located messages', () => {
  test('the kinds of case are the result’s CASE_KINDS; the methods those of METHOD_IDS', () => {
    type Defs = Record<string, { properties?: Record<string, { enum?: unknown }>; enum?: unknown }>;
    const defs = (sectionSchema as unknown as { $defs: Defs }).$defs;
    expect(defs.case.properties?.kind.enum).toEqual([...CASE_KINDS]);
    expect(defs.method.enum).toEqual([...METHOD_IDS]);
  });

  const only = (cases: string) => `${BASE}cases:\n${cases}`;

  test('name and kind are needed; the kind is one of the kinds', () => {
    const text = only('  - { requiredFs: 1.3 }\n  - { name: b, kind: long-trem }\n');
    const messages = messagesOf(text);
    expect(messages.map((m) => [m.path, m.code])).toEqual([
      ['cases[0]', 'missing'],
      ['cases[0]', 'missing'],
      ['cases[1].kind', 'unknown-value'],
    ]);
    expect(messages[0].message).toBe(
      'name is missing (every design case has a name, unique in the section)',
    );
    expect(messages[2].message).toMatch(/"long-trem" is not one of .*; did you mean long-term\?$/);
    expect(where(messages[2])).toEqual(at(text, 'long-trem'));
  });

  test('a rapid-drawdown case needs drawdown; no other kind may give it', () => {
    const text = only(
      '  - { name: a, kind: rapid-drawdown }\n  - name: b\n    kind: long-term\n    drawdown: { after: { piezometric: 12 } }\n',
    );
    const [a, b] = messagesOf(text);
    expect(formatMessage(a)).toBe(
      `cases.yaml:${at(text, 'name: a', '{').join(':')} cases[0]: drawdown is missing (a rapid-drawdown case gives the water after drawdown and how each material drains: drawdown: { after: { piezometric: … }, materials: … })`,
    );
    expect(formatMessage(b)).toBe(
      `cases.yaml:${at(text, 'drawdown: {', '{').join(':')} cases[1].drawdown: is not allowed here: only a rapid-drawdown case gives drawdown`,
    );
  });

  test('only a seismic case gives earthquake; its values have ranges and units', () => {
    const text = only(
      '  - name: a\n    kind: long-term\n    earthquake: { pga: 0.2 }\n  - name: b\n    kind: seismic\n    earthquake: { pga: 0, magnitude: 11, allowableDisplacement: 15 kPa }\n',
    );
    expect(messagesOf(text).map((m) => [m.path, m.code, m.message])).toEqual([
      [
        'cases[0].earthquake',
        'not-allowed',
        'is not allowed here: only a seismic case gives earthquake',
      ],
      ['cases[1].earthquake.pga', 'below-minimum', '0 must be more than 0'],
      ['cases[1].earthquake.magnitude', 'above-maximum', '11 is above 10'],
      [
        'cases[1].earthquake.allowableDisplacement',
        'wrong-dimension',
        '"15 kPa" is a pressure, not a displacement; give a displacement, e.g. "150 mm" or "6 in"',
      ],
    ]);
  });

  test('a slowly draining material gives dR and ψR; drains is free or slow', () => {
    const text = only(
      '  - name: a\n    kind: rapid-drawdown\n    drawdown:\n      after: { piezometric: 12 }\n      materials: { clay: { drains: slow, dR: 5 }, fill: { drains: quickly } }\n',
    );
    expect(messagesOf(text).map((m) => [m.path, m.code, m.message])).toEqual([
      [
        'cases[0].drawdown.materials.clay',
        'missing',
        'psiR is missing (a slowly draining material gives its undrained strength envelope: dR and psiR)',
      ],
      [
        'cases[0].drawdown.materials.fill.drains',
        'unknown-value',
        '"quickly" is not one of free, slow',
      ],
    ]);
  });

  test("a case's analysis has no case name or requirement of its own; unknown settings are named", () => {
    const text = only(
      '  - name: a\n    kind: other\n    analysis: { requiredFs: 1.2, slices: 20 }\n    colour: red\n',
    );
    expect(messagesOf(text).map((m) => [m.path, m.code, m.message])).toEqual([
      [
        'cases[0].analysis.requiredFs',
        'not-allowed',
        "is not allowed here: a case's requirement is its requiredFs, beside its name and kind",
      ],
      [
        'cases[0].colour',
        'unknown-setting',
        expect.stringMatching(
          /^unknown setting in design case; the settings here are name, kind, requiredFs/,
        ),
      ],
    ]);
  });

  test('at most 20 cases; a name of at most 100 characters', () => {
    const many = Array.from({ length: 21 }, (_, i) => `  - { name: c${i}, kind: other }`).join(
      '\n',
    );
    expect(one(only(`${many}\n`), 'cases', 'too-many').message).toBe(
      'has 21 entries, at most 20 allowed',
    );
    const long = only(`  - { name: ${'x'.repeat(101)}, kind: other }\n`);
    expect(one(long, 'cases[0].name').code).toBe('too-long');
  });

  test('values with units in a case are read in the file’s units', () => {
    const s = section(
      only(
        '  - name: a\n    kind: rapid-drawdown\n    water: { piezometric: 1800 cm }\n    drawdown:\n      after: { piezometric: 12 m }\n      materials: { clay: { drains: slow, dR: 0.008 MPa, psiR: 16 } }\n',
      ),
    );
    const [c] = s.cases!;
    expect(c.water).toMatchObject({
      line: [
        [0, 18],
        [50, 18],
      ],
    });
    expect(c.drawdown!.materials.clay).toEqual({ drains: 'slow', dR: 8, psiR: 16 });
  });
});

describe('the checks of each case: located messages', () => {
  const only = (cases: string) => `${BASE}cases:\n${cases}`;

  test('names are unique in a section', () => {
    const text = only('  - { name: same, kind: long-term }\n  - { name: same, kind: seismic }\n');
    const m = one(text, 'cases[1].name', 'case-name-twice');
    expect(m.message).toBe(
      '"same" is the name of an earlier case too; give each case a name of its own',
    );
    expect(where(m)).toEqual(at(text, 'name: same', 'same', 1));
  });

  test('a case changes only materials the section has, and its drawdown names only those', () => {
    const text = only(
      '  - name: a\n    kind: rapid-drawdown\n    materials: { caly: { unitWeight: 17 } }\n    drawdown:\n      after: { piezometric: 12 }\n      materials: { sand: { drains: free } }\n',
    );
    const a = one(text, 'cases[0].materials.caly');
    expect(a).toMatchObject({ severity: 'error', code: 'material-undefined' });
    expect(a.message).toBe(
      'no material of the section is named "caly"; did you mean clay? (a case changes the section\'s materials and adds none)',
    );
    expect(where(a)).toEqual(at(text, 'caly'));
    const b = one(text, 'cases[0].drawdown.materials.sand');
    expect(b.message).toMatch(
      /^no material of the section is named "sand"; the materials are fill, clay and rock/,
    );
    expect(where(b)).toEqual(at(text, 'sand: {', 'sand'));
  });

  test('a rigid base given a soil strength needs a unit weight', () => {
    const text = only(
      '  - name: a\n    kind: other\n    materials:\n      rock: { strength: { model: mohr-coulomb, cohesion: 50, frictionAngle: 40 } }\n',
    );
    const m = one(text, 'cases[0].materials.rock.strength', 'missing');
    expect(m.message).toBe(
      'unitWeight is missing: rock has none in the section (a rigid base), and a mohr-coulomb strength needs one; give unitWeight here too',
    );
    expect(
      section(text.replace('rock: { strength', 'rock: { unitWeight: 22, strength')).cases![0]
        .materials.rock.unitWeight,
    ).toBe(22);
  });

  test('the governing methods are among the methods the case asks for', () => {
    const text = only('  - name: a\n    kind: long-term\n    governs: [spencer, janbu]\n');
    const m = one(text, 'cases[0].governs[1]', 'governs-not-asked');
    expect(m.message).toBe(
      "janbu is not among this case's methods (bishop and spencer): add it to analysis.methods, or leave it out of governs",
    );
    expect(where(m)).toEqual(at(text, 'governs:', 'janbu'));
    // asked in the case's own analysis: fine
    section(
      text.replace(
        'governs: [spencer, janbu]',
        'governs: [janbu]\n    analysis: { methods: [janbu, spencer] }',
      ),
    );
  });

  test('a rapid drawdown needs a piezometric line before it, and one after it over the ground', () => {
    const dry = BASE.replace('water: { piezometric: [[0, 13], [50, 19]] }\n', '');
    const text = `${dry}cases:\n  - name: a\n    kind: rapid-drawdown\n    drawdown: { after: { piezometric: [[5, 9], [50, 12]] } }\n  - name: b\n    kind: rapid-drawdown\n    water: { ru: 0.3 }\n    drawdown: { after: { piezometric: 9 } }\n`;
    const [a, after, b] = messagesOf(text);
    expect([a.path, a.code, a.message]).toEqual([
      'cases[0].kind',
      'drawdown-water-before',
      'a rapid-drawdown case needs the water before drawdown as a piezometric line: give water: { piezometric: … } in the case or in the section',
    ]);
    expect(where(a)).toEqual(at(text, 'kind: rapid-drawdown', 'rapid-drawdown'));
    expect([after.path, after.code]).toEqual([
      'cases[0].drawdown.after.piezometric',
      'boundary-short',
    ]);
    expect(after.message).toMatch(
      /^the piezometric line after drawdown starts at x = 5 m, 5 m right of the ground's left end/,
    );
    expect(where(after)).toEqual(at(text, '[[5, 9]', '[[5, 9]'));
    expect([b.path, b.code]).toEqual(['cases[1].water', 'drawdown-water-before']);
    expect(b.message).toMatch(/as a piezometric line, not ru:/);
  });

  test('the water after drawdown above the water before is a warning', () => {
    const text = only(
      '  - name: a\n    kind: rapid-drawdown\n    drawdown: { after: { piezometric: [[0, 13], [50, 20]] } }\n',
    );
    const m = one(text, 'cases[0].drawdown.after.piezometric', 'drawdown-rises');
    expect(m.severity).toBe('warning');
    expect(m.message).toBe(
      'is above the water before drawdown between x = 0 and 50 m (by up to 1 m): after a drawdown the water is normally lower',
    );
  });

  test('a rigid material listed in a drawdown is a warning', () => {
    const text = only(
      '  - name: a\n    kind: rapid-drawdown\n    drawdown:\n      after: { piezometric: 9 }\n      materials: { rock: { drains: slow, dR: 5, psiR: 15 } }\n',
    );
    const m = one(text, 'cases[0].drawdown.materials.rock', 'drawdown-rigid');
    expect(m).toMatchObject({
      severity: 'warning',
      message: 'rock is a rigid base in this case: how it drains is not used',
    });
  });

  test('an earthquake without pga estimates no displacement: a warning', () => {
    const text = only(
      '  - name: a\n    kind: seismic\n    earthquake: { allowableDisplacement: 100 }\n',
    );
    const m = one(text, 'cases[0].earthquake', 'earthquake-no-pga');
    expect(m.severity).toBe('warning');
  });

  test('kh in a case whose kind is not seismic is a warning, from the section or the case', () => {
    const inherited = `${BASE.replace('seismic: { kh: 0, kv: 0 }', 'seismic: { kh: 0.1, kv: 0 }')}cases:\n  - { name: a, kind: long-term }\n  - { name: b, kind: seismic }\n`;
    const m = one(inherited, 'cases[0].kind', 'kh-not-seismic');
    expect(m.message).toBe(
      "long-term, but the section's seismic kh = 0.1 applies to this case: give it seismic: { kh: 0 }, or make its kind seismic",
    );
    const own = only('  - name: a\n    kind: end-of-construction\n    seismic: { kh: 0.15 }\n');
    expect(one(own, 'cases[0].seismic.kh', 'kh-not-seismic').message).toMatch(
      /^kh = 0\.15 in a end-of-construction case: a pseudo-static load/,
    );
    // a surcharge or other case may carry kh without a word
    expect(messagesOf(own.replace('end-of-construction', 'other'))).toEqual([]);
  });

  test('analysis.case beside cases is not used: a warning at it', () => {
    const text = `${BASE.replace('  requiredFs: 1.4\n', '  requiredFs: 1.4\n  case: long-term\n')}cases:\n  - { name: a, kind: other }\n`;
    const m = one(text, 'analysis.case', 'case-unused');
    expect(m.severity).toBe('warning');
    expect(where(m)).toEqual(at(text, 'case: long-term', 'long-term'));
  });

  test("each case is checked as the section it sees, the message at the case's own setting", () => {
    const text = only(
      [
        '  - name: a',
        '    kind: long-term',
        '    water: { piezometric: [[0, 13], [40, 19]] }',
        '    loads: [{ type: strip, from: 45, to: 55, pressure: 10 }]',
        '    materials: { clay: { unitWeight: 160 } }',
        '    analysis: { methods: [bishop, infinite-slope] }',
        '    requiredFs: 0.9',
        '',
      ].join('\n'),
    );
    expect(messagesOf(text).map((m) => [m.path, m.code, m.severity])).toEqual([
      // the section's saturated unit weight below the case's bulk one: at the case
      ['cases[0]', 'saturated-below-bulk', 'warning'],
      ['cases[0].water.piezometric', 'boundary-short', 'error'],
      ['cases[0].loads[0]', 'load-outside', 'error'],
      ['cases[0].materials.clay.unitWeight', 'unit-weight-unusual', 'warning'],
      ['cases[0].analysis.methods[1]', 'infinite-slope-missing', 'error'],
      ['cases[0].requiredFs', 'required-fs-below-one', 'warning'],
    ]);
    const [, water] = messagesOf(text);
    expect(where(water)).toEqual(at(text, '    water: { piezometric', '[[0, 13]'));
  });

  test("a message about the section's own settings that only a case causes is put at the case", () => {
    // the case makes the fill rigid: no surface enters the ground, none reaches the clay
    const text = only(
      '  - name: a\n    kind: other\n    materials: { fill: { strength: { model: rigid } } }\n',
    );
    expect(messagesOf(text).map((m) => [m.path, m.code, m.severity, m.message])).toEqual([
      [
        'cases[0]',
        'rigid-on-top',
        'warning',
        "with this case's settings, strata[0].material: the top stratum is rigid: no slip surface can enter the ground",
      ],
      [
        'cases[0]',
        'below-rigid',
        'warning',
        "with this case's settings, strata[1]: lies below the rigid fill (strata[0]): no slip surface can reach it",
      ],
    ]);
    expect(where(messagesOf(text)[0])).toEqual(at(text, '  - name: a', 'name'));
  });

  test('a message the section already gives is not said again for each case', () => {
    const text = `${BASE.replace('  requiredFs: 1.4\n', '  requiredFs: 0.9\n')}cases:\n  - { name: a, kind: other }\n  - { name: b, kind: other }\n`;
    expect(messagesOf(text).map((m) => [m.path, m.code])).toEqual([
      ['analysis.requiredFs', 'required-fs-below-one'],
    ]);
  });
});

describe('the work of all cases together is bounded as one analysis is', () => {
  const grid = '{ type: grid, centers: { nx: 50, ny: 50 }, radii: { count: 60 }, moves: 2 }';
  const heavy = BASE.replace('{ type: circle, center: [22, 36], radius: 20 }', grid);

  test('a section of 4 cases does 4 times the work; drawdown and seismic cases count their searches', () => {
    const a = { slices: 40, surface: { type: 'auto' } };
    expect(estimateCaseWork(a, 3, 'long-term')).toBe(estimateWork(a, 3));
    expect(estimateCaseWork(a, 3, 'rapid-drawdown')).toBe(4 * estimateWork(a, 3));
    expect(estimateCaseWork(a, 3, 'seismic')).toBe(12 * estimateWork(a, 3));
    const one = estimateWork(
      {
        slices: 40,
        surface: { type: 'grid', centers: { nx: 50, ny: 50 }, radii: { count: 60 }, moves: 2 },
      },
      3,
    );
    expect(one).toBeLessThan(WORK_LIMIT);
    expect(4 * one).toBeGreaterThan(WORK_LIMIT);
  });

  test('settings one analysis may use, asked by four cases, are refused at the settings', () => {
    expect(messagesOf(heavy)).toEqual([]);
    const four = `${heavy}cases:\n${['a', 'b', 'c', 'd'].map((n) => `  - { name: ${n}, kind: other }`).join('\n')}\n`;
    const { sections, messages } = parse(four);
    expect(sections).toEqual([]);
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ path: 'analysis.surface', code: 'too-much-work' });
    expect(messages[0].message).toMatch(
      /^the 4 cases ask for about 1\.\de\+8 slice evaluations together \("a" about 2\.\de\+7\), more than the 1e\+8 an analysis may use: use fewer grid centres, radii, moves, ground-range points, restarts or slices, or fewer cases$/,
    );
    expect(where(messages[0])).toEqual(at(four, 'surface: {', '{ type: grid'));
  });

  test("at the case's own surface when it gives the largest part; the searches of a seismic case counted", () => {
    const text = `${BASE}cases:\n  - name: a\n    kind: seismic\n    analysis: { surface: ${grid} }\n`;
    const m = one(text, 'cases[0].analysis.surface', 'too-much-work');
    expect(m.message).toMatch(
      /^the case asks for about .* \(a seismic case counts as 12 searches\): use /,
    );
  });
});

describe('corridor batches: the template’s cases, and a station’s changes to them', () => {
  const BATCH = `format: scarpline-batch/1
id: levee
units: si
template:
  materials:
    clay: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 28 } }
    sand: { unitWeight: 20, strength: { model: mohr-coulomb, cohesion: 0, frictionAngle: 34 } }
  strata: [{ material: clay }, { material: sand, depth: 4 }]
  water: { depth: 2 }
  analysis: { methods: [bishop], surface: { type: circle, center: [20, 25], radius: 12 }, requiredFs: 1.5 }
  cases:
    - name: long term
      kind: long-term
    - name: drawdown
      kind: rapid-drawdown
      requiredFs: 1.3
      water: { elevation: 19 }
      drawdown:
        after: { depth: 3 }
        materials: { clay: { drains: slow, dR: 8, psiR: 16 } }
sections:
  - station: 0
    ground: [[0, 10], [10, 10], [30, 20], [40, 20]]
  - station: 20
    ground: [[0, 11], [10, 11], [30, 21], [40, 21]]
    cases:
      - name: drawdown
        requiredFs: 1.2
        drawdown:
          after: { elevation: 12 }
          materials: { sand: { drains: free } }
        analysis: { slices: 50 }
      - name: earthquake
        kind: seismic
        seismic: { kh: 0.1 }
        earthquake: { pga: 0.2 }
`;

  test("every station gets the template's cases, its water by depth following its ground", () => {
    const { sections, messages } = parse(BATCH, 'levee.yaml');
    expect(messages.map(formatMessage)).toEqual([]);
    const [a] = sections;
    expect(a.cases!.map((c) => [c.name, c.kind, c.requiredFs])).toEqual([
      ['long term', 'long-term', 1.5],
      ['drawdown', 'rapid-drawdown', 1.3],
    ]);
    expect(a.cases![0].water).toEqual(a.water);
    expect(a.cases![1].water).toMatchObject({
      line: [
        [0, 19],
        [40, 19],
      ],
    });
    expect(a.cases![1].drawdown!.after).toMatchObject({
      line: [
        [0, 7],
        [10, 7],
        [30, 17],
        [40, 17],
      ],
    });
  });

  test("a station's case of the same name changes only what it gives; a case of another name is added", () => {
    const [, b] = parse(BATCH, 'levee.yaml').sections;
    expect(b.cases!.map((c) => [c.name, c.kind, c.requiredFs])).toEqual([
      ['long term', 'long-term', 1.5],
      ['drawdown', 'rapid-drawdown', 1.2],
      ['earthquake', 'seismic', 1.5],
    ]);
    const dd = b.cases![1];
    // the water before: the template case's; after: the station's; drainage merged by name
    expect(dd.water).toMatchObject({
      line: [
        [0, 19],
        [40, 19],
      ],
    });
    expect(dd.drawdown).toEqual({
      after: {
        kind: 'piezometric',
        line: [
          [0, 12],
          [40, 12],
        ],
        unitWeight: 9.81,
      },
      materials: { clay: { drains: 'slow', dR: 8, psiR: 16 }, sand: { drains: 'free' } },
    });
    // analysis setting by setting: the template's methods and surface, the station's slices
    expect(dd.analysis).toMatchObject({
      methods: ['bishop'],
      slices: 50,
      surface: { type: 'circle' },
    });
    expect(b.cases![2].earthquake).toEqual({
      pga: 0.2,
      magnitude: null,
      allowableDisplacement: null,
    });
  });

  test("a template case's error is said once, at the template; a station's at the station", () => {
    const text = BATCH.replace(
      'materials: { clay: { drains: slow, dR: 8, psiR: 16 } }',
      'materials: { caly: { drains: slow, dR: 8, psiR: 16 } }',
    ).replace('materials: { sand: { drains: free } }', 'materials: { snad: { drains: free } }');
    const { messages, sections } = parse(text, 'levee.yaml');
    expect(messages.map((m) => [m.path, m.code, m.sections])).toEqual([
      ['template.cases[1].drawdown.materials.caly', 'material-undefined', ['levee@0', 'levee@20']],
      ['sections[1].cases[0].drawdown.materials.snad', 'material-undefined', ['levee@20']],
    ]);
    expect(where(messages[0])).toEqual(at(text, 'caly'));
    expect(where(messages[1])).toEqual(at(text, 'snad'));
    expect(sections).toEqual([]);
  });

  test('a new case at a station needs its kind; names are unique after the merge', () => {
    const text = BATCH.replace(
      '      - name: earthquake\n        kind: seismic\n',
      '      - name: earthquake\n',
    ).replace(
      '        earthquake: { pga: 0.2 }\n',
      '        earthquake: { pga: 0.2 }\n      - name: drawdown\n        kind: other\n',
    );
    const { messages } = parse(text, 'levee.yaml');
    expect(messages.map((m) => [m.path, m.code])).toEqual([
      ['sections[1].cases[1]', 'missing'],
      ['sections[1].cases[2].name', 'case-name-twice'],
    ]);
    expect(messages[0].message).toMatch(/^kind is missing/);
  });

  test("a case's water by one of depth, elevation and ru; a drawdown's water after it by depth or elevation", () => {
    const text = BATCH.replace(
      'water: { elevation: 19 }',
      'water: { elevation: 19, ru: 0.1 }',
    ).replace('after: { elevation: 12 }', 'after: {}');
    const { messages } = parse(text, 'levee.yaml');
    expect(messages.map((m) => [m.path, m.code, m.message])).toEqual([
      ['template.cases[1].water', 'water-both', 'gives elevation and ru; give one of them'],
      [
        'sections[1].cases[0].drawdown.after',
        'missing',
        'depth or elevation is missing (the piezometric line after drawdown, below the ground or as an elevation)',
      ],
    ]);
  });

  test('a template case given by depth counts toward the values the sections hold', () => {
    // (the same bound as strata and water by depth: each such level is a copy of each ground)
    const { messages } = parse(BATCH, 'levee.yaml');
    expect(messages.filter((m) => m.code === 'too-many-values')).toEqual([]);
  });
});
