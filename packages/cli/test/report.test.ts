import { copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CAUTION } from '@scarpline/core';
import { flat, pageTexts, requirePoppler } from '../../report/test/poppler';
import { FIXTURES, ROOT, run } from './run';

const tmp = () => mkdtempSync(join(tmpdir(), 'scarpline-report-'));
const isPdf = (path: string) => readFileSync(path).subarray(0, 5).toString() === '%PDF-';

beforeAll(() => requirePoppler());

describe('scarpline report', () => {
  test('a section file: its section report, beside the input by default, with --project and --by', () => {
    const dir = tmp();
    const file = join(dir, 'levee.yaml');
    copyFileSync(join(ROOT, 'examples', 'levee-land-side.yaml'), file);
    const r = run(['report', file, '--project', 'Wendle flood bank', '--by', 'J. Marsh']);
    const pdf = join(dir, 'wfb-0410-section-report.pdf');
    expect(r.err).toBe('');
    expect(r.out).toContain(`wrote ${pdf}`);
    expect(r.code).toBe(2); // below its required FS, as `analyze` says
    expect(isPdf(pdf)).toBe(true);
    const pages = pageTexts(pdf);
    expect(flat(pages[0])).toContain('project Wendle flood bank');
    expect(flat(pages[0])).toContain('submitted by J. Marsh');
    expect(flat(pages[0])).toContain('Section report: wfb-0410');
    expect(flat(pages[0].replace(/page \d+ of \d+/, ''))).toContain(`Caution: ${CAUTION}`);
  });

  test('a batch file: the corridor report, analysed as batch does, with the appendix asked for', () => {
    const dir = tmp();
    const pdf = join(dir, 'corridor.pdf');
    const r = run([
      'report',
      join(FIXTURES, 'small-corridor.yaml'),
      '-o',
      pdf,
      '--appendix',
      'all',
      '--jobs',
      '1',
    ]);
    // one station does not read: located, and the report still made of the others
    expect(r.err).toMatch(/small-corridor\.yaml:28:\d+ sections\[2\]\.ground\[2\]/);
    expect(r.code).toBe(1);
    expect(r.out).toContain(`wrote ${pdf}`);
    const text = pageTexts(pdf).join('\n');
    const summary = flat(text.slice(text.indexOf('Summary'), text.indexOf('FS along')));
    expect(summary).toContain('stations 4');
    expect(summary).toContain('analyzed 3');
    expect(summary).toContain('not analyzed (failed) 1');
    expect(summary).toContain('below requirement 1');
    expect(flat(text)).toContain('1240 wcb-test@1240 did not read: sections[2].ground[2]');
    expect([...text.matchAll(/Appendix \d+ of 3: .*?(wcb-test@\d+)/g)].map((m) => m[1])).toEqual([
      'wcb-test@1200',
      'wcb-test@1220',
      'wcb-test@1260',
    ]);
  });

  test('batch --report: the corridor report in the output folder beside results.csv', () => {
    const out = tmp();
    const r = run([
      'batch',
      join(FIXTURES, 'small-corridor.yaml'),
      '--out',
      out,
      '--report',
      '--no-svg',
      '--jobs',
      '1',
    ]);
    const pdf = join(out, 'wcb-test-corridor-report.pdf');
    expect(r.out).toContain(`wrote ${pdf}`);
    expect(existsSync(join(out, 'results.csv'))).toBe(true);
    expect(isPdf(pdf)).toBe(true);
    // the default appendix: the stations below requirement
    const text = pageTexts(pdf).join('\n');
    expect([...text.matchAll(/Appendix \d+ of 1: .*?(wcb-test@\d+)/g)].map((m) => m[1])).toEqual([
      'wcb-test@1260',
    ]);
  });

  test('batch --report without --out: a clear error', () => {
    const r = run(['batch', join(FIXTURES, 'small-corridor.yaml'), '--report']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--report .* give --out <dir>/);
  });

  test('a bad section file: the located error and no PDF', () => {
    const dir = tmp();
    const file = join(dir, 'bad.yaml');
    const text = readFileSync(join(ROOT, 'examples', 'levee-land-side.yaml'), 'utf8');
    writeFileSync(file, text.replace(/frictionAngle: 27/, 'frictionAngle: 127'));
    expect(readFileSync(file, 'utf8')).not.toBe(text);
    const r = run(['report', file, '-o', join(dir, 'bad.pdf')]);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/bad\.yaml:\d+:\d+ .*frictionAngle: 127 is above 90°/);
    expect(r.err).toContain('no report written');
    expect(existsSync(join(dir, 'bad.pdf'))).toBe(false);
  });

  test('--out must name a .pdf', () => {
    const r = run(['report', join(ROOT, 'examples', 'levee-land-side.yaml'), '-o', 'x.txt']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/--out: x\.txt is not a \.pdf file name/);
  });
});
