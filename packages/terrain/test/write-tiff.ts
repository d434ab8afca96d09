import { writeArrayBuffer, type GeotiffWriterMetadata } from 'geotiff';

export interface Grid {
  width: number;
  height: number;
  /** Map position of the raster's top-left corner. */
  left: number;
  top: number;
  /** Pixel size (square). */
  pixel: number;
}

/**
 * A GeoTIFF of one Float32 band: the value at each pixel centre from `f(x, y)` (NaN allowed),
 * north-up, pixel is area, in a projected system (EPSG:32630 by default); `extra` adds or
 * replaces tags and geokeys (undefined: left out).
 */
export function writeTiff(
  grid: Grid,
  f: (x: number, y: number) => number,
  extra: Record<string, unknown> = {},
): Buffer {
  const { width, height, left, top, pixel } = grid;
  const values = new Float32Array(width * height);
  for (let row = 0; row < height; row++)
    for (let col = 0; col < width; col++)
      values[row * width + col] = f(left + (col + 0.5) * pixel, top - (row + 0.5) * pixel);
  const metadata: Record<string, unknown> = {
    width,
    height,
    ModelPixelScale: [pixel, pixel, 0],
    ModelTiepoint: [0, 0, 0, left, top, 0],
    GTModelTypeGeoKey: 1,
    GTRasterTypeGeoKey: 1,
    ProjectedCSTypeGeoKey: 32630,
    ...extra,
  };
  // a setting given as undefined in `extra` is left out
  for (const key of Object.keys(metadata)) if (metadata[key] === undefined) delete metadata[key];
  return Buffer.from(writeArrayBuffer(values, metadata as GeotiffWriterMetadata));
}
