import { Router } from 'express';
import { allow, principal } from '../middleware/auth';
import { reviewBatch, reviewSection } from '../services/reviews';
import { idParam, str } from './params';

export const reviewRoutes = Router();
const reviewers = allow('admin', 'reviewer');

reviewRoutes.post('/sections/:id/reviews', reviewers, async (req, res) => {
  const body = { decision: str(req.body, 'decision'), comment: str(req.body, 'comment') };
  res.status(201).json(await reviewSection(principal(req), idParam(req.params.id), body));
});

reviewRoutes.post('/batches/:id/reviews', reviewers, async (req, res) => {
  const body = { decision: str(req.body, 'decision'), comment: str(req.body, 'comment') };
  res.status(201).json(await reviewBatch(principal(req), idParam(req.params.id), body));
});
