/**
 * `scarpline batch`'s outputs for a station of several design cases: a row and a feature per
 * case then the station's, and the printed line naming the governing case. The station is made
 * on the normalised section (two cases of the test corridor's first cut), the analysis the
 * core's own.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  designCases,
  parseSections,
  stationRecords,
  type StationResult,
} from '@scarpline/core';
import { resultsGeoJson, stationLine, stationRow } from '../src/batch/outputs';
import { FIXTURES } from './run';

function twoCaseStation(): StationResult {
  const text = readFileSync(join(FIXTURES, 'small-corridor.yaml'), 'utf8');
  const s = parseSections(text, 'small-corridor.yaml').sections[0];
  const [own] = designCases(s);
  return analyzeSection({
    ...s,
    cases: [
      { ...own, name: 'long term', kind: 'long-term', requiredFs: 1.3 },
      {
        ...own,
        name: 'earthquake',
        kind: 'seismic',
        requiredFs: 1.1,
        seismic: { kh: 0.2, kv: 0 },
      },
    ],
  });
}

const result = twoCaseStation();
const records = stationRecords(result);

test('the station line: its governing case’s method, FS and requirement, the station’s verdict, and which case governs', () => {
  const station = stationRow(records);
  expect(station.row).toBe('station');
  const governing = result.cases.find((c) => c.name === result.governing!.case)!;
  const line = stationLine(records);
  expect(line).toContain(`(2 cases; governing: ${governing.name})`);
  expect(line).toMatch(
    new RegExp(
      `1200 +wcb-test@1200 +${governing.governing!.method} +${governing.governing!.fs.toFixed(3)} +${governing.requiredFs} +${result.verdict === 'below' ? 'below' : 'meets'}`,
    ),
  );
  // a station of one case says nothing of cases
  const one = stationRecords({ ...result, cases: [result.cases[0]], governing: null });
  expect(stationLine(one)).not.toMatch(/cases|governing/);
});

test('results.geojson: a feature per case then the station’s, each with the station’s line', () => {
  const geometry = {
    type: 'LineString',
    coordinates: [
      [0, 0, 62],
      [70, 0, 74],
    ],
  };
  const doc = JSON.parse(
    resultsGeoJson('wcb-test', [
      {
        records,
        feature: {
          index: 0,
          station: 1200,
          sectionId: 'wcb-test@1200',
          geometry,
          properties: { name: 'XS-1200' },
        },
      },
    ]),
  ) as { features: { id: string; geometry: unknown; properties: Record<string, unknown> }[] };
  expect(doc.features.map((f) => [f.id, f.properties.row, f.properties.case])).toEqual([
    ['wcb-test@1200#long term', 'case', 'long term'],
    ['wcb-test@1200#earthquake', 'case', 'earthquake'],
    ['wcb-test@1200', 'station', result.governing!.case],
  ]);
  for (const f of doc.features) {
    expect(f.geometry).toEqual(geometry);
    expect(f.properties.name).toBe('XS-1200');
  }
  expect(doc.features[1].properties.kind).toBe('seismic');
  expect(doc.features[1].properties.required_fs).toBe(1.1);
});
