/**
 * Every analysis is bounded: a section whose settings ask for too much work is refused with a
 * located message before any work starts, and the search stops at its bound or when its caller
 * says so, with what to change.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  AnalysisStopped,
  WORK_LIMIT,
  analyzeSection,
  formatMessage,
  parseSections,
} from '@scarpline/core';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const text = readFileSync(join(EXAMPLES, 'cut-thin-seam.yaml'), 'utf8');
const [section] = parseSections(text, 'cut-thin-seam.yaml').sections;

describe('the work an analysis may ask for', () => {
  test('a grid of 140 × 140 centres with 200 radii and 500 slices is refused where it is written', () => {
    const heavy = text.replace(
      '  surface: { type: auto }',
      '  surface: { type: grid, centers: { nx: 140, ny: 140 }, radii: { count: 200 }, moves: 0 }',
    );
    const { sections, messages } = parseSections(
      heavy.replace('slices: 30', 'slices: 500'),
      'heavy.yaml',
    );
    expect(sections).toHaveLength(0);
    const m = messages.find((x) => x.code === 'too-much-work');
    expect(m).toBeDefined();
    expect(formatMessage(m!)).toMatch(
      /^heavy\.yaml:\d+:\d+ analysis\.surface: asks for about 2\.1e\+9 slice evaluations/,
    );
  });

  test('the default automatic search is far inside the bound', () => {
    expect(parseSections(text, 'cut-thin-seam.yaml').messages).toEqual([]);
  });
});

describe('the search stops at its bound', () => {
  test('a bound of 20 000 slice evaluations stops it, saying what to change', () => {
    let stopped: unknown = null;
    try {
      analyzeSection(section, { workLimit: 20_000 });
    } catch (e) {
      stopped = e;
    }
    expect(stopped).toBeInstanceOf(AnalysisStopped);
    expect((stopped as AnalysisStopped).code).toBe('work-limit');
    expect((stopped as AnalysisStopped).message).toMatch(/use fewer grid centres/);
  });

  test('the caller stops it (its deadline passed) within a few hundred trials of asking', () => {
    let asked = 0;
    let error: unknown = null;
    try {
      analyzeSection(section, { shouldStop: () => ++asked >= 3 });
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(AnalysisStopped);
    expect((error as AnalysisStopped).code).toBe('stopped');
    expect(asked).toBe(3);
  });

  test('without a bound given, the default is WORK_LIMIT and the example runs to its end', () => {
    expect(WORK_LIMIT).toBe(1e8);
    expect(analyzeSection(section).governing).not.toBeNull();
  });
});
