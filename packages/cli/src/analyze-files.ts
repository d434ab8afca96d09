import { readFileSync } from 'node:fs';
import {
  CAUTION,
  analyzeSection,
  formatMessage,
  parseSections,
  type SectionResult,
} from '@scarpline/core';
import { collectFiles } from './collect-files';

export interface AnalyzeOptions {
  json?: boolean;
}

const fmt = (v: number | null, digits = 3) => (v === null ? '—' : v.toFixed(digits));

function surfaceText(r: SectionResult['results'][number], length: string): string {
  const s = r.surface;
  if (!s) return '';
  if (s.type === 'circle')
    return `circle centre (${fmt(s.center[0], 2)}, ${fmt(s.center[1], 2)}) R ${fmt(s.radius, 2)} ${length}`;
  if (s.type === 'polyline') return `polyline of ${s.points.length} points`;
  if (s.type === 'log-spiral')
    return `log spiral, pole (${fmt(s.pole[0], 2)}, ${fmt(s.pole[1], 2)})`;
  return `plane at ${s.angle}°, ${fmt(s.depth, 2)} ${length} deep`;
}

/** A readable report of one section. */
function table(r: SectionResult): string[] {
  const length = r.units === 'us' ? 'ft' : 'm';
  const lines = [`${r.id}  ${r.title}${r.case ? `  [${r.case}]` : ''}`];
  lines.push('  method             FS       converged  surface');
  for (const m of r.results) {
    lines.push(
      `  ${m.method.padEnd(18)} ${fmt(m.fs).padStart(6)}   ${(m.converged ? 'yes' : 'no').padEnd(9)}  ${m.converged ? surfaceText(m, length) : (m.reason ?? '')}`,
    );
  }
  if (r.governing) {
    const verdict = r.passes === null ? '' : r.passes ? '  PASS' : '  FAIL';
    lines.push(
      `  governing: ${r.governing.method} FS ${fmt(r.governing.fs)}${r.requiredFs !== null ? ` against required ${r.requiredFs}` : ''}${verdict}`,
    );
  } else lines.push('  governing: no method converged');
  const seen = new Set<string>();
  for (const m of r.results) {
    for (const w of m.warnings) {
      const key = `${w.code}:${w.message}`;
      if (seen.has(key) || w.code === 'not-applicable' || w.code === 'no-convergence') continue;
      seen.add(key);
      lines.push(`  warning (${m.method}): ${w.message}`);
    }
  }
  return lines;
}

/**
 * `scarpline analyze`: parse every file, analyse every section, print a table per section
 * (or the JSON result contract with --json). Returns the exit code: 1 when any file is
 * invalid, 2 when a section is below its required FS, 0 otherwise.
 */
export function analyzeFiles(
  paths: readonly string[],
  options: AnalyzeOptions,
  out: (line: string) => void,
  err: (line: string) => void,
): number {
  const { files, missing } = collectFiles(paths);
  let bad = missing.length > 0;
  for (const m of missing) err(`${m}: no such file or directory`);
  const results: SectionResult[] = [];
  for (const file of files) {
    const { sections, messages } = parseSections(readFileSync(file, 'utf8'), file);
    for (const m of messages) err(formatMessage(m));
    if (messages.some((m) => m.severity === 'error')) {
      bad = true;
      continue;
    }
    for (const s of sections) results.push(analyzeSection(s));
  }
  if (options.json) {
    out(JSON.stringify({ caution: CAUTION, sections: results }, null, 2));
  } else {
    for (const r of results) {
      for (const line of table(r)) out(line);
      out('');
    }
    out(`Caution: ${CAUTION}`);
  }
  if (bad) return 1;
  return results.some((r) => r.passes === false) ? 2 : 0;
}
