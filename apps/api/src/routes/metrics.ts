import crypto from 'node:crypto';
import { Router, type Request } from 'express';
import { config } from '../config';
import { forbidden, unauthorized } from '../errors';
import { metricsText } from '../services/metrics';

/**
 * Prometheus metrics. With METRICS_TOKEN set, the scraper sends it as a bearer token; without,
 * only the machine itself may ask (a loopback address, and no proxy's forwarding header).
 */
export const metricsRoutes = Router();

const LOOPBACK = /^(127\.\d+\.\d+\.\d+|::1|::ffff:127\.\d+\.\d+\.\d+)$/;

function sameSecret(given: string, expected: string): boolean {
  const a = crypto.createHash('sha256').update(given).digest();
  const b = crypto.createHash('sha256').update(expected).digest();
  return crypto.timingSafeEqual(a, b);
}

function mayScrape(req: Request): void {
  if (config.metricsToken) {
    const given = /^Bearer (.+)$/i.exec(req.get('authorization') ?? '')?.[1] ?? '';
    if (!sameSecret(given, config.metricsToken)) {
      throw unauthorized('/metrics asks for the bearer token set in METRICS_TOKEN.');
    }
    return;
  }
  const forwarded = req.get('forwarded') ?? req.get('x-forwarded-for');
  if (!LOOPBACK.test(req.socket.remoteAddress ?? '') || forwarded !== undefined) {
    throw forbidden(
      '/metrics answers only this machine (loopback) while METRICS_TOKEN is not set: set it to scrape from elsewhere.',
    );
  }
}

metricsRoutes.get('/metrics', async (req, res) => {
  mayScrape(req);
  const { contentType, text } = await metricsText();
  res.set('Cache-Control', 'no-store').type(contentType).send(text);
});
