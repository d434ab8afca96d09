/** The one error middleware: every error leaves as application/problem+json (RFC 9457). */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ConnectionError } from 'sequelize';
import { Problem } from '../errors';
import { StorageMissing, StorageUnavailable } from '../storage';

const TYPE_BASE = 'https://scarpline.example/problems/';

function slug(title: string): string {
  return title.toLowerCase().replace(/[^a-z0-9]+/g, '-');
}

export const notFoundRoute: RequestHandler = (req, _res, next) => {
  next(new Problem(404, 'Not found', `No route ${req.method} ${req.path}.`));
};

/** A member of a thrown value (body-parser's and multer's errors carry type, code, name). */
const field = (err: unknown, key: string): unknown =>
  err !== null && typeof err === 'object' ? (err as Record<string, unknown>)[key] : undefined;

/** Titles of the client errors that body-parser, busboy and zlib raise, by status. */
const CLIENT_TITLES: Record<number, string> = {
  400: 'Bad request',
  411: 'Length required',
  413: 'Content too large',
  415: 'Unsupported media type',
};

/** Network errors of a lost or refused connection to PostgreSQL. */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH']);
const LOST =
  /Connection terminated|connection timeout|Client has encountered a connection error|the database system is (starting up|shutting down|in recovery mode)|Connection is closed/i;

/**
 * Whether an error says that PostgreSQL cannot be reached or is going away (not that a query
 * was wrong): Sequelize's connection errors, network errors, and PostgreSQL's classes 08
 * (connection exception), 53 (insufficient resources) and 57P (operator intervention), found
 * on the error or the errors it wraps (Sequelize's `parent`, `original`, a `cause`).
 */
export function isDatabaseDown(err: unknown, depth = 0): boolean {
  if (err === null || typeof err !== 'object' || depth > 4) return false;
  if (err instanceof ConnectionError) return true;
  const code = field(err, 'code');
  if (typeof code === 'string' && (NETWORK_CODES.has(code) || /^(08|53|57P)/.test(code))) {
    return true;
  }
  const message = field(err, 'message');
  if (typeof message === 'string' && LOST.test(message)) return true;
  return ['parent', 'original', 'cause'].some((k) => isDatabaseDown(field(err, k), depth + 1));
}

/** The problem an error answers as. */
export function problemOf(err: unknown): Problem {
  if (err instanceof Problem) return err;
  const type = field(err, 'type');
  const status = field(err, 'status');
  if (type === 'entity.parse.failed') {
    return new Problem(400, 'Malformed JSON', String(field(err, 'message')));
  }
  if (type === 'entity.too.large') {
    return new Problem(413, 'Content too large', 'The request body is larger than allowed.');
  }
  if (field(err, 'code') === 'LIMIT_FILE_SIZE') {
    return new Problem(413, 'Content too large', 'An uploaded file is larger than allowed.');
  }
  if (field(err, 'name') === 'MulterError') {
    return new Problem(400, 'Bad upload', String(field(err, 'message')));
  }
  // body-parser's and zlib's client errors (a charset or encoding not taken, a broken gzip
  // body): http-errors that may be shown; the router's for a path it cannot decode (`%zz`).
  const client = field(err, 'expose') === true || field(err, 'name') === 'URIError';
  if (typeof status === 'number' && status >= 400 && status < 500 && client) {
    return new Problem(
      status,
      CLIENT_TITLES[status] ?? 'Bad request',
      String(field(err, 'message')),
    );
  }
  // Before the database's check: a storage outage carries the same network codes.
  if (err instanceof StorageMissing) {
    return new Problem(404, 'Not found', 'The stored file is missing from storage.');
  }
  if (err instanceof StorageUnavailable) {
    return new Problem(
      503,
      'Service unavailable',
      'File storage cannot be reached just now; try again in a little while.',
    );
  }
  if (isDatabaseDown(err)) {
    return new Problem(
      503,
      'Service unavailable',
      'The database cannot be reached just now; try again in a little while.',
    );
  }
  // Unknown errors: logged by the handler, never shown (no stack traces in responses).
  return new Problem(500, 'Internal server error', 'Something went wrong on our side.');
}

export const problemHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) return next(err);
  const problem = problemOf(err);
  // Unknown errors: logged here with the request's id, never shown (no stack traces).
  if (problem.status === 500) req.log.error({ err }, 'unhandled error');
  if (problem.status === 503) res.set('Retry-After', '5');
  if (problem.status === 411 || problem.status === 413) res.set('Connection', 'close');
  res
    .status(problem.status)
    .type('application/problem+json')
    .json({
      type: TYPE_BASE + slug(problem.title),
      title: problem.title,
      status: problem.status,
      ...(problem.detail ? { detail: problem.detail } : {}),
      instance: req.originalUrl,
      // The id of this request in the logs (and the X-Request-Id header): quote it to an operator.
      requestId: req.id,
      ...problem.extra,
    });
};
