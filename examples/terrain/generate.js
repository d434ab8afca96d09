#!/usr/bin/env node
// Writes the terrain of the Wendlecombe bypass, an invented road (invented demonstration data,
// not for design): the small valley of the invented Corrin brook, the road's alignment along its
// side from chainage 1+000 to 2+200, and a terrain job that cuts a section every 40 m.
//
//   wendlecombe-dem.tif        the ground: a GeoTIFF of Float32 elevations, 4 m pixels
//   wendlecombe-rock.tif       the top of the moderately weathered mudstone, 8 m pixels
//   wendlecombe-alignment.geojson  the road's centreline (a LineString)
//   wendlecombe.terrain.yaml   the terrain job (scarpline cut / scarpline batch), with the
//                              corridor settings: id, units, materials, cases
//
// The rasters are written with the geotiff package's own writer (writeArrayBuffer: one strip,
// uncompressed), in a local projected grid of the scenario (a user-defined system, metres).
// Deterministic: the same files every time.
//
//   node examples/terrain/generate.js
'use strict';
const fs = require('node:fs');
const path = require('node:path');

const HERE = __dirname;
const r2 = (v) => Math.round(v * 100) / 100;

// --- the alignment: chainage 1000 at (20400, 31200), heading 20° from east, curving left
const START = 1000;
const LENGTH = 1200;
const vertices = [];
{
  let [x, y] = [20400, 31200];
  let heading = (20 * Math.PI) / 180;
  const step = 20;
  vertices.push([x, y]);
  for (let s = step; s <= LENGTH; s += step) {
    const turn = s < 500 ? 1 / 2500 : 1 / 1600; // a gentle bend, then a tighter one
    heading += turn * step;
    x += step * Math.cos(heading - (turn * step) / 2);
    y += step * Math.sin(heading - (turn * step) / 2);
    vertices.push([r2(x), r2(y)]);
  }
}

// --- the valley: the Corrin brook runs beside the line, about 28 m to its right; the ground
// rises to the left in a bank whose height and steepness change along the line, then a gentle
// hillside. Written by chainage s and offset d from the alignment (right positive).
/** Chainage (from the start) and offset (right positive) of a map position: its nearest segment. */
function place(x, y) {
  let best = { dist: Infinity, s: 0, d: 0 };
  let s0 = 0;
  for (let i = 1; i < vertices.length; i++) {
    const [x0, y0] = vertices[i - 1];
    const [x1, y1] = vertices[i];
    const len = Math.hypot(x1 - x0, y1 - y0);
    const [tx, ty] = [(x1 - x0) / len, (y1 - y0) / len];
    const along = Math.min(Math.max((x - x0) * tx + (y - y0) * ty, 0), len);
    const [px, py] = [x0 + along * tx, y0 + along * ty];
    const dist = Math.hypot(x - px, y - py);
    if (dist < best.dist) best = { dist, s: s0 + along, d: (x - px) * ty - (y - py) * tx };
    s0 += len;
  }
  return best;
}
function ground(x, y) {
  const { s, d } = place(x, y);
  const floor = 30 - 0.008 * s + 2 * Math.sin((2 * Math.PI * s) / 900);
  const height = 7 + 3 * Math.sin((2 * Math.PI * s) / 700); // the bank: 4 to 10 m high
  const width = 5 + 4 * Math.cos((2 * Math.PI * s) / 450) ** 2; // its steepest 1:2 to 1:3.6
  const bank = height / (1 + Math.exp((d - 14) / width));
  const hill = 0.08 * Math.max(14 - d, 0);
  return floor + bank + hill;
}
/** Top of the moderately weathered mudstone: 3 m below the ground by the brook, 7 m up the hill. */
function rockTop(x, y) {
  const { d } = place(x, y);
  return ground(x, y) - (3 + 4 / (1 + Math.exp(d / 12)));
}

// --- the rasters: the alignment's extent and 70 m around it
const MARGIN = 70;
const xs = vertices.map((p) => p[0]);
const ys = vertices.map((p) => p[1]);
const bounds = {
  left: Math.floor((Math.min(...xs) - MARGIN) / 8) * 8,
  right: Math.ceil((Math.max(...xs) + MARGIN) / 8) * 8,
  bottom: Math.floor((Math.min(...ys) - MARGIN) / 8) * 8,
  top: Math.ceil((Math.max(...ys) + MARGIN) / 8) * 8,
};

async function writeRaster(file, pixel, f) {
  const { writeArrayBuffer } = await import('geotiff');
  const width = (bounds.right - bounds.left) / pixel;
  const height = (bounds.top - bounds.bottom) / pixel;
  const values = new Float32Array(width * height);
  for (let row = 0; row < height; row++)
    for (let col = 0; col < width; col++) {
      const x = bounds.left + (col + 0.5) * pixel;
      const y = bounds.top - (row + 0.5) * pixel;
      // outside the corridor's reach: no data, as a real survey's edge
      const near = Math.min(...vertices.map(([vx, vy]) => Math.hypot(x - vx, y - vy)));
      values[row * width + col] = near > MARGIN + 2 * pixel ? -9999 : r2(f(x, y));
    }
  const bytes = writeArrayBuffer(values, {
    width,
    height,
    ModelPixelScale: [pixel, pixel, 0],
    ModelTiepoint: [0, 0, 0, bounds.left, bounds.top, 0],
    GDAL_NODATA: '-9999',
    GTModelTypeGeoKey: 1, // projected
    GTRasterTypeGeoKey: 1, // pixel is area
    ProjectedCSTypeGeoKey: 32767, // user-defined: the scenario's local grid
    GTCitationGeoKey: 'Wendlecombe local grid (invented), metres',
  });
  fs.writeFileSync(path.join(HERE, file), Buffer.from(bytes));
  return `${file}: ${width} × ${height} pixels of ${pixel} m, ${Math.round(bytes.byteLength / 1024)} kB`;
}

const alignment = {
  type: 'Feature',
  properties: {
    name: 'Wendlecombe bypass, main line (invented)',
    startChainage: START,
  },
  geometry: { type: 'LineString', coordinates: vertices },
};

const job = `# A terrain job (invented demonstration data, not for design): the natural ground along the
# line of the Wendlecombe bypass before it is built, cut from its terrain model.
#   scarpline cut examples/terrain/wendlecombe.terrain.yaml -o wendlecombe.geojson
#   scarpline batch examples/terrain/wendlecombe.terrain.yaml --out results/
format: scarpline-terrain/1
terrain: wendlecombe-dem.tif
alignment: wendlecombe-alignment.geojson
stations: { every: 40 }
left: 40
right: 40
spacing: 2
strata:
  - material: weathered-mudstone
  - { material: mudstone, raster: wendlecombe-rock.tif }
water: { depth: 2 }
# The corridor settings: a corridor batch without its sections (schemas/batch.schema.json).
template:
  id: wcb-terrain
  title: Wendlecombe bypass, natural ground along the line
  description: >-
    Invented demonstration corridor (not for design): the natural slopes across the line of the
    bypass, cut every 40 m from a terrain model of the Corrin valley, 40 m either side of the
    centreline. The top of the moderately weathered mudstone from a ground model raster; the
    groundwater 2 m below the ground.
  units: si
  template:
    materials:
      weathered-mudstone:
        description: Highly weathered MUDSTONE, recovered as stiff clay
        unitWeight: 20
        saturatedUnitWeight: 20.5
        strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 26 }
      mudstone:
        description: Moderately weathered MUDSTONE, treated as a rigid base
        strength: { model: rigid }
    analysis:
      methods: [bishop, spencer]
      slices: 30
      surface: { type: auto }
      requiredFs: 1.5
    cases:
      - name: long term
        kind: long-term
`;

(async () => {
  fs.writeFileSync(
    path.join(HERE, 'wendlecombe-alignment.geojson'),
    `${JSON.stringify(alignment)}\n`,
  );
  fs.writeFileSync(path.join(HERE, 'wendlecombe.terrain.yaml'), job);
  console.log(await writeRaster('wendlecombe-dem.tif', 4, ground));
  console.log(await writeRaster('wendlecombe-rock.tif', 8, rockTop));
})().catch((e) => {
  console.error(e);
  process.exit(1);
});
