import { Router } from 'express';
import { API_LIMITS } from '../limits';
import { allow, principal } from '../middleware/auth';
import { reviewBatch, reviewSection } from '../services/reviews';
import { idParam, objectBody, text } from './params';

export const reviewRoutes = Router();
const reviewers = allow('admin', 'reviewer');

const decisionOf = (body: unknown) => {
  const b = objectBody(body);
  return { decision: text(b, 'decision', 20), comment: text(b, 'comment', API_LIMITS.comment) };
};

reviewRoutes.post('/sections/:id/reviews', reviewers, async (req, res) => {
  const body = decisionOf(req.body);
  res.status(201).json(await reviewSection(principal(req), idParam(req.params.id), body));
});

reviewRoutes.post('/batches/:id/reviews', reviewers, async (req, res) => {
  const body = decisionOf(req.body);
  res.status(201).json(await reviewBatch(principal(req), idParam(req.params.id), body));
});
