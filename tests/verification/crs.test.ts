/**
 * A corridor's projected coordinate system (proj4 through parseCrs): published control points,
 * a closed form of the Transverse Mercator, and round trips within a millimetre.
 */
import { crsDefinition, parseCrs, type Crs } from '@scarpline/core';

const system = (text: string): Crs => {
  const r = parseCrs(text);
  if (!r.crs) throw new Error(r.problem.message);
  return r.crs;
};

/** Metres on the ground between two positions in degrees (local plane; for differences of mm). */
const metresApart = (a: [number, number], b: [number, number]) => {
  const m = 111_320;
  return Math.hypot((a[0] - b[0]) * m * Math.cos((a[1] * Math.PI) / 180), (a[1] - b[1]) * m);
};

/**
 * The meridian arc from the equator to latitude φ on an ellipsoid (a, f): the integral of the
 * meridian radius of curvature ρ = a(1 − e²) / (1 − e² sin² t)^{3/2} (every geodesy text, e.g.
 * Snyder, Map Projections — A Working Manual, USGS PP 1395, eq. 3-21), by Simpson's rule with
 * 2000 intervals (error far below a micrometre here).
 */
function meridianArc(phiDeg: number, a: number, f: number): number {
  const e2 = f * (2 - f);
  const phi = (phiDeg * Math.PI) / 180;
  const rho = (t: number) => (a * (1 - e2)) / Math.pow(1 - e2 * Math.sin(t) ** 2, 1.5);
  const n = 2000;
  const h = phi / n;
  let sum = rho(0) + rho(phi);
  for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * rho(i * h);
  return (sum * h) / 3;
}

describe('parseCrs: published control points', () => {
  test('EPSG Guidance Note 7-2, Transverse Mercator example (OSGB 1936 / British National Grid)', () => {
    // Value from memory of IOGP Guidance Note 7-2, §3.5.3 (Transverse Mercator) worked example:
    // φ = 50°30′00″N, λ = 00°30′00″E on OSGB 1936 → E = 577274.99 m, N = 69740.50 m. The
    // projection alone (the example has no datum change): Airy 1830 without a shift, the
    // published parameters of the grid (epsg.io/27700: lat_0 49, lon_0 −2, k 0.9996012717,
    // false easting 400000, false northing −100000).
    const bng = system(
      '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +units=m +no_defs',
    );
    const [e, n] = bng.toProjected(0.5, 50.5);
    // the example gives centimetres; proj4's series agree with it to under a centimetre
    expect(Math.abs(e - 577274.99)).toBeLessThan(0.01);
    expect(Math.abs(n - 69740.5)).toBeLessThan(0.01);
    const [lon, lat] = bng.toLonLat(577274.99, 69740.5);
    expect(metresApart([lon, lat], [0.5, 50.5])).toBeLessThan(0.01);
  });

  test.each([
    ['EPSG:32631', 3, 45],
    ['EPSG:32630', -3, 51.25],
    ['EPSG:32633', 15, 0],
    ['EPSG:32733', 15, -33.5],
    ['EPSG:32760', 177, -41],
  ])(
    'UTM (%s) on its central meridian: E = 500 000 m, N = k0·M(φ) (+ 10 000 000 m south)',
    (code, lon, lat) => {
      // Closed form: on the central meridian the Transverse Mercator's northing is the meridian
      // arc scaled by k0 (Snyder, PP 1395, eq. 8-10 with λ = λ0); UTM: k0 = 0.9996, false
      // easting 500 000 m, false northing 10 000 000 m in the south (common practice: the UTM
      // definition, NGA.SIG.0012). WGS 84: a = 6 378 137 m, 1/f = 298.257223563.
      const [e, n] = system(code).toProjected(lon, lat);
      const arc = 0.9996 * meridianArc(Math.abs(lat), 6378137, 1 / 298.257223563);
      expect(Math.abs(e - 500000)).toBeLessThan(0.001);
      expect(Math.abs(n - (lat < 0 ? 10_000_000 - arc : arc))).toBeLessThan(0.001);
    },
  );
});

describe('parseCrs: round trips within a millimetre', () => {
  const cases: [string, number, number][] = [
    ['EPSG:32630', -2.4, 51.3],
    ['EPSG:32630', -5.9, 49.8],
    ['EPSG:32718', -77.1, -12.05],
    ['EPSG:25832', 9.7, 52.4],
    ['EPSG:27700', -1.55, 53.8],
    ['EPSG:2193', 174.76, -36.85],
    ['+proj=utm +zone=33 +datum=WGS84 +units=m +no_defs', 14.4, 50.1],
    [
      '+proj=tmerc +lat_0=0 +lon_0=-81 +k=0.9999 +x_0=500000 +y_0=0 +datum=WGS84 +units=us-ft',
      -80.2,
      25.8,
    ],
  ];
  test.each(cases)('%s: lon/lat → projected → lon/lat at (%f, %f)', (code, lon, lat) => {
    const crs = system(code);
    const [x, y] = crs.toProjected(lon, lat);
    const back = crs.toLonLat(x, y);
    expect(metresApart(back, [lon, lat])).toBeLessThan(0.001);
    // and projected → lon/lat → projected, in the system's own units
    const [x2, y2] = crs.toProjected(...crs.toLonLat(x + 123.456, y - 78.9));
    expect(Math.hypot(x2 - x - 123.456, y2 - y + 78.9) * crs.metresPerUnit).toBeLessThan(0.001);
  });

  test('a system in US survey feet says how many metres its unit is', () => {
    expect(system('+proj=tmerc +lon_0=-81 +datum=WGS84 +units=us-ft').metresPerUnit).toBeCloseTo(
      1200 / 3937,
      12,
    );
    expect(system('EPSG:32630').metresPerUnit).toBe(1);
  });
});

describe('parseCrs: what cannot be used', () => {
  test.each([
    ['EPSG:4326', 'not-projected'],
    ['EPSG:3857', 'unknown-crs'],
    ['EPSG:32661', 'unknown-crs'],
    ['UTM 30', 'bad-crs'],
    ['+proj=nonsense +zone=30', 'bad-crs'],
    ['+proj=longlat +datum=WGS84', 'not-projected'],
  ])('%s → %s', (text, code) => {
    const r = parseCrs(text);
    expect(r.crs).toBeNull();
    expect(r.problem?.code).toBe(code);
    expect(r.problem?.message.length).toBeGreaterThan(10);
  });

  test('the built-in set: UTM zones 1–60 both hemispheres, ETRS89 UTM, two national grids', () => {
    expect(crsDefinition(32601)).toContain('+zone=1 ');
    expect(crsDefinition(32760)).toContain('+zone=60 +south');
    expect(crsDefinition(25830)).toContain('+zone=30 +ellps=GRS80');
    expect(crsDefinition(27700)).toContain('+k=0.9996012717');
    expect(crsDefinition(2193)).toContain('+lon_0=173');
    expect(crsDefinition(32700)).toBeNull();
  });
});
