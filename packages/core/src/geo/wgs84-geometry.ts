/**
 * A section line in its corridor's projected system, as results.geojson writes it for RFC 7946:
 * positions in WGS 84 longitude and latitude, the projected ones kept beside them. Import-free
 * (the export entry is browser-safe): the line carries both, made where it is read (crs.ts).
 */

/**
 * A section line as a corridor with a named coordinate system keeps it: a GeoJSON LineString
 * of projected positions [x, y, z] with the system it is in (`crs`: what the corridor named,
 * an EPSG code or a proj4 definition) and the same positions in WGS 84 (`wgs84`: [lon, lat,
 * z], degrees). A geometry without these members is written as given.
 */
export interface ProjectedLine {
  type: 'LineString';
  coordinates: number[][];
  crs: string;
  wgs84: number[][];
}

/** Whether a geometry carries the coordinate system of its positions (a ProjectedLine). */
export function isProjectedLine(g: unknown): g is ProjectedLine {
  if (typeof g !== 'object' || g === null) return false;
  const r = g as Record<string, unknown>;
  return (
    r.type === 'LineString' &&
    typeof r.crs === 'string' &&
    Array.isArray(r.coordinates) &&
    Array.isArray(r.wgs84) &&
    r.wgs84.length === r.coordinates.length
  );
}

/** The geometry in WGS 84, as RFC 7946 has it, and what to keep of its projected form. */
export interface Wgs84Geometry {
  geometry: { type: 'LineString'; coordinates: number[][] };
  crs: string;
  projected: number[][];
}

/**
 * A projected line as results.geojson writes it: its WGS 84 positions as the geometry, its
 * projected positions and their system kept.
 *
 * @example wgs84Line({ type: 'LineString', crs: 'EPSG:32630', coordinates: [[500000, 5649824.4, 41]], wgs84: [[-3, 51, 41]] })
 * // → { geometry: { type: 'LineString', coordinates: [[-3, 51, 41]] }, crs: 'EPSG:32630', projected: [[500000, 5649824.4, 41]] }
 */
export function wgs84Line(line: ProjectedLine): Wgs84Geometry {
  return {
    geometry: { type: 'LineString', coordinates: line.wgs84 },
    crs: line.crs,
    projected: line.coordinates,
  };
}
