import { copyFileSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { CAUTION, countedText, type StationProbability } from '@scarpline/core';
import { flat, pageTexts, requirePoppler } from '../../report/test/poppler';
import { FIXTURES, ROOT, run } from './run';

const tmp = () => mkdtempSync(join(tmpdir(), 'scarpline-report-'));
const isPdf = (path: string) => readFileSync(path).subarray(0, 5).toString() === '%PDF-';

beforeAll(() => requirePoppler());

/** The small corridor with random variables in its template (weak enough for some FS below 1). */
function probabilisticCorridor(dir: string): string {
  const file = join(dir, 'pf-corridor.yaml');
  const text = readFileSync(join(FIXTURES, 'small-corridor.yaml'), 'utf8').replace(
    'sections:\n',
    [
      '  probability:',
      '    method: latin-hypercube',
      '    seed: 11',
      '    realisations: 500',
      '    surface: critical',
      '    variables:',
      '      - { name: c′ till, target: materials.till.cohesion, distribution: lognormal, mean: 6, cov: 0.5 }',
      '      - { name: φ′ till, target: materials.till.frictionAngle, distribution: normal, mean: 29, sd: 4 }',
      'sections:',
      '',
    ].join('\n'),
  );
  writeFileSync(file, text);
  return file;
}

/** A summary's numbers as the corridor report's row writes them, without spaces. */
const pfRow = (p: StationProbability) =>
  `${countedText(p.pFailure)}${p.betaNormal!.toFixed(2)}${p.betaLognormal!.toFixed(2)}${p.valid}/${p.realisations}`.replace(
    /\s+/g,
    '',
  );

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

  test('a section with random variables: its P(FS < 1) ± SE and β, as scarpline probability gives them', () => {
    const dir = tmp();
    const pdf = join(dir, 'levee.pdf');
    const file = join(ROOT, 'examples', 'levee-probability.yaml');
    const r = run(['report', file, '-o', pdf]);
    expect(r.out).toContain(`wrote ${pdf}`);
    const p = run(['probability', file, '--json']);
    expect(p.code).toBe(0);
    const c = (
      JSON.parse(p.out) as {
        sections: {
          cases: {
            pFailure: { p: number; standardError: number };
            betaNormal: { beta: number };
            betaLognormal: { beta: number };
            valid: number;
            realisations: number;
          }[];
        }[];
      }
    ).sections[0].cases[0];
    expect(c.pFailure.p).toBeGreaterThan(0);
    const text = flat(pageTexts(pdf).join('\n'));
    expect(text).toContain(`P(FS < 1) ${countedText(c.pFailure)} (1 SE)`);
    expect(text).toContain(`β, FS normal ${c.betaNormal.beta.toFixed(2)}`);
    expect(text).toContain(`β, FS lognormal ${c.betaLognormal.beta.toFixed(2)}`);
    expect(text).toContain(`realisations with an FS ${c.valid} of ${c.realisations}`);
    expect(text).toContain(
      'Random variables 5 random variables, Latin hypercube sampling, seed 520',
    );
  }, 60_000);

  test("a corridor with random variables: each station's P(FS < 1) ± SE and β, as batch's results.json holds them", () => {
    const dir = tmp();
    const file = probabilisticCorridor(dir);
    const pdf = join(dir, 'pf.pdf');
    const r = run(['report', file, '-o', pdf, '--appendix', 'none', '--jobs', '1']);
    expect(r.out).toContain(`wrote ${pdf}`);
    const b = run(['batch', file, '--out', join(dir, 'out'), '--no-svg', '--jobs', '1']);
    expect(b.out).toContain('wrote');
    const json = JSON.parse(readFileSync(join(dir, 'out', 'results.json'), 'utf8')) as {
      sections: { id: string; station: number; probability: StationProbability[] }[];
    };
    expect(json.sections).toHaveLength(3);
    expect(json.sections.some((s) => s.probability[0].pFailure.p > 0)).toBe(true);
    const text = flat(pageTexts(pdf).join('\n'));
    expect(text).toContain('3 of the 4 stations carry a probability of failure');
    const squeezed = text.replace(/\s+/g, '');
    for (const s of json.sections) expect(squeezed).toContain(`${s.station}${s.id}long-term`);
    for (const s of json.sections) expect(squeezed).toContain(pfRow(s.probability[0]));
  }, 60_000);

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
