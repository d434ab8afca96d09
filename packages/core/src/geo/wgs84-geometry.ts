/**
 * A section line in its corridor's projected system, written for RFC 7946: positions in WGS 84
 * longitude and latitude, the projected ones kept beside them.
 */
import { parseCrs, type Crs } from './crs';

/**
 * A section line as a corridor with a named coordinate system keeps it: a GeoJSON LineString
 * of projected positions [x, y, z] with the system it is in (`crs`: what the corridor named,
 * an EPSG code or a proj4 definition). Without a `crs` member a geometry is written as given.
 */
export interface ProjectedLine {
  type: 'LineString';
  coordinates: number[][];
  crs: string;
}

/** Whether a geometry carries the coordinate system of its positions (a ProjectedLine). */
export function isProjectedLine(g: unknown): g is ProjectedLine {
  if (typeof g !== 'object' || g === null) return false;
  const r = g as Record<string, unknown>;
  return r.type === 'LineString' && typeof r.crs === 'string' && Array.isArray(r.coordinates);
}

const DEGREE_DECIMALS = 1e9; // 1e-9° is about 0.1 mm on the ground

/** The geometry in WGS 84, as RFC 7946 has it, and what to keep of its projected form. */
export interface Wgs84Geometry {
  geometry: { type: 'LineString'; coordinates: number[][] };
  crs: string;
  projected: number[][];
}

const systems = new Map<string, Crs | null>();

/**
 * A projected line in WGS 84: each position [x, y, z] becomes [lon, lat, z] (degrees to nine
 * decimals, about 0.1 mm), the projected positions kept as given; null when its system
 * cannot be read (the corridor's reading has said why).
 *
 * @example wgs84Line({ type: 'LineString', crs: 'EPSG:32630', coordinates: [[500000, 5649824.4, 41]] })
 * // → { geometry: { type: 'LineString', coordinates: [[-3, 51, 41]] }, crs: 'EPSG:32630', projected: [[500000, 5649824.4, 41]] }
 */
export function wgs84Line(line: ProjectedLine): Wgs84Geometry | null {
  let crs = systems.get(line.crs);
  if (crs === undefined) {
    crs = parseCrs(line.crs).crs;
    if (systems.size > 50) systems.clear();
    systems.set(line.crs, crs);
  }
  if (!crs) return null;
  const round = (v: number) => Math.round(v * DEGREE_DECIMALS) / DEGREE_DECIMALS;
  const coordinates = line.coordinates.map((p) => {
    const [lon, lat] = crs.toLonLat(p[0], p[1]);
    return [round(lon), round(lat), ...p.slice(2)];
  });
  return {
    geometry: { type: 'LineString', coordinates },
    crs: line.crs,
    projected: line.coordinates,
  };
}
