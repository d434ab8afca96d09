/** Batches: submission (one transaction with its sections' jobs), progress, views, listing. */
import { QueryTypes } from 'sequelize';
import { CAUTION } from '@scarpline/core/caution';
import type { Section } from '@scarpline/core/model';
import { VERDICTS, type Verdict } from '@scarpline/core/verdict';
import { sequelize } from '../db';
import { notFound } from '../errors';
import { Batch, Project, SectionRow } from '../models';
import { enqueueSections } from '../queue';
import { audit } from './audit';
import { assertProject, type Principal } from './auth';
import { discardObjects, putObjects, recordObjects } from './files';
import { batchReview } from './reviews';
import { sectionMessage, type Parsed } from './validate';
import { userRef } from './views';
import { anyWorkerAlive } from './workers';

/** The project, which the principal may use; 404 when it does not exist or is not theirs. */
export async function loadProject(p: Principal, projectId: number): Promise<Project> {
  assertProject(p, projectId);
  const project = await Project.findByPk(projectId);
  if (!project) throw notFound('project');
  return project;
}

/** A submitted file's original bytes, kept in storage with the batch. */
export interface SubmittedInput {
  name: string;
  contentType: string;
  body: Buffer;
}

/**
 * Submits a batch: its inputs' bytes go to storage first, then the batch, its sections, their
 * jobs and the inputs' rows in one transaction. When storage cannot take the inputs (503) or
 * the transaction fails, nothing is created and the objects written are deleted again.
 */
export async function submitBatch(
  p: Principal,
  projectId: number,
  parsed: Parsed,
  source: string,
  inputs: SubmittedInput[],
) {
  await loadProject(p, projectId);
  const objects = await putObjects(
    inputs.map((f) => ({ ...f, kind: 'batch-input' as const, createdBy: p.userId })),
  );
  const batch = await sequelize
    .transaction(async (t) => {
      const b = await Batch.create(
        {
          projectId,
          submittedBy: p.userId,
          name: parsed.name,
          title: parsed.title,
          status: 'running',
          total: parsed.sections.length,
          source,
          finishedAt: null,
        },
        { transaction: t },
      );
      const rows = await SectionRow.bulkCreate(
        parsed.sections.map((s: Section, i) => ({
          batchId: b.id,
          key: s.id,
          position: i,
          station: s.station,
          input: s,
          status: 'queued' as const,
          failReason: null,
          geometry: parsed.geometries?.[s.id] ?? null,
          featureProperties: parsed.featureProperties?.[s.id] ?? null,
          inputWarnings: (parsed.sectionWarnings[s.id] ?? []).map(sectionMessage),
        })),
        // Only the ids come back: the rows' inputs need not travel back from the database.
        { transaction: t, returning: ['id'] },
      );
      await enqueueSections(
        rows.map((r) => ({ sectionId: r.id, run: 1 })),
        t,
      );
      await recordObjects(objects, { batchId: b.id }, t);
      await audit(p.userId, 'submit', 'batch', b.id, { sections: rows.length, source }, t);
      return b;
    })
    .catch(async (e: unknown) => {
      await discardObjects(objects);
      throw e;
    });
  return { ...(await batchView(batch.id)), warnings: parsed.warnings };
}

export async function progress(batchId: number) {
  const rows = await sequelize.query<{ status: string; n: string }>(
    'SELECT status, count(*) AS n FROM sections WHERE batch_id = $1 GROUP BY status',
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  const count = (s: string) => Number(rows.find((r) => r.status === s)?.n ?? 0);
  const below = (await verdictCounts(batchId)).below;
  const done = count('done');
  const failed = count('failed');
  const total = done + failed + count('queued') + count('running');
  const waiting = count('queued') + count('running') > 0;
  return {
    total,
    done,
    failed,
    queued: count('queued'),
    running: count('running'),
    belowRequiredFs: below,
    fraction: total ? (done + failed) / total : 1,
    /** Sections wait and no worker is alive to take them (services/workers.ts). */
    stalled: waiting && !(await anyWorkerAlive()),
  };
}

/** How many sections of a batch have each verdict, by their current result. */
export async function verdictCounts(batchId: number): Promise<Record<Verdict, number>> {
  const rows = await sequelize.query<{ verdict: Verdict; n: string }>(
    `SELECT r.verdict, count(*) AS n FROM results r
       JOIN sections s ON s.id = r.section_id AND r.run = s.run
      WHERE s.batch_id = $1 GROUP BY r.verdict`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  const counts = Object.fromEntries(VERDICTS.map((v) => [v, 0])) as Record<Verdict, number>;
  for (const r of rows) counts[r.verdict] = Number(r.n);
  return counts;
}

/**
 * The design case names of a batch's sections (their current input), in the order first seen:
 * by section, then as each lists them. A section that lists no cases is its own one case,
 * named by analysis.case or `as given` (designCases in the core).
 */
export async function batchCases(batchId: number): Promise<string[]> {
  const rows = await sequelize.query<{ name: string }>(
    `WITH s AS (
       SELECT position, input -> 'analysis' ->> 'case' AS own,
              CASE WHEN jsonb_typeof(input -> 'cases') = 'array' THEN input -> 'cases'
                   ELSE '[]'::jsonb END AS cases
         FROM sections WHERE batch_id = $1
     )
     SELECT n.name FROM s CROSS JOIN LATERAL (
         SELECT e.value ->> 'name' AS name, e.ord::int AS ord
           FROM jsonb_array_elements(s.cases) WITH ORDINALITY AS e(value, ord)
         UNION ALL
         SELECT coalesce(s.own, 'as given'), 0 WHERE jsonb_array_length(s.cases) = 0
       ) n
      WHERE n.name IS NOT NULL
      GROUP BY n.name ORDER BY min(ARRAY[s.position, n.ord])`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.name);
}

/**
 * For each case of a batch (batchCases' order), how many sections have each verdict in it, by
 * their current result.
 */
export async function caseCounts(
  batchId: number,
  cases: string[],
): Promise<Record<string, Record<Verdict, number>>> {
  const rows = await sequelize.query<{ name: string; verdict: Verdict; n: string }>(
    `SELECT c.name, c.verdict, count(*) AS n FROM case_results c
       JOIN results r ON r.id = c.result_id
       JOIN sections s ON s.id = r.section_id AND r.run = s.run
      WHERE s.batch_id = $1 GROUP BY c.name, c.verdict`,
    { bind: [batchId], type: QueryTypes.SELECT },
  );
  const zero = () => Object.fromEntries(VERDICTS.map((v) => [v, 0])) as Record<Verdict, number>;
  const counts: Record<string, Record<Verdict, number>> = {};
  for (const name of cases) counts[name] = zero();
  for (const r of rows) (counts[r.name] ??= zero())[r.verdict] = Number(r.n);
  return counts;
}

/** A station below its requirement in a case: its id, the case, its FS and required FS. */
export interface StationBelow {
  key: string;
  name: string;
  fs: number | null;
  requiredFs: number | null;
}

/** The cases below their requirement in a batch's current results, in station order (at most `limit`). */
export async function stationsBelow(batchId: number, limit: number): Promise<StationBelow[]> {
  return sequelize.query<StationBelow>(
    `SELECT s.key, c.name, c.governing_fs AS fs, c.required_fs AS "requiredFs"
       FROM case_results c
       JOIN results r ON r.id = c.result_id
       JOIN sections s ON s.id = r.section_id AND r.run = s.run
      WHERE s.batch_id = $1 AND c.verdict = 'below'
      ORDER BY s.station ASC NULLS LAST, s.position, c.position LIMIT $2`,
    { bind: [batchId, limit], type: QueryTypes.SELECT },
  );
}

export async function loadBatch(p: Principal, batchId: number): Promise<Batch> {
  const b = await Batch.findByPk(batchId);
  if (!b) throw notFound('batch');
  assertProject(p, b.projectId, 'batch');
  return b;
}

export async function batchView(batchId: number) {
  const b = await Batch.findByPk(batchId);
  if (!b) throw notFound('batch');
  const cases = await batchCases(b.id);
  return {
    id: b.id,
    projectId: b.projectId,
    name: b.name,
    title: b.title,
    status: b.status,
    source: b.source,
    submittedBy: b.submittedBy,
    submitter: await userRef(b.submittedBy),
    createdAt: b.createdAt,
    finishedAt: b.finishedAt,
    progress: await progress(b.id),
    cases,
    caseCounts: await caseCounts(b.id, cases),
    review: await batchReview(b.id),
    caution: CAUTION,
  };
}

export async function listBatches(p: Principal, projectId: number) {
  await loadProject(p, projectId);
  const rows = await Batch.findAll({ where: { projectId }, order: [['id', 'DESC']] });
  return Promise.all(rows.map((b) => batchView(b.id)));
}
