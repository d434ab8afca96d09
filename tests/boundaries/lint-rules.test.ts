/**
 * The package boundaries are ESLint rules (eslint.config.js): each must fail on a violation.
 * Each case lints a few lines as if they were a file at the given path, with the project's own
 * config (type-aware rules off: the file does not exist), and expects the boundary rules to
 * report exactly the lines that cross a boundary; the allowed imports beside them pass.
 */
import { ESLint, type Linter } from 'eslint';
import { join } from 'node:path';
import tseslint from 'typescript-eslint';

const ROOT = join(__dirname, '..', '..');
const BOUNDARY_RULES = [
  '@typescript-eslint/no-restricted-imports',
  'no-restricted-syntax',
  'no-restricted-globals',
];

// The project's config, passed in (ESLint would import the file, which Jest cannot do).
// eslint-disable-next-line @typescript-eslint/no-require-imports
const config = require('../../eslint.config.js') as Linter.Config[];
const eslint = new ESLint({
  cwd: ROOT,
  overrideConfigFile: true,
  baseConfig: config,
  overrideConfig: [tseslint.configs.disableTypeChecked],
});

/** The 1-based lines of `code` that a boundary rule reports, as if it were the file `path`. */
async function crossings(path: string, code: string): Promise<number[]> {
  const [result] = await eslint.lintText(code, { filePath: join(ROOT, path) });
  const fatal = result.messages.filter((m) => m.fatal);
  expect(fatal).toEqual([]);
  return result.messages
    .filter((m) => m.ruleId !== null && BOUNDARY_RULES.includes(m.ruleId))
    .map((m) => m.line)
    .sort((a, b) => a - b);
}

/** Lines ending in `// ✗` must be reported, every other line must pass. */
function expected(code: string): number[] {
  return code.split('\n').flatMap((line, i) => (line.trimEnd().endsWith('// ✗') ? [i + 1] : []));
}

const cases: [string, string, string][] = [
  [
    'the core is pure: no Node module, however it is loaded, and no Node global',
    'packages/core/src/boundary-probe.ts',
    `import { readFileSync } from 'node:fs'; // ✗
import path from 'path'; // ✗
import { promises } from 'fs/promises'; // ✗
export const load = () => import('node:os'); // ✗
export const spawn = () => require('child_process') as unknown; // ✗
export const cwd = () => process.cwd(); // ✗
export { readFileSync, path, promises };
import { yAt } from './geometry/y-at';
import { CAUTION } from './caution';
export const lazy = () => require('mathjs/lib/browser/math.js') as unknown;
export { yAt, CAUTION };
`,
  ],
  [
    'a drawing takes a result: draw/ does not import the analysis, search, slicer or methods',
    'packages/core/src/draw/boundary-probe.ts',
    `import { analyzeSection } from '../analyze'; // ✗
import type { SearchOutcome } from '../search/search-section'; // ✗
import { sliceSurface } from '../slices/slice-surface'; // ✗
import { bishop } from '../methods/bishop'; // ✗
import { brent } from '../numeric/brent'; // ✗
import { CAUTION } from '..'; // ✗
import { drawSection } from '../index'; // ✗
import { writeFileSync } from 'node:fs'; // ✗
export const later = () => import('../analyze'); // ✗
import type { SectionResult } from '../result';
import { yAt } from '../geometry/y-at';
import { fromSi } from '../model/units';
import { svgElement } from './svg-element';
export type { SearchOutcome, SectionResult };
export { analyzeSection, sliceSurface, bishop, brent, CAUTION, drawSection, writeFileSync };
export { yAt, fromSi, svgElement };
`,
  ],
  [
    'the web app imports the core only by subpath, values only from browser-safe ones',
    'apps/web/src/app/boundary-probe.ts',
    `import { CAUTION } from '@scarpline/core'; // ✗
import type { MethodId } from '@scarpline/core'; // ✗
import { parseSections } from '@scarpline/core/input'; // ✗
import { analyzeSection } from '@scarpline/core/analyze'; // ✗
import { VERDICTS } from '@scarpline/core/dist/verdict'; // ✗
import { chainageLabel } from '../../../../packages/core/src/draw/chainage-label'; // ✗
import { createApp } from '@scarpline/api'; // ✗
export const later = () => import('@scarpline/core'); // ✗
import type { Message } from '@scarpline/core/input';
import { CAUTION as C } from '@scarpline/core/caution';
import { scaleLinear, niceTicks } from '@scarpline/core/draw';
import { fromSi, type UnitSystem } from '@scarpline/core/units';
import { VERDICT_WORDS } from '@scarpline/core/verdict';
import type { SectionResult } from '@scarpline/core/result';
import { Auth } from '../core/auth';
export type { MethodId, Message, UnitSystem, SectionResult };
export { CAUTION, parseSections, analyzeSection, VERDICTS, chainageLabel, createApp };
export { C, scaleLinear, niceTicks, fromSi, VERDICT_WORDS, Auth };
`,
  ],
  [
    'the CLI uses the core by its entry points, never its files',
    'packages/cli/src/boundary-probe.ts',
    `import { analyzeSection } from '@scarpline/core/dist/analyze'; // ✗
import { searchSection } from '@scarpline/core/src/search/search-section'; // ✗
import { bishop } from '../../core/src/methods/bishop'; // ✗
export const later = () => import('@scarpline/core/src/analyze'); // ✗
export const old = () => require('@scarpline/core/dist/index.js') as unknown; // ✗
import { parseSections, type Section } from '@scarpline/core';
import { CAUTION } from '@scarpline/core/caution';
export const lazy = () => import('./analyze-files');
export type { Section };
export { analyzeSection, searchSection, bishop, parseSections, CAUTION };
`,
  ],
  [
    'the API uses the core by its entry points, never its files',
    'apps/api/src/services/boundary-probe.ts',
    `import { CAUTION } from '../../../../packages/core/src/caution'; // ✗
import { drawSection } from '@scarpline/core/dist/draw'; // ✗
import { stationRecords } from '@scarpline/core/export';
import { analyzeSection } from '@scarpline/core';
import { sequelize } from '../db';
export { CAUTION, drawSection, stationRecords, analyzeSection, sequelize };
`,
  ],
];

test.each(cases)(
  '%s',
  async (_name, path, code) => {
    const want = expected(code);
    expect(want.length).toBeGreaterThan(0);
    expect(await crossings(path, code)).toEqual(want);
  },
  60000,
);
