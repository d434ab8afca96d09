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
import { Batch, ResultRow, SectionRow } from '../models';
import { assertProject, type Principal } from './auth';
import { loadBatch } from './batches';
import { sectionReview, sectionReviewStates } from './reviews';
import { messageView } from './validate';
import { stationLabel, userRef } from './views';

/** A run's result; with `search`, also the search report (FS map, trials) the drawing uses. */
export function resultView(r: ResultRow, options: { search?: boolean } = {}) {
  return {
    run: r.run,
    verdict: r.verdict,
    governing: r.governingMethod ? { method: r.governingMethod, fs: r.governingFs } : null,
    requiredFs: r.requiredFs,
    reason: r.reason,
    criticalSurface: r.criticalSurface,
    methods: r.methods,
    warnings: r.warnings,
    solverVersion: r.solverVersion,
    inputHash: r.inputHash,
    timings: { startedAt: r.startedAt, finishedAt: r.finishedAt, durationMs: r.durationMs },
    attempt: r.attempt,
    ...(options.search ? { search: r.search } : {}),
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
    result: current ? resultView(current, { search: true }) : null,
    previous: results.filter((r) => r.run !== s.run).map((r) => resultView(r)),
    review: await sectionReview(s),
    caution: CAUTION,
  };
}

export interface SectionQuery {
  status?: string;
  verdict?: string;
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
  if (q.verdict !== undefined) {
    if (!(VERDICTS as readonly string[]).includes(q.verdict)) {
      throw badRequest(`verdict is one of ${VERDICTS.join(', ')}.`);
    }
    Object.assign(resultWhere, { verdict: q.verdict });
  }
  if (q.order !== undefined && q.order !== 'asc' && q.order !== 'desc') {
    throw badRequest('order is asc or desc.');
  }
  const dir = q.order === 'desc' ? 'DESC' : 'ASC';
  const sort = q.sort ?? 'station';
  if (!['station', 'fs', 'position'].includes(sort)) throw badRequest('sort is station or fs.');
  const order: OrderItem[] =
    sort === 'fs'
      ? [[{ model: ResultRow, as: 'ResultRows' }, 'governingFs', `${dir} NULLS LAST`]]
      : [[sort, `${dir} NULLS LAST`]];
  const { rows, count } = await SectionRow.findAndCountAll({
    where,
    include: [{ model: ResultRow, where: resultWhere, required: q.verdict !== undefined }],
    order: [...order, ['id', 'ASC']],
    limit: pageSize,
    offset: (page - 1) * pageSize,
    distinct: true,
  });
  const reviews = await sectionReviewStates(batch.id);
  return {
    page,
    pageSize,
    total: count,
    items: rows.map((s) => {
      const r = (s as SectionRow & { ResultRows?: ResultRow[] }).ResultRows?.[0];
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
        result: r
          ? {
              verdict: r.verdict,
              governingMethod: r.governingMethod,
              governingFs: r.governingFs,
              requiredFs: r.requiredFs,
              warnings: r.warnings,
            }
          : null,
      };
    }),
    caution: CAUTION,
  };
}
