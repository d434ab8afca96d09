/** One section: its input and its results (the current run first, older runs kept). */
import { CAUTION } from '@scarpline/core';
import { notFound } from '../errors';
import { ResultRow, SectionRow } from '../models';
import type { Principal } from './auth';
import { loadBatch } from './batches';
import { sectionReview } from './reviews';
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
  await loadBatch(p, s.batchId);
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
