/**
 * Request bodies. A corridor batch (POST /projects/{id}/batches) and a re-run's edits (POST
 * /sections/{id}/runs) are taken as their text, up to JSON_LIMIT, and read off the main thread
 * by the intake pool (services/intake.ts); every other JSON body is small (BODY_LIMIT), parsed
 * here and screened by the core (screenData: nesting, sizes, U+0000 and lone surrogates in any
 * text or name) before any route sees it. Uploads (multipart) are the upload route's business.
 */
import express, { type RequestHandler } from 'express';
import { screenData } from '@scarpline/core/input';
import { config } from '../config';
import { Problem } from '../errors';

/** The routes whose JSON body is read by the intake pool, as its text. */
const TEXT_BODIES = [
  /^\/api\/v1\/projects\/[^/]+\/batches\/?$/,
  /^\/api\/v1\/sections\/[^/]+\/runs\/?$/,
];

export const isTextBody = (method: string, path: string): boolean =>
  method === 'POST' && TEXT_BODIES.some((r) => r.test(path));

const text = express.text({ type: 'application/json', limit: config.jsonLimit });
const json = express.json({ limit: config.bodyLimit });

/** A JSON path as the API's messages write it: `a.b[2]`. */
const pathText = (path: readonly (string | number)[]): string =>
  path.map((k, i) => (typeof k === 'number' ? `[${k}]` : i === 0 ? k : `.${k}`)).join('');

/** Parses the body (see above) and refuses a small JSON body that holds what no input may. */
export const bodies: RequestHandler = (req, res, next) => {
  if (isTextBody(req.method, req.path)) return text(req, res, next);
  json(req, res, (err?: unknown) => {
    if (err) return next(err);
    if (req.body === undefined || req.body === null || typeof req.body !== 'object') return next();
    const { refusal, issues } = screenData(req.body);
    const found = refusal ? [refusal] : issues;
    if (found.length === 0) return next();
    const errors = found.slice(0, 20).map((i) => ({
      severity: 'error',
      path: pathText(i.path),
      code: i.code,
      message: i.message,
      text: `${pathText(i.path) || 'body'}: ${i.message}`,
    }));
    next(
      new Problem(
        422,
        'Invalid input',
        `${errors[0].text}${found.length > 1 ? ` (and ${found.length - 1} more)` : ''}`,
        {
          errors,
        },
      ),
    );
  });
};
