import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  CAUTION,
  fsText,
  parseSections,
  countedText,
  stationProbability,
  type ProbabilitySpec,
  type StationResult,
} from '@scarpline/core';
import { corridorReportPdf, REPORT_LIMITS, type CorridorStation, type ReportMeta } from '../src';
import { flat, pageTexts, pdfFile, requirePoppler } from './poppler';

const CORRIDOR = join(__dirname, '..', '..', '..', 'examples', 'corridor', 'corridor.json');

// five stations of the example corridor (two meet, three are below in one case or another),
// and one that was not analysed
const parsed = parseSections(readFileSync(CORRIDOR, 'utf8'), 'corridor.json');
const picked = parsed.sections.filter((s) => [1180, 1240, 1260, 1600, 1700].includes(s.station!));
const meta: ReportMeta = {
  project: 'Wendlecombe bypass',
  corridor: 'wcb-main',
  source: 'corridor.json',
  run: 12,
  date: '2026-12-03T10:00:00Z',
  solverVersion: '0.1.0',
  submittedBy: 'J. Marsh',
  review: {
    state: 'returned',
    reviewer: 'R. Okafor',
    date: '2026-12-02',
    decision: 'returned for the end-of-construction case',
    comment: 'check the drainage of the cut at 1+700',
  },
};
const stations: CorridorStation[] = [
  ...picked.map((section) => ({ section, result: analyzeSection(section), meta })),
  {
    section: parsed.sections.find((s) => s.station === 1620)!,
    result: null,
    reason: 'the solver ran out of time',
    meta,
  },
];
const analysed = stations.filter((s) => s.result) as (CorridorStation & {
  result: StationResult;
})[];
const belowIds = analysed.filter((s) => s.result.verdict === 'below').map((s) => s.section.id);

async function report(appendix: 'all' | 'below' | 'none') {
  const progress: [number, number][] = [];
  const pdf = await corridorReportPdf({
    meta,
    stations,
    appendix,
    onProgress: (done, total) => progress.push([done, total]),
  });
  const pages = pageTexts(pdfFile(pdf));
  return { pages, text: pages.join('\n'), progress };
}

/** The lines of the text between two headings. */
function between(text: string, from: string, to: string): string {
  const a = text.indexOf(from);
  const b = text.indexOf(to, a);
  expect(a).toBeGreaterThanOrEqual(0);
  expect(b).toBeGreaterThan(a);
  return text.slice(a, b);
}

/** The section ids named on the appendix's first lines ("Appendix i of n: …"). */
const appendixIds = (text: string) =>
  [...text.matchAll(/Appendix (\d+) of (\d+): .*?(wcb-main@\d+)/g)].map((m) => m[3]);

beforeAll(() => requirePoppler());

describe('corridorReportPdf', () => {
  test('the example has stations on both sides of their requirement', () => {
    expect(picked).toHaveLength(5);
    expect(belowIds.length).toBeGreaterThan(0);
    expect(belowIds.length).toBeLessThan(analysed.length);
  });

  test('appendix below: summary counts, the list below requirement, their section pages, progress', async () => {
    const { pages, text, progress } = await report('below');
    const summary = flat(between(text, 'Summary', 'FS along the chainage'));
    expect(summary).toContain(`stations ${stations.length}`);
    expect(summary).toContain(`analyzed ${analysed.length}`);
    expect(summary).toContain('not analyzed (failed) 1');
    expect(summary).toContain(`below requirement ${belowIds.length}`);
    const cases = new Set(analysed.flatMap((s) => s.result.cases.map((c) => c.name)));
    expect(summary).toContain(`design cases ${cases.size}`);
    // each case's row: stations and how many below in it
    for (const name of cases) {
      const inCase = analysed.flatMap((s) => s.result.cases.filter((c) => c.name === name));
      const below = inCase.filter((c) => c.verdict === 'below').length;
      expect(summary).toContain(`${name} ${inCase.length} ${below} `);
    }

    const list = between(text, 'Stations below requirement', 'Stations not analyzed');
    expect([...list.matchAll(/wcb-main@\d+/g)].map((m) => m[0])).toEqual(belowIds);
    for (const s of analysed.filter((x) => x.result.verdict === 'below')) {
      const g = s.result.governing!;
      expect(flat(list)).toContain(`${s.section.id} ${g.case} ${g.method}`);
    }
    expect(flat(between(text, 'Stations not analyzed', 'Appendix'))).toContain(
      'wcb-main@1620 the solver ran out of time',
    );

    expect(appendixIds(text)).toEqual(belowIds);
    expect(progress[progress.length - 1]).toEqual([belowIds.length, belowIds.length]);
    expect(progress.map((p) => p[0])).toEqual([...Array(belowIds.length + 1).keys()]);

    // the review record of the corridor, the caution and "page n of m" on every page
    expect(flat(pages[0])).toContain('state returned');
    expect(flat(pages[0])).toContain('reviewer R. Okafor');
    expect(flat(pages[0])).toContain('comment check the drainage of the cut at 1+700');
    pages.forEach((p, i) => {
      expect(p).toContain(`page ${i + 1} of ${pages.length}`);
      expect(flat(p.replace(/page \d+ of \d+/, ''))).toContain(`Caution: ${CAUTION}`);
    });
    // the chainage drawing of each case, as vector text
    for (const name of cases)
      expect(text).toContain(`Governing FS and the required FS along the chainage, case ${name}`);
    // no station carries a probability of failure: no section, column or block of it
    expect(text).not.toContain('Probability of failure');
    expect(text).not.toContain('P(FS < 1)');
    expect(text).not.toContain('Random variables');
  });

  test('appendix all: every station analysed; none: no section pages', async () => {
    const all = await report('all');
    expect(appendixIds(all.text)).toEqual(analysed.map((s) => s.section.id));
    expect(all.progress[all.progress.length - 1]).toEqual([analysed.length, analysed.length]);
    const none = await report('none');
    expect(appendixIds(none.text)).toEqual([]);
    expect(none.text).not.toContain('Section report:');
    expect(none.progress).toEqual([[0, 0]]);
    expect(none.pages.length).toBeLessThan(all.pages.length);
  });

  test('above REPORT_LIMITS.maxAppendixSections the appendix is cut, with a line saying so', async () => {
    const limit = REPORT_LIMITS.maxAppendixSections;
    expect(limit).toBe(400);
    REPORT_LIMITS.maxAppendixSections = 2;
    try {
      const { text, progress } = await report('all');
      expect(appendixIds(text)).toEqual(analysed.slice(0, 2).map((s) => s.section.id));
      expect(flat(text)).toContain(
        `The appendix is cut at 2 sections (REPORT_LIMITS.maxAppendixSections): the last ${analysed.length - 2} of the ${analysed.length} are left out`,
      );
      expect(progress[progress.length - 1]).toEqual([2, 2]);
    } finally {
      REPORT_LIMITS.maxAppendixSections = limit;
    }
  });
});

describe('corridorReportPdf of a corridor with a probability of failure', () => {
  // two stations of the example corridor with invented random variables (the fill's unit weight
  // and a shift of the piezometric line, correlated), few realisations to keep the test short
  const spec: ProbabilitySpec = {
    variables: [
      {
        name: 'γ weathered mudstone',
        target: 'materials.weathered-mudstone.unitWeight',
        distribution: { kind: 'normal', mean: 20, sd: 1 },
      },
      {
        name: 'water level',
        target: 'water.level',
        distribution: { kind: 'normal', mean: 0, sd: 1 },
      },
    ],
    correlations: [{ between: ['γ weathered mudstone', 'water level'], coefficient: 0.2 }],
    seed: 7,
    method: 'latin-hypercube',
    realisations: 200,
    surface: 'critical',
  };
  const uncertain: CorridorStation[] = picked
    .filter((s) => [1180, 1240].includes(s.station!))
    .map((s) => {
      const section = { ...s, probability: spec };
      const result = analyzeSection(section);
      const probability = stationProbability(section, {}, result)!.summary;
      return { section, result, probability, meta };
    });
  const plain = stations.find((s) => s.section.station === 1600)!;
  let text = '';
  beforeAll(async () => {
    const pdf = await corridorReportPdf({ meta, stations: [...uncertain, plain], appendix: 'all' });
    text = pageTexts(pdfFile(pdf)).join('\n');
  });

  test('the stations table: a row per station and case, P(FS < 1) ± SE and β as computed', () => {
    const part = flat(between(text, 'Probability of failure', 'Stations below requirement'));
    expect(part).toContain('P(FS < 1) ± SE β normal β lognormal valid / N');
    // the rows without spaces: pdftotext's layout drops some between narrow runs
    const squeezed = part.replace(/\s+/g, '');
    let rows = 0;
    for (const s of uncertain)
      for (const p of s.probability!) {
        const c = s.result!.cases.find((x) => x.name === p.case)!;
        const row = `${s.section.station} ${s.section.id} ${p.case} ${fsText(c.governing!.fs)} ${fsText(p.meanFs!)} ${countedText(p.pFailure)} ${p.betaNormal!.toFixed(2)} ${p.betaLognormal!.toFixed(2)} ${p.valid} / 200`;
        expect(squeezed).toContain(row.replace(/\s+/g, ''));
        rows++;
      }
    expect(rows).toBeGreaterThanOrEqual(4);
    // somewhere a case fails in some realisations, so the count is not all zeros
    expect(uncertain.some((s) => s.probability!.some((p) => p.pFailure.p > 0))).toBe(true);
    // the station without one has no row
    expect(part).not.toContain('wcb-main@1600');
  });

  test('the paragraph says what the numbers rest on', () => {
    const part = flat(between(text, 'Probability of failure', 'station ('));
    expect(part).toContain('2 of the 3 stations carry a probability of failure');
    expect(part).toContain(
      "Every station in the table below: 2 random variables, Latin hypercube sampling, seed 7, N = 200, on each case's critical surface at the means.",
    );
    expect(part).toContain(
      'γ weathered mudstone: materials.weathered-mudstone.unitWeight, normal, mean 20 kN/m³, SD 1 kN/m³',
    );
    expect(part).toContain('water level: water.level, normal, mean 0 m, SD 1 m');
    expect(part).toContain('correlation γ weathered mudstone – water level: 0.2');
    expect(part).toContain(
      'P(FS < 1) is counted: the share of the N realisations with FS below 1, with its standard error √(P(1 − P)/N)',
    );
    expect(part).toContain('β (FS normal) = (μ − 1)/σ');
    expect(part).toContain('β (FS lognormal) = ln(μ/√(1 + V²))/√(ln(1 + V²)), V = σ/μ');
  });

  test("each station's section page: the random variables and a block per case", () => {
    for (const s of uncertain) {
      const page = flat(between(text, `Section report: ${s.section.id}`, 'Appendix'));
      expect(page).toContain('Random variables');
      expect(page).toContain('variable target distribution');
      for (const p of s.probability!) {
        const c = s.result!.cases.find((x) => x.name === p.case)!;
        const block = flat(between(page, `Case ${p.case} (`, 'Drawing'));
        expect(block).toContain(`P(FS < 1) ${countedText(p.pFailure)} (1 SE)`);
        expect(block).toContain(`P(FS < ${c.requiredFs}) ${countedText(p.pBelowRequired!)} (1 SE)`);
        expect(block).toContain(`mean FS ${fsText(p.meanFs!)} SD of FS ${p.sdFs!.toFixed(3)}`);
        expect(block).toContain(
          `β, FS normal ${p.betaNormal!.toFixed(2)} β, FS lognormal ${p.betaLognormal!.toFixed(2)} realisations with an FS ${p.valid} of 200`,
        );
      }
    }
    const last = flat(text.slice(text.indexOf('Section report: wcb-main@1600')));
    expect(last).not.toContain('Probability of failure');
  });
});
