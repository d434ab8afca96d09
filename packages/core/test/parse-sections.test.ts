import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { formatMessage, parseSections, type Section } from '@scarpline/core';

const IN = join(__dirname, 'in');
const OUT = join(__dirname, 'out');

const parse = (text: string, name = 'test.yaml') => parseSections(text, name);
const errorsOf = (text: string, name?: string) =>
  parse(text, name).messages.filter((m) => m.severity === 'error');

describe('fixtures: test/in/<name> gives the located messages of test/out/<name>.json', () => {
  const files = readdirSync(IN).sort();
  test('every input has its expected output', () => {
    const outs = readdirSync(OUT).sort();
    expect(outs).toEqual(files.map((f) => f.replace(/\.(yaml|json)$/, '.json')));
  });
  test.each(files)('%s', (file) => {
    const expected = JSON.parse(
      readFileSync(join(OUT, file.replace(/\.(yaml|json)$/, '.json')), 'utf8'),
    ) as { sections: string[]; messages: string[] };
    const { sections, messages } = parseSections(readFileSync(join(IN, file), 'utf8'), file);
    expect(messages.map(formatMessage)).toEqual(expected.messages);
    expect(sections.map((s) => s.id)).toEqual(expected.sections);
    for (const m of messages) {
      expect(m.file).toBe(file);
      expect(m.code).toMatch(/^[a-z]+(-[a-z]+)*$/);
      expect(m.line).toBeGreaterThanOrEqual(1);
      expect(m.column).toBeGreaterThanOrEqual(1);
    }
  });
});

describe('the message format', () => {
  test('file:line:column path: message, as in the format described for users', () => {
    expect(
      formatMessage({
        severity: 'error',
        file: 'clay-cut.yaml',
        line: 12,
        column: 34,
        path: 'materials.clay.strength.frictionAngle',
        code: 'above-maximum',
        message: '95 is above 90°',
      }),
    ).toBe('clay-cut.yaml:12:34 materials.clay.strength.frictionAngle: 95 is above 90°');
  });
  test('a frictionAngle of 95 in a flow mapping is located at the 95', () => {
    const line =
      '  clay: { unitWeight: 17.5, strength: { model: mohr-coulomb, frictionAngle: 95, cohesion: 2 } }';
    const text = [
      'format: scarpline/1',
      'id: clay-cut',
      'units: si',
      'ground: [[0, 20], [12, 20], [32, 30], [50, 30]]',
      'materials:',
      line,
      'strata: [{ material: clay }]',
    ].join('\n');
    const [m] = errorsOf(text, 'clay-cut.yaml');
    expect(m).toMatchObject({ line: 6, column: line.indexOf('95') + 1, code: 'above-maximum' });
    expect(formatMessage(m)).toBe(
      `clay-cut.yaml:6:${line.indexOf('95') + 1} materials.clay.strength.frictionAngle: 95 is above 90°`,
    );
  });
});

const MINIMAL = `format: scarpline/1
id: minimal
units: si
ground: [[0, 10], [10, 10], [30, 20], [40, 20]]
materials:
  soil: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
strata:
  - { material: soil }
`;

describe('normalisation', () => {
  test('fills every default', () => {
    const { sections, messages } = parse(MINIMAL);
    expect(messages).toEqual([]);
    const s = sections[0];
    expect(s).toEqual<Section>({
      format: 'scarpline/1',
      id: 'minimal',
      title: 'minimal',
      station: null,
      offset: null,
      units: 'si',
      ground: [
        [0, 10],
        [10, 10],
        [30, 20],
        [40, 20],
      ],
      materials: {
        soil: {
          name: 'soil',
          unitWeight: 19,
          saturatedUnitWeight: 19,
          strength: { model: 'mohr-coulomb', cohesion: 4, frictionAngle: 30 },
        },
      },
      strata: [
        {
          material: 'soil',
          top: [
            [0, 10],
            [10, 10],
            [30, 20],
            [40, 20],
          ],
        },
      ],
      water: { kind: 'none', unitWeight: 9.81 },
      loads: [],
      reinforcement: [],
      seismic: { kh: 0, kv: 0 },
      crack: null,
      analysis: {
        methods: ['bishop'],
        slices: 30,
        surface: { type: 'auto' },
        infiniteSlope: null,
        case: null,
        requiredFs: null,
      },
    });
  });

  test('constant elevations become level lines over the ground; undrained defaults', () => {
    const text = `${MINIMAL.replace('strata:\n  - { material: soil }\n', '')}  clay: { unitWeight: 17, strength: { model: undrained, su: 20 } }
  rock: { strength: { model: rigid } }
strata:
  - { material: soil }
  - { material: clay, top: 8 }
  - { material: rock, top: 2 }
water: { piezometric: 9, unitWeight: 10 }
loads: [{ type: line, x: 35, force: 10 }]
crack: { depth: auto }
analysis: { methods: [infinite-slope], infiniteSlope: { angle: 26.6, depth: 2 } }
`;
    const { sections, messages } = parse(text);
    expect(messages).toEqual([]);
    const s = sections[0];
    expect(s.strata.map((t) => t.top)).toEqual([
      s.ground,
      [
        [0, 8],
        [40, 8],
      ],
      [
        [0, 2],
        [40, 2],
      ],
    ]);
    expect(s.materials.clay.strength).toEqual({
      model: 'undrained',
      su: 20,
      suRate: 0,
      suDatum: null,
    });
    expect(s.materials.rock).toEqual({
      name: 'rock',
      unitWeight: 0,
      saturatedUnitWeight: 0,
      strength: { model: 'rigid' },
    });
    expect(s.water).toEqual({
      kind: 'piezometric',
      line: [
        [0, 9],
        [40, 9],
      ],
      unitWeight: 10,
    });
    expect(s.loads).toEqual([{ type: 'line', x: 35, force: 10, angle: 0 }]);
    expect(s.crack).toEqual({ depth: 'auto', waterDepth: 0 });
    // Only the infinite slope is asked for: no slip surface is needed.
    expect(s.analysis.surface).toBeNull();
    expect(s.analysis.infiniteSlope).toEqual({ angle: 26.6, depth: 2, waterRatio: 0 });
  });

  test('boundaries and the piezometric line are cut to the ground x-range', () => {
    const text = MINIMAL.replace(
      'strata:\n  - { material: soil }\n',
      `  clay: { unitWeight: 18, strength: { model: undrained, su: 30 } }
strata:
  - { material: soil }
  - { material: clay, top: [[-10, 4], [10, 6], [50, 10]] }
water: { piezometric: [[-5, 9], [20, 12], [45, 13]] }
`,
    );
    const { sections, messages } = parse(text);
    expect(messages).toEqual([]);
    // y of the clay top at x = 0: 4 + 2·(10/20) = 5; at x = 40: 6 + 4·(30/40) = 9.
    expect(sections[0].strata[1].top).toEqual([
      [0, 5],
      [10, 6],
      [40, 9],
    ]);
    // Piezometric line at x = 0: 9 + 3·(5/25) = 9.6; at x = 40: 12 + 1·(20/25) = 12.8.
    const water = sections[0].water;
    if (water.kind !== 'piezometric') throw new Error(water.kind);
    expect(water.line[0][0]).toBe(0);
    expect(water.line[0][1]).toBeCloseTo(9.6, 12);
    expect(water.line[1]).toEqual([20, 12]);
    expect(water.line[2][0]).toBe(40);
    expect(water.line[2][1]).toBeCloseTo(12.8, 12);
  });

  test('tops that rise above the ground or the stratum above are clipped (test/in/clipped.yaml)', () => {
    const { sections } = parseSections(readFileSync(join(IN, 'clipped.yaml'), 'utf8'), 'c.yaml');
    const [, clay, rock] = sections[0].strata;
    // Clay top 21 − 0.15x meets the ground (20) at x = 20/3.
    expect(clay.top.length).toBe(4);
    expect(clay.top[0]).toEqual([0, 20]);
    expect(clay.top[1][0]).toBeCloseTo(20 / 3, 12);
    expect(clay.top[1][1]).toBeCloseTo(20, 12);
    expect(clay.top.slice(2)).toEqual([
      [20, 18],
      [50, 28],
    ]);
    // Rock top (10 + 0.4x, then 22 − 0.5(x − 30)) rises above the clay top (18 + (x − 20)/3)
    // between x = 20 and 30.8: there it follows the clay top.
    const xs = rock.top.map((p) => p[0]);
    expect(xs[0]).toBe(0);
    expect(xs[1]).toBeCloseTo(20, 9);
    expect(xs[2]).toBeCloseTo(30.8, 9);
    expect(xs[3]).toBe(50);
    expect(rock.top[2][1]).toBeCloseTo(18 + 10.8 / 3, 9);
    expect(rock.top[3][1]).toBe(12);
  });

  test('a stratum covered everywhere by the one below is reported', () => {
    const text = MINIMAL.replace(
      'strata:\n  - { material: soil }\n',
      `  clay: { unitWeight: 18, strength: { model: undrained, su: 30 } }
  rock: { strength: { model: rigid } }
strata:
  - { material: soil }
  - { material: clay, top: 5 }
  - { material: rock, top: 6 }
`,
    );
    const { messages, sections } = parse(text);
    expect(messages.map((m) => [m.severity, m.path, m.code])).toEqual([
      ['warning', 'strata[1]', 'stratum-vanishes'],
      ['warning', 'strata[2].top', 'boundary-crosses'],
    ]);
    expect(sections[0].strata[2].top).toEqual(sections[0].strata[1].top);
  });

  test('a us file is converted to SI; water defaults to 62.4 pcf', () => {
    const us = MINIMAL.replace('units: si', 'units: us').replace(
      'unitWeight: 19',
      'unitWeight: 120',
    );
    const { sections, messages } = parse(us);
    expect(messages).toEqual([]);
    const s = sections[0];
    expect(s.units).toBe('us');
    expect(s.ground[3][0]).toBeCloseTo(40 * 0.3048, 12);
    // 1 lbf/ft³ = 4.4482216152605 N / 0.3048³ m³ (NIST SP 811 exact definitions).
    const pcf = 4.4482216152605 / 0.3048 ** 3 / 1000;
    expect(s.materials.soil.unitWeight).toBeCloseTo(120 * pcf, 12);
    expect(s.water.unitWeight).toBeCloseTo(62.4 * pcf, 12);
    expect(s.water.unitWeight).toBeCloseTo(9.802, 3);
    const strength = s.materials.soil.strength;
    if (strength.model !== 'mohr-coulomb') throw new Error(strength.model);
    expect(strength.cohesion).toBeCloseTo((4 * 4.4482216152605) / 0.3048 ** 2 / 1000, 12);
    expect(strength.frictionAngle).toBe(30);
  });
});

describe('reading YAML and JSON', () => {
  test('multi-document YAML gives one section per document', () => {
    const text = `${MINIMAL}---\n${MINIMAL.replace('id: minimal', 'id: second')}---\n`;
    const { sections, messages } = parse(text);
    expect(messages).toEqual([]);
    expect(sections.map((s) => s.id)).toEqual(['minimal', 'second']);
  });

  test('an error in the second document is located in it', () => {
    const second = MINIMAL.replace('id: minimal', 'id: second').replace(
      'cohesion: 4',
      'cohesion: -4',
    );
    const { sections, messages } = parse(`${MINIMAL}---\n${second}`);
    expect(sections.map((s) => s.id)).toEqual(['minimal']);
    // Document two starts after line 8 (the first document) and line 9 (---): its line 6.
    expect(messages).toMatchObject([{ line: 15, path: 'materials.soil.strength.cohesion' }]);
  });

  test('the same section as JSON is read and located', () => {
    const json = JSON.stringify(
      {
        format: 'scarpline/1',
        id: 'as-json',
        units: 'si',
        ground: [
          [0, 10],
          [40, 20],
        ],
        materials: {
          soil: {
            unitWeight: 19,
            strength: { model: 'mohr-coulomb', cohesion: 4, frictionAngle: 30 },
          },
        },
        strata: [{ material: 'soil' }],
      },
      null,
      2,
    );
    expect(parseSections(json, 'a.json')).toMatchObject({
      messages: [],
      sections: [{ id: 'as-json' }],
    });
    const bad = json.replace('"frictionAngle": 30', '"frictionAngle": 91');
    const [m] = parseSections(bad, 'a.json').messages;
    const lines = bad.split('\n');
    const row = lines.findIndex((l) => l.includes('91'));
    expect(m).toMatchObject({ line: row + 1, column: lines[row].indexOf('91') + 1 });
  });

  test('JSON must be strict JSON: a comment is a located syntax error', () => {
    const text = '{\n  "format": "scarpline/1", # note\n  "id": "x"\n}\n';
    const messages = parseSections(text, 'x.json').messages;
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({ code: 'syntax', line: 2, column: 28 });
  });

  test('aliases and merge keys are followed', () => {
    const text = `format: scarpline/1
id: anchors
units: si
ground: &g [[0, 10], [40, 20]]
materials:
  base: &base { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
  wet: { <<: *base, saturatedUnitWeight: 20 }
strata:
  - { material: base }
  - { material: wet, top: 5 }
analysis: { surface: { type: polyline, points: *g } }
`;
    const { sections, messages } = parse(text);
    expect(messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(sections[0].materials.wet).toMatchObject({ unitWeight: 19, saturatedUnitWeight: 20 });
  });

  test('every error of a file is reported, not only the first', () => {
    // test/in/ranges.yaml holds 13 values out of range.
    const { messages } = parseSections(readFileSync(join(IN, 'ranges.yaml'), 'utf8'), 'r.yaml');
    expect(messages.filter((m) => m.severity === 'error')).toHaveLength(13);
  });
});

describe('corridor batches', () => {
  const BATCH = `format: scarpline-batch/1
id: line-a
title: Line A
units: si
template:
  materials:
    soil: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
    rock: { strength: { model: rigid } }
  strata:
    - { material: soil }
    - { material: rock, depth: 5 }
  water: { depth: 1.5 }
  analysis: { methods: [bishop, spencer], requiredFs: 1.5 }
sections:
  - station: 100
    ground: [[0, 10], [10, 10], [30, 20]]
  - station: 120
    title: Over the culvert
    ground: [[0, 11], [30, 22]]
    materials:
      soil: { unitWeight: 18, strength: { model: mohr-coulomb, cohesion: 2, frictionAngle: 28 } }
    water: { elevation: 9 }
    analysis: { requiredFs: 1.6 }
  - station: 140
    ground: [[0, 12], [30, 25]]
    strata:
      - { material: soil }
      - { material: rock, elevation: [[0, 4], [30, 6]] }
    water: { ru: 0.2 }
`;

  test('expands every section with the template merged in', () => {
    const { sections, messages } = parse(BATCH, 'line-a.yaml');
    expect(messages).toEqual([]);
    expect(sections.map((s) => s.id)).toEqual(['line-a@100', 'line-a@120', 'line-a@140']);
    const [a, b, c] = sections;
    expect(a.title).toBe('Line A, station 100');
    expect(a.station).toBe(100);
    // Strata and water by depth follow the section's ground.
    expect(a.strata[1].top).toEqual([
      [0, 5],
      [10, 5],
      [30, 15],
    ]);
    expect(a.water).toEqual({
      kind: 'piezometric',
      line: [
        [0, 8.5],
        [10, 8.5],
        [30, 18.5],
      ],
      unitWeight: 9.81,
    });
    expect(a.analysis).toMatchObject({ methods: ['bishop', 'spencer'], requiredFs: 1.5 });
    // Overrides: a material replaced by name, water by elevation, one analysis setting.
    expect(b.title).toBe('Over the culvert');
    expect(b.materials.soil.unitWeight).toBe(18);
    expect(b.materials.rock.strength.model).toBe('rigid');
    expect(b.water).toMatchObject({
      kind: 'piezometric',
      line: [
        [0, 9],
        [30, 9],
      ],
    });
    expect(b.analysis).toMatchObject({ methods: ['bishop', 'spencer'], requiredFs: 1.6 });
    expect(c.strata[1].top).toEqual([
      [0, 4],
      [30, 6],
    ]);
    expect(c.water).toEqual({ kind: 'ru', ru: 0.2, unitWeight: 9.81 });
  });

  test('an error in a section points to its item; one from the template to the template', () => {
    const text = BATCH.replace('[[0, 11], [30, 22]]', '[[0, 11], [30, 22], [20, 23]]').replace(
      'depth: 5 }',
      'depth: 5, colour: grey }',
    );
    const { messages, sections } = parse(text, 'line-a.yaml');
    const lines = text.split('\n');
    const groundLine = lines.findIndex((l) => l.includes('[20, 23]'));
    const colourLine = lines.findIndex((l) => l.includes('colour'));
    expect(messages.map((m) => [m.line, m.column, m.path, m.code])).toEqual([
      [
        colourLine + 1,
        lines[colourLine].indexOf('colour') + 1,
        'template.strata[1].colour',
        'unknown-setting',
      ],
      [
        groundLine + 1,
        lines[groundLine].indexOf('[20, 23]') + 1,
        'sections[1].ground[2]',
        'ground-x-order',
      ],
    ]);
    // The template's error spoils every section.
    expect(sections).toEqual([]);
  });

  test('a template boundary that rises above some sections says at which stations', () => {
    const text = BATCH.replace('depth: 5 }', 'elevation: 11 }');
    const { messages, sections } = parse(text, 'line-a.yaml');
    expect(messages).toHaveLength(1);
    expect(messages[0]).toMatchObject({
      severity: 'warning',
      path: 'template.strata[1].elevation',
    });
    expect(messages[0].message).toMatch(
      /^at station 100: rises above the ground between x = 0 and 12 m/,
    );
    expect(sections).toHaveLength(3);
  });
});
