/**
 * Review requests: an engineer (or an admin) asks the reviewers to look at a finished batch.
 * Every active reviewer sees every project, so they are the project's reviewers; the batch's
 * submitter is left out, since nobody reviews a batch they submitted.
 */
import { Op } from 'sequelize';
import { CAUTION } from '@scarpline/core/caution';
import { conflict, invalid } from '../errors';
import { User } from '../models';
import { audit } from './audit';
import type { Principal } from './auth';
import { loadBatch } from './batches';
import { reviewRequested } from './mail';

export async function requestReview(p: Principal, batchId: number, body: { comment?: unknown }) {
  const batch = await loadBatch(p, batchId);
  if (body.comment !== undefined && typeof body.comment !== 'string') {
    throw invalid('comment is a string.');
  }
  const comment = (body.comment ?? '').trim();
  if (comment.length > 5000) throw invalid('comment has at most 5000 characters.');
  if (batch.status !== 'done') {
    throw conflict('The batch is still running; request a review once it has finished.');
  }
  const reviewers = await User.findAll({
    where: { role: 'reviewer', active: true, id: { [Op.ne]: batch.submittedBy } },
    order: [['id', 'ASC']],
  });
  if (reviewers.length === 0) throw conflict('There is no reviewer to ask.');
  const recipients = reviewers.map((u) => u.email);
  const sent = await reviewRequested(batch, p, recipients, comment);
  await audit(p.userId, 'request-review', 'batch', batch.id, { recipients, sent });
  return { batchId: batch.id, requestedBy: p.userId, recipients, comment, sent, caution: CAUTION };
}
