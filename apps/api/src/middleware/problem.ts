/** The one error middleware: every error leaves as application/problem+json (RFC 9457). */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { Problem } from '../errors';

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

export const problemHandler: ErrorRequestHandler = (err: unknown, req, res, next) => {
  if (res.headersSent) return next(err);
  let problem: Problem;
  if (err instanceof Problem) problem = err;
  else if (field(err, 'type') === 'entity.parse.failed') {
    problem = new Problem(400, 'Malformed JSON', String(field(err, 'message')));
  } else if (field(err, 'type') === 'entity.too.large') {
    problem = new Problem(413, 'Content too large', 'The request body is larger than allowed.');
  } else if (field(err, 'code') === 'LIMIT_FILE_SIZE') {
    problem = new Problem(413, 'Content too large', 'An uploaded file is larger than allowed.');
  } else if (field(err, 'name') === 'MulterError') {
    problem = new Problem(400, 'Bad upload', String(field(err, 'message')));
  } else {
    // Unknown errors: logged here, never shown (no stack traces in responses).
    req.log.error({ err }, 'unhandled error');
    problem = new Problem(500, 'Internal server error', 'Something went wrong on our side.');
  }
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
