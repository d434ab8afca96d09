import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { config } from '../config';
import { Problem } from '../errors';
import { ALL, allow, authenticate, principal } from '../middleware/auth';
import { login, logout } from '../services/auth';
import { str } from './params';

export const authRoutes = Router();

const limiter = rateLimit({
  windowMs: config.loginWindowMs,
  limit: config.loginLimit,
  standardHeaders: 'draft-8',
  legacyHeaders: false,
  handler: (_req, _res, next) =>
    next(new Problem(429, 'Too many requests', 'Too many sign-in attempts; wait and try again.')),
});

authRoutes.post('/auth/login', limiter, async (req, res) => {
  res.json(await login(str(req.body, 'email'), str(req.body, 'password')));
});

authRoutes.post('/auth/logout', authenticate, allow(...ALL), async (req, res) => {
  await logout(principal(req));
  res.status(204).end();
});

authRoutes.get('/me', authenticate, allow(...ALL), (req, res) => {
  const p = principal(req);
  res.json({ id: p.userId, email: p.email, name: p.name, role: p.role, projectIds: p.projectIds });
});
