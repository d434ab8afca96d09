/** LandXML 1.2 cross-sections read into a corridor batch, with located messages. */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  isLandXml,
  parseGeoJsonCorridor,
  parseLandXmlCorridor,
  stationRecord,
} from '@scarpline/core';

const EXAMPLES = join(__dirname, '../../../examples/corridor');
const example = (name: string) => readFileSync(join(EXAMPLES, name), 'utf8');

const HEADER = `id: wcb-xs
units: si
template:
  materials:
    till:
      unitWeight: 20.5
      strength: { model: mohr-coulomb, cohesion: 6, frictionAngle: 29 }
    rock:
      strength: { model: rigid }
  strata:
    - material: till
    - material: rock
      depth: 8
  analysis:
    methods: [bishop]
    requiredFs: 1.3
`;
const header = (text = HEADER) => ({ text, fileName: 'header.yaml' });

/** A LandXML document of these CrossSect elements (one alignment). */
const landxml = (crossSects: string, units = '<Units><Metric linearUnit="meter"/></Units>') =>
  `<?xml version="1.0"?>
<LandXML xmlns="http://www.landxml.org/schema/LandXML-1.2" version="1.2">
  ${units}
  <Alignments>
    <Alignment name="WCB test" length="100" staStart="0">
      <CrossSects>
${crossSects}
      </CrossSects>
    </Alignment>
  </Alignments>
</LandXML>
`;
const GROUND = '0 62 18 62 38 72 70 74';
const section = (sta: string, surfaces: string) =>
  `        <CrossSect sta="${sta}">\n${surfaces}\n        </CrossSect>`;
const surf = (name: string, points: string) =>
  `          <CrossSectSurf name="${name}"><PntList2D>${points}</PntList2D></CrossSectSurf>`;

describe('parseLandXmlCorridor', () => {
  test('each CrossSect is a section at its station: the ground surface its ground', () => {
    const xml = landxml(
      [
        section('1200', surf('Existing Ground', GROUND)),
        section('1220.5', surf('Existing Ground', GROUND)),
      ].join('\n'),
    );
    expect(isLandXml(xml)).toBe(true);
    const r = parseLandXmlCorridor(xml, 'c.xml', header());
    expect(r.messages).toEqual([]);
    expect(r.alignment).toBe('WCB test');
    expect(r.sections.map((s) => s.id)).toEqual(['wcb-xs@1200', 'wcb-xs@1220.5']);
    expect(r.sections[0].ground).toEqual([
      [0, 62],
      [18, 62],
      [38, 72],
      [70, 74],
    ]);
    expect(r.entries.map((e) => [e.id, e.line])).toEqual([
      ['wcb-xs@1200', 7],
      ['wcb-xs@1220.5', 10],
    ]);
  });

  test('a surface named as a stratum (or by surfaces.strata) is its top; surfaces.water the water', () => {
    const xml = landxml(
      section(
        '1200',
        [surf('EG', GROUND), surf('Rock', '0 55 70 57'), surf('GWL', '10 60 60 66')].join('\n'),
      ),
    );
    const r = parseLandXmlCorridor(
      xml,
      'c.xml',
      header(`${HEADER}surfaces:\n  water: GWL\n  strata: { rock: Rock }\n`),
    );
    const s = r.sections[0];
    expect(r.messages.map((m) => m.code)).toEqual(['surface-extended']);
    expect(r.messages[0]).toMatchObject({ file: 'c.xml', line: 10, severity: 'warning' });
    // the rock's top: the surface, not the template's depth of 8
    expect(s.strata[1].top).toEqual([
      [0, 55],
      [70, 57],
    ]);
    // the water surface, extended level to the ends of the ground
    expect(s.water).toMatchObject({
      kind: 'piezometric',
      line: [
        [0, 60],
        [10, 60],
        [60, 66],
        [70, 66],
      ],
    });
    // by the stratum's material name, without surfaces.strata
    const byName = parseLandXmlCorridor(
      landxml(
        section('1200', [surf('Existing ground', GROUND), surf('rock', '0 55 70 57')].join('\n')),
      ),
      'c.xml',
      header(),
    );
    expect(byName.messages).toEqual([]);
    expect(byName.sections[0].strata[1].top).toEqual([
      [0, 55],
      [70, 57],
    ]);
  });

  test('Imperial files are converted to the corridor units', () => {
    const xml = landxml(
      section('100', surf('EG', '0 100 50 100 100 125')),
      '<Units><Imperial linearUnit="foot"/></Units>',
    );
    const r = parseLandXmlCorridor(xml, 'c.xml', header());
    // a corridor in m: 50 ft = 15.24 m, station 100 ft = 30.48
    expect(r.sections[0].id).toBe('wcb-xs@30.48');
    expect(r.sections[0].ground[1][0]).toBeCloseTo(15.24, 9);
    expect(r.sections[0].ground[2][1]).toBeCloseTo(38.1, 9);
  });

  test('located messages: syntax, no station, odd numbers, which surface is ground, unused surfaces', () => {
    const broken = parseLandXmlCorridor(
      '<?xml version="1.0"?>\n<LandXML>\n  <Units>\n</LandXML>\n',
      'b.xml',
    );
    expect(broken.messages[0]).toMatchObject({ code: 'syntax', file: 'b.xml', line: 4 });

    const xml = landxml(
      [
        section('1200', surf('EG', GROUND)),
        '        <CrossSect name="no station">\n' + surf('EG', GROUND) + '\n        </CrossSect>',
        section('1240', surf('EG', '0 62 18')),
        section('1260', [surf('Design', GROUND), surf('Other', GROUND)].join('\n')),
        section('1280', [surf('EG', GROUND), surf('Sewer', '0 50 70 50')].join('\n')),
      ].join('\n'),
    );
    const r = parseLandXmlCorridor(xml, 'c.xml', header());
    const byCode = (code: string) => r.messages.filter((m) => m.code === code);
    expect(byCode('missing')[0]).toMatchObject({
      line: 10,
      severity: 'error',
      path: 'CrossSect[1]',
    });
    expect(byCode('bad-points')[0]).toMatchObject({ line: 14, severity: 'error' });
    expect(byCode('bad-points')[0].message).toContain('pairs of offset and elevation');
    expect(byCode('no-ground')[0]).toMatchObject({ line: 16, severity: 'error' });
    expect(byCode('no-ground')[0].message).toContain('surfaces.ground');
    // (the surfaces of a cross-section without a ground are not told apart: its error says it)
    expect(byCode('surface-unused').map((m) => m.line)).toEqual([22]);
    expect(r.sections.map((s) => s.id)).toEqual(['wcb-xs@1200', 'wcb-xs@1280']);
    expect(byCode('missing')[0].sections).toEqual([]);
    expect(byCode('bad-points')[0].sections).toEqual(['wcb-xs@1240']);
  });

  test('what cannot be read at all: an empty document, an unknown unit, too many sections, nesting, entities', () => {
    const codes = (text: string) =>
      parseLandXmlCorridor(text, 'x.xml', header()).messages.map((m) => m.code);
    expect(codes('<LandXML/>')).toEqual(['no-units', 'no-cross-sections']);
    expect(
      codes(
        landxml(section('1', surf('EG', GROUND)), '<Units><Metric linearUnit="furlong"/></Units>'),
      ),
    ).toEqual(['unknown-unit']);
    const many = Array.from({ length: 1001 }, (_, i) => section(String(i), surf('EG', GROUND)));
    expect(codes(landxml(many.join('\n')))).toEqual(['too-many']);
    const deep = `<LandXML>${'<a>'.repeat(500)}${'</a>'.repeat(500)}</LandXML>`;
    expect(codes(deep)).toEqual(['syntax']);
    // entities are not expanded: a name of a thousand "lol"s stays a reference
    const lol = `<?xml version="1.0"?>
<!DOCTYPE LandXML [<!ENTITY a "lol"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;&a;&a;"><!ENTITY c "&b;&b;&b;&b;&b;&b;&b;&b;&b;&b;">]>
<LandXML><Units><Metric linearUnit="meter"/></Units><Alignments><Alignment name="&c;"><CrossSects>
${section('1', surf('EG', GROUND))}
</CrossSects></Alignment></Alignments></LandXML>`;
    expect(isLandXml(lol)).toBe(true);
    const r = parseLandXmlCorridor(lol, 'x.xml', header());
    expect(r.alignment).toBe('&c;');
    expect(r.sections).toHaveLength(1);
    expect(isLandXml('<?xml version="1.0"?><svg/>')).toBe(false);
  });

  test('the checks of a batch located in the LandXML and in the header file', () => {
    // x not increasing in the ground: located at the ground surface's line
    const xml = landxml(section('1200', surf('EG', '0 62 18 62 10 72 70 74')));
    const r = parseLandXmlCorridor(xml, 'c.xml', header());
    const e = r.messages.find((m) => m.severity === 'error');
    expect(e).toMatchObject({ file: 'c.xml', line: 8 });
    expect(e?.path).toMatch(/^CrossSect\[0\]\.ground\[2\]/);
    // a material undefined in the template: located in the header file
    const bad = parseLandXmlCorridor(
      landxml(section('1200', surf('EG', GROUND))),
      'c.xml',
      header(HEADER.replace('- material: rock', '- material: granite')),
    );
    const h = bad.messages.find((m) => m.severity === 'error');
    expect(h).toMatchObject({ file: 'header.yaml', line: 12 });
    expect(bad.sections).toEqual([]);
    // a surfaces setting of the wrong shape: the schema, located in the header
    const shape = parseLandXmlCorridor(
      landxml(section('1200', surf('EG', GROUND))),
      'c.xml',
      header(`${HEADER}surfaces:\n  ground: [EG]\n`),
    );
    expect(shape.messages.find((m) => m.severity === 'error')).toMatchObject({
      file: 'header.yaml',
      path: 'surfaces.ground',
    });
  });

  test('the example cut reads and runs to the same verdicts as its lon/lat GeoJSON twin', () => {
    const xml = parseLandXmlCorridor(example('wendlecombe-cut.xml'), 'wendlecombe-cut.xml', {
      text: example('wendlecombe-cut.yaml'),
      fileName: 'wendlecombe-cut.yaml',
    });
    const geo = parseGeoJsonCorridor(
      example('wendlecombe-lonlat.geojson'),
      'wendlecombe-lonlat.geojson',
    );
    expect(xml.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(geo.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(xml.sections).toHaveLength(6);
    expect(geo.sections).toHaveLength(6);
    xml.sections.forEach((s, k) => {
      const twin = geo.sections[k];
      s.ground.forEach(([x, y], i) => {
        expect(Math.abs(x - twin.ground[i][0])).toBeLessThan(0.001);
        expect(y).toBe(twin.ground[i][1]);
      });
      expect(s.strata[1].top).toEqual(twin.strata[1].top);
      const a = stationRecord(
        analyzeSection({ ...s, analysis: { ...s.analysis, methods: ['bishop'] } }),
      );
      const b = stationRecord(
        analyzeSection({ ...twin, analysis: { ...twin.analysis, methods: ['bishop'] } }),
      );
      expect(a.verdict).toBe(b.verdict);
      expect(Math.abs((a.fs as number) - (b.fs as number))).toBeLessThan(1e-3);
    });
  });
});
