import { mkdirSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { SingleBar, Presets } from 'cli-progress';
import { parseAllDocuments } from 'yaml';
import {
  CAUTION,
  drawChainage,
  formatMessage,
  isGeoJsonCorridor,
  parseGeoJsonCorridor,
  parseSections,
  type Message,
  type Section,
  type UnitSystem,
} from '@scarpline/core';
import { writeFileSync } from 'node:fs';
import { applyOverrides, type Overrides } from '../overrides';
import { readInput, UserError } from '../read-input';
import type { Reply, Task } from './messages';
import { csvHeader, csvRow, Output, resultsGeoJson, status, type Row } from './outputs';
import { WorkerPool } from './pool';

export interface BatchOptions extends Overrides {
  out?: string;
  jobs?: number;
  template?: string;
  svg?: boolean;
  units?: UnitSystem;
  /** Show a progress bar (a terminal) or plain lines. */
  tty?: boolean;
}

interface Entry extends Row {
  section: Section | null;
}

const isRecord = (v: unknown): v is Record<string, unknown> =>
  v !== null && typeof v === 'object' && !Array.isArray(v);

/** The messages of a batch item or a feature: their path starts with `sections[i]` / `features[i]`. */
const itemOf = (m: Message, list: string): number | null => {
  const r = new RegExp(`^${list}\\[(\\d+)\\]`).exec(m.path);
  return r ? Number(r[1]) : null;
};

/** Every station of the file, read or not, in the order of the file. */
function entriesOf(
  file: string,
  text: string,
  name: string,
  templateFile?: string,
): { entries: Entry[]; messages: Message[]; units: UnitSystem | null; id: string } {
  if (isGeoJsonCorridor(text)) {
    const header = templateFile ? readInput(templateFile) : undefined;
    const parsed = parseGeoJsonCorridor(
      text,
      name,
      header ? { text: header.text, fileName: header.name } : undefined,
    );
    const byId = new Map(parsed.sections.map((s) => [s.id, s]));
    const entries = parsed.features.map((f): Entry => {
      const section = f.sectionId ? (byId.get(f.sectionId) ?? null) : null;
      const own = parsed.messages.filter(
        (m) => m.severity === 'error' && m.file === name && itemOf(m, 'features') === f.index,
      );
      return {
        id: f.sectionId ?? `features[${f.index}]`,
        station: f.station,
        section,
        summary: null,
        error: section
          ? null
          : own.length
            ? own.map((m) => `${m.path}: ${m.message}`).join('; ')
            : 'the section did not read (see the messages above)',
        feature: f,
      };
    });
    return {
      entries,
      messages: parsed.messages,
      units: parsed.sections[0]?.units ?? null,
      id: parsed.batchId,
    };
  }
  if (templateFile)
    throw new UserError(
      '--template applies to a GeoJSON corridor; a batch file has its own template',
    );
  const parsed = parseSections(text, name);
  const byId = new Map(parsed.sections.map((s) => [s.id, s]));
  const claimed = new Set<string>();
  const entries: Entry[] = [];
  let batchId = '';
  const docs = parseAllDocuments(text);
  for (const doc of Array.isArray(docs) ? docs : []) {
    let data: unknown;
    try {
      data = doc.toJS();
    } catch {
      continue;
    }
    if (!isRecord(data)) continue;
    if (data.format === 'scarpline-batch/1' && Array.isArray(data.sections)) {
      batchId ||= String(data.id);
      data.sections.forEach((item: unknown, i: number) => {
        const station = isRecord(item) && typeof item.station === 'number' ? item.station : null;
        const id = `${String(data.id)}@${station ?? `sections[${i}]`}`;
        const section = !claimed.has(id) ? (byId.get(id) ?? null) : null;
        if (section) claimed.add(id);
        const own = parsed.messages.filter(
          (m) => m.severity === 'error' && itemOf(m, 'sections') === i,
        );
        entries.push({
          id,
          station,
          section,
          summary: null,
          error: section
            ? null
            : own.length
              ? own.map((m) => `${m.path}: ${m.message}`).join('; ')
              : 'the section did not read (see the messages above)',
          feature: null,
        });
      });
    } else if (typeof data.id === 'string') {
      const section = !claimed.has(data.id) ? (byId.get(data.id) ?? null) : null;
      if (section) claimed.add(data.id);
      entries.push({
        id: data.id,
        station: typeof data.station === 'number' ? data.station : null,
        section,
        summary: null,
        error: section ? null : 'the section did not read (see the messages above)',
        feature: null,
      });
    }
  }
  for (const s of parsed.sections)
    if (!claimed.has(s.id))
      entries.push({
        id: s.id,
        station: s.station,
        section: s,
        summary: null,
        error: null,
        feature: null,
      });
  return {
    entries,
    messages: parsed.messages,
    units: parsed.sections[0]?.units ?? null,
    id: batchId || file,
  };
}

const fmt = (v: number | null) => (v === null ? '—' : v.toFixed(3));

function line(row: Row): string {
  const s = row.summary;
  const st = row.station === null ? '—' : String(row.station);
  const verdict = {
    pass: 'PASS',
    fail: 'FAIL',
    'no-result': 'NO RESULT',
    'no-required': 'no required FS',
    error: 'ERROR',
  }[status(row)];
  const note = row.error ?? s?.reason ?? '';
  return `  ${st.padStart(9)}  ${row.id.padEnd(22)} ${(s?.governing ?? '—').padEnd(18)} ${fmt(s?.fs ?? null).padStart(6)}  ${(s?.requiredFs ?? '—').toString().padStart(5)}  ${verdict}${note && status(row) !== 'pass' && status(row) !== 'fail' ? `  (${note})` : ''}`;
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
  const input = readInput(file);
  const { entries, messages, units, id } = entriesOf(
    file,
    input.text,
    input.name,
    options.template,
  );
  for (const m of messages) err(formatMessage(m));
  const runnable = entries.filter((e) => e.section);
  if (entries.length === 0 || runnable.length === 0) {
    err(`${input.name}: no section could be read; nothing analysed`);
    return 1;
  }
  const shownUnits = options.units ?? units ?? 'si';
  const outDir = options.out;
  const drawings = outDir && options.svg !== false ? join(outDir, 'sections') : null;
  if (outDir) mkdirSync(outDir, { recursive: true });
  if (drawings) mkdirSync(drawings, { recursive: true });
  const json = outDir ? new Output(join(outDir, 'results.json')) : null;
  const csv = outDir ? new Output(join(outDir, 'results.csv')) : null;
  await json?.write(
    `{"caution":${JSON.stringify(CAUTION)},"corridor":${JSON.stringify({ id, file: input.name, units: shownUnits })},"sections":[\n`,
  );
  await csv?.write(csvHeader());

  const jobs = Math.max(1, Math.min(options.jobs ?? availableParallelism(), runnable.length));
  const total = entries.length;
  const bar = options.tty
    ? new SingleBar(
        {
          format: 'analysing |{bar}| {value}/{total} sections  {last}',
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
        const section = applyOverrides(e.section, options);
        const task: Task = {
          index: queued,
          section,
          svgPath: drawings ? join(drawings, `${safe(e.id)}.svg`) : null,
          units: options.units ?? null,
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
        if (reply.ok) {
          e.summary = reply.summary;
          await json?.write(`${written > 0 ? ',\n' : ''}${reply.json}`);
          written++;
        } else e.error = `the solver failed: ${reply.error}`;
      }
      e.section = null; // done with it: let it go
      await csv?.write(csvRow(e));
      next++;
      if (bar) bar.update(next, { last: e.id });
      else err(`[${next}/${total}] ${line(e).trim()}`);
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

  const done = entries.slice(0, next);
  const failures = done
    .filter((e) => status(e) === 'error')
    .map((e) => ({ id: e.id, station: e.station, error: e.error }));
  await json?.write(
    `\n],"failures":${JSON.stringify(failures)},"complete":${!signalled},"stations":${total},"written":${done.length}}\n`,
  );
  await json?.close();
  await csv?.close();
  if (outDir) {
    writeFileSync(join(outDir, 'results.geojson'), resultsGeoJson(done));
    const points = done
      .map((e) => ({
        station: e.station ?? Number.NaN,
        fs: e.summary?.fs ?? null,
        requiredFs: e.summary?.requiredFs ?? null,
      }))
      .filter((p) => Number.isFinite(p.station));
    writeFileSync(
      join(outDir, 'chainage.svg'),
      `${drawChainage(points, { title: `Factor of safety along the chainage: ${id}`, units: shownUnits })}\n`,
    );
  }

  out('  station    id                     method                 FS  req.   verdict');
  for (const e of done) out(line(e));
  const count = (s: string) => done.filter((e) => status(e) === s).length;
  out('');
  out(
    `${done.length} of ${total} sections: ${count('pass')} pass, ${count('fail')} below the required FS, ${count('no-result')} without a factor of safety, ${count('no-required')} without a required FS, ${count('error')} not analysed`,
  );
  if (outDir) {
    const svgs = drawings ? `, sections/*.svg (${written})` : '';
    out(`wrote ${outDir}: results.json, results.csv, results.geojson, chainage.svg${svgs}`);
  }
  if (signalled)
    err(
      `interrupted: stopped after ${done.length} of ${total} sections${outDir ? `; ${outDir} holds the results of those (results.json says "complete": false)` : ''}`,
    );
  out(`Caution: ${CAUTION}`);
  if (signalled) return 130;
  if (count('error') || count('no-result')) return 1;
  return count('fail') ? 2 : 0;
}
