/** A corridor as a GeoJSON FeatureCollection of section lines: sections and located messages. */
import { formatMessage, isGeoJsonCorridor, parseGeoJsonCorridor } from '@scarpline/core';

/** A section line across the corridor: ground offsets d at elevations z, walked along (0.6, 0.8). */
const line = (x0: number, y0: number, profile: [number, number][]) =>
  profile.map(([d, z]) => [x0 + 0.6 * d, y0 + 0.8 * d, z]);
const PROFILE: [number, number][] = [
  [0, 62],
  [18, 62],
  [38, 72],
  [70, 74],
];

const header = {
  id: 'wcb-gis',
  units: 'si',
  template: {
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
      requiredFs: 1.3,
    },
  },
};
const feature = (station: unknown, coordinates: unknown, extra: Record<string, unknown> = {}) => ({
  type: 'Feature',
  properties: { station, name: `XS-${String(station)}`, ...extra },
  geometry: { type: 'LineString', coordinates },
});
const text = (features: unknown[], head: unknown = header) =>
  JSON.stringify({ type: 'FeatureCollection', scarpline: head, features }, null, 2);

describe('parseGeoJsonCorridor', () => {
  test('each LineString is a section: ground = z along the horizontal length, id <batch>@<station>', () => {
    const t = text([
      feature(1200, line(352100, 5120400, PROFILE)),
      feature(1220, line(352112, 5120416, PROFILE), { analysis: { requiredFs: 1.6 } }),
    ]);
    expect(isGeoJsonCorridor(t)).toBe(true);
    const { sections, messages, features } = parseGeoJsonCorridor(t, 'corridor.geojson');
    expect(messages).toEqual([]);
    expect(sections.map((s) => s.id)).toEqual(['wcb-gis@1200', 'wcb-gis@1220']);
    sections[0].ground.forEach(([x, y], i) => {
      expect(x).toBeCloseTo(PROFILE[i][0], 9);
      expect(y).toBe(PROFILE[i][1]);
    });
    // a feature's own settings apply to its section only
    expect(sections.map((s) => s.analysis.requiredFs)).toEqual([1.3, 1.6]);
    expect(features.map((f) => f.sectionId)).toEqual(['wcb-gis@1200', 'wcb-gis@1220']);
    expect(features[0].properties.name).toBe('XS-1200');
  });

  test("the header's template cases, and a feature's changes to them, as in a batch", () => {
    const head = {
      ...header,
      template: {
        ...header.template,
        cases: [
          { name: 'long term', kind: 'long-term' },
          { name: 'earthquake', kind: 'seismic', requiredFs: 1.1, seismic: { kh: 0.1 } },
        ],
      },
    };
    const t = text(
      [
        feature(1200, line(352100, 5120400, PROFILE)),
        feature(1220, line(352112, 5120416, PROFILE), {
          cases: [
            { name: 'earthquake', seismic: { kh: 0.15 } },
            { name: 'cracked', kind: 'other', crack: { depth: 'auto' }, colour: 'red' },
          ],
        }),
      ],
      head,
    );
    const { sections, messages } = parseGeoJsonCorridor(t, 'corridor.geojson');
    // a feature's case is located in the feature's property (a GeoJSON message: at the value)
    const lines = t.split('\n');
    const row = lines.findIndex((l) => l.includes('"colour"'));
    expect(messages.map(formatMessage)).toEqual([
      `corridor.geojson:${row + 1}:${lines[row].indexOf('"red"') + 1} features[1].properties.cases[1].colour: unknown setting in design case; the settings here are name, kind, requiredFs, governs, water, materials, loads, reinforcement, seismic, crack, analysis, drawdown and earthquake`,
    ]);
    expect(sections.map((s) => s.id)).toEqual(['wcb-gis@1200']);
    const fixed = parseGeoJsonCorridor(
      t.replace(', "colour": "red"', '').replace(/,\s*"colour": "red"/, ''),
      'c.geojson',
    );
    expect(fixed.messages).toEqual([]);
    expect(fixed.sections[1].cases!.map((c) => [c.name, c.requiredFs, c.seismic.kh])).toEqual([
      ['long term', 1.3, 0],
      ['earthquake', 1.1, 0.15],
      ['cracked', 1.3, 0],
    ]);
  });

  test('a feature without z, without a station or not a line is reported where it is; the rest read', () => {
    const t = text([
      feature(1200, line(0, 0, PROFILE)),
      feature(1220, [
        [0, 0, 62],
        [10, 0],
      ]),
      feature('1240', line(0, 0, PROFILE)),
      {
        type: 'Feature',
        properties: { station: 1260 },
        geometry: { type: 'Point', coordinates: [0, 0, 1] },
      },
    ]);
    const { sections, messages } = parseGeoJsonCorridor(t, 'c.geojson');
    expect(sections.map((s) => s.id)).toEqual(['wcb-gis@1200']);
    const lines = messages.map(formatMessage);
    const at = (needle: string) => t.split('\n').findIndex((l) => l.includes(needle)) + 1;
    expect(lines).toEqual([
      expect.stringMatching(
        /^c\.geojson:\d+:\d+ features\[1\]\.geometry\.coordinates\[1\]: expected a position \[x, y, z\]/,
      ),
      expect.stringMatching(
        /^c\.geojson:\d+:\d+ features\[2\]\.properties\.station: expected a number/,
      ),
      expect.stringMatching(/^c\.geojson:\d+:\d+ features\[3\]\.geometry: expected a LineString/),
    ]);
    // the station message points at the line of the "1240" string
    expect(messages[1].line).toBe(at('"station": "1240"'));
  });

  test('a section error found by the batch checks is located in the GeoJSON: the coordinate', () => {
    const bad = line(0, 0, PROFILE);
    bad[2] = [bad[1][0], bad[1][1], 70]; // the same x, y twice: no horizontal progress
    const t = text([feature(1200, bad)]);
    const { sections, messages } = parseGeoJsonCorridor(t, 'c.geojson');
    expect(sections).toEqual([]);
    const m = messages.find((x) => x.severity === 'error');
    expect(m?.path).toBe('features[0].geometry.coordinates[2]');
    expect(m?.message).toMatch(/does not increase/);
  });

  test('template errors are located in the header file when one is given', () => {
    const t = text([feature(1200, line(0, 0, PROFILE))], undefined);
    const yaml = [
      'format: scarpline-batch/1',
      'id: wcb-b',
      'units: si',
      'template:',
      '  materials:',
      '    till: { unitWeight: 20, strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 95 } }',
      '  strata: [{ material: till }]',
    ].join('\n');
    const { messages, batchId } = parseGeoJsonCorridor(t, 'c.geojson', {
      text: yaml,
      fileName: 'settings.yaml',
    });
    expect(batchId).toBe('wcb-b');
    expect(messages.map(formatMessage)).toContain(
      'settings.yaml:6:90 template.materials.till.strength.frictionAngle: 95 is above 90°',
    );
  });

  test('no settings: a warning, the id from the file name; a JSON syntax error is located', () => {
    const t = JSON.stringify({
      type: 'FeatureCollection',
      features: [feature(1, line(0, 0, PROFILE))],
    });
    const r = parseGeoJsonCorridor(t, 'dir/north side.geojson');
    expect(r.batchId).toBe('north-side');
    expect(r.messages[0]).toMatchObject({ severity: 'warning', code: 'no-template' });
    const broken = parseGeoJsonCorridor(
      '{\n  "type": "FeatureCollection",\n  "features": [,]\n}',
      'b.geojson',
    );
    expect(broken.messages[0]).toMatchObject({ file: 'b.geojson', line: 3, code: 'syntax' });
  });
});
