import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  CAUTION,
  fsText,
  parseSections,
  countedText,
  stationProbability,
  variableDistributionWords,
} from '@scarpline/core';
import { sectionReportPdf, type ReportMeta } from '../src';
import { flat, fonts, images, pageTexts, pdfFile, requirePoppler } from './poppler';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');

function example(file: string) {
  const section = parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file).sections[0];
  return { section, result: analyzeSection(section) };
}

beforeAll(() => requirePoppler());

describe('sectionReportPdf', () => {
  // a layered section under a piezometric line, reviewed; three design cases, not reviewed
  const cases = [
    {
      file: 'levee-land-side.yaml',
      review: {
        state: 'approved',
        reviewer: 'R. Okafor',
        date: '2026-11-30T09:00:00Z',
        decision: 'accepted with the berm of drawing 14',
        comment: 'seepage case checked against the piezometer readings',
      },
    },
    { file: 'levee-drawdown-seismic.yaml', review: null },
  ] as const;

  for (const { file, review } of cases) {
    describe(file, () => {
      const { section, result } = example(file);
      const meta: ReportMeta = {
        project: 'Wendlecombe flood defences',
        corridor: 'Wendle flood bank',
        source: file,
        run: 7,
        date: '2026-12-03T10:00:00Z',
        solverVersion: result.solverVersion,
        submittedBy: 'J. Marsh',
        review,
      };
      let path = '';
      let pages: string[] = [];
      let text = '';
      beforeAll(async () => {
        const pdf = await sectionReportPdf({ section, result, meta });
        expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
        path = pdfFile(pdf);
        pages = pageTexts(path);
        text = pages.join('\n');
      });

      test("each case's and method's FS, as the result has it, in the case's table", () => {
        expect(result.cases.length).toBe(file.includes('drawdown') ? 3 : 1);
        const chunks = text.split(/\n\s*Case /).slice(1);
        expect(chunks).toHaveLength(result.cases.length);
        result.cases.forEach((c, i) => {
          expect(chunks[i].startsWith(`${c.name} (`)).toBe(true);
          for (const m of c.results) {
            const fs = m.fs === null ? '—' : fsText(m.fs);
            expect(chunks[i]).toMatch(new RegExp(`\\n\\s*${m.method}( \\*)?\\s+${fs}\\s`));
          }
          if (c.governing)
            expect(flat(chunks[i])).toContain(
              `Governing: ${c.governing.method} FS ${fsText(c.governing.fs)}`,
            );
        });
      });

      test('the caution and "page n of m" on every page', () => {
        expect(pages.length).toBeGreaterThan(1);
        pages.forEach((p, i) => {
          expect(p).toContain(`page ${i + 1} of ${pages.length}`);
          expect(flat(p.replace(/page \d+ of \d+/, ''))).toContain(`Caution: ${CAUTION}`);
        });
      });

      test('the title block and the review record given', () => {
        const first = flat(pages[0]);
        expect(first).toContain('project Wendlecombe flood defences');
        expect(first).toContain('run 7');
        expect(first).toContain('submitted by J. Marsh');
        expect(first).toContain(`solver version ${result.solverVersion}`);
        if (review) {
          expect(first).toContain('state approved');
          expect(first).toContain('reviewer R. Okafor');
          expect(first).toContain('date 2026-11-30');
          expect(first).toContain(`decision ${review.decision}`);
          expect(first).toContain(`comment ${review.comment}`);
          expect(first).not.toContain('signature');
        } else {
          expect(first).toContain('state not reviewed');
          expect(first).toMatch(/checked by date signature/);
        }
      });

      test("the materials' names and their sources (descriptions)", () => {
        const plain = flat(pageTexts(path, false).join(' '));
        for (const m of Object.values(section.materials)) {
          expect(text).toMatch(new RegExp(`\\n${m.name}\\s`));
          // the description's words in order (a long one wraps in its cell)
          const words = (m.description ?? '').split(/\s+/).filter(Boolean);
          expect(words.length).toBeGreaterThan(0);
          let at = plain.indexOf(` ${m.name} `);
          for (const w of words) {
            at = plain.indexOf(w, at);
            expect(at).toBeGreaterThanOrEqual(0);
          }
        }
      });

      test('the methods with their references', () => {
        for (const m of new Set(result.cases.flatMap((c) => c.results.map((r) => r.method))))
          expect(text).toContain(`(${m})`);
        expect(flat(text)).toMatch(/Bishop, A\. W\. \(1955\)\. The use of the slip circle/);
      });

      test('Fira Sans embedded (Noto Sans Math for the signs it lacks), and the drawing as vector graphics (no images) with its text', () => {
        const f = fonts(path);
        expect(f.length).toBeGreaterThan(0);
        expect(f.every((x) => /FiraSans|NotoSansMath/.test(x.name) && x.embedded)).toBe(true);
        expect(f.some((x) => /FiraSans/.test(x.name))).toBe(true);
        // the prime of c′ and φ′ (the materials' strengths) is written as itself, not as a
        // quotation mark
        expect(text).toMatch(/[cφ]′/);
        expect(text).not.toMatch(/[cφ]’/);
        expect(f.some((x) => /NotoSansMath/.test(x.name))).toBe(true);
        expect(images(path)).toEqual([]);
        // the drawing's own words: its legend, axis and the governing callout
        expect(text).toMatch(/piezometric line/);
        expect(text).toMatch(/x \(m\)/);
        expect(text).toMatch(/critical surface \(governing/);
        expect(text).toMatch(/\d+ slices \(/);
      });

      test('the slice table of the governing method, its header on each page it spans', () => {
        const g = result.cases[0].results.find(
          (m) => m.method === result.cases[0].governing?.method,
        );
        expect(g?.slices.length).toBeGreaterThan(0);
        expect(text).toContain(`Slices of the governing method (${g?.method})`);
        const heads = pages.filter((p) => /#\s+x \(m\)\s+b \(m\)/.test(p)).length;
        expect(heads).toBeGreaterThanOrEqual(result.cases.length);
      });
    });
  }
});

describe('sectionReportPdf of a section with random variables', () => {
  const { section, result } = example('levee-probability.yaml');
  const meta: ReportMeta = { date: '2026-12-03T10:00:00Z', solverVersion: result.solverVersion };
  const probability = stationProbability(section, {}, result)!.summary;
  const textOf = async (p: typeof probability | null) =>
    flat(
      pageTexts(pdfFile(await sectionReportPdf({ section, result, probability: p, meta }))).join(
        '\n',
      ),
    );

  test('the random variables with the inputs, and the probability of failure of the case', async () => {
    const text = await textOf(probability);
    const spec = section.probability!;
    expect(text).toContain(
      `Random variables ${spec.variables.length} random variables, Latin hypercube sampling, seed 520, N = 10000, on each case's critical surface at the means.`,
    );
    for (const v of spec.variables) expect(text).toContain(variableDistributionWords(v, 'si'));
    // c′ of the bank clay: lognormal, mean 4 kPa, COV 0.4 (the file's words) → SD 1.6 kPa
    expect(text).toContain('lognormal, mean 4 kPa, SD 1.6 kPa');
    for (const k of spec.correlations)
      // the primes written as the fonts hold them (fonts.ts)
      expect(text).toContain(`${k.between[0]} – ${k.between[1]}: ${k.coefficient}`);
    expect(probability).toHaveLength(1);
    const p = probability[0];
    const block = text.slice(text.indexOf('Probability of failure mean FS'));
    expect(block).toContain(`P(FS < 1) ${countedText(p.pFailure)} (1 SE)`);
    expect(block).toContain(`P(FS < 1.5) ${countedText(p.pBelowRequired!)} (1 SE)`);
    expect(block).toContain(`β, FS normal ${p.betaNormal!.toFixed(2)}`);
    expect(block).toContain(`β, FS lognormal ${p.betaLognormal!.toFixed(2)}`);
    expect(block).toContain(`realisations with an FS ${p.valid} of 10000`);
    expect(p.pFailure.p).toBeGreaterThan(0);
  });

  test('without a computed summary: the variables, and a line saying there is none', async () => {
    const text = await textOf(null);
    expect(text).toContain('Random variables');
    expect(text).toContain('No probability of failure was computed with this run');
    expect(text).not.toContain('Probability of failure');
  });
});
