import { Router, type Request } from 'express';
import { rateLimit } from 'express-rate-limit';
import { config } from '../config';
import { tooMany } from '../errors';
import { API_LIMITS } from '../limits';
import { ALL, allow, authenticate, principal } from '../middleware/auth';
import { changePassword, login, logout, normalEmail } from '../services/auth';
import { objectBody, str } from './params';

export const authRoutes = Router();

const refuse = (detail: string) => (_req: Request, _res: unknown, next: (e: unknown) => void) =>
  next(tooMany(detail));

/** Sign-in attempts per address (IP) per window, successful or not. */
const perAddress = rateLimit({
  windowMs: config.loginWindowMs,
  limit: config.loginLimit,
  standardHeaders: 'draft-8',
  legacyHeaders: false,
  handler: refuse('Too many sign-in attempts; wait and try again.'),
});

/** The e-mail address a request names, as accounts are stored, for the per-account limit. */
const accountOf = (req: Request): string => {
  const email = (req.body as Record<string, unknown> | undefined)?.email;
  return `account:${typeof email === 'string' ? normalEmail(email).slice(0, API_LIMITS.email) : ''}`;
};

/**
 * Failed sign-ins per account per window, from any address: guessing one account's password
 * from many addresses is stopped too. A successful sign-in does not count.
 */
const perAccount = rateLimit({
  windowMs: config.loginWindowMs,
  limit: config.loginAccountLimit,
  standardHeaders: 'draft-8',
  legacyHeaders: false,
  // only a wrong password counts (401), not a malformed request
  skipSuccessfulRequests: true,
  requestWasSuccessful: (_req, res) => res.statusCode !== 401,
  keyGenerator: accountOf,
  handler: refuse('Too many failed sign-ins for this account; wait and try again.'),
});

/** Wrong current passwords per signed-in user per window (changing one's password). */
const perUser = rateLimit({
  windowMs: config.loginWindowMs,
  limit: config.loginAccountLimit,
  standardHeaders: 'draft-8',
  legacyHeaders: false,
  // only a wrong current password counts (403)
  skipSuccessfulRequests: true,
  requestWasSuccessful: (_req, res) => res.statusCode !== 403,
  keyGenerator: (req) => `user:${principal(req).userId}`,
  handler: refuse('Too many wrong passwords; wait and try again.'),
});

authRoutes.post('/auth/login', perAddress, perAccount, async (req, res) => {
  const body = objectBody(req.body);
  res.json(
    await login(
      str(body, 'email', false, API_LIMITS.email),
      str(body, 'password', false, API_LIMITS.passwordMax),
    ),
  );
});

authRoutes.post('/auth/logout', authenticate, allow(...ALL), async (req, res) => {
  await logout(principal(req));
  res.status(204).end();
});

authRoutes.get('/me', authenticate, allow(...ALL), (req, res) => {
  const p = principal(req);
  res.json({
    id: p.userId,
    email: p.email,
    name: p.name,
    role: p.role,
    projectIds: p.projectIds,
    mustChangePassword: p.mustChangePassword ?? false,
  });
});

/** A signed-in person changes their own password (integration users have none). */
authRoutes.post(
  '/me/password',
  authenticate,
  allow('admin', 'engineer', 'reviewer', 'viewer'),
  perUser,
  async (req, res) => {
    const body = objectBody(req.body);
    const current = str(body, 'currentPassword', false, API_LIMITS.passwordMax);
    const next = str(body, 'newPassword', false, API_LIMITS.passwordMax);
    res.json(await changePassword(principal(req), current, next));
  },
);
