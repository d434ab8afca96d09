import { Router } from 'express';
import { API_LIMITS } from '../limits';
import { allow, principal } from '../middleware/auth';
import { requestReview } from '../services/review-requests';
import { idParam, objectBody, text } from './params';

export const reviewRequestRoutes = Router();

reviewRequestRoutes.post(
  '/batches/:id/review-requests',
  allow('admin', 'engineer'),
  async (req, res) => {
    const comment = text(objectBody(req.body), 'comment', API_LIMITS.comment, { optional: true });
    res.status(202).json(await requestReview(principal(req), idParam(req.params.id), { comment }));
  },
);
