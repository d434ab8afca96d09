/** passport-http-bearer on every route but sign-in; roles checked per route. */
import type { RequestHandler } from 'express';
import passport from 'passport';
import { Strategy as BearerStrategy } from 'passport-http-bearer';
import { forbidden, Problem, unauthorized } from '../errors';
import type { Role } from '../models';
import { principalOf, type Principal } from '../services/auth';

passport.use(
  new BearerStrategy((token, done) => {
    principalOf(token).then(
      (p) => done(null, p ?? false),
      (e) => done(e),
    );
  }),
);

/** The one route that takes `?access_token=` (EventSource cannot send headers). */
const QUERY_TOKEN_ROUTE = /^\/batches\/[^/]+\/events$/;

/** What a user who must replace their password may do until they have: these alone. */
const BEFORE_NEW_PASSWORD = new Set(['GET /me', 'POST /me/password', 'POST /auth/logout']);

export const authenticate: RequestHandler = (req, res, next) => {
  // passport-http-bearer also reads access_token from the query and the body; only the
  // live-progress stream may use the query, and no route the body.
  const query = req.query as Record<string, unknown>;
  const body = req.body as Record<string, unknown> | undefined;
  if (
    (query.access_token !== undefined &&
      !(req.method === 'GET' && QUERY_TOKEN_ROUTE.test(req.path))) ||
    (body && typeof body === 'object' && body.access_token !== undefined)
  ) {
    return next(
      unauthorized(
        'Send the token in the Authorization header; ?access_token= is accepted only by GET /batches/{id}/events.',
      ),
    );
  }
  const check = passport.authenticate(
    'bearer',
    { session: false },
    (err: unknown, user: Principal | false) => {
      if (err) return next(err);
      if (!user) return next(unauthorized());
      req.user = user;
      if (user.mustChangePassword && !BEFORE_NEW_PASSWORD.has(`${req.method} ${req.path}`)) {
        return next(
          new Problem(
            403,
            'Password change required',
            'You signed in with the password you were sent: choose your own password first (POST /me/password).',
          ),
        );
      }
      next();
    },
  ) as RequestHandler;
  check(req, res, next);
};

/** Only these roles may pass. */
export function allow(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    const p = req.user as Principal | undefined;
    if (!p) return next(unauthorized());
    if (!roles.includes(p.role)) return next(forbidden());
    next();
  };
}

export function principal(req: { user?: unknown }): Principal {
  if (!req.user) throw unauthorized();
  return req.user as Principal;
}

export const ALL: Role[] = ['admin', 'engineer', 'reviewer', 'viewer', 'integration'];
