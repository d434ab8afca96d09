/**
 * The batch structure parsing gives every caller: the batch header, an entry per section (read
 * or not) with where it is given and its own messages, and on every message the ids of the
 * sections it concerns.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  BATCH_FORMAT,
  SECTION_FORMAT,
  corridorSectionId,
  formatMessage,
  parseGeoJsonCorridor,
  parseSections,
  type Message,
} from '@scarpline/core';

const IN = join(__dirname, 'in');
const codes = (ms: readonly Message[]) => ms.map((m) => `${m.code} ${m.path}`);

describe('a corridor batch', () => {
  const parsed = parseSections(readFileSync(join(IN, 'batch.yaml'), 'utf8'), 'batch.yaml');

  test('the header: id, title, units and where the id is written', () => {
    expect(parsed.batch).toEqual({
      id: 'batch-bad',
      title: null,
      units: 'si',
      file: 'batch.yaml',
      line: 3,
      column: 5,
    });
  });

  test('an entry per item, in order, with its id, station and the place of its station', () => {
    expect(
      parsed.entries.map((e) => [e.id, e.label, e.station, e.batch, e.line, e.column, e.path]),
    ).toEqual([
      ['batch-bad@0', 'batch-bad@0', 0, 'batch-bad', 14, 14, 'sections[0].station'],
      ['batch-bad@20', 'batch-bad@20', 20, 'batch-bad', 16, 14, 'sections[1].station'],
      ['batch-bad@40', 'batch-bad@40', 40, 'batch-bad', 18, 14, 'sections[2].station'],
      ['batch-bad@40', 'batch-bad@40', 40, 'batch-bad', 20, 14, 'sections[3].station'],
    ]);
    // the template's errors spoil every section
    expect(parsed.entries.every((e) => e.section === null)).toBe(true);
  });

  test('an item’s messages concern its section; the template’s every section they hold at', () => {
    const [a, b, c, d] = parsed.entries;
    const template = [
      'above-maximum template.materials.clay.strength.frictionAngle',
      'water-both template.water',
    ];
    expect(codes(a.messages)).toEqual(template);
    expect(codes(b.messages)).toEqual([...template, 'ground-x-order sections[1].ground[2]']);
    // the elevation rises above the ground at station 40 only: the first item at 40 says so
    expect(codes(c.messages)).toEqual([
      'above-maximum template.materials.clay.strength.frictionAngle',
      'boundary-above-ground template.strata[1].elevation',
      'water-both template.water',
    ]);
    expect(codes(d.messages)).toEqual([
      ...template,
      'duplicate-id sections[3].station',
      'top-both sections[3].strata[1]',
    ]);
    const byCode = (code: string) => parsed.messages.find((m) => m.code === code)!;
    expect(byCode('water-both').sections).toEqual(['batch-bad@0', 'batch-bad@20', 'batch-bad@40']);
    expect(byCode('ground-x-order').sections).toEqual(['batch-bad@20']);
    expect(byCode('boundary-above-ground').sections).toEqual(['batch-bad@40']);
    expect(formatMessage(byCode('boundary-above-ground'))).toMatch(/at station 40: rises above/);
    // every message of the file belongs to at least one entry
    const kept = new Set(parsed.entries.flatMap((e) => e.messages));
    expect(parsed.messages.filter((m) => !kept.has(m))).toEqual([]);
  });
});

describe('a file of section documents and a batch', () => {
  const section = (id: string, extra = '') => `format: ${SECTION_FORMAT}
id: ${id}
units: si
ground: [[0, 10], [10, 10], [30, 20], [40, 20]]
materials:
  soil: { unitWeight: ${extra || 19}, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
strata:
  - { material: soil }
`;
  const batch = `format: ${BATCH_FORMAT}
id: north
title: North cut
units: si
template:
  materials:
    soil: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
    spare: { unitWeight: 19, strength: { model: mohr-coulomb, cohesion: 4, frictionAngle: 30 } }
  strata: [{ material: soil }]
sections:
  - station: 0
    ground: [[0, 10], [10, 10], [30, 20], [40, 20]]
  - ground: [[0, 10], [40, 20]]
  - station: 20
    ground: [[0, 10], [10, 10], [30, 20], [40, 20]]
`;
  const text = [section('plain'), section('heavy', '45'), batch].join('---\n');
  const parsed = parseSections(text, 'mixed.yaml');

  test('the header is the batch’s; each document and item has its entry', () => {
    expect(parsed.batch).toMatchObject({ id: 'north', title: 'North cut', units: 'si' });
    expect(parsed.entries.map((e) => [e.label, e.batch, e.section?.id ?? null])).toEqual([
      ['plain', null, 'plain'],
      ['heavy', null, 'heavy'],
      [corridorSectionId('north', 0), 'north', corridorSectionId('north', 0)],
      ['sections[1]', 'north', null],
      [corridorSectionId('north', 20), 'north', corridorSectionId('north', 20)],
    ]);
    expect(parsed.entries[3].id).toBeNull();
  });

  test('a document’s warning concerns its section only; an item without a station has its error', () => {
    const [plain, heavy, , nameless] = parsed.entries;
    expect(plain.messages).toEqual([]);
    expect(codes(heavy.messages)).toEqual(['unit-weight-unusual materials.soil.unitWeight']);
    expect(heavy.messages[0].sections).toEqual(['heavy']);
    expect(codes(nameless.messages)).toContain('missing sections[1]');
    const missing = nameless.messages.find((m) => m.code === 'missing')!;
    // it concerns a section without an id: no id to carry
    expect(missing.sections).toEqual([]);
  });

  test('a template warning concerns every section of the batch and no other', () => {
    // the item without a station is an error of the batch schema at sections[1]: it stops
    // that item alone
    const batchWide = parsed.messages.filter((m) => m.code === 'material-unused');
    expect(batchWide).toHaveLength(1);
    expect(batchWide[0].sections).toEqual([
      corridorSectionId('north', 0),
      corridorSectionId('north', 20),
    ]);
  });
});

describe('a GeoJSON corridor', () => {
  const head = {
    id: 'wcb-gis',
    title: 'Wendlecombe bypass, GIS cut',
    units: 'si',
    template: {
      materials: {
        till: {
          unitWeight: 20.5,
          strength: { model: 'mohr-coulomb', cohesion: 6, frictionAngle: 29 },
        },
      },
      strata: [{ material: 'till' }],
      analysis: { methods: ['bishop'], requiredFs: 1.3 },
    },
  };
  const line = (station: unknown, z = true) => ({
    type: 'Feature',
    properties: { station, name: `XS-${String(station)}` } as Record<string, unknown>,
    geometry: {
      type: 'LineString',
      coordinates: [
        [352100, 5120400, 62],
        [352110.8, 5120414.4, 62],
        [352122.8, 5120430.4, 72],
        [352142, 5120456, 74],
      ].map((c) => (z ? c : c.slice(0, 2))),
    },
  });
  const features = [line(1200), line(1220, false), line(1240)];
  features[2].properties = {
    ...features[2].properties,
    materials: { till: { ...head.template.materials.till, unitWeight: 45 } },
  };
  const parsed = parseGeoJsonCorridor(
    JSON.stringify({ type: 'FeatureCollection', scarpline: head, features }, null, 2),
    'corridor.geojson',
  );

  test('the header and one entry per feature, each with its feature', () => {
    expect(parsed.batch).toMatchObject({
      id: 'wcb-gis',
      title: 'Wendlecombe bypass, GIS cut',
      units: 'si',
      file: 'corridor.geojson',
    });
    expect(parsed.entries.map((e) => [e.id, e.feature.index, e.section !== null])).toEqual([
      ['wcb-gis@1200', 0, true],
      ['wcb-gis@1220', 1, false],
      ['wcb-gis@1240', 2, true],
    ]);
    expect(parsed.entries[0]).toMatchObject({ path: 'features[0].properties.station' });
  });

  test('a feature’s messages concern its section, located in the GeoJSON', () => {
    const [ok, noZ, heavy] = parsed.entries;
    expect(ok.messages).toEqual([]);
    expect(codes(noZ.messages)).toEqual(['no-elevation features[1].geometry.coordinates[0]']);
    expect(noZ.messages[0].sections).toEqual(['wcb-gis@1220']);
    expect(codes(heavy.messages)).toEqual([
      'unit-weight-unusual features[2].properties.materials.till.unitWeight',
    ]);
    expect(heavy.messages[0]).toMatchObject({
      file: 'corridor.geojson',
      sections: ['wcb-gis@1240'],
    });
  });

  test('a message about the whole corridor concerns every section', () => {
    const bare = parseGeoJsonCorridor(
      JSON.stringify({ type: 'FeatureCollection', features: [line(1200), line(1220)] }),
      'bare.geojson',
    );
    const noTemplate = bare.messages.find((m) => m.code === 'no-template')!;
    expect(noTemplate.sections).toEqual(['bare@1200', 'bare@1220']);
    expect(bare.entries.every((e) => e.messages.includes(noTemplate))).toBe(true);
  });
});
