/**
 * The workbook described as data (export/export-workbook.ts): the results sheet is the CSV's
 * records with the same precision, every sheet opens with the caution, and sheet names obey
 * the spreadsheet format's rules (ECMA-376 Part 1, §18.2.19 sheet name: at most 31 characters,
 * none of : \ / ? * [ ], unique without regard to case — value from memory of the standard).
 */
import { parse } from 'csv-parse/sync';
import {
  CAUTION,
  DATA_ROW,
  EXPORT_COLUMNS,
  exportCsvRow,
  resultsSheet,
  resultsWorkbook,
  SHEET_NAME_LIMIT,
  sliceSheet,
  uniqueSheetName,
  unanalysedRecord,
  type ExportRecord,
} from '@scarpline/core';

const record: ExportRecord = {
  ...unanalysedRecord({ id: 'wcb@1240', station: 1240, units: 'si', verdict: null, note: null }),
  row: 'case',
  case: 'long term',
  kind: 'long-term',
  governing_method: 'bishop',
  fs: 1.23456,
  required_fs: 1.3,
  ratio: 1.23456 / 1.3,
  verdict: 'below',
  required_force: 12.3,
  warnings: 0,
};

describe('resultsSheet', () => {
  test('the caution, the names, the units, then the records rounded as the CSV writes them', () => {
    const s = resultsSheet([{ record, extra: ['approved'] }], {
      units: 'us',
      extra: ['review_state'],
    });
    expect(s.rows[0]).toEqual([`Caution: ${CAUTION}`]);
    expect(s.rows[1]).toEqual([...EXPORT_COLUMNS, 'review_state']);
    const unit = (c: string) => s.rows[2][s.rows[1].indexOf(c)];
    expect([unit('station'), unit('required_force'), unit('fs')]).toEqual(['ft', 'lbf/ft', '–']);
    const row = s.rows[DATA_ROW - 1];
    const [csv] = parse(exportCsvRow(record, ['approved']));
    // as a spreadsheet shows each cell: the number in its column's format (0.000: three decimals)
    const text = row.map((v, i) =>
      v === null ? '' : s.columns[i].format === '0.000' ? (v as number).toFixed(3) : String(v),
    );
    expect(text).toEqual(csv);
    expect(row[EXPORT_COLUMNS.indexOf('fs')]).toBe(1.235);
    expect(s.columns[EXPORT_COLUMNS.indexOf('fs')].format).toBe('0.000');
    expect(s.frozen).toBe(DATA_ROW - 1);
  });

  test('units of a corridor whose sections differ: each section’s own', () => {
    const s = resultsSheet([{ record }], { units: null });
    expect(s.rows[2][0]).toBe("section's length unit");
  });
});

describe('sliceSheet', () => {
  test('a case without a governing method has no rows; the sheet still has the caution', () => {
    const s = sliceSheet(
      { id: 'wcb@1240', units: 'si', cases: [{ name: 'x', governing: null, results: [] }] },
      new Set(),
    );
    expect(s.rows).toHaveLength(DATA_ROW - 1);
    expect(s.rows[0][0]).toMatch(/^Caution: /);
    expect(
      resultsWorkbook(resultsSheet([], { units: 'si' }), [s]).sheets.map((x) => x.name),
    ).toEqual(['results', 'wcb@1240']);
  });
});

describe('uniqueSheetName', () => {
  test('forbidden characters replaced, cut to the limit, unique without regard to case', () => {
    const taken = new Set<string>();
    expect(uniqueSheetName('a/b:c*d?e[f]g\\h', taken)).toBe('a_b_c_d_e_f_g_h');
    const long = 'wendlecombe-bypass-northbound@1240.5';
    const first = uniqueSheetName(long, taken);
    const second = uniqueSheetName(long.toUpperCase(), taken);
    expect(first).toBe(long.slice(0, SHEET_NAME_LIMIT));
    expect(second).toHaveLength(SHEET_NAME_LIMIT);
    expect(second.endsWith('~2')).toBe(true);
    expect(uniqueSheetName('Results', taken)).toBe('Results~2');
  });
});
