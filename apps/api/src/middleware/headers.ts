/** Response headers that depend on the request: HSTS over HTTPS only, no caching of the API. */
import type { RequestHandler } from 'express';
import helmet from 'helmet';

const hsts = helmet.strictTransportSecurity({ maxAge: 31_536_000, includeSubDomains: true });

/**
 * Strict-Transport-Security only on a request that came over HTTPS (RFC 6797 §7.2: a host
 * sends it over secure transport only): the connection's own TLS, or X-Forwarded-Proto from a
 * proxy that TRUST_PROXY trusts (`req.secure`).
 */
export const hstsOverHttps: RequestHandler = (req, res, next) =>
  req.secure ? hsts(req, res, next) : next();

/**
 * The API's answers hold people's names and addresses and what they did: no cache keeps them
 * (`Cache-Control: no-store`), unless a route says otherwise.
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.set('Cache-Control', 'no-store');
  next();
};
