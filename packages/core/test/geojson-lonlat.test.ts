/** A GeoJSON corridor in longitude and latitude (RFC 7946) projected to the corridor's crs. */
import {
  analyzeSection,
  exportCollection,
  exportFeature,
  parseCrs,
  parseGeoJsonCorridor,
  stationRecord,
  type Crs,
} from '@scarpline/core';

const utm = parseCrs('EPSG:32630').crs as Crs;
/** A section line across the corridor in UTM 30N: ground offsets d at elevations z. */
const line = (x0: number, y0: number, profile: [number, number][]) =>
  profile.map(([d, z]) => [x0 + 0.6 * d, y0 + 0.8 * d, z]);
const PROFILE: [number, number][] = [
  [0, 62],
  [18, 62],
  [38, 72],
  [70, 74],
];
const toLonLat = (coords: number[][]) => coords.map(([x, y, z]) => [...utm.toLonLat(x, y), z]);

const header = (extra: Record<string, unknown> = {}) => ({
  id: 'wcb-map',
  units: 'si',
  ...extra,
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
});
const feature = (station: number, coordinates: unknown) => ({
  type: 'Feature',
  properties: { station, name: `XS-${station}` },
  geometry: { type: 'LineString', coordinates },
});
const text = (features: unknown[], head: unknown) =>
  JSON.stringify({ type: 'FeatureCollection', scarpline: head, features }, null, 2);

const LINES = [line(552100, 5673400, PROFILE), line(552114, 5673412, PROFILE)];

describe('a corridor in longitude and latitude', () => {
  test('runs to the same ground profiles and verdicts as its projected twin', () => {
    const projected = parseGeoJsonCorridor(
      text(
        LINES.map((l, i) => feature(1200 + 20 * i, l)),
        header(),
      ),
      'twin.geojson',
    );
    const lonLat = parseGeoJsonCorridor(
      text(
        LINES.map((l, i) => feature(1200 + 20 * i, toLonLat(l))),
        header({ crs: 'EPSG:32630' }),
      ),
      'map.geojson',
    );
    expect(projected.messages).toEqual([]);
    expect(lonLat.messages).toEqual([]);
    expect(lonLat.crs?.name).toBe('EPSG:32630');
    expect(lonLat.sections).toHaveLength(2);
    lonLat.sections.forEach((s, k) => {
      s.ground.forEach(([x, y], i) => {
        expect(Math.abs(x - projected.sections[k].ground[i][0])).toBeLessThan(0.001);
        expect(x).toBeCloseTo(PROFILE[i][0], 3);
        expect(y).toBe(PROFILE[i][1]);
      });
      const a = stationRecord(analyzeSection(s));
      const b = stationRecord(analyzeSection(projected.sections[k]));
      expect(a.verdict).toBe(b.verdict);
      expect(a.fs).not.toBeNull();
      expect(Math.abs((a.fs as number) - (b.fs as number))).toBeLessThan(1e-3);
    });
    // the line kept in the projected system, for results.geojson
    const kept = lonLat.features[0].line;
    expect(kept?.crs).toBe('EPSG:32630');
    kept?.coordinates.forEach((c, i) => {
      expect(Math.hypot(c[0] - LINES[0][i][0], c[1] - LINES[0][i][1])).toBeLessThan(0.001);
    });
  });

  test('results.geojson in WGS 84 (RFC 7946): lon/lat geometry, no crs member, projected positions in the properties', () => {
    const parsed = parseGeoJsonCorridor(
      text([feature(1200, LINES[0])], header({ crs: 'EPSG:32630', coordinates: 'projected' })),
      'projected.geojson',
    );
    expect(parsed.messages).toEqual([]);
    const f = parsed.features[0];
    const record = stationRecord(analyzeSection(parsed.sections[0]));
    const out = exportFeature(record, { geometry: f.line, input: f.properties });
    const g = out.geometry as { type: string; coordinates: number[][]; crs?: unknown };
    expect(g.type).toBe('LineString');
    expect(g.crs).toBeUndefined();
    g.coordinates.forEach((c, i) => {
      const [x, y] = utm.toProjected(c[0], c[1]);
      expect(Math.hypot(x - LINES[0][i][0], y - LINES[0][i][1])).toBeLessThan(0.001);
      expect(c[2]).toBe(LINES[0][i][2]);
      expect(c[0]).toBeGreaterThan(-3);
      expect(c[0]).toBeLessThan(-2);
      expect(c[1]).toBeGreaterThan(51);
      expect(c[1]).toBeLessThan(52);
    });
    expect(out.properties.crs).toBe('EPSG:32630');
    expect(out.properties.projected_coordinates).toEqual(LINES[0]);
    expect(out.properties.name).toBe('XS-1200');
    const fc = exportCollection('wcb-map', [out]) as Record<string, unknown>;
    expect(fc.crs).toBeUndefined();
    // without a named system a geometry is written as given
    expect(exportFeature(record, { geometry: f.geometry }).geometry).toEqual(f.geometry);
  });

  test('a file whose old (2008) "crs" member names a projected system is read as projected', () => {
    const legacy = (name: string, coordinates: number[][]) =>
      JSON.stringify({
        type: 'FeatureCollection',
        crs: { type: 'name', properties: { name } },
        scarpline: header({ crs: 'EPSG:32630' }),
        features: [feature(1200, coordinates)],
      });
    const projected = parseGeoJsonCorridor(
      legacy('urn:ogc:def:crs:EPSG::32630', LINES[0]),
      'old.geojson',
    );
    expect(projected.messages).toEqual([]);
    expect(projected.features[0].line?.coordinates).toEqual(LINES[0]);
    // one naming WGS 84 degrees is read as RFC 7946 has it
    const degrees = parseGeoJsonCorridor(
      legacy('urn:ogc:def:crs:OGC:1.3:CRS84', toLonLat(LINES[0])),
      'old.geojson',
    );
    expect(degrees.messages).toEqual([]);
    degrees.sections[0].ground.forEach(([x], i) => expect(x).toBeCloseTo(PROFILE[i][0], 3));
  });

  test('a proj4 definition in feet: lengths in the corridor units', () => {
    const def = '+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs';
    const parsed = parseGeoJsonCorridor(
      text([feature(1200, toLonLat(LINES[0]))], { ...header({ crs: def }), units: 'us' }),
      'feet.geojson',
    );
    // a system in metres, a corridor in feet: offsets measured in metres, read as feet (and
    // normalised to metres again: read as feet without the conversion, 18 m would be 5.49 m)
    expect(parsed.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(parsed.entries[0].section?.units).toBe('us');
    parsed.entries[0].section?.ground.forEach(([x], i) => expect(x).toBeCloseTo(PROFILE[i][0], 3));
  });

  test('located messages: an unknown code, an unreadable definition, positions that are not degrees', () => {
    const unknown = parseGeoJsonCorridor(
      text([feature(1200, toLonLat(LINES[0]))], header({ crs: 'EPSG:9999' })),
      'c.geojson',
    );
    const e = unknown.messages.find((m) => m.code === 'unknown-crs');
    expect(e).toMatchObject({
      severity: 'error',
      file: 'c.geojson',
      path: 'scarpline.crs',
      line: 6,
    });
    expect(unknown.sections).toEqual([]);

    const bad = parseGeoJsonCorridor(
      text([feature(1200, toLonLat(LINES[0]))], header({ crs: '+proj=nowhere' })),
      'c.geojson',
    );
    expect(bad.messages.map((m) => m.code)).toContain('bad-crs');
    expect(bad.sections).toEqual([]);

    const notDegrees = parseGeoJsonCorridor(
      text(
        [feature(1200, toLonLat(LINES[0])), feature(1220, LINES[1])],
        header({ crs: 'EPSG:32630' }),
      ),
      'c.geojson',
    );
    const m = notDegrees.messages.find((x) => x.code === 'not-lon-lat');
    expect(m?.path).toBe('features[1].geometry.coordinates[0]');
    expect(m?.message).toContain('"coordinates": "projected"');
    expect(notDegrees.sections.map((s) => s.id)).toEqual(['wcb-map@1200']);

    const schema = parseGeoJsonCorridor(
      text([feature(1200, toLonLat(LINES[0]))], header({ crs: 'EPSG:32630', coordinates: 'utm' })),
      'c.geojson',
    );
    expect(schema.messages.find((x) => x.severity === 'error')?.path).toBe('scarpline.coordinates');
  });

  test('without a named system, lon/lat-looking lines keep their warning', () => {
    const parsed = parseGeoJsonCorridor(
      text([feature(1200, toLonLat(LINES[0]))], header()),
      'c.geojson',
    );
    const w = parsed.messages.find((m) => m.code === 'looks-like-degrees');
    expect(w?.severity).toBe('warning');
    expect(w?.message).toContain('crs');
    // and coordinates without a crs says it is not read
    const alone = parseGeoJsonCorridor(
      text([feature(1200, LINES[0])], header({ coordinates: 'lon-lat' })),
      'c.geojson',
    );
    expect(alone.messages.map((m) => [m.code, m.path])).toEqual([
      ['coordinates-without-crs', 'scarpline.coordinates'],
    ]);
    expect(alone.sections).toHaveLength(1);
  });
});
