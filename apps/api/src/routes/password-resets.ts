import { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { config } from '../config';
import { tooMany } from '../errors';
import { API_LIMITS } from '../limits';
import { normalEmail } from '../services/auth';
import { confirmReset, requestReset } from '../services/password-resets';
import { objectBody, str, text } from './params';

export const passwordResetRoutes = Router();

const limit = (n: number, detail: string) =>
  rateLimit({
    windowMs: config.loginWindowMs,
    limit: n,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    handler: (_req, _res, next) => next(tooMany(detail)),
  });
const asking = limit(
  config.loginLimit,
  'Too many requests for a new password; wait and try again.',
);
/** Links asked for one address per window (so that nobody's mailbox is flooded). */
const perAccount = rateLimit({
  windowMs: config.loginWindowMs,
  limit: 3,
  standardHeaders: 'draft-8',
  legacyHeaders: false,
  keyGenerator: (req) => {
    const email = (req.body as Record<string, unknown> | undefined)?.email;
    return `reset:${typeof email === 'string' ? normalEmail(email).slice(0, API_LIMITS.email) : ''}`;
  },
  handler: (_req, _res, next) =>
    next(tooMany('Links for this address were asked for several times; wait and try again.')),
});
const setting = limit(
  config.loginLimit,
  'Too many attempts to set a password; wait and try again.',
);

/**
 * Asks for a link to set a new password. Answered 202 at once, the same for any address: the
 * mail (when there is an account) is sent after the answer, so that neither the answer nor its
 * time says whether the address has an account.
 */
passwordResetRoutes.post('/password-resets', asking, perAccount, (req, res) => {
  const email = text(objectBody(req.body), 'email', API_LIMITS.email);
  requestReset(email).catch((e: unknown) => console.error('password reset:', e));
  res.status(202).json({
    detail: 'If an account has this address, a link to set a new password is on its way to it.',
    expiresInMinutes: config.resetMinutes,
  });
});

/** Sets a new password with the token of a mailed link. */
passwordResetRoutes.post('/password-resets/confirm', setting, async (req, res) => {
  const body = objectBody(req.body);
  const token = text(body, 'token', 200);
  const password = str(body, 'password', false, API_LIMITS.passwordMax);
  res.json(await confirmReset(token, password));
});
