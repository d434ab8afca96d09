import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { SliceReport, StationResult } from '@scarpline/core';
import { ROOT, run } from './run';
import { readXlsx, rowValues } from './xlsx-cells';

const r = (v: number | null | undefined, digits: number) =>
  typeof v === 'number' ? Number(v.toFixed(digits)) : null;

/** What each column of a slice sheet holds of a slice, read straight from results.json. */
const EXPECTED: Record<string, (s: SliceReport) => unknown> = {
  x: (s) => r(s.x, 2),
  b: (s) => r(s.width, 3),
  α: (s) => r(s.alpha, 1),
  l: (s) => r(s.baseLength, 3),
  W: (s) => r(s.weight, 1),
  u: (s) => r(s.porePressure, 1),
  'N′': (s) => r(s.normal, 1),
  S: (s) => r(s.shear, 1),
  E: (s) => r(s.interslice.E, 1),
  X: (s) => r(s.interslice.X, 1),
  'thrust y': (s) => r(s.interslice.thrust, 2),
  material: (s) => s.material,
  'c′/Su': (s) => r(s.cohesion, 1),
  'φ′': (s) => r(s.frictionAngle, 1),
  T: (s) => (s.reinforcement ? r(s.reinforcement, 1) : null),
  'taken at': (s) => (s.strengthAt ? (s.strengthAt.kind === 'normal' ? 'σ′n' : 'σ′v') : null),
  stress: (s) => r(s.strengthAt?.stress, 1),
};

describe('scarpline batch --slice-sheets', () => {
  // soil nails (a reinforcement force per slice) and Hoek–Brown rock (strength taken at σ′n)
  for (const [file, extra] of [
    ['cut-soil-nailed.yaml', 'T'],
    ['cut-rock-hoek-brown.yaml', 'stress'],
  ] as const) {
    test(`${file}: a sheet per section, each case's governing slices as results.json has them`, async () => {
      const out = mkdtempSync(join(tmpdir(), 'scarpline-xlsx-'));
      const res = run([
        'batch',
        join(ROOT, 'examples', file),
        '--out',
        out,
        '--slice-sheets',
        '--no-svg',
        '--jobs',
        '1',
      ]);
      expect(res.err).not.toMatch(/error/i);
      expect(res.out).toMatch(/results\.xlsx \(with slice sheets\)/);
      const json = JSON.parse(readFileSync(join(out, 'results.json'), 'utf8')) as {
        sections: StationResult[];
      };
      const wb = await readXlsx(join(out, 'results.xlsx'));
      const section = json.sections[0];
      expect(wb.worksheets.map((w) => w.name)).toEqual(['results', section.id]);
      const ws = wb.worksheets[1];
      expect(ws.getCell('A1').value).toMatch(/^Caution: .*licensed practice govern/);
      const width = ws.getRow(2).cellCount;
      const names = rowValues(ws, 2, width) as string[];
      const units = rowValues(ws, 3, width);
      expect(names.slice(0, 3)).toEqual(['case', 'method', '#']);
      expect(names).toContain(extra);
      expect(units[names.indexOf('x')]).toBe('m');
      expect(units[names.indexOf('W')]).toBe('kN/m');
      expect(units[names.indexOf('c′/Su')]).toBe('kPa');
      const expected = section.cases.flatMap((c) => {
        const m = c.results.find((k) => k.method === c.governing?.method);
        return (m?.slices ?? []).map((s, i) => [
          c.name,
          m!.method,
          i + 1,
          ...names.slice(3).map((n) => EXPECTED[n](s)),
        ]);
      });
      expect(expected.length).toBeGreaterThan(10);
      expect(ws.rowCount).toBe(3 + expected.length);
      expected.forEach((row, i) => expect(rowValues(ws, 4 + i, width)).toEqual(row));
      // the column asked about holds values (a force on the nailed slices, a stress on the rock)
      expect(expected.some((row) => typeof row[names.indexOf(extra)] === 'number')).toBe(true);
    }, 30_000); // a child process that solves: seconds on a busy machine
  }

  test('--slice-sheets without --out: a plain message, exit 1', () => {
    const res = run(['batch', join(ROOT, 'examples', 'cut-homogeneous.yaml'), '--slice-sheets']);
    expect(res.code).toBe(1);
    expect(res.err).toMatch(/--slice-sheets is for results\.xlsx: give --out <dir>/);
  });
});
