/**
 * Reviews: a reviewer (or an admin) approves or returns one section's current run, or a whole
 * finished batch, with a comment. Nobody reviews a batch they submitted.
 */
import { Op } from 'sequelize';
import { CAUTION } from '@scarpline/core/caution';
import { sequelize } from '../db';
import { conflict, forbidden, invalid, notFound } from '../errors';
import { Batch, ResultRow, Review, SectionRow, User } from '../models';
import { audit } from './audit';
import { assertProject, type Principal } from './auth';

// Loaded here rather than from batches/sections, which show the review state (no import cycle).
async function batchOf(p: Principal, batchId: number, what = 'batch'): Promise<Batch> {
  const b = await Batch.findByPk(batchId);
  if (!b) throw notFound(what);
  assertProject(p, b.projectId, what);
  return b;
}

export const DECISIONS = ['approved', 'returned'] as const;
export type Decision = (typeof DECISIONS)[number];
/** pending: no review applies to the current result yet. */
export type ReviewState = Decision | 'pending';

export interface ReviewBody {
  decision: string;
  comment: string;
}

export function reviewView(r: Review, reviewer?: User | null) {
  return {
    id: r.id,
    batchId: r.batchId,
    sectionId: r.sectionId,
    run: r.run,
    scope: r.sectionId === null ? 'batch' : 'section',
    decision: r.decision,
    comment: r.comment,
    reviewer: reviewer ? { id: reviewer.id, name: reviewer.name } : { id: r.reviewerId },
    at: r.createdAt,
  };
}

function checkBody(body: ReviewBody): { decision: Decision; comment: string } {
  if (!(DECISIONS as readonly string[]).includes(body.decision)) {
    throw invalid(`decision is one of ${DECISIONS.join(', ')}.`);
  }
  return { decision: body.decision as Decision, comment: body.comment.trim() };
}

/**
 * Nobody reviews their own work, whatever their role (admins included): not a batch they
 * submitted, and not a section whose current run they started with edits (for a whole batch:
 * any of its sections). 403 saying why.
 */
async function notOwn(p: Principal, batch: Batch, section?: SectionRow): Promise<void> {
  if (batch.submittedBy === p.userId) {
    throw forbidden(
      'You submitted this batch; its results must be reviewed by someone who did not.',
    );
  }
  if (section) {
    if (section.editedBy === p.userId) {
      throw forbidden(
        `You edited the current run (run ${section.run}) of section ${section.key}; it must be reviewed by someone who did not.`,
      );
    }
    return;
  }
  const edited = await SectionRow.findAll({
    where: { batchId: batch.id, editedBy: p.userId },
    attributes: ['key'],
    order: [['position', 'ASC']],
    limit: 5,
  });
  if (edited.length > 0) {
    throw forbidden(
      `You edited the current run of section ${edited.map((s) => s.key).join(', ')}${edited.length === 5 ? ' and perhaps more' : ''} of this batch; the batch must be reviewed by someone who did not.`,
    );
  }
}

export async function reviewSection(p: Principal, sectionId: number, body: ReviewBody) {
  const section = await SectionRow.findByPk(sectionId);
  if (!section) throw notFound('section');
  const batch = await batchOf(p, section.batchId, 'section');
  await notOwn(p, batch, section);
  const { decision, comment } = checkBody(body);
  if (section.status === 'queued' || section.status === 'running') {
    throw conflict(`Section ${section.key} is ${section.status}; review it when its run ends.`);
  }
  const review = await sequelize.transaction(async (t) => {
    const r = await Review.create(
      {
        batchId: batch.id,
        sectionId: section.id,
        reviewerId: p.userId,
        decision,
        comment,
        run: section.run,
      },
      { transaction: t },
    );
    await audit(
      p.userId,
      'review',
      'section',
      section.id,
      { decision, run: section.run, reviewId: r.id },
      t,
    );
    return r;
  });
  return { ...reviewView(review, await User.findByPk(p.userId)), caution: CAUTION };
}

export async function reviewBatch(p: Principal, batchId: number, body: ReviewBody) {
  const batch = await batchOf(p, batchId);
  await notOwn(p, batch);
  const { decision, comment } = checkBody(body);
  if (batch.status !== 'done')
    throw conflict('The batch is still running; review it when it is done.');
  const review = await sequelize.transaction(async (t) => {
    const r = await Review.create(
      { batchId: batch.id, sectionId: null, reviewerId: p.userId, decision, comment, run: null },
      { transaction: t },
    );
    await audit(p.userId, 'review', 'batch', batch.id, { decision, reviewId: r.id }, t);
    return r;
  });
  return { ...reviewView(review, await User.findByPk(p.userId)), caution: CAUTION };
}

async function withReviewers(rows: Review[]) {
  const ids = [...new Set(rows.map((r) => r.reviewerId))];
  const users = ids.length ? await User.findAll({ where: { id: { [Op.in]: ids } } }) : [];
  const byId = new Map(users.map((u) => [u.id, u]));
  return rows.map((r) => reviewView(r, byId.get(r.reviewerId)));
}

/** The review of a whole batch: its latest batch-level decision and the history. */
export async function batchReview(batchId: number) {
  const rows = await Review.findAll({
    where: { batchId, sectionId: null },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  const history = await withReviewers(rows);
  return {
    state: (rows[0]?.decision ?? 'pending') as ReviewState,
    latest: history[0] ?? null,
    history,
  };
}

/**
 * The review state of every section of a batch. The latest of these applies to a section's
 * current result: a review of that section's current run, or a review of the whole batch made
 * after that result was written. A re-run therefore starts again at pending.
 */
export async function sectionReviewStates(batchId: number): Promise<Map<number, Review | null>> {
  const sections = await SectionRow.findAll({ where: { batchId }, attributes: ['id', 'run'] });
  const results = await ResultRow.findAll({
    where: { sectionId: { [Op.in]: sections.map((s) => s.id) } },
    attributes: ['sectionId', 'run', 'updatedAt'],
  });
  const reviews = await Review.findAll({
    where: { batchId },
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
  });
  const out = new Map<number, Review | null>();
  for (const s of sections) {
    const current = results.find((r) => r.sectionId === s.id && r.run === s.run);
    let applies: Review | null = null;
    for (const r of reviews) {
      const own = r.sectionId === s.id && r.run === s.run;
      const whole =
        r.sectionId === null && current !== undefined && r.createdAt >= current.updatedAt;
      if (own || whole) applies = r;
    }
    out.set(s.id, applies);
  }
  return out;
}

/** One section's review: the state of its current result and every review of it. */
export async function sectionReview(section: SectionRow) {
  const applied = (await sectionReviewStates(section.batchId)).get(section.id) ?? null;
  const rows = await Review.findAll({
    where: { sectionId: section.id },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  const history = await withReviewers(rows);
  const latest = applied ? (await withReviewers([applied]))[0] : null;
  return { state: applied?.decision ?? 'pending', latest, history };
}
