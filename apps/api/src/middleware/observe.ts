/**
 * What an operator sees of each request: a request id (the caller's X-Request-Id when it is a
 * plain token, else a new UUID) echoed in the X-Request-Id response header and in problem+json
 * bodies; one JSON log line per request (pino-http: method, URL with any access token blanked,
 * status, time, request id); and the request's time in the Prometheus histogram, by method,
 * route as registered (never the raw URL, so ids do not make new series) and status.
 */
import crypto from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import type { RequestHandler } from 'express';
import { pinoHttp } from 'pino-http';
import { log, safeUrl } from '../log';
import { httpDuration } from '../metrics';

const GIVEN_ID = /^[A-Za-z0-9._:-]{1,128}$/;
/** Asked every few seconds by load balancers and scrapers: logged only when they do not answer 2xx. */
const QUIET = new Set(['/health', '/ready', '/metrics']);

export const requestLog = pinoHttp({
  logger: log,
  genReqId(req: IncomingMessage, res: ServerResponse) {
    const given = req.headers['x-request-id'];
    const id = typeof given === 'string' && GIVEN_ID.test(given) ? given : crypto.randomUUID();
    res.setHeader('X-Request-Id', id);
    return id;
  },
  customLogLevel(req, res, err) {
    // A probe's 503 (not ready) is news, not an error of the service.
    if (QUIET.has((req.url ?? '').split('?')[0])) return res.statusCode < 400 ? 'silent' : 'warn';
    if (err || res.statusCode >= 500) return 'error';
    return res.statusCode >= 400 ? 'warn' : 'info';
  },
  serializers: {
    req: (req: { id: unknown; method: string; url: string; remoteAddress?: string }) => ({
      id: req.id,
      method: req.method,
      url: safeUrl(req.url),
      remoteAddress: req.remoteAddress,
    }),
    res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
  },
});

/** The request's route as registered (`/batches/:id`), or `(none)` when no route answered it. */
function routeOf(req: { route?: { path?: unknown } }): string {
  const p = req.route?.path;
  return typeof p === 'string' ? p : '(none)';
}

export const requestMetrics: RequestHandler = (req, res, next) => {
  const end = httpDuration.startTimer();
  res.once('close', () => {
    end({ method: req.method, route: routeOf(req), status: String(res.statusCode) });
  });
  next();
};
