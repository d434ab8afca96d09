import { Router } from 'express';
import { allow, principal } from '../middleware/auth';
import { requestReview } from '../services/review-requests';
import { idParam } from './params';

export const reviewRequestRoutes = Router();

reviewRequestRoutes.post(
  '/batches/:id/review-requests',
  allow('admin', 'engineer'),
  async (req, res) => {
    const body = (req.body ?? {}) as { comment?: unknown };
    res.status(202).json(await requestReview(principal(req), idParam(req.params.id), body));
  },
);
