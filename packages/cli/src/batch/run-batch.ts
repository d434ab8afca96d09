import { mkdirSync, writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { SingleBar, Presets } from 'cli-progress';
import {
  CAUTION,
  drawChainage,
  exportCsvHeader,
  exportCsvRow,
  formatMessage,
  fromSi,
  isGeoJsonCorridor,
  isLandXml,
  parseLandXmlCorridor,
  parseGeoJsonCorridor,
  parseSections,
  resultsSheet,
  resultsWorkbook,
  SOLVER_VERSION,
  uniqueSheetName,
  toSi,
  unanalysedRecord,
  VERDICT_WORDS,
  VERDICTS,
  type CorridorFeature,
  type ExportRecord,
  type Section,
  type SectionEntry,
  type SheetSpec,
  type StationResult,
  type UnitSystem,
  type Verdict,
} from '@scarpline/core';
import { applyOverrides, type Overrides } from '../overrides';
import { readInput, UserError } from '../read-input';
import type { Reply, Task } from './messages';
import { Output, resultsGeoJson, stationLine as line, stationRow } from './outputs';
import { WorkerPool } from './pool';
import { writeXlsx } from '@scarpline/report';
import { corridorReportName, writeCorridorReport, type ReportRequest } from '../report-file';

export interface BatchOptions extends Overrides {
  out?: string;
  jobs?: number;
  template?: string;
  svg?: boolean;
  /** Add a sheet per section to results.xlsx: the slice table of each case's governing method. */
  sliceSheets?: boolean;
  units?: UnitSystem;
  /** Show a progress bar (a terminal) or plain lines. */
  tty?: boolean;
  /** Also write the corridor report (PDF) there, with these section pages. */
  report?: ReportRequest;
  /** The corridor's text when it is not the file's own (a corridor cut from terrain). */
  input?: { name: string; text: string };
}

/**
 * One station of the batch: its section until it is analysed, then its rows of the results
 * table (a row per case, then the station's, last; the station's row alone without a result).
 */
interface Entry {
  label: string;
  station: number | null;
  units: UnitSystem;
  section: Section | null;
  /** Why the section did not read (its errors), when it did not. */
  inputError: string | null;
  feature: CorridorFeature | null;
  records: ExportRecord[] | null;
  /** Its slice sheet of results.xlsx, when asked for and analysed. */
  slices: SheetSpec | null;
  /** Its result is in results.json. */
  analysed: boolean;
  /** Kept for the corridor report, when one is asked for: the section analysed and its result. */
  kept: { section: Section; result: StationResult | null; reason?: string } | null;
}

/** The errors of a section that did not read, as one note. */
function inputErrorOf(e: SectionEntry): string | null {
  if (e.section) return null;
  const errors = e.messages.filter((m) => m.severity === 'error');
  return errors.length
    ? errors.map((m) => `${m.path ? `${m.path}: ` : ''}${m.message}`).join('; ')
    : 'the section did not read (see the messages above)';
}

/** Every station of the file, read or not, in the order of the file (the core's entries). */
function entriesOf(
  file: string,
  text: string,
  name: string,
  templateFile?: string,
): { entries: Entry[]; messages: string[]; units: UnitSystem | null; id: string } {
  let parsed;
  if (isLandXml(text)) {
    const header = templateFile ? readInput(templateFile) : undefined;
    parsed = parseLandXmlCorridor(
      text,
      name,
      header ? { text: header.text, fileName: header.name } : undefined,
    );
  } else if (isGeoJsonCorridor(text)) {
    const header = templateFile ? readInput(templateFile) : undefined;
    parsed = parseGeoJsonCorridor(
      text,
      name,
      header ? { text: header.text, fileName: header.name } : undefined,
    );
  } else {
    if (templateFile)
      throw new UserError(
        '--template applies to a GeoJSON or LandXML corridor; a batch file has its own template',
      );
    parsed = parseSections(text, name);
  }
  const units = parsed.batch?.units ?? parsed.sections[0]?.units ?? null;
  const entries = parsed.entries.map((e): Entry => ({
    label: e.label,
    station: e.station,
    units: e.section?.units ?? units ?? 'si',
    section: e.section,
    inputError: inputErrorOf(e),
    feature: 'feature' in e ? (e.feature as CorridorFeature) : null,
    records: null,
    slices: null,
    analysed: false,
    kept: null,
  }));
  return {
    entries,
    messages: parsed.messages.map(formatMessage),
    units,
    id: parsed.batch?.id ?? file,
  };
}

/** The row of a station without a result, in the units shown. */
function unanalysed(
  e: Entry,
  shown: UnitSystem,
  verdict: 'input-error' | 'no-fs',
  note: string,
): ExportRecord {
  const station =
    e.station === null ? null : fromSi(toSi(e.station, 'length', e.units), 'length', shown);
  return unanalysedRecord({
    id: e.label,
    station,
    units: shown,
    case: e.section?.analysis.case ?? null,
    requiredFs: e.section?.analysis.requiredFs ?? null,
    verdict,
    note,
  });
}

/**
 * `scarpline batch`: every section of a corridor (a batch file or a GeoJSON corridor) on a
 * pool of worker threads, one per core; results are streamed to disk in station order as they
 * come, so memory stays flat however long the corridor. A section that does not read or does
 * not solve is reported and the others go on. Ctrl-C stops the workers and closes the files
 * with what was written. Returns the exit code: 1 when a section could not be analysed (or
 * has no FS), else 2 when one is below its required FS, else 0; 130 when interrupted.
 */
export async function runBatch(
  file: string,
  options: BatchOptions,
  out: (line: string) => void,
  err: (line: string) => void,
): Promise<number> {
  const input = options.input ?? readInput(file);
  const { entries, messages, units, id } = entriesOf(
    file,
    input.text,
    input.name,
    options.template,
  );
  for (const m of messages) err(m);
  const runnable = entries.filter((e) => e.section);
  if (entries.length === 0 || runnable.length === 0) {
    err(`${input.name}: no section could be read; nothing analyzed`);
    return 1;
  }
  const shownUnits = options.units ?? units ?? 'si';
  // the caution before any result on standard error (the progress and the per-station lines),
  // so that a run whose standard output goes elsewhere never shows a result without it
  err(`Caution: ${CAUTION}`);
  const outDir = options.out;
  const drawings = outDir && options.svg !== false ? join(outDir, 'sections') : null;
  if (outDir) mkdirSync(outDir, { recursive: true });
  if (drawings) mkdirSync(drawings, { recursive: true });
  const json = outDir ? new Output(join(outDir, 'results.json')) : null;
  const csv = outDir ? new Output(join(outDir, 'results.csv')) : null;
  await json?.write(
    `{"caution":${JSON.stringify(CAUTION)},"corridor":${JSON.stringify({ id, file: input.name, units: shownUnits })},"sections":[\n`,
  );
  await csv?.write(exportCsvHeader());

  const jobs = Math.max(1, Math.min(options.jobs ?? availableParallelism(), runnable.length));
  const total = entries.length;
  const bar = options.tty
    ? new SingleBar(
        {
          format: 'analyzing |{bar}| {value}/{total} sections  {last}',
          stream: process.stderr,
          hideCursor: true,
          clearOnComplete: true,
        },
        Presets.shades_classic,
      )
    : null;
  bar?.start(total, 0, { last: '' });

  let written = 0;
  let next = 0;
  let queued = 0;
  const replies = new Map<number, Reply>();
  const window = 4 * jobs;
  let stopping = false;
  let finish: (code: number) => void = () => undefined;
  const finished = new Promise<number>((r) => (finish = r));

  const safe = (name: string) => name.replace(/[^A-Za-z0-9._+@-]/g, '_');
  const pool = new WorkerPool(join(__dirname, 'worker.js'), jobs, (reply) => {
    replies.set(reply.index, reply);
    void drain();
  });

  const dispatch = () => {
    while (!stopping && pool.idle > 0 && queued < entries.length && queued < next + window) {
      const e = entries[queued];
      if (e.section) {
        // the section as analysed (the corridor report shows it with its result)
        const section = (e.section = applyOverrides(e.section, options));
        const task: Task = {
          index: queued,
          section,
          svgPath: drawings ? join(drawings, `${safe(e.label)}.svg`) : null,
          units: options.units ?? null,
          sliceSheet: outDir !== undefined && options.sliceSheets === true,
        };
        pool.run(task);
      }
      queued++;
    }
  };

  let draining = false;
  const drain = async (): Promise<void> => {
    if (draining) return;
    draining = true;
    while (!stopping && next < entries.length) {
      const e = entries[next];
      if (e.section) {
        const reply = replies.get(next);
        if (!reply) break;
        replies.delete(next);
        const kept = options.report ? e.section : null;
        if (reply.ok) {
          if (kept) e.kept = { section: kept, result: JSON.parse(reply.json) as StationResult };
          e.records = reply.records;
          e.slices = reply.slices;
          e.analysed = true;
          await json?.write(`${written > 0 ? ',\n' : ''}${reply.json}`);
          written++;
        } else {
          e.records = [unanalysed(e, shownUnits, 'no-fs', `the solver failed: ${reply.error}`)];
          if (kept)
            e.kept = { section: kept, result: null, reason: `the solver failed: ${reply.error}` };
        }
      } else e.records = [unanalysed(e, shownUnits, 'input-error', e.inputError ?? '')];
      e.section = null; // done with it: let it go
      await csv?.write(e.records.map((r) => exportCsvRow(r)).join(''));
      next++;
      if (bar) bar.update(next, { last: e.label });
      else err(`[${next}/${total}] ${line(e.records).trim()}`);
      dispatch();
    }
    draining = false;
    if (!stopping && next === entries.length) finish(0);
    else dispatch();
  };

  const onSignal = () => {
    if (stopping) return;
    stopping = true;
    finish(130);
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  dispatch();
  void drain();
  const signalled = (await finished) === 130;
  process.removeListener('SIGINT', onSignal);
  process.removeListener('SIGTERM', onSignal);
  await pool.terminate();
  bar?.stop();

  const done = entries.slice(0, next).map((e) => {
    const records = e.records as ExportRecord[];
    return {
      records,
      record: stationRow(records),
      feature: e.feature,
      analysed: e.analysed,
      slices: e.slices,
    };
  });
  const failures = done
    .filter((e) => !e.analysed)
    .map(({ record: r }) => ({
      id: r.section_id,
      station: r.station,
      verdict: r.verdict,
      error: r.note,
    }));
  await json?.write(
    `\n],"failures":${JSON.stringify(failures)},"complete":${!signalled},"stations":${total},"written":${done.length}}\n`,
  );
  await json?.close();
  await csv?.close();
  if (outDir) {
    writeFileSync(join(outDir, 'results.geojson'), resultsGeoJson(id, done));
    // the same records as results.csv, then the slice sheets asked for (names unique)
    const taken = new Set<string>();
    await writeXlsx(
      join(outDir, 'results.xlsx'),
      resultsWorkbook(
        resultsSheet(
          done.flatMap((e) => e.records.map((record) => ({ record }))),
          { units: shownUnits },
        ),
        done.flatMap(({ slices }) =>
          slices ? [{ ...slices, name: uniqueSheetName(slices.name, taken) }] : [],
        ),
      ),
    );
    // the station's governing FS against its requirement (its governing case's)
    const points = done
      .map(({ record: r }) => ({
        station: r.station ?? Number.NaN,
        fs: r.fs,
        requiredFs: r.required_fs,
      }))
      .filter((p) => Number.isFinite(p.station));
    writeFileSync(
      join(outDir, 'chainage.svg'),
      `${drawChainage(points, { title: `Factor of safety along the chainage: ${id}`, units: shownUnits })}\n`,
    );
  }

  out('  station    id                     method                 FS  req.   verdict');
  for (const e of done) out(line(e.records));
  const count = (v: Verdict) => done.filter((e) => e.record.verdict === v).length;
  out('');
  out(
    `${done.length} of ${total} ${total === 1 ? 'section' : 'sections'}: ${VERDICTS.map((v) => `${VERDICT_WORDS[v]}: ${count(v)}`).join(', ')}`,
  );
  if (outDir) {
    const svgs = drawings ? `, sections/*.svg (${written})` : '';
    out(
      `wrote ${outDir}: results.json, results.csv, results.geojson, results.xlsx${options.sliceSheets ? ' (with slice sheets)' : ''}, chainage.svg${svgs}`,
    );
  }
  if (options.report) {
    const path = await writeCorridorReport(
      {
        ...options.report,
        path: options.report.path ?? join(outDir ?? '.', corridorReportName(id)),
      },
      {
        id,
        source: input.name,
        solverVersion: SOLVER_VERSION,
        stations: entries.slice(0, next).flatMap((e) => (e.kept ? [e.kept] : [])),
        unread: entries
          .slice(0, next)
          .filter((e) => e.inputError !== null)
          .map((e) => ({ label: e.label, station: e.station, reason: e.inputError ?? '' })),
      },
      err,
    );
    out(`wrote ${path}`);
  }
  if (signalled)
    err(
      `interrupted: stopped after ${done.length} of ${total} sections${outDir ? `; ${outDir} holds the results of those (results.json says "complete": false)` : ''}`,
    );
  out(`Caution: ${CAUTION}`);
  if (signalled) return 130;
  if (count('input-error') || count('no-fs')) return 1;
  return count('below') ? 2 : 0;
}
