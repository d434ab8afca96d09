import { fail } from './errors';

/**
 * An elevation raster read from a GeoTIFF: one band of values on a north-up grid. Pixel (col,
 * row) has its centre at x = centreX + col · pixelX, y = centreY + row · pixelY (pixelY is
 * negative in a north-up raster: rows go south).
 */
export interface Raster {
  name: string;
  width: number;
  height: number;
  /** Map position of the centre of pixel (0, 0). */
  centreX: number;
  centreY: number;
  /** Pixel size along x and y (y negative when north-up). */
  pixelX: number;
  pixelY: number;
  /** The no-data value of the file (GDAL_NODATA), or null; NaN is no data in any raster. */
  noData: number | null;
  /** EPSG code of the projected coordinate system the file names (ProjectedCSTypeGeoKey), if any. */
  epsg: number | null;
  /** Row-major values, row 0 at the top. */
  values: ArrayLike<number>;
}

/** Caps on a raster read: its file size and its pixel count. */
export interface RasterLimits {
  maxBytes: number;
  maxPixels: number;
}

export const DEFAULT_RASTER_LIMITS: RasterLimits = { maxBytes: 512 * 2 ** 20, maxPixels: 100e6 };

/** geotiff is an ES module package: loaded by import() (kept as such in the build) when needed. */
const loadGeoTiff = () => import('geotiff');

/** The raster type geokey's value for "pixel is point": the tie point is a pixel's centre. */
const PIXEL_IS_POINT = 2;
/** The model type geokey's value for a geographic (longitude, latitude) system. */
const MODEL_GEOGRAPHIC = 2;

/**
 * Reads the first band of a GeoTIFF elevation raster from its bytes: its grid (origin and
 * pixel size, from ModelTiepoint and ModelPixelScale, or an unrotated ModelTransformation),
 * its no-data value (GDAL_NODATA) and its values. Refused, with the file named: a file that is
 * not a TIFF, a raster without a georeference, a rotated or sheared grid (north-up only), a
 * raster in longitude and latitude (give it in a projected system in the corridor's units), and
 * a file above the size or pixel caps.
 *
 * @example const dem = await readRaster(readFileSync('dem.tif'), 'dem.tif');
 */
export async function readRaster(
  bytes: Uint8Array,
  name: string,
  limits: RasterLimits = DEFAULT_RASTER_LIMITS,
): Promise<Raster> {
  if (bytes.byteLength > limits.maxBytes)
    throw fail({
      file: name,
      code: 'too-large',
      message: `the file is ${mb(bytes.byteLength)}; at most ${mb(limits.maxBytes)} is read`,
    });
  const { fromArrayBuffer } = await loadGeoTiff();
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
  let image;
  try {
    image = await (await fromArrayBuffer(buffer as ArrayBuffer)).getImage(0);
  } catch (e) {
    throw fail({
      file: name,
      code: 'not-a-geotiff',
      message: `not a GeoTIFF raster that can be read (${e instanceof Error ? e.message : String(e)})`,
    });
  }
  const width = image.getWidth();
  const height = image.getHeight();
  if (width * height > limits.maxPixels)
    throw fail({
      file: name,
      code: 'too-many-pixels',
      message: `${width} × ${height} pixels; at most ${limits.maxPixels.toLocaleString('en')} are read (cut the raster to the corridor)`,
    });
  const transform = image.fileDirectory.getValue<'ModelTransformation'>('ModelTransformation');
  if (transform && (transform[1] !== 0 || transform[4] !== 0))
    throw fail({
      file: name,
      code: 'rotated',
      message:
        'the raster grid is rotated or sheared (ModelTransformation): only north-up rasters are read; warp it to a north-up grid first',
    });
  let origin: number[];
  let resolution: number[];
  try {
    origin = image.getOrigin();
    resolution = image.getResolution();
  } catch {
    throw fail({
      file: name,
      code: 'no-georeference',
      message: 'the raster has no georeference (ModelTiepoint and ModelPixelScale)',
    });
  }
  const keys = image.getGeoKeys() ?? {};
  if (keys.GTModelTypeGeoKey === MODEL_GEOGRAPHIC)
    throw fail({
      file: name,
      code: 'geographic',
      message:
        "the raster is in longitude and latitude: give it in a projected coordinate system in the corridor's units (m or ft)",
    });
  const [pixelX, pixelY] = resolution;
  if (!(pixelX > 0) || !Number.isFinite(pixelY) || pixelY === 0)
    throw fail({ file: name, code: 'no-georeference', message: 'the raster has no pixel size' });
  // the tie point is a pixel's corner (pixel is area, the default) or its centre
  const half = keys.GTRasterTypeGeoKey === PIXEL_IS_POINT ? 0 : 0.5;
  const rasters = await image.readRasters({ samples: [0], interleave: true });
  const noData = image.getGDALNoData();
  return {
    name,
    width,
    height,
    centreX: origin[0] + half * pixelX,
    centreY: origin[1] + half * pixelY,
    pixelX,
    pixelY,
    noData: noData !== null && Number.isFinite(noData) ? noData : null,
    epsg: typeof keys.ProjectedCSTypeGeoKey === 'number' ? keys.ProjectedCSTypeGeoKey : null,
    values: rasters as unknown as ArrayLike<number>,
  };
}

const mb = (bytes: number) => `${(bytes / 2 ** 20).toFixed(1)} MB`;

/** Why a raster has no value at a point. */
export type NoValue = 'outside' | 'no-data';

/**
 * The raster's value at a map position by bilinear interpolation between the centres of the
 * four pixels around it (exact on a plane). A point between the outermost pixel centres and the
 * raster's edge takes the value along that edge (the half pixel at the border). Returns why not
 * when the point is outside the raster or one of the four pixels holds no data.
 *
 * @example sample(dem, 512.3, 880.1) // → 41.27, or 'no-data'
 */
export function sample(r: Raster, x: number, y: number): number | NoValue {
  const fc = (x - r.centreX) / r.pixelX;
  const fr = (y - r.centreY) / r.pixelY;
  if (fc < -0.5 || fr < -0.5 || fc > r.width - 0.5 || fr > r.height - 0.5) return 'outside';
  const c = Math.min(Math.max(fc, 0), r.width - 1);
  const rr = Math.min(Math.max(fr, 0), r.height - 1);
  const c0 = Math.min(Math.floor(c), Math.max(r.width - 2, 0));
  const r0 = Math.min(Math.floor(rr), Math.max(r.height - 2, 0));
  const c1 = Math.min(c0 + 1, r.width - 1);
  const r1 = Math.min(r0 + 1, r.height - 1);
  const tx = c - c0;
  const ty = rr - r0;
  const v = (col: number, row: number) => r.values[row * r.width + col];
  const z00 = v(c0, r0);
  const z10 = v(c1, r0);
  const z01 = v(c0, r1);
  const z11 = v(c1, r1);
  // a pixel of no data counts only where it has weight
  const used: [number, number][] = [
    [z00, (1 - tx) * (1 - ty)],
    [z10, tx * (1 - ty)],
    [z01, (1 - tx) * ty],
    [z11, tx * ty],
  ];
  let z = 0;
  for (const [value, weight] of used) {
    if (weight === 0) continue;
    if (Number.isNaN(value) || value === r.noData) return 'no-data';
    z += value * weight;
  }
  return z;
}
