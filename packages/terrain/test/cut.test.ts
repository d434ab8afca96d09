import { parseCrs, parseGeoJsonCorridor } from '@scarpline/core';
import {
  Alignment,
  corridorText,
  cutCorridor,
  readAlignment,
  readRaster,
  runTerrainJob,
  sample,
  TerrainError,
  type BatchHeader,
  type TerrainJob,
  type Raster,
  type TerrainCorridor,
} from '../src';
import { writeTiff, type Grid } from './write-tiff';

// Synthetic terrains with analytic surfaces, written as GeoTIFFs and cut: the profiles against
// the surfaces, the section lines against the alignment's geometry (closed forms).

const GRID: Grid = { width: 200, height: 160, left: 500000, top: 5600800, pixel: 5 };
const X0 = GRID.left;
const Y0 = GRID.top - GRID.height * GRID.pixel;
const header: BatchHeader = {
  id: 'synthetic',
  units: 'si',
  template: {
    materials: {
      clay: { unitWeight: 19, strength: { model: 'mohr-coulomb', cohesion: 8, frictionAngle: 25 } },
    },
    strata: [{ material: 'clay' }],
  },
};

const raster = async (f: (x: number, y: number) => number, name = 'dem.tif'): Promise<Raster> =>
  readRaster(writeTiff(GRID, f), name);

const line = (coordinates: number[][]) =>
  JSON.stringify({
    type: 'Feature',
    properties: {},
    geometry: { type: 'LineString', coordinates },
  });

/** Every sample of every section: its map position and its z. */
const samples = (c: TerrainCorridor) => c.features.flatMap((f) => f.geometry.coordinates);

describe('reading a GeoTIFF', () => {
  it('reads the grid, the no-data value and the coordinate system', async () => {
    const r = readRaster(
      writeTiff(GRID, () => 1, { GDAL_NODATA: '-9999' }),
      'a.tif',
    );
    await expect(r).resolves.toMatchObject({
      width: 200,
      height: 160,
      centreX: X0 + 2.5,
      centreY: GRID.top - 2.5,
      pixelX: 5,
      pixelY: -5,
      noData: -9999,
      epsg: 32630,
    });
  });

  it('places the tie point at a pixel centre when the raster says pixel is point', async () => {
    const r = await readRaster(
      writeTiff(GRID, () => 1, { GTRasterTypeGeoKey: 2 }),
      'p.tif',
    );
    expect([r.centreX, r.centreY]).toEqual([X0, GRID.top]);
  });

  it('refuses a rotated grid, a raster in longitude and latitude and a file that is not a TIFF', async () => {
    const rotated = writeTiff(GRID, () => 1, {
      ModelPixelScale: undefined,
      ModelTiepoint: undefined,
      ModelTransformation: [4, 1, 0, X0, 1, -4, 0, GRID.top, 0, 0, 0, 0, 0, 0, 0, 1],
    });
    await expect(readRaster(rotated, 'rot.tif')).rejects.toThrow(/rot\.tif: error: .*north-up/);
    const geographic = writeTiff({ ...GRID, left: -3, top: 51, pixel: 0.001 }, () => 1, {
      GTModelTypeGeoKey: 2,
      ProjectedCSTypeGeoKey: undefined,
      GeographicTypeGeoKey: 4326,
    });
    await expect(readRaster(geographic, 'll.tif')).rejects.toThrow(/longitude and latitude/);
    await expect(readRaster(Buffer.from('not a tiff at all'), 'x.tif')).rejects.toThrow(
      /x\.tif: error: not a GeoTIFF/,
    );
  });

  it('refuses a raster above the pixel cap, naming its size', async () => {
    const bytes = writeTiff(GRID, () => 1);
    await expect(readRaster(bytes, 'big.tif', { maxBytes: 1e9, maxPixels: 1000 })).rejects.toThrow(
      /200 × 160 pixels; at most 1,000/,
    );
  });
});

describe('sections cut from analytic surfaces', () => {
  // straight alignment across the raster at a bearing of about 60°
  const a = { x: X0 + 150, y: Y0 + 150 };
  const b = { x: X0 + 850, y: Y0 + 550 };
  const straight = line([
    [a.x, a.y],
    [b.x, b.y],
  ]);

  it('a plane: every sample on the plane (bilinear interpolation is exact on a plane)', async () => {
    const plane = (x: number, y: number) => 120 + 0.08 * (x - X0) - 0.05 * (y - Y0);
    const ground = await raster(plane);
    const alignment = readAlignment(straight, 'line.geojson', { start: 200 });
    const { corridor, messages } = cutCorridor({
      ground,
      alignment,
      header,
      settings: { stations: { every: 50 }, left: 30, right: 40, spacing: 2.5 },
    });
    expect(messages).toEqual([]);
    expect(corridor.features).toHaveLength(Math.floor((alignment.end - 200) / 50) + 1);
    // 120 m of float32 values: a rounding of 1e-5 m; the coordinates are written to 0.1 mm
    for (const [x, y, z] of samples(corridor)) expect(Math.abs(z - plane(x, y))).toBeLessThan(2e-4);
  });

  it('a cone: within the bilinear error bound h²/8 · (max|f_xx| + max|f_yy|) = h²/8 · k/r', async () => {
    // z = 150 − k·r about an apex off the alignment; f_xx + f_yy bounded by k / r (r the
    // distance from the apex), so over a pixel cell at least r − h√2 from the apex the
    // interpolation error is at most h²·k / (8 (r − h√2)). Error bound of linear
    // interpolation, |f − p| ≤ h²/8 · max|f''|, applied along x then y (value from memory of
    // the interpolation error theorem, e.g. Burden & Faires, Numerical Analysis, §3.1).
    const cx = X0 + 400;
    const cy = Y0 + 300;
    const k = 0.3;
    const cone = (x: number, y: number) => 150 - k * Math.hypot(x - cx, y - cy);
    const ground = await raster(cone);
    const { corridor } = cutCorridor({
      ground,
      alignment: readAlignment(straight, 'line.geojson'),
      header,
      settings: { stations: { every: 40 }, left: 60, right: 60, spacing: 1 },
    });
    const h = GRID.pixel;
    let checked = 0;
    let largest = 0;
    for (const [x, y, z] of samples(corridor)) {
      const rMin = Math.hypot(x - cx, y - cy) - h * Math.SQRT2;
      if (rMin <= h) continue; // the cell of the apex: no bound (the cone has no curvature bound there)
      const bound = (h * h * k) / (8 * rMin) + 2e-4;
      const error = Math.abs(z - cone(x, y));
      expect(error).toBeLessThanOrEqual(bound);
      largest = Math.max(largest, error);
      checked++;
    }
    expect(checked).toBeGreaterThan(1500);
    // the bound is reached in order of magnitude: the check is not loose by construction
    expect(largest).toBeGreaterThan(1e-3);
  });

  it('a valley: within h²/8 · |f_xx| = b·h²/4 of the parabola', async () => {
    // z = 80 + b (x − xv)²: f_xx = 2b, f_yy = 0
    const b = 0.004;
    const xv = X0 + 500;
    const valley = (x: number) => 80 + b * (x - xv) ** 2;
    const ground = await raster((x) => valley(x));
    const across = line([
      [xv, Y0 + 100],
      [xv, Y0 + 700],
    ]);
    const { corridor } = cutCorridor({
      ground,
      alignment: readAlignment(across, 'valley.geojson', { start: 1000 }),
      header,
      settings: { stations: [1000, 1250.5, 1600], left: 200, right: 200, spacing: 0.5 },
    });
    const bound = (b * GRID.pixel ** 2) / 4 + 2e-4;
    let largest = 0;
    for (const [x, , z] of samples(corridor)) {
      const error = Math.abs(z - valley(x));
      expect(error).toBeLessThanOrEqual(bound);
      largest = Math.max(largest, error);
    }
    expect(largest).toBeGreaterThan(bound / 2);
  });

  it('strata and water from rasters at the same samples, a top above the ground put on it', async () => {
    const plane = (x: number, y: number) => 100 + 0.02 * (x - X0) + 0.01 * (y - Y0);
    const ground = await raster(plane);
    const rock = await raster((x, y) => plane(x, y) - 4 + 0.01 * (x - X0 - 400), 'rock.tif');
    const water = await raster((x, y) => plane(x, y) - 1.5, 'gw.tif');
    const { corridor, messages } = cutCorridor({
      ground,
      alignment: readAlignment(straight, 'line.geojson'),
      header,
      strata: [{ material: 'clay' }, { material: 'rock', raster: rock }],
      water: { raster: water },
      settings: { stations: [100, 300], left: 20, right: 20, spacing: 2 },
    });
    for (const f of corridor.features) {
      const coords = f.geometry.coordinates;
      const strata = f.properties.strata as { material: string; elevation?: number[][] }[];
      const top = strata[1].elevation ?? [];
      const gw = (f.properties.water as { elevation: number[][] }).elevation;
      expect(top.map(([x]) => x)).toEqual(coords.map((_, i) => expect.closeTo(i * 2, 3) as number));
      expect(gw.map(([x]) => x)).toEqual(top.map(([x]) => x));
      coords.forEach(([x, y, z], i) => {
        expect(top[i][1]).toBeCloseTo(Math.min(z, plane(x, y) - 4 + 0.01 * (x - X0 - 400)), 3);
        expect(gw[i][1]).toBeCloseTo(z - 1.5, 3);
      });
    }
    // 400 m along x past the left edge the rock top is above the ground: put on it, with a warning
    expect(messages.every((m) => m.code === 'stratum-above-ground')).toBe(true);
  });
});

describe('stations and section lines where the alignment says', () => {
  const flat = () => raster(() => 50);

  it('a straight line: stations at start + k·interval along it, sections square to it', async () => {
    const [ax, ay] = [X0 + 100, Y0 + 200];
    const theta = 0.7; // direction of the line from the x axis
    const [tx, ty] = [Math.cos(theta), Math.sin(theta)];
    const alignment = readAlignment(
      line([
        [ax, ay],
        [ax + 600 * tx, ay + 600 * ty],
      ]),
      'line.geojson',
      { start: 2000 },
    );
    const { corridor } = cutCorridor({
      ground: await flat(),
      alignment,
      header,
      settings: { stations: { every: 25, from: 2010, to: 2580 }, left: 15, right: 35, spacing: 5 },
    });
    expect(corridor.features.map((f) => f.properties.station)).toEqual(
      Array.from({ length: 23 }, (_, k) => 2010 + 25 * k),
    );
    for (const f of corridor.features) {
      const s = (f.properties.station as number) - 2000;
      const [px, py] = [ax + s * tx, ay + s * ty];
      const c = f.geometry.coordinates;
      // left end: 15 to the left (normal (−ty, tx)); right end: 35 to the right
      expect(c[0][0]).toBeCloseTo(px - 15 * ty, 3);
      expect(c[0][1]).toBeCloseTo(py + 15 * tx, 3);
      expect(c[c.length - 1][0]).toBeCloseTo(px + 35 * ty, 3);
      expect(c[c.length - 1][1]).toBeCloseTo(py - 35 * tx, 3);
      expect(f.properties.offset).toBe(15);
      expect(f.properties.alignment_x).toBeCloseTo(px, 3);
      // bearing from north, clockwise
      expect(f.properties.bearing).toBeCloseTo(90 - (theta * 180) / Math.PI, 3);
    }
  });

  it('an arc: at each vertex and mid-chord of an inscribed polygon the section passes through the centre', async () => {
    const [cx, cy, R] = [X0 + 500, Y0 + 400, 250];
    const n = 12;
    const step = Math.PI / 2 / n; // a quarter circle, counter-clockwise from the east
    const chord = 2 * R * Math.sin(step / 2);
    const vertices = Array.from({ length: n + 1 }, (_, k) => [
      cx + R * Math.cos(k * step),
      cy + R * Math.sin(k * step),
    ]);
    const alignment = readAlignment(line(vertices), 'arc.geojson');
    expect(alignment.end).toBeCloseTo(n * chord, 9);
    const stations = Array.from({ length: 2 * n + 1 }, (_, k) => (k * chord) / 2);
    const { corridor } = cutCorridor({
      ground: await flat(),
      alignment,
      header,
      settings: { stations, left: 40, right: 30, spacing: 10 },
    });
    corridor.features.forEach((f, k) => {
      // the ends of the line: square to the first and the last chord (checked by the straight line)
      if (k === 0 || k === 2 * n) return;
      // a vertex lies at R, a mid-chord point at R cos(step/2) from the centre; counter-clockwise,
      // the left is towards the centre
      const r = k % 2 === 0 ? R : R * Math.cos(step / 2);
      const c = f.geometry.coordinates;
      const dist = ([x, y]: number[]) => Math.hypot(x - cx, y - cy);
      expect(dist(c[0])).toBeCloseTo(r - 40, 3);
      expect(dist(c[c.length - 1])).toBeCloseTo(r + 30, 3);
      // every sample on the radial line: the cross product of (p − centre) and (end − centre) is 0
      const [ex, ey] = c[c.length - 1];
      for (const [x, y] of c)
        expect(
          Math.abs((x - cx) * (ey - cy) - (y - cy) * (ex - cx)) / dist(c[c.length - 1]),
        ).toBeLessThan(1e-3);
    });
  });

  it('refuses a station off the alignment, by its place in the list', () => {
    const alignment = new Alignment(
      [
        [X0 + 100, Y0 + 100],
        [X0 + 200, Y0 + 100],
      ],
      0,
    );
    expect(() =>
      cutCorridor({
        ground: raster as never,
        alignment,
        header,
        settings: { stations: [0, 150], left: 5, right: 5, spacing: 1 },
      }),
    ).toThrow(/stations\[1\].*station 150 is off the alignment \(chainage 0 to 100\)/);
  });
});

describe('samples without a value', () => {
  // a hole of no data: the pixels with centres in x ∈ (X0+600, X0+620), y < Y0+350
  const holed = (x: number, y: number) =>
    x > X0 + 600 && x < X0 + 620 && y < Y0 + 350 ? -9999 : 70;
  const across = line([
    [X0 + 500, Y0 + 200],
    [X0 + 500, Y0 + 600],
  ]);
  const holedTif = async () =>
    readRaster(writeTiff(GRID, holed, { GDAL_NODATA: '-9999' }), 'holed.tif');

  it('are located by station and offset, and refuse the cut', async () => {
    const ground = await holedTif();
    const error: unknown = await Promise.resolve()
      .then(() =>
        cutCorridor({
          ground,
          alignment: readAlignment(across, 'line.geojson', { start: 0 }),
          header,
          settings: { stations: [0, 100, 200], left: 10, right: 150, spacing: 10 },
        }),
      )
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(TerrainError);
    const messages = (error as TerrainError).messages;
    // the line runs north: its right is east (+x); samples at x = X0+500+offset. Pixel centres
    // 602.5..617.5 hold no data: a sample at x leans on them when 597.5 < x < 622.5 → offsets
    // 100, 110 and 120, at stations 0 and 100 (y = Y0+200, Y0+300), not at 200 (y = Y0+400)
    expect(messages.map((m) => [m.station, m.offset, m.code])).toEqual([
      [0, 100, 'no-data'],
      [0, 110, 'no-data'],
      [0, 120, 'no-data'],
      [100, 100, 'no-data'],
      [100, 110, 'no-data'],
      [100, 120, 'no-data'],
    ]);
    expect((error as Error).message).toMatch(
      /^holed\.tif: station 0, offset 100 \(x 500600, y 5600200\): error: no data/,
    );
  });

  it('leave the station out with a warning under noData: skip', async () => {
    const { corridor, messages } = cutCorridor({
      ground: await holedTif(),
      alignment: readAlignment(across, 'line.geojson'),
      header,
      settings: { stations: [0, 100, 200], left: 10, right: 150, spacing: 10, noData: 'skip' },
    });
    expect(corridor.features.map((f) => f.properties.station)).toEqual([200]);
    expect(messages.filter((m) => m.code === 'station-left-out').map((m) => m.station)).toEqual([
      0, 100,
    ]);
    expect(messages.every((m) => m.severity === 'warning')).toBe(true);
  });

  it('outside the raster is located too', async () => {
    const error: unknown = await holedTif()
      .then((ground) =>
        cutCorridor({
          ground,
          alignment: readAlignment(across, 'line.geojson'),
          header,
          settings: { stations: [200], left: 510, right: 10, spacing: 5 },
        }),
      )
      .catch((e: unknown) => e);
    // the raster starts 500 m west of the line; its outermost half pixel is read as its edge
    expect((error as TerrainError).messages.map((m) => [m.offset, m.code])).toEqual([
      [-510, 'outside'],
      [-505, 'outside'],
    ]);
  });

  it('sample() tells outside from no data', async () => {
    const r = await holedTif();
    expect(sample(r, X0 - 1, Y0 + 10)).toBe('outside');
    expect(sample(r, X0 + 610, Y0 + 10)).toBe('no-data');
    expect(sample(r, X0 + 1, Y0 + 10)).toBe(70);
  });
});

describe('the cut corridor reads as a batch', () => {
  it('every section reads, its ground the samples along the line, the alignment at x = left', async () => {
    const plane = (x: number, y: number) => 60 + 0.1 * (x - X0) + 0.02 * (y - Y0);
    const { corridor } = cutCorridor({
      ground: await raster(plane),
      alignment: readAlignment(
        line([
          [X0 + 300, Y0 + 100],
          [X0 + 320, Y0 + 700],
        ]),
        'line.geojson',
        { start: 500 },
      ),
      header,
      strata: [{ material: 'clay' }, { material: 'clay', depth: 6 }],
      water: { depth: 2 },
      settings: { stations: { every: 100 }, left: 24, right: 36, spacing: 3 },
    });
    const parsed = parseGeoJsonCorridor(corridorText(corridor), 'cut.geojson');
    expect(parsed.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(parsed.sections).toHaveLength(corridor.features.length);
    const first = parsed.sections[0];
    expect(first.id).toBe('synthetic@500');
    expect(first.ground.map(([x]) => x)).toEqual(
      Array.from({ length: 21 }, (_, i) => expect.closeTo(i * 3, 3) as number),
    );
    expect(first.ground.map(([, y]) => y)).toEqual(
      corridor.features[0].geometry.coordinates.map(([, , z]) => expect.closeTo(z, 6) as number),
    );
  });
});

describe('an alignment in longitude and latitude (RFC 7946)', () => {
  // The raster is in EPSG:32630 (WGS 84 / UTM zone 30N). The same alignment given in projected
  // coordinates and in WGS 84 degrees (converted with the core's crs) must give the same cut:
  // the projection round trip is within a millimetre (packages/core/test/crs checks proj4).
  const plane = (x: number, y: number) => 100 + 0.05 * (x - X0) - 0.02 * (y - Y0);
  const projected = [
    [X0 + 200, Y0 + 400],
    [X0 + 800, Y0 + 400],
  ];
  const { crs } = parseCrs('EPSG:32630');
  const lonLat = projected.map(([x, y]) => crs!.toLonLat(x, y));
  const job = (alignment: string): TerrainJob => ({
    terrain: 'dem.tif',
    alignment,
    start: 0,
    stations: { every: 100 },
    left: 40,
    right: 40,
    spacing: 2,
    template: header,
  });
  const files: Record<string, Uint8Array> = {
    'dem.tif': writeTiff(GRID, plane),
    'xy.geojson': Buffer.from(line(projected)),
    'll.geojson': Buffer.from(line(lonLat)),
  };
  const read = (name: string) => Promise.resolve(files[name] ?? null);

  it('is projected to the raster’s system and cut as its projected twin', async () => {
    const a = await runTerrainJob(job('xy.geojson'), 'xy.terrain.yaml', read);
    const b = await runTerrainJob(job('ll.geojson'), 'll.terrain.yaml', read);
    expect(b.corridor.features).toHaveLength(7);
    const pa = samples(a.corridor);
    const pb = samples(b.corridor);
    expect(pb).toHaveLength(pa.length);
    pa.forEach((p, i) => p.forEach((v, k) => expect(Math.abs(pb[i][k] - v)).toBeLessThan(1e-3)));
  });

  it('names the system in the cut corridor, its positions projected, so its results map in WGS 84', async () => {
    const { corridor } = await runTerrainJob(job('ll.geojson'), 'll.terrain.yaml', read);
    expect(corridor.scarpline).toMatchObject({ crs: 'EPSG:32630', coordinates: 'projected' });
    const parsed = parseGeoJsonCorridor(corridorText(corridor), 'cut.geojson');
    expect(parsed.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(parsed.sections).toHaveLength(7);
  });

  it('a crs of the settings that cannot be read is located at it', async () => {
    const bad = { ...job('ll.geojson'), template: { ...header, crs: 'EPSG:4326' } };
    await expect(runTerrainJob(bad, 'll.terrain.yaml', read)).rejects.toThrow(/4326/);
  });
});
