/**
 * The web app's production build (index.html and hashed assets) served beside the API: files
 * as they are, and index.html for any other page a browser asks for (GET, accepts text/html,
 * not under /api), so deep links such as /batches/12 open the app, which routes them itself.
 */
import express, { Router } from 'express';
import fs from 'node:fs';
import path from 'node:path';

/** name-HASH.ext as the Angular build writes it: the name changes whenever the content does. */
const HASHED = /-[A-Z0-9]{8}\.[A-Za-z0-9]+$/;
const LONG = 'public, max-age=31536000, immutable';
/** Cached, but checked with the server (ETag) before each use. */
const REVALIDATE = 'no-cache';

const isApi = (p: string) => p === '/api' || p.startsWith('/api/');

/** True when the folder holds a build (an index.html). */
export function hasWebBuild(dist: string): boolean {
  return fs.existsSync(path.join(dist, 'index.html'));
}

/** Cache-Control of a file of the build: long for hashed names, revalidate for the rest. */
export function cacheControlOf(file: string): string {
  const name = path.basename(file);
  return name !== 'index.html' && HASHED.test(name) ? LONG : REVALIDATE;
}

/** Whether the request is a browser asking for a page (not a script, an image or JSON). */
function wantsPage(req: express.Request): boolean {
  if (req.method !== 'GET' && req.method !== 'HEAD') return false;
  if (isApi(req.path)) return false;
  const accept = req.get('accept') ?? '';
  return /\btext\/html\b/.test(accept) && req.accepts('html') === 'html';
}

export function webRoutes(dist: string): Router {
  const root = path.resolve(dist);
  const index = path.join(root, 'index.html');
  const router = Router();
  const files = express.static(root, {
    index: false,
    redirect: false,
    cacheControl: false,
    setHeaders: (res, file) => void res.setHeader('Cache-Control', cacheControlOf(file)),
  });
  router.use((req, res, next) => (isApi(req.path) ? next() : files(req, res, next)));
  router.use((req, res, next) => {
    if (!wantsPage(req)) return next();
    res.setHeader('Cache-Control', REVALIDATE);
    res.sendFile(index, { cacheControl: false }, (err) => err && next(err));
  });
  return router;
}
