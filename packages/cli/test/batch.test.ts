import { spawn } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parse } from 'csv-parse/sync';
import { XMLValidator } from 'fast-xml-parser';
import Ajv2020 from 'ajv/dist/2020';
import { resultSchema } from '@scarpline/schemas';
import { parseSections, stationProbability } from '@scarpline/core';
import { FIXTURES, MAIN, ROOT, run } from './run';
import { readXlsx, shown } from './xlsx-cells';

const validate = new Ajv2020({ strict: false }).compile(resultSchema);
const tmp = () => mkdtempSync(join(tmpdir(), 'scarpline-batch-'));

/** The structure RFC 7946 asks of a FeatureCollection (sections 3.1–3.3). */
function expectFeatureCollection(doc: {
  type: string;
  features: {
    type: string;
    geometry: { type: string; coordinates: unknown } | null;
    properties: unknown;
  }[];
}) {
  expect(doc.type).toBe('FeatureCollection');
  expect(Array.isArray(doc.features)).toBe(true);
  for (const f of doc.features) {
    expect(f.type).toBe('Feature');
    expect(typeof f.properties === 'object' && f.properties !== null).toBe(true);
    if (f.geometry === null) continue;
    expect(f.geometry.type).toBe('LineString');
    const c = f.geometry.coordinates as number[][];
    expect(c.length).toBeGreaterThanOrEqual(2);
    for (const p of c) {
      expect(p.length).toBeGreaterThanOrEqual(2);
      for (const v of p) expect(typeof v).toBe('number');
    }
  }
}

describe('scarpline batch', () => {
  const out = tmp();
  const r = run(['batch', join(FIXTURES, 'small-corridor.yaml'), '--out', out, '--jobs', '2']);

  test('a broken section is reported, located, and the others still finish (exit 1)', () => {
    expect(r.code).toBe(1);
    expect(r.err).toMatch(
      /small-corridor\.yaml:28:\d+ sections\[2\]\.ground\[2\]: x = 15 does not increase/,
    );
    expect(r.out).toMatch(/1200 +wcb-test@1200 +bishop +\d\.\d{3} +1\.3 +meets/);
    expect(r.out).toMatch(/1240 +wcb-test@1240 .*input error/);
    expect(r.out).toMatch(/1260 +wcb-test@1260 +bishop +\d\.\d{3} +1\.7 +below/);
    expect(r.out).toContain(
      '4 of 4 sections: meets the required FS: 2, below the required FS: 1, no factor of safety: 0, no requirement given: 0, no significant slope: 0, input error: 1',
    );
    expect(r.out).toMatch(/Caution: /);
    // not a terminal: a plain line per section on standard error, after the caution
    expect(r.err.match(/^\[\d\/4\] /gm)).toHaveLength(4);
    const caution = r.err.indexOf('Caution: Results are for review by a qualified');
    expect(caution).toBeGreaterThanOrEqual(0);
    expect(caution).toBeLessThan(r.err.search(/^\[1\/4\] /m));
  });

  test('results.json: the caution, every analysed section valid against the result schema, in station order', () => {
    const doc = JSON.parse(readFileSync(join(out, 'results.json'), 'utf8')) as {
      caution: string;
      sections: { id: string }[];
      failures: { id: string }[];
      complete: boolean;
    };
    expect(doc.caution).toMatch(/qualified geotechnical engineer/);
    expect(doc.sections.map((s) => s.id)).toEqual([
      'wcb-test@1200',
      'wcb-test@1220',
      'wcb-test@1260',
    ]);
    for (const s of doc.sections) expect(validate(s)).toBe(true);
    expect(doc.failures.map((f) => f.id)).toEqual(['wcb-test@1240']);
    expect(doc.complete).toBe(true);
  });

  test('results.csv: the core’s results table, per station a row per case then the station’s', () => {
    const rows = parse<Record<string, string>>(readFileSync(join(out, 'results.csv'), 'utf8'), {
      columns: true,
    });
    expect(Object.keys(rows[0])).toEqual([
      'station',
      'chainage',
      'section_id',
      'row',
      'case',
      'kind',
      'governing_method',
      'fs',
      'required_fs',
      'ratio',
      'verdict',
      'required_force',
      'required_layers',
      'pf',
      'pf_se',
      'beta_normal',
      'beta_lognormal',
      'warnings',
      'note',
      'caution',
    ]);
    // each section is its one case (analysis.case: long-term); one that did not read has its station row only
    expect(rows.map((x) => [x.station, x.row, x.case, x.kind, x.verdict])).toEqual([
      ['1200', 'case', 'long-term', 'long-term', 'meets'],
      ['1200', 'station', 'long-term', 'long-term', 'meets'],
      ['1220', 'case', 'long-term', 'long-term', 'meets'],
      ['1220', 'station', 'long-term', 'long-term', 'meets'],
      ['1240', 'station', '', '', 'input-error'],
      ['1260', 'case', 'long-term', 'long-term', 'below'],
      ['1260', 'station', 'long-term', 'long-term', 'below'],
    ]);
    for (const x of rows.filter((x) => x.fs)) {
      expect(x.fs).toMatch(/^\d+\.\d{3}$/);
      expect(x.ratio).toMatch(/^\d+\.\d{3}$/);
      expect(Number(x.ratio)).toBeCloseTo(Number(x.fs) / Number(x.required_fs), 2);
    }
    expect(rows[4].note).toMatch(/^sections\[2\]\.ground\[2\]: x = 15 does not increase/);
    expect(rows[4].ratio).toBe('');
    expect(Number(rows[6].fs)).toBeLessThan(Number(rows[6].required_fs));
    expect(Number(rows[6].ratio)).toBeLessThan(1);
    // a station of one case: its station row is its case row but for the row
    for (const i of [0, 2, 5]) expect({ ...rows[i], row: 'station' }).toEqual(rows[i + 1]);
    for (const x of rows) expect(x.caution).toMatch(/licensed practice/);
  });

  test('results.xlsx: its results sheet holds the CSV, cell by cell, with the caution, names and units above', async () => {
    const csv = parse(readFileSync(join(out, 'results.csv'), 'utf8'));
    const wb = await readXlsx(join(out, 'results.xlsx'));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['results']); // no slice sheets unless asked
    const ws = wb.worksheets[0];
    expect(ws.getCell('A1').value).toMatch(/^Caution: Results are for review by a qualified/);
    const [header, ...records] = csv;
    header.forEach((name, i) => expect(ws.getRow(2).getCell(i + 1).value).toBe(name));
    expect(ws.getRow(3).getCell(header.indexOf('station') + 1).value).toBe('m');
    expect(ws.getRow(3).getCell(header.indexOf('required_force') + 1).value).toBe('kN/m');
    expect(ws.rowCount).toBe(3 + records.length);
    records.forEach((record, r) =>
      record.forEach((text, c) => {
        expect(shown(ws, r + 4, c + 1)).toBe(text);
        const v = ws.getRow(r + 4).getCell(c + 1).value;
        // numbers are stored as numbers, to the CSV's precision (not more)
        if (typeof v === 'number') expect(v).toBe(Number(text));
      }),
    );
  });

  test('results.geojson from a YAML batch: unlocated features (geometry null) keyed by station and case', () => {
    const doc = JSON.parse(readFileSync(join(out, 'results.geojson'), 'utf8'));
    expectFeatureCollection(doc);
    expect(doc.features.map((f: { id: string }) => f.id)).toEqual([
      'wcb-test@1200#long-term',
      'wcb-test@1200',
      'wcb-test@1220#long-term',
      'wcb-test@1220',
      'wcb-test@1240',
      'wcb-test@1260#long-term',
      'wcb-test@1260',
    ]);
    expect(doc.features.every((f: { geometry: unknown }) => f.geometry === null)).toBe(true);
    expect(doc.features[0].properties).toMatchObject({
      station: 1200,
      section_id: 'wcb-test@1200',
      row: 'case',
      case: 'long-term',
      kind: 'long-term',
      governing_method: 'bishop',
      verdict: 'meets',
    });
    expect(doc.features[1].properties).toMatchObject({ row: 'station', verdict: 'meets' });
    expect(doc.features[0].properties.caution).toMatch(/qualified/);
  });

  test('an SVG per analysed section and the FS along the chainage, all well-formed', () => {
    const svgs = readdirSync(join(out, 'sections')).sort();
    expect(svgs).toEqual(['wcb-test@1200.svg', 'wcb-test@1220.svg', 'wcb-test@1260.svg']);
    for (const f of svgs)
      expect(XMLValidator.validate(readFileSync(join(out, 'sections', f), 'utf8'))).toBe(true);
    const chainage = readFileSync(join(out, 'chainage.svg'), 'utf8');
    expect(XMLValidator.validate(chainage)).toBe(true);
    expect(chainage).toContain('class="required"');
    expect(chainage.match(/class="below"/g)).toHaveLength(1);
    expect(chainage).toMatch(/Caution: Results are for review/);
  });

  test('a GeoJSON corridor: the input lines come back with FS properties; errors located in it', () => {
    const dir = tmp();
    const g = run(['batch', join(FIXTURES, 'corridor.geojson'), '--out', dir, '--no-svg']);
    expect(g.code).toBe(1);
    expect(g.err).toMatch(
      /corridor\.geojson:\d+:\d+ features\[2\]\.geometry\.coordinates\[1\]: expected a position \[x, y, z\]/,
    );
    const input = JSON.parse(readFileSync(join(FIXTURES, 'corridor.geojson'), 'utf8'));
    const doc = JSON.parse(readFileSync(join(dir, 'results.geojson'), 'utf8'));
    expectFeatureCollection(doc);
    // the station's features (each station is its one case here, and its case's feature the same line)
    const stations = doc.features.filter(
      (f: { properties: { row: string } }) => f.properties.row === 'station',
    );
    expect(doc.features).toHaveLength(2 * stations.length - 1);
    expect(stations.map((f: { geometry: unknown }) => f.geometry)).toEqual(
      input.features.map((f: { geometry: unknown }) => f.geometry),
    );
    expect(doc.features[0].geometry).toEqual(stations[0].geometry);
    expect(stations[0].properties).toMatchObject({
      station: 1200,
      name: 'XS-1200',
      section_id: 'wcb-gis@1200',
      verdict: 'meets',
    });
    expect(stations[1].properties).toMatchObject({ required_fs: 1.6, verdict: 'below' });
    expect(stations[1].properties.analysis).toBeUndefined(); // settings are not attributes
    expect(stations[2].properties.verdict).toBe('input-error');
    expect(readdirSync(dir)).not.toContain('sections');
  });

  test('--template: the corridor settings from a file, its errors located there', () => {
    const t = run([
      'batch',
      join(FIXTURES, 'corridor.geojson'),
      '--template',
      join(FIXTURES, 'corridor-settings.yaml'),
    ]);
    expect(t.code).toBe(1);
    expect(t.err).toMatch(
      /corridor-settings\.yaml:10:\d+ template\.materials\.till\.strength\.frictionAngle: 95 is above 90°/,
    );
  });

  test('a file that does not exist, or holds no section: a plain message, exit 1', () => {
    const a = run(['batch', 'no/such.json']);
    expect(a).toMatchObject({ code: 1 });
    expect(a.err).toMatch(/^scarpline: no\/such\.json: no such file or directory$/m);
    const b = run(['batch', 'packages/core/test/in/batch.yaml']);
    expect(b.code).toBe(1);
    expect(b.err).toMatch(/no section could be read/);
  });

  test('Ctrl-C stops the workers and closes results.json with what was done', async () => {
    // a longer corridor: the small one repeated at 40 stations
    const text = readFileSync(join(FIXTURES, 'small-corridor.yaml'), 'utf8');
    const head = text.slice(0, text.indexOf('sections:'));
    const items = Array.from(
      { length: 120 },
      (_, i) =>
        `  - station: ${2000 + 20 * i}\n    ground: [[0, 62], [18, 62], [38, 72], [70, 74]]\n`,
    );
    const dir = tmp();
    const file = join(dir, 'long.yaml');
    writeFileSync(file, `${head}sections:\n${items.join('')}`);
    const child = spawn(
      process.execPath,
      [MAIN, 'batch', file, '--out', join(dir, 'out'), '--jobs', '1'],
      { cwd: ROOT },
    );
    let err = '';
    let sent = false;
    const code = await new Promise<number | null>((resolve) => {
      child.stderr.on('data', (d: Buffer) => {
        err += d.toString();
        if (!sent && /\[3\/120\]/.test(err)) sent = child.kill('SIGINT');
      });
      child.on('close', (c) => resolve(c));
    });
    expect(code).toBe(130);
    expect(err).toMatch(/interrupted: stopped after \d+ of 120 sections/);
    const doc = JSON.parse(readFileSync(join(dir, 'out', 'results.json'), 'utf8')) as {
      complete: boolean;
      sections: unknown[];
      written: number;
    };
    expect(doc.complete).toBe(false);
    expect(doc.sections.length).toBeGreaterThanOrEqual(3);
    expect(doc.sections.length).toBeLessThan(120);
    const csv = parse<Record<string, string>>(
      readFileSync(join(dir, 'out', 'results.csv'), 'utf8'),
      {
        columns: true,
      },
    );
    expect(csv.filter((x) => x.row === 'station')).toHaveLength(doc.written);
  }, 20000);
});

test('a corridor whose template asks for the probability of failure on the critical surface: results.csv and results.json carry each station’s P_f, as the core computes it', () => {
  const dir = tmp();
  const text = readFileSync(join(FIXTURES, 'small-corridor.yaml'), 'utf8').replace(
    'sections:\n',
    [
      '  probability:',
      '    seed: 3',
      '    realisations: 300',
      '    variables:',
      '      - { name: c′ till, target: materials.till.cohesion, distribution: lognormal, mean: 6, cov: 0.3 }',
      '      - { name: φ′ till, target: materials.till.frictionAngle, distribution: normal, mean: 29, sd: 2 }',
      'sections:',
      '',
    ].join('\n'),
  );
  const file = join(dir, 'probable.yaml');
  writeFileSync(file, text);
  const r = run(['batch', file, '--out', join(dir, 'out'), '--jobs', '2']);
  expect(r.code).toBe(1); // the station that does not read
  const rows = parse<Record<string, string>>(
    readFileSync(join(dir, 'out', 'results.csv'), 'utf8'),
    {
      columns: true,
    },
  );
  const sections = parseSections(text, 'probable.yaml').sections;
  const analysed = rows.filter((x) => x.verdict !== 'input-error');
  expect(analysed.length).toBe(6);
  for (const row of analysed) {
    const s = sections.find((x) => x.id === row.section_id)!;
    const p = stationProbability(s)!.summary[0];
    expect(p.realisations).toBe(300);
    expect(Number(row.pf)).toBeCloseTo(p.pFailure.p, 6);
    expect(Number(row.pf_se)).toBeCloseTo(p.pFailure.standardError, 6);
    expect(Number(row.beta_normal)).toBeCloseTo(p.betaNormal!, 3);
    expect(Number(row.beta_lognormal)).toBeCloseTo(p.betaLognormal!, 3);
  }
  expect(rows.find((x) => x.verdict === 'input-error')!.pf).toBe('');
  const doc = JSON.parse(readFileSync(join(dir, 'out', 'results.json'), 'utf8')) as {
    sections: { probability: unknown[] }[];
  };
  for (const s of doc.sections) {
    expect(validate(s)).toBe(true);
    expect(s.probability).toHaveLength(1);
  }
});
