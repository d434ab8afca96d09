/** `scarpline batch` and `validate` on a LandXML corridor and a lon/lat GeoJSON corridor. */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseCrs } from '@scarpline/core';
import { ROOT, run } from './run';

const tmp = () => mkdtempSync(join(tmpdir(), 'scarpline-map-'));
const CORRIDOR = join(ROOT, 'examples', 'corridor');
const XML = join(CORRIDOR, 'wendlecombe-cut.xml');
const SETTINGS = join(CORRIDOR, 'wendlecombe-cut.yaml');
const LONLAT = join(CORRIDOR, 'wendlecombe-lonlat.geojson');

interface Collection {
  type: string;
  crs?: unknown;
  features: {
    id: string;
    geometry: { type: string; coordinates: number[][] } | null;
    properties: Record<string, unknown>;
  }[];
}
const rowsOf = (out: string) =>
  out.split('\n').filter((l) => /^ +1[34]\d0 +wcb-cut(-map)?@/.test(l));

describe('scarpline batch on a LandXML corridor and on its lon/lat GeoJSON twin', () => {
  const xmlOut = tmp();
  const geoOut = tmp();
  const xml = run(['batch', XML, '--template', SETTINGS, '--out', xmlOut, '--no-svg']);
  const geo = run(['batch', LONLAT, '--out', geoOut, '--no-svg']);

  test('both run to verdicts, the same at every station', () => {
    // 2: a section below its required FS (the demo cut is steep), the same for both
    expect(xml.code).toBe(2);
    expect(geo.code).toBe(2);
    const a = rowsOf(xml.out);
    const b = rowsOf(geo.out);
    expect(a).toHaveLength(6);
    // the same columns but the batch id
    const cells = (l: string) =>
      l
        .trim()
        .split(/ +/)
        .filter((_, i) => i !== 1);
    expect(b.map(cells)).toEqual(a.map(cells));
    expect(a.map((l) => cells(l)[4])).toContain('below');
  });

  test('results.geojson of the lon/lat corridor is WGS 84 (RFC 7946), the projected positions kept', () => {
    const doc = JSON.parse(readFileSync(join(geoOut, 'results.geojson'), 'utf8')) as Collection;
    expect(doc.crs).toBeUndefined();
    const input = JSON.parse(readFileSync(LONLAT, 'utf8')) as Collection;
    const utm = parseCrs('EPSG:32630').crs!;
    const station = doc.features.filter((f) => f.properties.row === 'station');
    expect(station).toHaveLength(6);
    station.forEach((f, k) => {
      const given = input.features[k].geometry!.coordinates;
      expect(f.properties.crs).toBe('EPSG:32630');
      f.geometry!.coordinates.forEach((c, i) => {
        // the input's degrees, within a millimetre on the ground
        expect(
          Math.abs(c[0] - given[i][0]) * 111320 * Math.cos((c[1] * Math.PI) / 180),
        ).toBeLessThan(0.001);
        expect(Math.abs(c[1] - given[i][1]) * 111320).toBeLessThan(0.001);
        expect(c[2]).toBe(given[i][2]);
        const p = (f.properties.projected_coordinates as number[][])[i];
        const [x, y] = utm.toProjected(given[i][0], given[i][1]);
        expect(Math.hypot(p[0] - x, p[1] - y)).toBeLessThan(0.001);
      });
    });
  });

  test('validate reads .xml with its settings, and locates what it cannot use', () => {
    const ok = run(['validate', XML, '--template', SETTINGS]);
    expect(ok.code).toBe(0);
    expect(ok.out).toContain('wendlecombe-cut.xml: valid: 6 sections');
    const dir = tmp();
    const broken = join(dir, 'broken.xml');
    writeFileSync(broken, readFileSync(XML, 'utf8').replace('<CrossSect sta="1320"', '<CrossSect'));
    const bad = run(['validate', broken, '--template', SETTINGS]);
    expect(bad.code).toBe(1);
    expect(bad.out).toMatch(/broken\.xml:22:7 CrossSect\[1\]: the cross-section has no station/);
    const geoOk = run(['validate', LONLAT]);
    expect(geoOk.code).toBe(0);
    expect(geoOk.out).toContain('valid: 6 sections');
  });
});
