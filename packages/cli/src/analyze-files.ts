import {
  AnalysisStopped,
  CAUTION,
  analyzeSection,
  formatMessage,
  parseSections,
  stationInUnits,
  type StationResult,
  type UnitSystem,
} from '@scarpline/core';
import { collectFiles } from './collect-files';
import { analyzeCsv } from './csv';
import { applyOverrides, type Overrides } from './overrides';
import { readInput, STDIN_NAME, UserError } from './read-input';
import { sectionTable } from './table';

export interface AnalyzeOptions extends Overrides {
  json?: boolean;
  csv?: boolean;
  units?: UnitSystem;
  /** Each case's table ends with its governing method's slices. */
  sliceTable?: boolean;
}

/**
 * The exit code of analysed sections, from every case of every section: 1 when a file was
 * invalid or a case has no factor of safety (no method converged), else 2 when a case is below
 * its required FS, else 0 (a station's verdict is the worst of its cases').
 */
export function exitCode(bad: boolean, results: readonly StationResult[]): number {
  if (bad || results.some((r) => r.verdict === 'no-fs')) return 1;
  return results.some((r) => r.verdict === 'below') ? 2 : 0;
}

/**
 * `scarpline analyze`: parse every file (`-` is standard input), analyse every section with
 * the command line's overrides under each of its design cases, and print a table per section
 * (its cases, then the station's verdict), or the result contract as JSON (`{ caution,
 * sections }`), or CSV (a row per section, case and method). Returns the exit
 * code (see exitCode).
 */
export function analyzeFiles(
  paths: readonly string[],
  options: AnalyzeOptions,
  out: (line: string) => void,
  err: (line: string) => void,
): number {
  const stdin = paths.filter((p) => p === '-').length;
  if (stdin > 1) throw new UserError('standard input (-) can be read only once');
  const { files, missing } = collectFiles(paths.filter((p) => p !== '-'));
  const inputs = paths.includes('-') ? [...files, '-'] : files;
  let bad = missing.length > 0;
  for (const m of missing) err(`${m}: no such file or directory`);
  const results: { file: string; result: StationResult }[] = [];
  for (const file of inputs) {
    let input: { name: string; text: string };
    try {
      input = readInput(file);
    } catch (e) {
      err(e instanceof Error ? e.message : String(e));
      bad = true;
      continue;
    }
    // standard input: YAML reads JSON too
    const { sections, messages } = parseSections(
      input.text,
      input.name === STDIN_NAME ? 'stdin.yaml' : input.name,
    );
    for (const m of messages) err(formatMessage({ ...m, file: input.name }));
    if (messages.some((m) => m.severity === 'error')) {
      bad = true;
      continue;
    }
    for (const s of sections) {
      let r;
      try {
        r = analyzeSection(applyOverrides(s, options));
      } catch (e) {
        // a bounded analysis that ran out of its work says what to change; others are bugs
        if (!(e instanceof AnalysisStopped)) throw e;
        err(`${input.name}: ${s.id}: ${e.message}`);
        bad = true;
        continue;
      }
      if (options.units) r = stationInUnits(r, options.units);
      results.push({ file: input.name, result: r });
    }
  }
  if (options.json) {
    out(JSON.stringify({ caution: CAUTION, sections: results.map((r) => r.result) }, null, 2));
  } else if (options.csv) {
    // every record ends CRLF: the last one's LF is the line's own
    out(analyzeCsv(results).replace(/\n$/, ''));
  } else {
    for (const { result } of results) {
      for (const line of sectionTable(result, { slices: options.sliceTable })) out(line);
      out('');
    }
    out(`Caution: ${CAUTION}`);
  }
  return exitCode(
    bad,
    results.map((r) => r.result),
  );
}
