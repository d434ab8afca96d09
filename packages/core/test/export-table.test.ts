/**
 * The one vocabulary of results (verdict.ts) and the results table every export writes
 * (export/export-table.ts), against their contract in schemas/.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { exportTableSchema, resultSchema } from '@scarpline/schemas';
import {
  analyzeSection,
  CAUTION,
  designCases,
  EXPORT_COLUMNS,
  exportCollection,
  exportCsvHeader,
  exportCsvRow,
  exportFeature,
  FS_DECIMALS,
  fsText,
  JOB_STATE_WORDS,
  JOB_STATES,
  parseSections,
  stationProbability,
  stationRecord,
  stationRecords,
  unanalysedRecord,
  VERDICT_SHORT,
  VERDICT_WORDS,
  verdictOf,
  VERDICTS,
  type Section,
  type StationResult,
} from '@scarpline/core';

const ajv = new Ajv2020({ strict: false, allErrors: true });
ajv.addSchema(resultSchema);
const validateRow = ajv.compile(exportTableSchema);
const schema = exportTableSchema as unknown as {
  $defs: {
    columns: { const: string[] };
    serviceColumns: { const: string[] };
    serviceRow: { properties: { job_state: { enum: string[] } } };
  };
};
const verdictEnum = (resultSchema as unknown as { $defs: { verdict: { enum: string[] } } }).$defs
  .verdict.enum;

/** The sections of the demo corridor's first stations. */
function corridorSections(n: number): Section[] {
  const text = readFileSync(join(__dirname, '../../../examples/corridor/corridor.json'), 'utf8');
  const corridor = JSON.parse(text) as { sections: unknown[] };
  const small = JSON.stringify({ ...corridor, sections: corridor.sections.slice(0, n) });
  return parseSections(small, 'corridor.json').sections;
}

/** The demo corridor's first stations analysed in one case: each station's own settings (its cases left out). */
function corridorResults(n: number): StationResult[] {
  return corridorSections(n).map((s) => analyzeSection({ ...s, cases: [] }));
}

/**
 * A station of the corridor in two design cases, made on the normalised section: the section's
 * own settings as a long-term case (required 1.5), and the same with a pseudo-static kh of 0.15
 * as a seismic case (required 1.1), so that each case has its own FS.
 */
function twoCaseStation(): StationResult {
  const s = corridorSections(1)[0];
  const [own] = designCases(s);
  return analyzeSection({
    ...s,
    cases: [
      { ...own, name: 'long term', kind: 'long-term', requiredFs: 1.5 },
      {
        ...own,
        name: 'earthquake',
        kind: 'seismic',
        requiredFs: 1.1,
        seismic: { kh: 0.15, kv: 0 },
      },
    ],
  });
}

describe('the vocabulary', () => {
  test('verdict codes as in the result schema, job states as in the service’s columns', () => {
    expect([...VERDICTS]).toEqual(verdictEnum);
    expect([...JOB_STATES]).toEqual(schema.$defs.serviceRow.properties.job_state.enum);
  });

  test('every verdict and job state has words, and no word or code is used twice', () => {
    const verdictWords = VERDICTS.map((v) => VERDICT_WORDS[v]);
    const shortWords = VERDICTS.map((v) => VERDICT_SHORT[v]);
    const jobWords = JOB_STATES.map((s) => JOB_STATE_WORDS[s]);
    for (const list of [verdictWords, shortWords, jobWords]) {
      expect(list.every((w) => w.length > 0)).toBe(true);
      expect(new Set(list).size).toBe(list.length);
    }
    const verdictSide = new Set([...VERDICTS, ...verdictWords, ...shortWords]);
    for (const s of [...JOB_STATES, ...jobWords]) expect(verdictSide.has(s)).toBe(false);
  });

  test('verdictOf: the governing FS against the required FS, equal meets', () => {
    expect(verdictOf(1.5, 1.5)).toBe('meets');
    expect(verdictOf(1.4999, 1.5)).toBe('below');
    expect(verdictOf(2.1, null)).toBe('no-requirement');
    expect(verdictOf(null, 1.5)).toBe('no-fs');
    expect(verdictOf(null, null)).toBe('no-fs');
  });

  test('a factor of safety is written with three decimals', () => {
    expect(FS_DECIMALS).toBe(3);
    expect(fsText(1.274871643)).toBe('1.275');
    expect(fsText(2)).toBe('2.000');
  });
});

describe('the results table', () => {
  const results = corridorResults(3);

  test('the columns are the schema’s, in its order', () => {
    expect([...EXPORT_COLUMNS]).toEqual(schema.$defs.columns.const);
    expect(exportCsvHeader()).toBe(`${EXPORT_COLUMNS.join(',')}\r\n`);
    expect(exportCsvHeader(schema.$defs.serviceColumns.const)).toBe(
      `${[...EXPORT_COLUMNS, 'review_state', 'job_state'].join(',')}\r\n`,
    );
  });

  test('a station of one case: its case row, then its station row, the same but for row; valid against the schema', () => {
    for (const r of results) {
      const rows = stationRecords(r);
      expect(rows).toHaveLength(2);
      const [c] = r.cases;
      expect(rows[0]).toEqual({
        station: r.station,
        chainage: expect.stringMatching(/^1\+0[024]0$/),
        section_id: r.id,
        row: 'case',
        case: c.name,
        kind: c.kind,
        governing_method: c.governing!.method,
        fs: c.governing!.fs,
        required_fs: c.requiredFs,
        ratio: c.ratio,
        verdict: c.verdict,
        required_force: null,
        required_layers: null,
        pf: null,
        pf_se: null,
        beta_normal: null,
        beta_lognormal: null,
        warnings: expect.any(Number),
        note: null,
        caution: CAUTION,
      });
      // a station's own settings without a case name: the one case 'as given', of kind other
      expect(rows[0]).toMatchObject({ case: 'as given', kind: 'other', required_fs: 1.5 });
      // FS / required FS, or none where the slope is not significant (FS above the cap)
      if (c.verdict === 'no-slope') expect(rows[0].ratio).toBeNull();
      else expect(rows[0].ratio).toBeCloseTo(c.governing!.fs / 1.5, 12);
      expect(rows[1]).toEqual({ ...rows[0], row: 'station', verdict: r.verdict });
      for (const row of rows) {
        expect(validateRow(row)).toBe(true);
        expect(Object.keys(row)).toEqual([...EXPORT_COLUMNS]);
      }
    }
  });

  test('a station of several cases: a row per case in their order, then the station’s with its governing case and verdict', () => {
    const r = twoCaseStation();
    const rows = stationRecords(r);
    expect(rows.map((x) => [x.row, x.case, x.kind])).toEqual([
      ['case', 'long term', 'long-term'],
      ['case', 'earthquake', 'seismic'],
      ['station', r.governing!.case, r.cases.find((c) => c.name === r.governing!.case)!.kind],
    ]);
    const [long, quake, station] = rows;
    // kh lowers the FS: each case its own FS and requirement
    expect(quake.fs!).toBeLessThan(long.fs!);
    expect([long.required_fs, quake.required_fs]).toEqual([1.5, 1.1]);
    expect(long.ratio).toBeCloseTo(long.fs! / 1.5, 12);
    expect(quake.ratio).toBeCloseTo(quake.fs! / 1.1, 12);
    // the governing case: the least FS / required FS; the station's verdict: the worst case's
    const least = long.ratio! <= quake.ratio! ? long : quake;
    expect(station).toMatchObject({
      case: least.case,
      governing_method: least.governing_method,
      fs: least.fs,
      required_fs: least.required_fs,
      ratio: least.ratio,
    });
    const worst = [long.verdict, quake.verdict].includes('below') ? 'below' : 'meets';
    expect(station.verdict).toBe(worst);
    for (const row of rows) expect(validateRow(row)).toBe(true);
    // GeoJSON: a case's feature is keyed by the section and the case, the station's by the section
    expect(rows.map((x) => exportFeature(x).id)).toEqual([
      `${r.id}#long term`,
      `${r.id}#earthquake`,
      r.id,
    ]);
  });

  test('a section that asks for its probability of failure on the critical surface: each case row its P_f, its standard error and β, the station row its governing case’s; none without', () => {
    const file = 'levee-probability.yaml';
    const text = readFileSync(join(__dirname, '../../../examples', file), 'utf8');
    const read = parseSections(text, file).sections[0];
    const section = { ...read, probability: { ...read.probability!, realisations: 500 } };
    const p = stationProbability(section)!;
    const analysed = analyzeSection(section);
    const result = { ...analysed, probability: p.summary };
    // the deterministic result's critical surface, reused, gives the numbers of a run that searches at the means
    expect(stationProbability(section, {}, analysed)).toEqual(p);
    const [caseRow, stationRow] = stationRecords(result);
    const c = p.result.cases[0];
    expect(c.realisations).toBe(500);
    expect(caseRow).toMatchObject({
      pf: Number(c.pFailure.p.toFixed(6)),
      pf_se: Number(c.pFailure.standardError.toFixed(6)),
      beta_normal: Number(c.betaNormal.beta!.toFixed(3)),
      beta_lognormal: Number(c.betaLognormal.beta!.toFixed(3)),
    });
    // the standard error of a counted probability, √(P(1 − P)/N)
    expect(c.pFailure.standardError).toBeCloseTo(
      Math.sqrt((c.pFailure.p * (1 - c.pFailure.p)) / c.valid),
      12,
    );
    expect(stationRow.pf).toBe(caseRow.pf);
    for (const row of [caseRow, stationRow]) expect(validateRow(row)).toBe(true);
    // the same with the corridor's design cases (its long-term and seismic cases)
    const probability = section.probability;
    const corridor = { ...corridorSections(1)[0] };
    corridor.probability = {
      ...probability,
      realisations: 200,
      variables: [
        {
          name: 'φ′',
          target: 'materials.weathered-mudstone.frictionAngle',
          distribution: { kind: 'normal', mean: 26, sd: 2 },
        },
      ],
      correlations: [],
    };
    const cased = analyzeSection(corridor);
    expect(cased.cases.length).toBe(2);
    const both = stationProbability(corridor, {}, cased)!;
    expect(both.summary.map((x) => x.case)).toEqual(cased.cases.map((x) => x.name));
    expect(both).toEqual(stationProbability(corridor));
    // searching again in each realisation is left to a study of its own: no columns in a corridor
    expect(
      stationProbability({
        ...section,
        probability: { ...section.probability, surface: 'search' },
      }),
    ).toBeNull();
    expect(stationRecords(analyzeSection(section))[0].pf).toBeNull();
  });

  test('a case below its requirement that asks for the required reinforcement: its force (or layers), or why none', () => {
    const file = 'embankment-basal-reinforcement.yaml';
    const text = readFileSync(join(__dirname, '../../../examples', file), 'utf8');
    const section = parseSections(text, file).sections[0];
    const r = analyzeSection(section);
    const req = r.cases[0].requiredReinforcement!;
    const [caseRow, stationRow] = stationRecords(r);
    expect(caseRow).toMatchObject({
      required_force: Math.round(req.value! * 10) / 10,
      required_layers: null,
      note: null,
    });
    expect(stationRow.required_force).toBe(caseRow.required_force);
    for (const row of [caseRow, stationRow]) expect(validateRow(row)).toBe(true);
    // a level in the rigid base, which no slip surface reaches: no force in range, and the note says why
    const high = analyzeSection({
      ...section,
      analysis: {
        ...section.analysis,
        requiredReinforcement: {
          kind: 'force',
          line: [
            [0, 0.5],
            [70, 0.5],
          ],
          dividedByF: true,
        },
      },
    });
    const [row] = stationRecords(high);
    expect(row.required_force).toBeNull();
    expect(row.note).toMatch(/^required reinforcement not reached: /);
  });

  test('CSV: FS and ratio with three decimals, empty cells for null, quoted cells, CRLF', () => {
    const r = results[0];
    const row = stationRecord(r);
    const line = exportCsvRow(row, ['pending', 'done']);
    expect(line.endsWith('\r\n')).toBe(true);
    const cells = line.slice(0, -2).split(',');
    expect(cells[EXPORT_COLUMNS.indexOf('fs')]).toBe(r.governing!.fs.toFixed(3));
    expect(cells[EXPORT_COLUMNS.indexOf('ratio')]).toBe(r.governing!.ratio!.toFixed(3));
    expect(cells[EXPORT_COLUMNS.indexOf('row')]).toBe('station');
    expect(cells[EXPORT_COLUMNS.indexOf('note')]).toBe('');
    expect(cells.slice(-2)).toEqual(['pending', 'done']);
    const bad = unanalysedRecord({
      id: 'wcb@sections[2]',
      station: null,
      units: 'si',
      verdict: 'input-error',
      note: 'ground[2]: x = 15 does not increase, "from" the point before',
    });
    expect(validateRow(bad)).toBe(true);
    expect(exportCsvRow(bad)).toBe(
      `,,wcb@sections[2],station,,,,,,,input-error,,,,,,,,"ground[2]: x = 15 does not increase, ""from"" the point before",${CAUTION}\r\n`,
    );
  });

  test('GeoJSON: the input’s flat attributes, then the columns (FS rounded), then the writer’s', () => {
    const r = results[1];
    const f = exportFeature(stationRecord(r), {
      geometry: {
        type: 'LineString',
        coordinates: [
          [0, 0, 1],
          [1, 1, 2],
        ],
      },
      input: { name: 'XS-1020', station: 'overwritten', materials: { clay: {} } },
      extra: { review_state: 'pending' },
    });
    expect(f.id).toBe(r.id);
    expect(Object.keys(f.properties)).toEqual(['name', ...EXPORT_COLUMNS, 'review_state']);
    expect(f.properties).toMatchObject({
      name: 'XS-1020',
      station: 1020,
      chainage: '1+020',
      fs: Number(r.governing!.fs.toFixed(3)),
      verdict: r.verdict,
    });
    expect(f.properties.materials).toBeUndefined();
    const fc = exportCollection('wcb-main', [f]);
    expect(fc).toEqual({
      type: 'FeatureCollection',
      name: 'wcb-main',
      caution: CAUTION,
      features: [f],
    });
  });

  test('a case without a factor of safety says why in the note; the station’s row too, by case when it has several', () => {
    const noFs = (name: string) => ({
      name,
      kind: 'other' as const,
      requiredFs: 1.3,
      governing: null,
      ratio: null,
      verdict: 'no-fs' as const,
      warnings: [],
      results: [
        { method: 'bishop' as const, reason: 'no convergence', warnings: [] },
        { method: 'spencer' as const, warnings: [] },
      ],
    });
    const one = {
      ...results[0],
      cases: [noFs('as given')],
      governing: null,
      verdict: 'no-fs' as const,
    };
    const [c, st] = stationRecords(one);
    for (const row of [c, st]) {
      expect(row).toMatchObject({
        fs: null,
        governing_method: null,
        ratio: null,
        verdict: 'no-fs',
      });
      expect(row.note).toBe('bishop: no convergence; spencer: no solution');
      expect(validateRow(row)).toBe(true);
    }
    // two cases, one with a factor of safety: the station has none to give for the other
    const [fine] = results[0].cases;
    const two = { ...one, cases: [fine, noFs('end of construction')] };
    const station = stationRecord({ ...two, governing: { case: fine.name } });
    expect(station).toMatchObject({ case: fine.name, fs: fine.governing!.fs, verdict: 'no-fs' });
    expect(station.note).toBe('end of construction: bishop: no convergence; spencer: no solution');
    // no case governs: the row speaks for the first case
    expect(stationRecord({ ...two, governing: null }).case).toBe(fine.name);
  });
});
