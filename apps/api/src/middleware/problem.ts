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

export const problemHandler: ErrorRequestHandler = (err, req, res, next) => {
  if (res.headersSent) return next(err);
  let problem: Problem;
  if (err instanceof Problem) problem = err;
  else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.parse.failed') {
    problem = new Problem(400, 'Malformed JSON', String((err as Error).message));
  } else if (err && typeof err === 'object' && 'type' in err && err.type === 'entity.too.large') {
    problem = new Problem(413, 'Content too large', 'The request body is larger than allowed.');
  } else if (err && typeof err === 'object' && 'code' in err && err.code === 'LIMIT_FILE_SIZE') {
    problem = new Problem(413, 'Content too large', 'An uploaded file is larger than allowed.');
  } else if (err && typeof err === 'object' && 'name' in err && err.name === 'MulterError') {
    problem = new Problem(400, 'Bad upload', String((err as Error).message));
  } else {
    // Unknown errors: logged here, never shown (no stack traces in responses).
    console.error(err);
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
      ...problem.extra,
    });
};
