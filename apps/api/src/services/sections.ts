/**
 * Sections: one section with its input and its results (the current run first, older runs
 * kept), and the sections of a batch with their current results (filtered, sorted, paged).
 */
import { Op, type OrderItem, type WhereOptions } from 'sequelize';
import { CAUTION } from '@scarpline/core/caution';
import type { Section } from '@scarpline/core/model';
import { JOB_STATES, VERDICTS } from '@scarpline/core/verdict';
import { sequelize } from '../db';
import { badRequest, notFound } from '../errors';
import { Batch, CaseResultRow, ResultRow, SectionRow } from '../models';
import { assertProject, type Principal } from './auth';
import { loadBatch } from './batches';
import { sectionReview, sectionReviewStates } from './reviews';
import { messageView } from './validate';
import { stationLabel, userRef } from './views';

/** What a list of sections reads of each case: its summary and its warnings, no reports. */
const BRIEF: (keyof CaseResultRow)[] = [
  'resultId',
  'position',
  'name',
  'kind',
  'verdict',
  'governingMethod',
  'governingFs',
  'requiredFs',
  'ratio',
  'warnings',
];

/**
 * The case rows of these results, in each result's order of cases: with `search`, their
 * search reports too; `brief`, only their summaries and warnings.
 */
export async function casesOf(
  results: readonly ResultRow[],
  options: { search?: boolean; brief?: boolean } = {},
): Promise<Map<number, CaseResultRow[]>> {
  const attributes = options.brief ? BRIEF : options.search ? undefined : { exclude: ['search'] };
  const rows = results.length
    ? await CaseResultRow.findAll({
        where: { resultId: results.map((r) => r.id) },
        attributes,
        order: [
          ['resultId', 'ASC'],
          ['position', 'ASC'],
        ],
      })
    : [];
  const out = new Map<number, CaseResultRow[]>(results.map((r) => [r.id, []]));
  for (const c of rows) out.get(c.resultId)?.push(c);
  return out;
}

/** One case of a run's result (CaseView); its search report only when asked (and loaded). */
function caseView(c: CaseResultRow, search: boolean) {
  return {
    name: c.name,
    kind: c.kind,
    requiredFs: c.requiredFs,
    governs: c.governs,
    governing:
      c.governingMethod !== null && c.governingFs !== null
        ? { method: c.governingMethod, fs: c.governingFs }
        : null,
    ratio: c.ratio,
    verdict: c.verdict,
    warnings: c.warnings,
    methods: c.methods,
    criticalSurface: c.criticalSurface,
    search: search ? (c.search ?? null) : null,
    ...(c.drawdown ? { drawdown: c.drawdown } : {}),
    ...(c.seismic ? { seismic: c.seismic } : {}),
    ...(c.requiredReinforcement ? { requiredReinforcement: c.requiredReinforcement } : {}),
  };
}

/** The warnings of a run's result: its governing case's (the first case's when none governs), then the station's own. */
function warningsOf(r: ResultRow, cases: readonly CaseResultRow[]): object[] {
  const shown = cases.find((c) => c.name === r.governingCase) ?? cases[0];
  return [...(shown?.warnings ?? []), ...(r.warnings as object[])];
}

/**
 * A run's result: the station's verdict over every case, its governing case, and that case's
 * method, FS, requirement, reports and warnings (the first case's when none governs; the
 * station's own warnings after them), then every case; with `search`, the search reports (the
 * FS map, the trials) the drawing uses.
 */
export function resultView(
  r: ResultRow,
  cases: readonly CaseResultRow[],
  options: { search?: boolean } = {},
) {
  const shown = cases.find((c) => c.name === r.governingCase) ?? cases[0];
  const search = options.search ?? false;
  return {
    run: r.run,
    verdict: r.verdict,
    governingCase: r.governingCase,
    governing: r.governingMethod ? { method: r.governingMethod, fs: r.governingFs } : null,
    requiredFs: r.requiredFs,
    reason: r.reason,
    criticalSurface: shown?.criticalSurface ?? null,
    methods: shown?.methods ?? [],
    warnings: warningsOf(r, cases),
    solverVersion: r.solverVersion,
    inputHash: r.inputHash,
    timings: { startedAt: r.startedAt, finishedAt: r.finishedAt, durationMs: r.durationMs },
    attempt: r.attempt,
    ...(search ? { search: shown?.search ?? null } : {}),
    cases: cases.map((c) => caseView(c, search)),
    caution: CAUTION,
  };
}

export async function loadSection(p: Principal, id: number): Promise<SectionRow> {
  const s = await SectionRow.findByPk(id);
  if (!s) throw notFound('section');
  const b = await Batch.findByPk(s.batchId, { attributes: ['id', 'projectId'] });
  if (!b) throw notFound('section');
  // outside a token's projects: the answer for a section that does not exist
  assertProject(p, b.projectId, 'section');
  return s;
}

export async function sectionView(p: Principal, id: number) {
  const s = await loadSection(p, id);
  const batch = await loadBatch(p, s.batchId);
  const results = await ResultRow.findAll({ where: { sectionId: s.id }, order: [['run', 'DESC']] });
  const current = results.find((r) => r.run === s.run);
  const previous = results.filter((r) => r !== current);
  const currentCases = await casesOf(current ? [current] : [], { search: true });
  const previousCases = await casesOf(previous);
  return {
    id: s.id,
    batchId: s.batchId,
    key: s.key,
    station: s.station,
    stationLabel: stationLabel(s),
    status: s.status,
    run: s.run,
    failReason: s.failReason,
    /** Who submitted the batch: they may not review it. */
    submittedBy: batch.submittedBy,
    submitter: await userRef(batch.submittedBy),
    /** Who started the current run with edits (null: the submitted run): they may not review it. */
    editedBy: s.editedBy ?? null,
    input: s.input,
    /** The warnings of the input checks about this section's current input. */
    inputWarnings: s.inputWarnings.map(messageView),
    geometry: s.geometry ?? null,
    /** Each case's probability of failure on its critical surface (current run), where the section asks for it. */
    probability: current?.probability ?? null,
    result: current
      ? resultView(current, currentCases.get(current.id) ?? [], { search: true })
      : null,
    previous: previous.map((r) => resultView(r, previousCases.get(r.id) ?? [])),
    review: await sectionReview(s),
    caution: CAUTION,
  };
}

export interface SectionQuery {
  status?: string;
  verdict?: string;
  /** A design case by name: the verdict filter then applies to that case. */
  case?: string;
  sort?: string;
  order?: string;
  page: number;
  pageSize: number;
}

/** The sections of a batch with their current result: filtered, sorted, paged. */
export async function listSections(batch: Batch, q: SectionQuery) {
  const { page, pageSize } = q;
  const where: WhereOptions = { batchId: batch.id };
  if (q.status !== undefined) {
    if (!(JOB_STATES as readonly string[]).includes(q.status)) {
      throw badRequest(`status is one of ${JOB_STATES.join(', ')}.`);
    }
    Object.assign(where, { status: q.status });
  }
  const resultWhere: WhereOptions = { run: { [Op.eq]: sequelize.col('SectionRow.run') } };
  if (q.verdict !== undefined && !(VERDICTS as readonly string[]).includes(q.verdict)) {
    throw badRequest(`verdict is one of ${VERDICTS.join(', ')}.`);
  }
  if (q.case !== undefined) {
    // the sections whose current result has a case of that name (with that verdict)
    const verdict = q.verdict === undefined ? '' : `AND c.verdict = ${sequelize.escape(q.verdict)}`;
    Object.assign(where, {
      [Op.and]: sequelize.literal(
        `EXISTS (SELECT 1 FROM case_results c JOIN results r ON r.id = c.result_id
           WHERE r.section_id = "SectionRow"."id" AND r.run = "SectionRow"."run"
             AND c.name = ${sequelize.escape(q.case)} ${verdict})`,
      ),
    });
  } else if (q.verdict !== undefined) {
    Object.assign(resultWhere, { verdict: q.verdict });
  }
  if (q.order !== undefined && q.order !== 'asc' && q.order !== 'desc') {
    throw badRequest('order is asc or desc.');
  }
  const dir = q.order === 'desc' ? 'DESC' : 'ASC';
  const sort = q.sort ?? 'station';
  if (!['station', 'fs', 'ratio', 'position'].includes(sort)) {
    throw badRequest('sort is station, fs, ratio or position.');
  }
  const byResult = { fs: 'governingFs', ratio: 'ratio' } as Record<string, string>;
  const order: OrderItem[] = byResult[sort]
    ? [[{ model: ResultRow, as: 'ResultRows' }, byResult[sort], `${dir} NULLS LAST`]]
    : [[sort, `${dir} NULLS LAST`]];
  const { rows, count } = await SectionRow.findAndCountAll({
    where,
    include: [
      {
        model: ResultRow,
        where: resultWhere,
        required: q.verdict !== undefined && q.case === undefined,
      },
    ],
    order: [...order, ['id', 'ASC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
    distinct: true,
  });
  const reviews = await sectionReviewStates(batch.id);
  const resultOf = (s: SectionRow) =>
    (s as SectionRow & { ResultRows?: ResultRow[] }).ResultRows?.[0];
  const cases = await casesOf(
    rows.map(resultOf).filter((r): r is ResultRow => r !== undefined),
    { brief: true },
  );
  return {
    page,
    pageSize,
    total: count,
    items: rows.map((s) => {
      const r = resultOf(s);
      return {
        id: s.id,
        key: s.key,
        station: s.station,
        stationLabel: stationLabel(s),
        title: (s.input as Section).title,
        units: (s.input as Section).units,
        status: s.status,
        run: s.run,
        failReason: s.failReason,
        reviewState: reviews.get(s.id)?.decision ?? 'pending',
        // The section line of a GeoJSON corridor feature; null when the input had no coordinates.
        geometry: s.geometry ?? null,
        // each case's probability of failure on its critical surface, where the section asks
        probability: r?.probability ?? null,
        result: r
          ? {
              verdict: r.verdict,
              governingCase: r.governingCase,
              governingMethod: r.governingMethod,
              governingFs: r.governingFs,
              requiredFs: r.requiredFs,
              ratio: r.ratio,
              warnings: warningsOf(r, cases.get(r.id) ?? []),
              cases: (cases.get(r.id) ?? []).map((c) => ({
                name: c.name,
                kind: c.kind,
                verdict: c.verdict,
                governingMethod: c.governingMethod,
                governingFs: c.governingFs,
                requiredFs: c.requiredFs,
                ratio: c.ratio,
              })),
            }
          : null,
      };
    }),
    caution: CAUTION,
  };
}
