#!/usr/bin/env node
// Writes two more inputs of the Wendlecombe bypass (an invented road; invented demonstration
// data, not for design), for the same cut between chainage 1+300 and 1+400:
//   wendlecombe-cut.xml        its cross-sections as LandXML 1.2 (CrossSects/CrossSect/
//                              CrossSectSurf/PntList2D): the existing ground, the top of the
//                              mudstone and the groundwater, right-hand side, offsets 0 to 40 m;
//                              read with wendlecombe-cut.yaml (the corridor settings)
//   wendlecombe-lonlat.geojson the same sections as an RFC 7946 GeoJSON corridor: section lines
//                              in WGS 84 longitude and latitude, projected by Scarpline to the
//                              corridor's crs (EPSG:32630, WGS 84 / UTM zone 30N)
// Deterministic: the shapes are closed forms of the chainage.
//
//   node examples/corridor/generate-map.js
'use strict';
const fs = require('node:fs');
const path = require('node:path');
const proj4 = require('proj4');

const UTM30 = '+proj=utm +zone=30 +datum=WGS84 +units=m +no_defs';
const r3 = (v) => Math.round(v * 1000) / 1000;
const STATIONS = [1300, 1320, 1340, 1360, 1380, 1400];
const PLATFORM = 40; // road level (m)
const HALF = 8; // platform and verge, m from the centreline
const OFFSETS = [0, 8, 12, 16, 20, 24, 28, 32, 36, 40];

/** The natural ground at an offset of a station: rising away from the road. */
function natural(s, x) {
  const crest = 48 + 2 * Math.sin((2 * Math.PI * (s - 1300)) / 200);
  return crest + 0.05 * (x - 20);
}
/** The cut: the platform, then a 1:2 slope up to the natural ground. */
function ground(s, x) {
  if (x <= HALF) return PLATFORM;
  return Math.min(PLATFORM + (x - HALF) / 2, natural(s, x));
}
/** The top of the mudstone: below the platform at the road, rising gently into the hill. */
const mudstone = (s, x) => 37 + 0.12 * x + 0.5 * (natural(s, 20) - 48);
const water = (s, x) => PLATFORM - 0.5 + Math.max(0, (x - HALF) * 0.12) + 0 * s;

const surface = (name, f, s) =>
  `        <CrossSectSurf name="${name}">\n          <PntList2D>${OFFSETS.map((x) => `${x} ${r3(f(s, x))}`).join(' ')}</PntList2D>\n        </CrossSectSurf>`;

const xml = `<?xml version="1.0" encoding="UTF-8"?>
<!-- Wendlecombe bypass, cut at 1+300 to 1+400, right-hand side: invented demonstration data, not for design. -->
<LandXML xmlns="http://www.landxml.org/schema/LandXML-1.2" version="1.2" date="2026-12-03" time="00:00:00">
  <Units>
    <Metric linearUnit="meter" areaUnit="squareMeter" volumeUnit="cubicMeter" angularUnit="decimal degrees" directionUnit="decimal degrees"/>
  </Units>
  <Project name="Wendlecombe bypass"/>
  <Alignments>
    <Alignment name="WCB main line" length="2200" staStart="1000">
      <CrossSects>
${STATIONS.map(
  (s) => `      <CrossSect sta="${s}" name="XS ${s}">
${surface('Existing Ground', ground, s)}
${surface('Top of mudstone', mudstone, s)}
${surface('Groundwater', water, s)}
      </CrossSect>`,
).join('\n')}
      </CrossSects>
    </Alignment>
  </Alignments>
</LandXML>
`;
fs.writeFileSync(path.join(__dirname, 'wendlecombe-cut.xml'), xml);

// The section lines in plan: the alignment runs north-east from (552000, 5673000) in UTM 30N;
// each section runs at right angles to it, to the right (south-east).
const along = [Math.SQRT1_2, Math.SQRT1_2];
const across = [Math.SQRT1_2, -Math.SQRT1_2];
const toLonLat = proj4(UTM30, 'WGS84');
const features = STATIONS.map((s) => {
  const e0 = 552000 + (s - 1300) * along[0];
  const n0 = 5673000 + (s - 1300) * along[1];
  const coordinates = OFFSETS.map((x) => {
    const [lon, lat] = toLonLat.forward([e0 + x * across[0], n0 + x * across[1]]);
    return [Number(lon.toFixed(9)), Number(lat.toFixed(9)), r3(ground(s, x))];
  });
  return {
    type: 'Feature',
    properties: {
      station: s,
      name: `XS ${s}`,
      strata: [
        { material: 'weathered-mudstone' },
        { material: 'mudstone', elevation: OFFSETS.map((x) => [x, r3(mudstone(s, x))]) },
      ],
      water: { elevation: OFFSETS.map((x) => [x, r3(water(s, x))]) },
    },
    geometry: { type: 'LineString', coordinates },
  };
});
const settings = fs.readFileSync(path.join(__dirname, 'wendlecombe-cut.yaml'), 'utf8');
const yaml = require('yaml');
const head = yaml.parse(settings);
delete head.surfaces;
const geojson = {
  type: 'FeatureCollection',
  scarpline: { ...head, id: 'wcb-cut-map', crs: 'EPSG:32630' },
  features,
};
fs.writeFileSync(
  path.join(__dirname, 'wendlecombe-lonlat.geojson'),
  `${JSON.stringify(geojson, null, 1)}\n`,
);
