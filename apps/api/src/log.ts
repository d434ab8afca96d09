/**
 * The process's logger: JSON lines on stdout (pino), one object a line with `level`, `time`,
 * `pid`, `hostname`, `service` (api or worker, once logAs has named the process) and `msg`. LOG_LEVEL sets the level (silent under
 * the tests unless set). Everything the API and the workers say goes through here.
 */
import os from 'node:os';
import pino from 'pino';
import { config } from './config';

export const log = pino({
  level: config.logLevel,
  base: { pid: process.pid, hostname: os.hostname() },
  timestamp: pino.stdTimeFunctions.isoTime,
  formatters: { level: (label) => ({ level: label }) },
});

/** Names the process in every line from now on (`api`, `worker`). */
export function logAs(service: string): void {
  log.setBindings({ service });
}

/** A URL with its access token (EventSource sends ?access_token=) blanked out. */
export function safeUrl(url: string): string {
  return url.replace(/([?&]access_token=)[^&#]*/gi, '$1[redacted]');
}
