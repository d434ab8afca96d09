/**
 * Section studies: a probabilistic analysis, a sensitivity or a solve of one section's current
 * input, asked for here, computed by workers (a pg-boss job, the computation on a study thread
 * it can stop: studies/pool.ts) with its progress written to the row, its result kept as JSON
 * (the core's shapes, SI). A probabilistic analysis that searches the surface again in each
 * realisation is shared among workers: its critical surfaces at the means first, then a job per
 * chunk of realisations i..j (the core's seeded run gives the same numbers in chunks as in one
 * piece), then, when the last chunk is written, one job combines them.
 */
import { QueryTypes } from 'sequelize';
import {
  caseModels,
  normaliseProbability,
  parseTarget,
  targetQuantity,
  targetValue,
  toSi,
  type Critical,
  type ProbabilitySpec,
  type RawProbability,
  type Section,
  type SolveRequest,
} from '@scarpline/core';
import { CAUTION } from '@scarpline/core/caution';
import { drawProbability, drawSensitivity, drawTornado } from '@scarpline/core/draw';
import { readSectionDocument, sectionDocument, type Message } from '@scarpline/core/input';
import type {
  ProbabilityResult,
  SensitivityResult,
  SolveResult,
  TaylorResult,
} from '@scarpline/core';
import { config } from '../config';
import { sequelize } from '../db';
import { conflict, invalid, notFound, tooMany, Problem } from '../errors';
import { PoolError } from '../intake/thread-pool';
import { ResultRow, StudyRow, STUDY_KINDS, type StudyKind } from '../models';
import { enqueueStudies, STUDY_QUEUE, type StudyJob } from '../queue';
import { computeOnThread, studyFailure } from '../studies/pool';
import type { StudyAnswer } from '../studies/thread';
import { audit } from './audit';
import type { Principal } from './auth';
import { loadSection } from './sections';
import { userRefs } from './views';

/** How many of a user's studies may wait or run at once (the next is 429). */
export const STUDIES_PER_USER = 4;
/** How many of a section's studies its list shows, newest first. */
export const STUDY_LIST = 50;
/** The progress of a study is written at most this often (ms). */
const PROGRESS_EVERY_MS = 500;

type Json = Record<string, unknown>;
const isObject = (v: unknown): v is Json =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/** A located error of the request: a JSON pointer into the body, as well as the path. */
interface RequestError {
  pointer: string;
  path: string;
  code: string;
  message: string;
  text: string;
  severity: 'error';
}

const pointerOf = (path: readonly (string | number)[]) =>
  path.map((k) => `/${String(k).replace(/~/g, '~0').replace(/\//g, '~1')}`).join('');

function requestError(path: (string | number)[], code: string, message: string): RequestError {
  const at = path.join('.');
  return {
    severity: 'error',
    pointer: pointerOf(path),
    path: at,
    code,
    message,
    text: `${at}: ${message}`,
  };
}

/** A 422 with located errors in the request. */
function refused(errors: RequestError[]): Problem {
  const n = errors.length;
  return invalid(n === 1 ? errors[0].text : `${n} errors in the request: ${errors[0].text}; …`, {
    errors,
  });
}

const fail = (path: (string | number)[], code: string, message: string) =>
  refused([requestError(path, code, message)]);

/** The section's random variables as a request gives them (file units), checked by the core. */
function requestedSpec(stored: Section, block: unknown): ProbabilitySpec {
  if (!isObject(block))
    throw fail(['probability'], 'type', 'give the random variables as an object');
  // The core's reading checks the block (its schema and its checks) within the section as
  // written: the section's own document with this block in place of its own. Its errors are
  // located in the block; its values are read in the section's units below.
  const doc = { ...(sectionDocument(stored) as unknown as Json), probability: block };
  const read = readSectionDocument(doc, 'study.json', stored.units);
  const errors = read.messages.filter((m: Message) => m.severity === 'error');
  if (errors.length > 0) {
    throw refused(
      errors.slice(0, 50).map((m) => {
        const path = m.path ? m.path.replace(/\[(\d+)\]/g, '.$1').split('.') : [];
        return requestError(path.length ? path : ['probability'], m.code, m.message);
      }),
    );
  }
  return normaliseProbability(block as unknown as RawProbability, stored.units);
}

/** The names of a section's design cases, in order. */
const caseNames = (s: Section) => caseModels(s).map((c) => c.name);

/** The `case` of a request: one of the section's cases, or undefined (every case). */
function requestedCase(s: Section, body: Json): string | undefined {
  const c = body.case;
  if (c === undefined) return undefined;
  const names = caseNames(s);
  if (typeof c !== 'string' || !names.includes(c))
    throw fail(['case'], 'no-such-case', `the section's cases are ${names.join(', ')}`);
  return c;
}

/** What the study asks of the core (SI), checked; and the request as accepted. */
interface Accepted {
  kind: StudyKind;
  request: Json;
  spec: Json;
  total: number;
}

function acceptProbability(s: Section, body: Json, kind: 'probability' | 'sensitivity'): Accepted {
  const given = body.probability;
  if (given === undefined && !s.probability)
    throw fail(
      ['probability'],
      'no-variables',
      'the section gives no random variables: send them here (a probability block of the section file, in its units)',
    );
  const spec = given === undefined ? s.probability! : requestedSpec(s, given);
  const caseName = requestedCase(s, body);
  const cap = spec.surface === 'search' ? config.studySearchRealisations : config.studyRealisations;
  if (kind === 'probability' && spec.realisations > cap)
    throw fail(
      given === undefined ? ['probability'] : ['probability', 'realisations'],
      'too-many-realisations',
      `at most ${cap} realisations${spec.surface === 'search' ? ' when each searches the surface again' : ''}; ${spec.realisations} were asked`,
    );
  const cases = caseName ? 1 : caseNames(s).length;
  return {
    kind,
    request: {
      kind,
      ...(given !== undefined ? { probability: given } : {}),
      ...(caseName ? { case: caseName } : {}),
    },
    spec: { spec, ...(caseName ? { caseName } : {}) },
    total: kind === 'probability' ? cases * spec.realisations : cases * spec.variables.length,
  };
}

function acceptSolve(s: Section, body: Json): Accepted {
  const errors: RequestError[] = [];
  const target = body.target;
  let parsed: ReturnType<typeof parseTarget> | null = null;
  if (typeof target !== 'string' || target === '')
    errors.push(
      requestError(
        ['target'],
        'required',
        'name the input to solve for, e.g. materials.clay.frictionAngle',
      ),
    );
  else {
    parsed = parseTarget(target);
    if (!parsed.ok) errors.push(requestError(['target'], 'target-unknown', parsed.reason));
    else {
      const has = targetValue(s, parsed.target);
      if (!has.ok) errors.push(requestError(['target'], 'target-missing', has.reason));
    }
  }
  let caseName: string | undefined;
  try {
    caseName = requestedCase(s, body);
  } catch (e) {
    if (!(e instanceof Problem)) throw e;
    errors.push(...((e.extra.errors as RequestError[]) ?? []));
  }
  const range = body.range;
  const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);
  if (!Array.isArray(range) || range.length !== 2 || !range.every(finite))
    errors.push(
      requestError(
        ['range'],
        'range',
        "give the range to look in as two numbers [from, to] in the section's units",
      ),
    );
  else if (range[0] === range[1])
    errors.push(requestError(['range', 1], 'range', "the range's ends must differ"));
  const model = caseModels(s, caseName)[0];
  let targetFs = body.targetFs;
  if (targetFs === undefined) targetFs = model?.requiredFs ?? undefined;
  if (targetFs === undefined)
    errors.push(
      requestError(
        ['targetFs'],
        'required',
        `case ${model?.name ?? ''} has no required FS: give targetFs`.replace('  ', ' '),
      ),
    );
  else if (!finite(targetFs) || targetFs <= 0)
    errors.push(requestError(['targetFs'], 'target-fs', 'targetFs is a number above 0'));
  if (errors.length > 0) throw refused(errors);
  const t = (parsed as { ok: true; target: Parameters<typeof targetQuantity>[0] }).target;
  const quantity = targetQuantity(t);
  const [a, b] = range as [number, number];
  const si = (v: number) => (quantity ? toSi(v, quantity, s.units) : v);
  const request: SolveRequest = {
    target: target as string,
    targetFs: targetFs as number,
    range: [si(a), si(b)],
    caseName: model.name,
  };
  return {
    kind: 'solve',
    request: { kind: 'solve', target, case: model.name, targetFs, range: [a, b] },
    spec: { request },
    total: 0,
  };
}

/** A study as the API shows it (the contract's Study). */
export function studyView(r: StudyRow, names: Map<number, { id: number; name: string }>) {
  return {
    id: r.id,
    sectionId: r.sectionId,
    batchId: r.batchId,
    run: r.run,
    kind: r.kind,
    status: r.status,
    request: r.request,
    progress: r.total > 0 ? { done: Math.min(r.done, r.total), total: r.total } : null,
    result: r.status === 'done' ? (r.result ?? null) : null,
    problem: r.problem ?? null,
    requestedBy: names.get(r.requestedBy) ?? { id: r.requestedBy, name: `user ${r.requestedBy}` },
    createdAt: r.createdAt,
    finishedAt: r.finishedAt ?? null,
    caution: CAUTION,
  };
}

async function viewOf(r: StudyRow) {
  return studyView(r, await userRefs([r.requestedBy]));
}

/**
 * Asks for a study of a section's current run: checked (422 located in the body; 409 while the
 * section has no finished run; 429 when the user has STUDIES_PER_USER waiting or running), then
 * a row (queued) and its job, together.
 */
export async function requestStudy(p: Principal, sectionId: number, body: unknown) {
  const s = await loadSection(p, sectionId);
  if (!isObject(body)) throw invalid('Send the study as a JSON object.');
  const kind = body.kind;
  if (typeof kind !== 'string' || !(STUDY_KINDS as readonly string[]).includes(kind))
    throw fail(['kind'], 'kind', `kind is one of ${STUDY_KINDS.join(', ')}`);
  const result = await ResultRow.findOne({
    where: { sectionId: s.id, run: s.run },
    attributes: ['id'],
  });
  if (!result)
    throw conflict(
      `Section ${s.key} has no finished run yet (run ${s.run} is ${s.status}); ask for a study when it has a result.`,
    );
  const input = s.input as Section;
  const accepted =
    kind === 'solve'
      ? acceptSolve(input, body)
      : acceptProbability(input, body, kind as 'probability');
  const waiting = await StudyRow.count({
    where: { requestedBy: p.userId, status: ['queued', 'running'] },
  });
  if (waiting >= STUDIES_PER_USER)
    throw tooMany(
      `You have ${waiting} studies waiting or running; ask for another when one of them is done.`,
    );
  const row = await sequelize.transaction(async (t) => {
    const r = await StudyRow.create(
      {
        sectionId: s.id,
        batchId: s.batchId,
        run: s.run,
        kind: accepted.kind,
        status: 'queued',
        request: accepted.request,
        input,
        spec: accepted.spec,
        total: accepted.total,
        requestedBy: p.userId,
      },
      { transaction: t },
    );
    await enqueueStudies([{ studyId: r.id, step: 'run' }], t);
    await audit(p.userId, 'study', 'section', s.id, { studyId: r.id, kind }, t);
    return r;
  });
  return viewOf(row);
}

/** A study the principal may see (through its section's project); 404 otherwise. */
export async function loadStudy(p: Principal, id: number): Promise<StudyRow> {
  const r = await StudyRow.findByPk(id);
  if (!r) throw notFound('study');
  try {
    await loadSection(p, r.sectionId);
  } catch (e) {
    if (e instanceof Problem && e.status === 404) throw notFound('study');
    throw e;
  }
  return r;
}

export async function getStudy(p: Principal, id: number) {
  return viewOf(await loadStudy(p, id));
}

/** A section's studies, newest first (the last STUDY_LIST). */
export async function listStudies(p: Principal, sectionId: number) {
  const s = await loadSection(p, sectionId);
  const rows = await StudyRow.findAll({
    where: { sectionId: s.id },
    order: [['id', 'DESC']],
    limit: STUDY_LIST,
  });
  const names = await userRefs(rows.map((r) => r.requestedBy));
  return rows.map((r) => studyView(r, names));
}

type StoredResult =
  | { kind: 'probability'; probability: ProbabilityResult; taylor: TaylorResult }
  | { kind: 'sensitivity'; sensitivity: SensitivityResult }
  | { kind: 'solve'; solve: SolveResult };

/**
 * The drawing of a done study (the core's, with the caution): a probabilistic analysis's
 * histogram and CDF of one case (`case`, the first by default); a sensitivity's tornado
 * (`view=tornado`, the default) or its FS one variable at a time (`view=series`).
 */
export async function studyPlot(p: Principal, id: number, q: { case?: string; view?: string }) {
  const r = await loadStudy(p, id);
  if (r.status !== 'done' || !r.result)
    throw conflict(`Study ${r.id} is ${r.status}; its drawing is made when it is done.`);
  const result = r.result as StoredResult;
  const input = r.input as Section;
  if (result.kind === 'solve')
    throw notFound(
      `drawing of a solve (study ${r.id}): a solve gives a value, not a drawing; analyse the section at the solved value to see its surface`,
    );
  const cases = result.kind === 'probability' ? result.probability.cases : result.sensitivity.cases;
  const c = q.case === undefined ? cases[0] : cases.find((x) => x.case === q.case);
  if (!c) throw notFound(`case ${q.case ?? ''} in study ${r.id}`);
  const safe = (t: string) => t.replace(/[^A-Za-z0-9._-]+/g, '_');
  if (result.kind === 'probability') {
    const pc = result.probability.cases.find((x) => x.case === c.case)!;
    return {
      svg: drawProbability(pc, { title: `${input.title}: distribution of FS` }),
      fileName: `study-${r.id}-${safe(c.case)}-probability.svg`,
    };
  }
  const sc = result.sensitivity.cases.find((x) => x.case === c.case)!;
  const requiredFs = caseModels(input, c.case)[0]?.requiredFs ?? null;
  const view = q.view ?? 'tornado';
  if (view !== 'tornado' && view !== 'series')
    throw fail(['view'], 'view', 'view is tornado or series');
  return view === 'tornado'
    ? {
        svg: drawTornado(sc, { requiredFs, title: `${input.title}: tornado of FS` }),
        fileName: `study-${r.id}-${safe(c.case)}-tornado.svg`,
      }
    : {
        svg: drawSensitivity(sc, {
          requiredFs,
          title: `${input.title}: FS one variable at a time`,
        }),
        fileName: `study-${r.id}-${safe(c.case)}-sensitivity.svg`,
      };
}

// ---------------------------------------------------------------- the worker's part

/** Writes the progress of a step now and then (never more often than PROGRESS_EVERY_MS). */
function progressWriter(row: StudyRow, offset = () => 0) {
  let written = 0;
  let writing: Promise<unknown> = Promise.resolve();
  return {
    hear(done: number) {
      if (Date.now() - written < PROGRESS_EVERY_MS) return;
      written = Date.now();
      const at = offset() + done;
      writing = writing.then(() =>
        StudyRow.update({ done: at }, { where: { id: row.id, status: 'running' } }).catch(
          () => undefined,
        ),
      );
    },
    idle: () => writing,
  };
}

async function finish(row: StudyRow, result: StoredResult): Promise<void> {
  await StudyRow.update(
    { status: 'done', result, done: row.total, finishedAt: new Date() },
    { where: { id: row.id } },
  );
}

async function failStudy(id: number, title: string, detail: string): Promise<void> {
  await StudyRow.update(
    { status: 'failed', problem: { title, detail }, finishedAt: new Date() },
    { where: { id } },
  );
}

/**
 * Fails the studies the queue has given up on: queued or running, and no job of theirs waiting
 * or active any more (the worker computing a step ended, a kill or a crash, on its try and on
 * its retry; the queue then fails the job, and nothing else would end the study). Every job of
 * a study is queued in the transaction that writes its row, and a step ends the row before its
 * job, so a study between two steps always has one. Called by the API's stall watch; returns
 * the ids it failed.
 */
export async function failOrphanedStudies(): Promise<number[]> {
  const problem = {
    title: 'The study was not finished',
    detail:
      'The worker computing it stopped before it finished, on every try (a worker that was killed or ran out of memory). Ask for the study again; if it fails again, ask for fewer realisations or a narrower range.',
  };
  const rows = await sequelize.query<{ id: number }>(
    `UPDATE studies s SET status = 'failed', problem = $2::jsonb, finished_at = now(), updated_at = now()
      WHERE s.status IN ('queued', 'running')
        AND NOT EXISTS (
          SELECT 1 FROM pgboss.job j
           WHERE j.name = $1 AND j.state IN ('created', 'retry', 'active')
             AND j.data->>'studyId' = s.id::text)
      RETURNING s.id`,
    { bind: [STUDY_QUEUE, JSON.stringify(problem)], type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.id);
}

/** The chunks of a search-again run: each case's realisations in pieces of STUDY_CHUNK. */
function chunksOf(spec: ProbabilitySpec, cases: string[]) {
  const out: { caseName: string; from: number; to: number }[] = [];
  for (const caseName of cases)
    for (let from = 0; from < spec.realisations; from += config.studyChunk)
      out.push({ caseName, from, to: Math.min(spec.realisations, from + config.studyChunk) });
  return out;
}

function answer<K extends StudyAnswer['kind']>(a: StudyAnswer, kind: K) {
  if (a.kind !== kind) throw new Error(`the study thread answered ${a.kind}, not ${kind}`);
  return a as Extract<StudyAnswer, { kind: K }>;
}

/** One step of a study on a study thread. */
async function step(row: StudyRow, job: StudyJob): Promise<void> {
  const input = row.input as Section;
  const asked = row.spec as { spec?: ProbabilitySpec; caseName?: string; request?: SolveRequest };
  if (row.kind === 'solve') {
    const progress = progressWriter(row);
    const a = answer(
      await computeOnThread({ kind: 'solve', section: input, request: asked.request! }, (n) =>
        progress.hear(n),
      ),
      'solve',
    );
    await progress.idle();
    return finish(row, { kind: 'solve', solve: a.solve });
  }
  const spec = asked.spec!;
  const only = asked.caseName ? { caseName: asked.caseName } : {};
  if (row.kind === 'sensitivity') {
    const a = answer(
      await computeOnThread({ kind: 'sensitivity', section: input, spec, ...only }),
      'sensitivity',
    );
    return finish(row, { kind: 'sensitivity', sensitivity: a.sensitivity });
  }
  if (spec.surface === 'critical') {
    const progress = progressWriter(row);
    const a = answer(
      await computeOnThread({ kind: 'probability', section: input, spec, ...only }, (d) =>
        progress.hear(d),
      ),
      'probability',
    );
    await progress.idle();
    return finish(row, { kind: 'probability', probability: a.probability, taylor: a.taylor });
  }
  // Searching again in each realisation: shared among the workers in chunks.
  if (job.step === 'run') {
    const a = answer(
      await computeOnThread({ kind: 'criticals', section: input, spec, ...only }),
      'criticals',
    );
    const chunks = chunksOf(spec, Object.keys(a.criticals));
    await sequelize.transaction(async (t) => {
      await StudyRow.update(
        { criticals: a.criticals, chunks: chunks.length, chunksDone: 0, done: 0 },
        { where: { id: row.id }, transaction: t },
      );
      await enqueueStudies(
        chunks.map((_, position) => ({ studyId: row.id, step: 'chunk', position })),
        t,
      );
    });
    return;
  }
  const criticals = row.criticals as Record<string, Critical>;
  const chunks = chunksOf(spec, Object.keys(criticals));
  if (job.step === 'chunk') {
    const c = chunks[job.position];
    if (!c) throw new Error(`study ${row.id} has no chunk ${job.position}`);
    const a = answer(
      await computeOnThread({ kind: 'chunk', section: input, spec, criticals, ...c }),
      'chunk',
    );
    // The chunk's FS, then the count of those written; the chunk that finds them all claims
    // the combining (once: `combined`) and enqueues it, together.
    await sequelize.query(
      `INSERT INTO study_chunks (study_id, position, case_name, from_index, fs)
       VALUES ($1, $2, $3, $4, $5::jsonb) ON CONFLICT DO NOTHING`,
      { bind: [row.id, job.position, c.caseName, c.from, JSON.stringify(a.fs)] },
    );
    const [counted] = await sequelize.query<{ written: number; chunks: number }>(
      `UPDATE studies s SET
         chunks_done = n.written, done = n.done, updated_at = now()
         FROM (SELECT count(*)::int AS written,
                      COALESCE(sum(jsonb_array_length(fs)), 0)::int AS done
                 FROM study_chunks WHERE study_id = $1) n
        WHERE s.id = $1 AND s.status = 'running'
       RETURNING n.written, s.chunks`,
      { bind: [row.id], type: QueryTypes.SELECT },
    );
    if (!counted || counted.written < counted.chunks) return;
    await sequelize.transaction(async (t) => {
      const [claims] = await StudyRow.update(
        { combined: true },
        { where: { id: row.id, combined: false }, transaction: t },
      );
      if (claims > 0) await enqueueStudies([{ studyId: row.id, step: 'combine' }], t);
    });
    return;
  }
  // combine: every chunk's FS in order, the statistics and the Taylor series check
  const written = await sequelize.query<{
    case_name: string;
    from_index: number;
    fs: (number | null)[];
  }>('SELECT case_name, from_index, fs FROM study_chunks WHERE study_id = $1 ORDER BY position', {
    bind: [row.id],
    type: QueryTypes.SELECT,
  });
  const fs: Record<string, (number | null)[]> = {};
  for (const name of Object.keys(criticals))
    fs[name] = new Array<number | null>(spec.realisations).fill(null);
  for (const w of written) w.fs.forEach((v, k) => (fs[w.case_name][w.from_index + k] = v));
  const a = answer(
    await computeOnThread({ kind: 'combine', section: input, spec, criticals, fs, ...only }),
    'probability',
  );
  return finish(row, { kind: 'probability', probability: a.probability, taylor: a.taylor });
}

/**
 * A worker's part: one step of a study (the whole of it, or for a search-again run its
 * critical surfaces, a chunk or the combining). A study that is done or failed is left as it is
 * (a job delivered twice); a computation that fails or is stopped at its limit fails the study
 * with the reason (it would fail again); other errors (the database) are thrown, so that the
 * queue tries the job again.
 */
export async function runStudyJob(job: StudyJob): Promise<void> {
  const row = await StudyRow.findByPk(job.studyId);
  if (!row || row.status === 'done' || row.status === 'failed') return;
  if (row.status === 'queued') {
    await StudyRow.update({ status: 'running' }, { where: { id: row.id, status: 'queued' } });
    row.status = 'running';
  }
  try {
    await step(row, job);
  } catch (e) {
    if (e instanceof PoolError) {
      await failStudy(row.id, 'The study was stopped', studyFailure(e));
      return;
    }
    // The core's refusals (an input a variable's values cannot take, …) would come again.
    if (e instanceof Error && !isDatabaseError(e)) {
      await failStudy(row.id, 'The study could not be computed', e.message);
      return;
    }
    throw e;
  }
}

/** Whether an error came from the database (worth trying the job again). */
function isDatabaseError(e: Error): boolean {
  const code = (e as { code?: unknown }).code;
  return (
    /^Sequelize/.test(e.name) ||
    'routine' in e ||
    (typeof code === 'string' && /^E[A-Z]+/.test(code) && code !== 'ERR_WORKER_OUT_OF_MEMORY')
  );
}
