/**
 * The projected coordinate system of a corridor: the one home of the concept. A corridor names
 * it by an EPSG code of a small built-in set or by a proj4 definition (or WKT) for any other
 * system; positions in longitude and latitude (WGS 84, as RFC 7946 GeoJSON has them) are
 * projected to it with proj4 before any length is measured, and projected positions are
 * written back in WGS 84 for a web map.
 */
import proj4 from 'proj4';
import type { ProjectedLine } from './wgs84-geometry';

/** A corridor's projected coordinate system, ready to transform positions. */
export interface Crs {
  /** As the corridor named it: `EPSG:32630`, or the proj4 definition as given. */
  name: string;
  /** The proj4 definition used. */
  definition: string;
  /** Metres in one unit of the projected coordinates (1 for a system in metres). */
  metresPerUnit: number;
  /** WGS 84 longitude and latitude (degrees) → projected x (easting) and y (northing). */
  toProjected(lon: number, lat: number): [number, number];
  /** Projected x and y → WGS 84 longitude and latitude (degrees). */
  toLonLat(x: number, y: number): [number, number];
}

/** Why a named coordinate system cannot be used. */
export interface CrsProblem {
  code: 'unknown-crs' | 'bad-crs' | 'not-projected';
  message: string;
}

const BNG =
  '+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m +no_defs';

/**
 * The built-in EPSG codes and their proj4 definitions (the published parameters of each):
 * WGS 84 / UTM zones 1–60 north (32601–32660) and south (32701–32760), ETRS89 / UTM zones
 * 28–38 north (25828–25838), OSGB 1936 / British National Grid (27700, with its published
 * seven-parameter shift to WGS 84) and NZGD2000 / New Zealand Transverse Mercator (2193).
 *
 * @example crsDefinition(32630) // → '+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs'
 */
export function crsDefinition(code: number): string | null {
  if (code >= 32601 && code <= 32660)
    return `+proj=utm +zone=${code - 32600} +datum=WGS84 +units=m +no_defs`;
  if (code >= 32701 && code <= 32760)
    return `+proj=utm +zone=${code - 32700} +south +datum=WGS84 +units=m +no_defs`;
  if (code >= 25828 && code <= 25838)
    return `+proj=utm +zone=${code - 25800} +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs`;
  if (code === 27700) return BNG;
  if (code === 2193)
    return '+proj=tmerc +lat_0=0 +lon_0=173 +k=0.9996 +x_0=1600000 +y_0=10000000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs';
  return null;
}

/** What the built-in set holds, in words (for messages and documentation). */
export const BUILT_IN_CRS =
  'EPSG:32601–32660 and 32701–32760 (WGS 84 / UTM north and south), 25828–25838 (ETRS89 / UTM), 27700 (British National Grid), 2193 (New Zealand Transverse Mercator)';

/**
 * A corridor's `crs` read: `EPSG:<code>` of the built-in set, or a proj4 definition (`+proj=…`)
 * or WKT of a projected system; otherwise why not.
 *
 * @example parseCrs('EPSG:32630').crs?.toProjected(-3, 51) // → [500000, 5649824.4…]
 */
export function parseCrs(
  text: string,
): { crs: Crs; problem: null } | { crs: null; problem: CrsProblem } {
  const fail = (code: CrsProblem['code'], message: string) => ({
    crs: null,
    problem: { code, message },
  });
  const trimmed = text.trim();
  const epsg = /^(?:EPSG|epsg):\s*(\d+)$/.exec(trimmed);
  let definition: string;
  if (epsg) {
    const code = Number(epsg[1]);
    if (code === 4326)
      return fail(
        'not-projected',
        'EPSG:4326 is longitude and latitude; name the projected system the sections are measured in (e.g. the UTM zone of the corridor)',
      );
    const d = crsDefinition(code);
    if (!d)
      return fail(
        'unknown-crs',
        `EPSG:${code} is not in the built-in set (${BUILT_IN_CRS}); give its proj4 definition instead ("+proj=…")`,
      );
    definition = d;
  } else if (/^\+proj=|^(?:PROJCS|PROJCRS)\[/i.test(trimmed)) {
    definition = trimmed;
  } else {
    return fail(
      'bad-crs',
      'expected an EPSG code ("EPSG:32630") or a proj4 definition ("+proj=utm +zone=30 +datum=WGS84")',
    );
  }
  let projection: proj4.Converter;
  let projName: string | undefined;
  let toMeter: number | undefined;
  try {
    const p = proj4.Proj(definition) as unknown as {
      projName?: string;
      to_meter?: number;
      long0?: number;
      lat0?: number;
    };
    projName = p.projName;
    toMeter = p.to_meter;
    projection = proj4('WGS84', definition);
    // a definition proj4 reads but cannot use fails on its own origin
    const deg = (r: number | undefined) => ((r ?? 0) * 180) / Math.PI;
    const probe = projection.forward([deg(p.long0), deg(p.lat0)]);
    if (!probe.every(Number.isFinite)) throw new Error('not finite');
  } catch (e) {
    const why = e instanceof Error && e.message ? `: ${e.message}` : '';
    return fail('bad-crs', `proj4 cannot read this definition${why}`);
  }
  if (!projName || projName === 'longlat' || projName === 'identity')
    return fail(
      'not-projected',
      'this is a geographic system (longitude and latitude); name a projected one',
    );
  const crs: Crs = {
    name: epsg ? `EPSG:${epsg[1]}` : trimmed,
    definition,
    metresPerUnit: toMeter && Number.isFinite(toMeter) && toMeter > 0 ? toMeter : 1,
    toProjected: (lon, lat) => {
      const [x, y] = projection.forward([lon, lat]);
      return [x, y];
    },
    toLonLat: (x, y) => {
      const [lon, lat] = projection.inverse([x, y]);
      return [lon, lat];
    },
  };
  return { crs, problem: null };
}

const DEGREES = 1e9; // 1e-9° is about 0.1 mm on the ground

/**
 * A section line in a corridor's projected system, with its positions in WGS 84 for
 * results.geojson: those given (a line read in longitude and latitude), or the projected ones
 * taken back with proj4 (degrees to nine decimals, about 0.1 mm). z and any further member of
 * a position are kept.
 *
 * @example lineInCrs([[500000, 5649824.4, 41]], parseCrs('EPSG:32630').crs!)
 * // → { type: 'LineString', coordinates: [[500000, 5649824.4, 41]], crs: 'EPSG:32630', wgs84: [[-3, 51, 41]] }
 */
export function lineInCrs(projected: number[][], crs: Crs, wgs84?: number[][]): ProjectedLine {
  const round = (v: number) => Math.round(v * DEGREES) / DEGREES;
  return {
    type: 'LineString',
    coordinates: projected,
    crs: crs.name,
    wgs84:
      wgs84 ??
      projected.map((p) => {
        const [lon, lat] = crs.toLonLat(p[0], p[1]);
        return [round(lon), round(lat), ...p.slice(2)];
      }),
  };
}
