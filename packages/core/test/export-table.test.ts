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
  caseView,
  CAUTION,
  EXPORT_COLUMNS,
  exportCollection,
  exportCsvHeader,
  exportCsvRow,
  exportFeature,
  exportRecord,
  FS_DECIMALS,
  fsText,
  JOB_STATE_WORDS,
  JOB_STATES,
  parseSections,
  unanalysedRecord,
  VERDICT_SHORT,
  VERDICT_WORDS,
  verdictOf,
  VERDICTS,
  type SectionResult,
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

/** The sections of the demo corridor's first stations, analysed. */
function corridorResults(n: number): SectionResult[] {
  const text = readFileSync(join(__dirname, '../../../examples/corridor/corridor.json'), 'utf8');
  const corridor = JSON.parse(text) as { sections: unknown[] };
  const small = JSON.stringify({ ...corridor, sections: corridor.sections.slice(0, n) });
  return parseSections(small, 'corridor.json').sections.map((s) => caseView(analyzeSection(s)));
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

  test('a row of an analysed section: its id, chainage, FS, verdict; valid against the schema', () => {
    for (const r of results) {
      const row = exportRecord(r);
      expect(row).toEqual({
        station: r.station,
        chainage: expect.stringMatching(/^1\+0[024]0$/),
        section_id: r.id,
        case: r.case,
        governing_method: r.governing!.method,
        fs: r.governing!.fs,
        required_fs: r.requiredFs,
        verdict: r.verdict,
        warnings: expect.any(Number),
        note: null,
        caution: CAUTION,
      });
      expect(validateRow(row)).toBe(true);
      expect(Object.keys(row)).toEqual([...EXPORT_COLUMNS]);
    }
  });

  test('CSV: FS with three decimals, empty cells for null, quoted cells, CRLF', () => {
    const r = results[0];
    const row = exportRecord(r);
    const line = exportCsvRow(row, ['pending', 'done']);
    expect(line.endsWith('\r\n')).toBe(true);
    const cells = line.slice(0, -2).split(',');
    expect(cells[EXPORT_COLUMNS.indexOf('fs')]).toBe(r.governing!.fs.toFixed(3));
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
      `,,wcb@sections[2],,,,,input-error,,"ground[2]: x = 15 does not increase, ""from"" the point before",${CAUTION}\r\n`,
    );
  });

  test('GeoJSON: the input’s flat attributes, then the columns (FS rounded), then the writer’s', () => {
    const r = results[1];
    const f = exportFeature(exportRecord(r), {
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

  test('a section without a factor of safety says why in the note', () => {
    const r = { ...results[0], governing: null, verdict: 'no-fs' as const };
    const row = exportRecord({
      ...r,
      results: [
        { method: 'bishop', reason: 'no convergence', warnings: [] },
        { method: 'spencer', warnings: [] },
      ],
    });
    expect(row).toMatchObject({ fs: null, governing_method: null, verdict: 'no-fs' });
    expect(row.note).toBe('bishop: no convergence; spencer: no solution');
    expect(validateRow(row)).toBe(true);
  });
});
