import { fail } from './errors';

/** A point of the alignment at a chainage: its map position and the unit tangent there. */
export interface AlignmentPoint {
  x: number;
  y: number;
  /** Unit vector along the alignment (towards increasing chainage). */
  tx: number;
  ty: number;
}

/**
 * Map coordinates of a position given in longitude and latitude: the seam where the coordinate
 * systems plug in (a projection to the raster's system). Without one, an alignment that reads
 * as longitude and latitude is refused.
 */
export type Projection = (lon: number, lat: number) => [number, number];

/**
 * An alignment: a polyline in the raster's projected coordinate system, its chainage starting
 * at `start` at the first vertex and growing by the horizontal length walked along it.
 */
export class Alignment {
  /** Chainage at each vertex. */
  readonly chainages: number[];
  constructor(
    readonly vertices: readonly [number, number][],
    readonly start: number,
  ) {
    this.chainages = [start];
    for (let i = 1; i < vertices.length; i++) {
      const [x0, y0] = vertices[i - 1];
      const [x1, y1] = vertices[i];
      this.chainages.push(this.chainages[i - 1] + Math.hypot(x1 - x0, y1 - y0));
    }
  }

  get end(): number {
    return this.chainages[this.chainages.length - 1];
  }

  /**
   * The position and direction at a chainage. Within a segment the direction is the
   * segment's; at an inner vertex it is the bisector of the two segments' directions, so that
   * the section there is perpendicular to neither and splits the bend (on a polyline inscribed
   * in a circle it points through the centre). Null outside [start, end].
   */
  at(chainage: number): AlignmentPoint | null {
    const eps = 1e-9 * Math.max(1, Math.abs(this.end));
    if (chainage < this.start - eps || chainage > this.end + eps) return null;
    const n = this.vertices.length;
    let i = 1;
    while (i < n - 1 && this.chainages[i] < chainage - eps) i++;
    // chainage lies on segment i-1 → i
    const dir = (k: number): [number, number] => {
      const [x0, y0] = this.vertices[k - 1];
      const [x1, y1] = this.vertices[k];
      const len = Math.hypot(x1 - x0, y1 - y0);
      return [(x1 - x0) / len, (y1 - y0) / len];
    };
    let [tx, ty] = dir(i);
    if (Math.abs(chainage - this.chainages[i]) <= eps && i < n - 1) {
      const [ux, uy] = dir(i + 1);
      const bx = tx + ux;
      const by = ty + uy;
      const len = Math.hypot(bx, by);
      if (len > 1e-12) [tx, ty] = [bx / len, by / len];
      const [x, y] = this.vertices[i];
      return { x, y, tx, ty };
    }
    const s = Math.min(
      Math.max(chainage - this.chainages[i - 1], 0),
      this.chainages[i] - this.chainages[i - 1],
    );
    const [x0, y0] = this.vertices[i - 1];
    return { x: x0 + s * tx, y: y0 + s * ty, tx, ty };
  }
}

const isRecord = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Reads an alignment from GeoJSON: a LineString, a Feature of one, or a FeatureCollection of
 * exactly one LineString feature, its positions [x, y] (a z is ignored) in the raster's
 * projected coordinate system. The start chainage is the given one, else the feature's
 * `startChainage` (or `chainage`) property, else 0. Coordinates that read as longitude and
 * latitude are projected by `project` when one is given and refused otherwise.
 *
 * @example readAlignment(text, 'line.geojson', { start: 1000 }).at(1020) // → { x, y, tx, ty }
 */
export function readAlignment(
  text: string,
  fileName: string,
  options: { start?: number; project?: Projection } = {},
): Alignment {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    throw fail({
      file: fileName,
      code: 'syntax',
      message: `not JSON: ${e instanceof Error ? e.message : String(e)}`,
    });
  }
  let properties: Record<string, unknown> = {};
  let geometry: unknown = data;
  if (isRecord(data) && data.type === 'FeatureCollection') {
    const lines = Array.isArray(data.features)
      ? data.features.filter(
          (f) => isRecord(f) && isRecord(f.geometry) && f.geometry.type === 'LineString',
        )
      : [];
    if (lines.length !== 1)
      throw fail({
        file: fileName,
        path: 'features',
        code: 'not-one-line',
        message: `expected one LineString feature (the alignment); found ${lines.length}`,
      });
    data = lines[0];
  }
  if (isRecord(data) && data.type === 'Feature') {
    properties = isRecord(data.properties) ? data.properties : {};
    geometry = data.geometry;
  }
  if (!isRecord(geometry) || geometry.type !== 'LineString' || !Array.isArray(geometry.coordinates))
    throw fail({
      file: fileName,
      code: 'not-a-line',
      message: 'expected a GeoJSON LineString (or a Feature of one): the alignment',
    });
  const vertices: [number, number][] = [];
  geometry.coordinates.forEach((p: unknown, i) => {
    if (!Array.isArray(p) || p.length < 2 || !p.slice(0, 2).every((v) => Number.isFinite(v)))
      throw fail({
        file: fileName,
        path: `coordinates[${i}]`,
        code: 'not-a-position',
        message: 'expected a position [x, y]',
      });
    vertices.push([p[0] as number, p[1] as number]);
  });
  if (vertices.length < 2)
    throw fail({
      file: fileName,
      path: 'coordinates',
      code: 'too-short',
      message: 'an alignment needs at least two positions',
    });
  const lonLat = vertices.every(([x, y]) => Math.abs(x) <= 180 && Math.abs(y) <= 90);
  const run = vertices
    .slice(1)
    .reduce((s, v, i) => s + Math.hypot(v[0] - vertices[i][0], v[1] - vertices[i][1]), 0);
  if (lonLat && run < 2) {
    if (!options.project)
      throw fail({
        file: fileName,
        code: 'lon-lat',
        message: `the line is ${run.toPrecision(2)} long: these read as longitude and latitude; give the alignment in the raster's projected coordinate system`,
      });
    const project = options.project;
    vertices.forEach((v, i) => (vertices[i] = project(v[0], v[1])));
  }
  for (let i = 1; i < vertices.length; i++) {
    if (vertices[i][0] === vertices[i - 1][0] && vertices[i][1] === vertices[i - 1][1])
      throw fail({
        file: fileName,
        path: `coordinates[${i}]`,
        code: 'repeated-position',
        message: 'the position repeats the one before it',
      });
  }
  const fromProps = [properties.startChainage, properties.chainage].find(
    (v): v is number => typeof v === 'number' && Number.isFinite(v),
  );
  return new Alignment(vertices, options.start ?? fromProps ?? 0);
}
