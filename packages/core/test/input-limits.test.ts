/**
 * Input that cannot hurt whoever reads it: each attack on the reading of files, reproduced,
 * and refused with a located message in plain words. Only the behaviour is tested here (what
 * is refused, where, in which words); how fast is for the benchmarks.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { LineCounter, parseDocument } from 'yaml';
import { batchSchema, sectionSchema } from '@scarpline/schemas';
import {
  INPUT_LIMITS,
  MAX_SECTIONS,
  badCharacter,
  capMessages,
  countValues,
  formatMessage,
  isGeoJsonCorridor,
  parseGeoJsonCorridor,
  parseSections,
  readSectionDocument,
  screenText,
  type Message,
} from '@scarpline/core';
import { JsonIndex } from '../src/input/json-index';
import { locateInDocument } from '../src/input/locate-in-document';
import type { PathKey } from '../src/input/types';
import { closest } from '../src/input/words';

const ROOT = join(__dirname, '../../..');
const CORRIDOR = readFileSync(join(ROOT, 'examples/corridor/corridor.json'), 'utf8');

/** A valid section as data, to spoil one setting of. */
const section = (): Record<string, unknown> => ({
  format: 'scarpline/1',
  id: 'wcb-1240-L',
  units: 'si',
  ground: [
    [0, 62],
    [18, 62],
    [38, 72],
    [70, 74],
  ],
  materials: {
    till: {
      unitWeight: 20.5,
      strength: { model: 'mohr-coulomb', cohesion: 6, frictionAngle: 29 },
    },
  },
  strata: [{ material: 'till' }],
  analysis: {
    methods: ['bishop'],
    surface: { type: 'circle', center: [23.19, 84], radius: 23.84 },
  },
});
const corridor = (): Record<string, unknown> => JSON.parse(CORRIDOR) as Record<string, unknown>;
const lines = (ms: readonly Message[]) => ms.map(formatMessage);
const codes = (ms: readonly Message[]) => ms.map((m) => m.code);

describe('nesting: refused by a scan before any parser runs', () => {
  const deep = '['.repeat(10000) + ']'.repeat(10000);

  test.each([
    ['deep.yaml', 64],
    ['deep.json', 65],
  ])('10 000 nested lists in %s: one located error, no stack overflow', (name, column) => {
    const { sections, messages, entries } = parseSections(deep, name);
    expect(sections).toEqual([]);
    expect(entries).toEqual([]);
    expect(lines(messages)).toEqual([
      `${name}:1:${column} lists and groups are nested more than 64 deep here; a section file needs far fewer: is this the right file?`,
    ]);
    expect(messages[0].code).toBe('too-deep');
  });

  test('lists of the block style inside one another on one line (`- - - x`), and by indentation', () => {
    expect(codes(parseSections('- '.repeat(10000) + 'x\n', 'dashes.yaml').messages)).toEqual([
      'too-deep',
    ]);
    let indented = '';
    for (let i = 0; i < 3000; i++) indented += `${' '.repeat(i)}a:\n`;
    const { messages } = parseSections(indented, 'indent.yaml');
    expect(lines(messages)).toEqual([
      'indent.yaml:65:65 lists and groups are nested more than 64 deep here; a section file needs far fewer: is this the right file?',
    ]);
  });

  test('groups of the flow style inside a block setting, and quoted brackets that are text', () => {
    const deepGroups = `format: scarpline/1\nid: x\ntitle: {${'"a": {'.repeat(100)}}}\n`;
    expect(codes(parseSections(deepGroups, 'groups.yaml').messages)).toEqual(['too-deep']);
    // brackets inside texts, comments and block texts open nothing
    const text = [
      `title: "${'['.repeat(100)}"`,
      `description: '${'{'.repeat(100)}'`,
      `# ${'['.repeat(100)}`,
      'notes: |',
      `  ${'['.repeat(100)}`,
      `plain: a ${'['.repeat(100)}`,
    ].join('\n');
    expect(screenText(text, false).refusal).toBeNull();
  });

  test('YAML aliases that would make data deeper than its text: refused by the parser', () => {
    let chain = 'a0: &a0 [1]\n';
    for (let i = 1; i < 1500; i++) chain += `a${i}: &a${i} [*a${i - 1}]\n`;
    const { messages, sections } = parseSections(chain, 'aliases.yaml');
    expect(sections).toEqual([]);
    expect(lines(messages)).toEqual([
      'aliases.yaml:1:1 Excessive alias count indicates a resource exhaustion attack',
    ]);
  });

  test('every example and fixture passes the scan; JSON is counted exactly', () => {
    const files = [
      ...['cut-homogeneous', 'cut-mixed-units', 'embankment-stages', 'levee-land-side'].map((f) =>
        join(ROOT, 'examples', `${f}.yaml`),
      ),
      join(ROOT, 'examples/corridor/corridor.json'),
      ...['batch.yaml', 'multi.yaml', 'names.yaml', 'units-in-batch.yaml', 'json-schema.json'].map(
        (f) => join(__dirname, 'in', f),
      ),
    ];
    for (const file of files) {
      const text = readFileSync(file, 'utf8');
      const json = file.endsWith('.json');
      const screened = screenText(text, json);
      expect(screened.refusal).toBeNull();
      if (json) expect(screened.values).toBe(countValues(JSON.parse(text)));
    }
  });
});

describe('size: the text, its lists and its values are counted before anything is parsed', () => {
  test('a 10 MB JSON file of five million numbers is refused by its length', () => {
    const text = `[${'1,'.repeat(5_000_000 - 1)}1]`;
    const { messages } = parseSections(text, 'big.json');
    expect(lines(messages)).toEqual([
      'big.json:1:1 the file has 10 000 001 characters; at most 8 000 000 are read (split a long corridor into several batches)',
    ]);
  });

  test('a list longer than any list of a section file, in JSON and in YAML', () => {
    const list = `[${'1.5,'.repeat(1_000_000)}1]`;
    expect(lines(parseSections(list, 'list.json').messages)).toEqual([
      'list.json:1:1 a list of more than 2 000 entries; at most 2 000 are read',
    ]);
    const block = `ground:\n${'  - [0, 1]\n'.repeat(3000)}`;
    expect(lines(parseSections(block, 'list.yaml').messages)).toEqual([
      'list.yaml:2:3 a list of more than 2 000 entries; at most 2 000 are read',
    ]);
  });

  test('many lists, each short enough, holding more values than a file may', () => {
    const row = `[${'1.5,'.repeat(1999)}1]`;
    const text = `[${Array.from({ length: 101 }, () => row).join(',\n')}]`;
    const { messages } = parseSections(text, 'rows.json');
    expect(codes(messages)).toEqual(['too-many-values']);
    expect(messages[0].message).toBe(
      'the file holds more than 200 000 values (numbers, texts, lists and groups); at most 200 000 are read',
    );
    expect(messages[0].line).toBe(100);
  });

  test('a text longer than any a section file holds: in quotes, plain, and as a block', () => {
    const long = 'x'.repeat(1_000_000);
    const data = section();
    data.analysis = { methods: [long] };
    const { messages } = parseSections(JSON.stringify(data), 'method.json');
    expect(codes(messages)).toEqual(['too-long']);
    expect(messages[0].message).toBe(
      'a text of more than 10 000 characters; at most 10 000 are read',
    );
    expect(codes(parseSections(`title: ${long}\n`, 'plain.yaml').messages)).toEqual(['too-long']);
    const block = `description: |\n${`  ${'y'.repeat(100)}\n`.repeat(200)}`;
    expect(codes(parseSections(block, 'block.yaml').messages)).toEqual(['too-long']);
  });

  test('a batch of 20 000 sections is refused by its count before any section is read', () => {
    const batch = corridor();
    batch.sections = Array.from({ length: 20000 }, (_, i) => ({
      station: i,
      ground: [
        [0, 0],
        [10, 5],
      ],
    }));
    // (more than any list may hold: the scan of the text refuses it)
    const text = JSON.stringify(batch);
    expect(codes(parseSections(text, 'b.json').messages)).toEqual(['too-many']);
    // a count the scan lets through and the batch schema does not: refused by the count alone
    batch.sections = (batch.sections as unknown[]).slice(0, MAX_SECTIONS + 1);
    const parsed = parseSections(JSON.stringify(batch, null, 1), 'b.json');
    expect(parsed.entries).toEqual([]);
    expect(parsed.batch?.id).toBe('wcb-main');
    expect(parsed.messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'sections: has 1 001 sections; a batch holds at most 1 000: split the corridor into several batches',
    ]);
  });

  test('a template that every section copies cannot make the batch larger than what is read', () => {
    const batch = corridor();
    const template = batch.template as Record<string, unknown>;
    const elevation = Array.from({ length: 1000 }, (_, i) => [i * 0.2 - 100, -20 - i * 0.001]);
    template.strata = [
      { material: 'weathered-mudstone' },
      ...Array.from({ length: 40 }, (_, k) => ({
        material: 'weathered-mudstone',
        elevation: elevation.map(([x, y]) => [x, y - k]),
      })),
    ];
    const { messages, entries } = parseSections(JSON.stringify(batch), 'amplified.json');
    expect(entries).toEqual([]);
    expect(codes(messages)).toEqual(['too-many-values']);
    expect(messages[0].message).toMatch(
      /^the sections hold \d( \d{3}){2} values once each is given the template .*; at most 2 000 000 are read: split the corridor into several batches, or give fewer points$/,
    );
  });

  test('the limits of the schemas: a title, strata, the points of a polyline', () => {
    const data = section();
    data.title = 't'.repeat(201);
    data.strata = Array.from({ length: 51 }, (_, i) =>
      i === 0 ? { material: 'till' } : { material: 'till', top: 60 - i * 0.1 },
    );
    data.ground = Array.from({ length: 1001 }, (_, i) => [i * 0.1, 62 + i * 0.01]);
    const { messages, sections } = parseSections(JSON.stringify(data, null, 2), 'limits.json');
    expect(sections).toEqual([]);
    expect(messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'ground: has 1001 points, at most 1000 allowed',
      'strata: has 51 entries, at most 50 allowed',
      'title: is longer than 200 characters',
    ]);
  });

  test('every limit of the schemas lies within the limits of every file', () => {
    const found: [string, number][] = [];
    const walk = (v: unknown, at: string): void => {
      if (Array.isArray(v)) v.forEach((x, i) => walk(x, `${at}/${i}`));
      else if (v && typeof v === 'object') {
        for (const [k, x] of Object.entries(v)) {
          if (['maxItems', 'maxLength', 'maxProperties'].includes(k) && typeof x === 'number') {
            found.push([`${at}/${k}`, x]);
          } else walk(x, `${at}/${k}`);
        }
      }
    };
    walk(sectionSchema, 'section');
    walk(batchSchema, 'batch');
    expect(found.length).toBeGreaterThan(20);
    for (const [where, limit] of found) {
      const most = where.endsWith('maxLength') ? INPUT_LIMITS.textLength : INPUT_LIMITS.entries;
      expect([where, limit <= most]).toEqual([where, true]);
    }
    expect(MAX_SECTIONS).toBe(1000);
  });
});

describe('values with their unit', () => {
  test('a text far longer than a value with its unit is not read as one', () => {
    const data = section();
    const till = (data.materials as Record<string, Record<string, unknown>>).till;
    till.unitWeight = `20 k${' '.repeat(5000)}N/m3`;
    const { messages } = parseSections(JSON.stringify(data), 'unit.json');
    expect(messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'materials.till.unitWeight: is longer than 100 characters',
    ]);
  });
});

describe('"did you mean": only for words a person could have misspelt, at a bounded cost', () => {
  test('a word of a million characters gets no suggestion', () => {
    expect(closest('x'.repeat(1_000_000), ['bishop', 'spencer'])).toBeNull();
    expect(closest('bishpo', ['ordinary', 'bishop', 'spencer'])).toBe('bishop');
    expect(closest('frictionangle', ['cohesion', 'frictionAngle'])).toBe('frictionAngle');
  });

  test('a long method name is quoted shortened, with its length', () => {
    const data = section();
    data.analysis = { methods: ['x'.repeat(9000)] };
    const { messages } = parseSections(JSON.stringify(data), 'method.json');
    expect(messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'analysis.methods[0]: "xxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxxx…" (9000 characters) is not one of ordinary, bishop, janbu, spencer, morgenstern-price, phi-zero-circle, log-spiral, infinite-slope',
    ]);
  });

  test('a list of materials in a message names ten and counts the rest', () => {
    const data = section();
    const till = (data.materials as Record<string, unknown>).till;
    data.materials = Object.fromEntries(Array.from({ length: 12 }, (_, i) => [`m${i}`, till]));
    data.strata = [{ material: 'granite' }];
    const { messages } = parseSections(JSON.stringify(data), 'm.json');
    expect(messages.find((m) => m.code === 'material-undefined')?.message).toBe(
      'no material is named "granite"; the materials are m0, m1, m2, m3, m4, m5, m6, m7, m8, m9 and 2 more',
    );
  });
});

describe('the messages of a file: at most 200, and one that counts the rest', () => {
  test('a small file with thousands of errors gives 200 of them and the count of the others', () => {
    const batch = corridor();
    batch.sections = Array.from({ length: 30 }, (_, i) => ({
      station: i,
      ground: Array.from({ length: 30 }, (_, j) => [30 - j, 'x']),
    }));
    const text = JSON.stringify(batch);
    const { messages, entries } = parseSections(text, 'errors.json');
    expect(messages).toHaveLength(201);
    const last = messages[200];
    expect(last.code).toBe('more-messages');
    expect(last.severity).toBe('error');
    expect(last.message).toBe(
      '700 more messages not shown (700 errors), the first of them here: correct the ones above and read the file again',
    );
    // the first left out: the eleventh point of the seventh section
    expect(last.path).toBe('');
    expect(last.column).toBeGreaterThan(messages[199].column);
    expect(last.sections).toEqual(entries.slice(6).map((e) => e.id));
    // each section keeps its own (30 each: under the limit)
    expect(entries[20].messages).toHaveLength(30);
  });

  test('errors are kept before warnings; a list within the limit comes back as it is', () => {
    const m = (severity: Message['severity'], line: number): Message => ({
      severity,
      file: 'f.yaml',
      line,
      column: 1,
      path: '',
      code: severity,
      message: severity,
      sections: [`s${line}`],
    });
    const list = [
      ...Array.from({ length: 5 }, (_, i) => m('warning', i + 1)),
      m('error', 9),
      m('error', 10),
    ];
    expect(capMessages(list, 10)).toEqual(list);
    const capped = capMessages(list, 3);
    expect(capped.map((x) => `${x.code}:${x.line}`)).toEqual([
      'warning:1',
      'error:9',
      'error:10',
      'more-messages:2',
    ]);
    expect(capped[3].severity).toBe('warning');
    expect(capped[3].message).toBe(
      '4 more messages not shown (4 warnings), the first of them here: correct the ones above and read the file again',
    );
    expect(capped[3].sections).toEqual(['s2', 's3', 's4', 's5']);
  });

  test('past a thousand errors the rest of a file is not read, and a message says so', () => {
    const batch = corridor();
    const sections = batch.sections as Record<string, unknown>[];
    for (const item of sections) {
      item.strata = Array.from({ length: 30 }, (_, k) =>
        k === 0 ? { material: 'granite' } : { material: `granite${k}`, elevation: -k },
      );
    }
    const { messages, entries } = parseSections(JSON.stringify(batch, null, 1), 'many.json');
    const notRead = messages[messages.length - 1];
    expect(notRead.code).toBe('not-read');
    expect(notRead.message).toBe(
      'more than 1 000 errors: the rest of the file is not read; correct those above and read it again',
    );
    expect(messages[messages.length - 2].code).toBe('more-messages');
    expect(entries.every((e) => e.section === null)).toBe(true);
    // 30 errors a section: the thousandth is the tenth of the 34th section; the rest of it,
    // and the sections after it, are not read
    expect(notRead.line).toBeGreaterThan(entries[33].line);
    expect(notRead.line).toBeLessThan(entries[34].line);
    expect(entries[60].messages.map((m) => m.code)).toEqual(['not-read']);
    expect(notRead.sections).toEqual(entries.slice(33).map((e) => e.id));
  });

  test('errors that come from the template count once a section toward the thousand', () => {
    const batch = corridor();
    const template = batch.template as Record<string, unknown>;
    template.strata = Array.from({ length: 30 }, (_, k) =>
      k === 0 ? { material: 'granite' } : { material: `granite${k}`, elevation: -k },
    );
    batch.sections = (batch.sections as Record<string, unknown>[]).map(({ station, ground }) => ({
      station,
      ground,
    }));
    const { messages } = parseSections(JSON.stringify(batch, null, 1), 'template.json');
    // each said once, for the stations checked (34 of 61: 1 020 errors), then the stop
    const undefinedMaterial = messages.filter((m) => m.code === 'material-undefined');
    expect(undefinedMaterial).toHaveLength(30);
    expect(undefinedMaterial[0].message).toBe(
      'at stations 1000, 1020, 1040, 1060, 1080 and 29 more: no material is named "granite"; the materials are weathered-mudstone and mudstone',
    );
    expect(undefinedMaterial[0].sections).toHaveLength(34);
    expect(messages[messages.length - 1].code).toBe('not-read');
  });
});

describe('text that no stored text may hold: U+0000 and half of a surrogate pair', () => {
  test.each([
    ['title', { title: 'Ch 1+240\u0000' }, 'title', 'the character U+0000 (NUL)'],
    ['the id', { id: 'wcb\u0000' }, 'id', 'the character U+0000 (NUL)'],
    [
      "a case's name",
      { analysis: { case: 'long-term\ud800' } },
      'analysis.case',
      'half of a character on its own (U+D800, a lone surrogate: the text is not valid Unicode)',
    ],
    [
      "a stratum's material",
      { strata: [{ material: 'till\udc00' }] },
      'strata[0].material',
      'half of a character on its own (U+DC00, a lone surrogate: the text is not valid Unicode)',
    ],
  ])('in %s: an error where it is written', (_, change, path, words) => {
    for (const name of ['s.json', 's.yaml']) {
      const { sections, messages } = parseSections(
        JSON.stringify({ ...section(), ...change }, null, 2),
        name,
      );
      expect(sections).toEqual([]);
      const m = messages.find((x) => x.code === 'bad-character');
      expect(m && `${m.path}: ${m.message}`).toBe(`${path}: holds ${words}: remove it`);
    }
  });

  test("in a material's name: an error at the name", () => {
    const data = section();
    data.materials = { 'till\u0000': (data.materials as Record<string, unknown>).till };
    data.strata = [{ material: 'till\u0000' }];
    const { messages } = parseSections(JSON.stringify(data, null, 2), 'n.json');
    const bad = messages.filter((m) => m.code === 'bad-character');
    const text = JSON.stringify(data, null, 2);
    const lineOf = (needle: string) => text.split('\n').findIndex((l) => l.includes(needle)) + 1;
    expect(bad.map((m) => `${m.line}:${m.column} ${m.message}`)).toEqual([
      `${lineOf('"till\\u0000": {')}:5 the name holds the character U+0000 (NUL): remove it`,
      `${lineOf('"material": "till\\u0000"')}:19 holds the character U+0000 (NUL): remove it`,
    ]);
  });

  test('in a batch: the sections it concerns are not read', () => {
    const batch = corridor();
    const sections = batch.sections as Record<string, unknown>[];
    sections[1].title = 'bad\ud83d';
    const { entries, messages } = parseSections(JSON.stringify(batch, null, 1), 'c.json');
    expect(entries.filter((e) => e.section === null).map((e) => e.id)).toEqual([entries[1].id]);
    expect(messages.map((m) => `${m.path}: ${m.code}`)).toEqual([
      'sections[1].title: bad-character',
    ]);
    expect(messages[0].sections).toEqual([entries[1].id]);
  });

  test('badCharacter passes whole surrogate pairs and other text', () => {
    expect(badCharacter('Wendlecombe 🌧 ±5° — naïve')).toBeNull();
    expect(badCharacter('a\u0000')).toBe('the character U+0000 (NUL)');
    expect(badCharacter('\ude00x')).toMatch(/^half of a character on its own \(U\+DE00/);
  });
});

describe('a GeoJSON corridor', () => {
  const feature = (station: number, extra: Record<string, unknown> = {}) => ({
    type: 'Feature',
    properties: { station, ...extra },
    geometry: {
      type: 'LineString',
      coordinates: [
        [0, 0, 62],
        [18, 0, 62],
        [38, 0, 72],
        [70, 0, 74],
      ],
    },
  });
  const head = {
    id: 'gis',
    units: 'si',
    template: {
      materials: section().materials as Record<string, unknown>,
      strata: [{ material: 'till' }],
      analysis: section().analysis,
    },
  };
  const collection = (features: unknown[]) =>
    JSON.stringify({ type: 'FeatureCollection', scarpline: head, features }, null, 1);

  test('of more features than a corridor has sections: refused by the count', () => {
    const text = collection(Array.from({ length: MAX_SECTIONS + 1 }, (_, i) => feature(i)));
    expect(isGeoJsonCorridor(text)).toBe(true);
    const { messages, sections } = parseGeoJsonCorridor(text, 'c.geojson');
    expect(sections).toEqual([]);
    expect(messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'features: has 1 001 features; a corridor holds at most 1 000 sections: split it into several files',
    ]);
  });

  test('too large to read: told by its beginning, refused with the reason', () => {
    const text = `{"type": "FeatureCollection", "features": [${'['.repeat(100)}${']'.repeat(100)}]}`;
    expect(isGeoJsonCorridor(text)).toBe(true);
    expect(codes(parseGeoJsonCorridor(text, 'c.geojson').messages)).toEqual(['too-deep']);
  });

  test('a NUL in a property kept for the results, and in a setting: errors where they are', () => {
    const text = collection([
      feature(0, { name: 'XS\u0000' }),
      feature(20, { title: 'x\u0000' }),
      feature(40),
    ]);
    const { messages, entries, sections } = parseGeoJsonCorridor(text, 'c.geojson');
    expect(messages.map((m) => `${m.path}: ${m.code}`)).toEqual([
      'features[0].properties.name: bad-character',
      'features[1].properties.title: bad-character',
    ]);
    expect(entries.map((e) => e.section !== null)).toEqual([false, false, true]);
    expect(sections.map((s) => s.id)).toEqual(['gis@40']);
  });
});

describe('a GeoJSON corridor, its settings and its lines', () => {
  const line = (n: number) => Array.from({ length: n }, (_, i) => [i * 0.1, 0, 62 + i * 0.01]);
  const feature = (station: number, coordinates: number[][]) => ({
    type: 'Feature',
    properties: { station },
    geometry: { type: 'LineString', coordinates },
  });
  const head = (title: string) => ({
    id: 'gis',
    title,
    units: 'si',
    template: { materials: section().materials, strata: [{ material: 'till' }] },
  });

  test('a NUL in the corridor settings: every section is stopped, and told', () => {
    const text = JSON.stringify(
      {
        type: 'FeatureCollection',
        scarpline: head('GIS\u0000'),
        features: [feature(0, line(5)), feature(20, line(5))],
      },
      null,
      1,
    );
    const { messages, entries } = parseGeoJsonCorridor(text, 'c.geojson');
    expect(messages.map((m) => `${m.path}: ${m.code}`)).toEqual(['scarpline.title: bad-character']);
    expect(messages[0].sections).toEqual(['gis@0', 'gis@20']);
    expect(entries.map((e) => e.section)).toEqual([null, null]);
  });

  test('a line of more points than a polyline may have: an error at its coordinates', () => {
    const text = JSON.stringify(
      {
        type: 'FeatureCollection',
        scarpline: head('GIS'),
        features: [feature(0, line(1001)), feature(20, line(5))],
      },
      null,
      1,
    );
    const { messages, sections } = parseGeoJsonCorridor(text, 'c.geojson');
    expect(messages.map((m) => `${m.path}: ${m.message}`)).toEqual([
      'features[0].geometry.coordinates: has 1001 points, at most 1000 allowed',
    ]);
    expect(sections.map((s) => s.id)).toEqual(['gis@20']);
  });
});

describe('an edited section document that is not one', () => {
  test('nested too deep to write out: refused, nothing thrown', () => {
    let doc: unknown = 1;
    for (let i = 0; i < 100_000; i++) doc = [doc];
    const read = readSectionDocument(doc, 'edited-section.json', 'si');
    expect(read.section).toBeNull();
    expect(read.messages.map((m) => m.code)).toEqual(['too-deep']);
  });
});

describe('JSON files are located by an index of their text, as the YAML parser locates them', () => {
  const small = corridor();
  small.sections = (small.sections as unknown[]).slice(0, 4);
  const documents = [
    JSON.stringify(small, null, 2),
    readFileSync(join(__dirname, 'in/json-schema.json'), 'utf8'),
    JSON.stringify(section()),
    JSON.stringify({ 'a.b': { 'x"y': [1, [2, { '': null }]], '\u00e9': '\\"' } }, null, 3),
    '  [ {"a" : 1 ,"b":[ ]} , { } ]  ',
  ];
  /** Every path into the data, and one more that is not there below each. */
  const paths = (data: unknown, at: PathKey[] = []): PathKey[][] => {
    const out: PathKey[][] = [at, [...at, 'missing'], [...at, 99]];
    if (Array.isArray(data)) data.forEach((v, i) => out.push(...paths(v, [...at, i])));
    else if (data && typeof data === 'object') {
      for (const [k, v] of Object.entries(data)) out.push(...paths(v, [...at, k]));
    }
    return out;
  };

  test.each(documents.map((d, i) => [i, d]))('document %i', (_, text) => {
    const index = new JsonIndex(text);
    const counter = new LineCounter();
    const doc = parseDocument(text, { lineCounter: counter, schema: 'json' });
    for (const path of paths(JSON.parse(text))) {
      for (const atKey of [false, true]) {
        expect([path, atKey, index.locate(path, atKey)]).toEqual([
          path,
          atKey,
          locateInDocument(doc, counter, path, atKey),
        ]);
      }
      // and back: the place of a value gives its path
      const offset = index.offset(path);
      const back = index.pathAt(offset);
      expect(index.offset(back)).toBe(offset);
    }
  });

  test('a JSON file that names a setting twice is read by the YAML parser, which says so', () => {
    const text = '{\n  "format": "scarpline/1",\n  "id": "a",\n  "id": "b"\n}';
    expect(lines(parseSections(text, 'twice.json').messages)).toEqual([
      'twice.json:4:3 the key "id" appears twice in the same mapping',
    ]);
  });
});
