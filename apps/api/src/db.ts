/**
 * The one Sequelize instance of a process, and how a process rides out an outage of the
 * database (a restart, a failover): which errors mean "the database is not there right now",
 * and a retry of an operation until it is back.
 */
import { setTimeout as delay } from 'node:timers/promises';
import { ConnectionError, Sequelize } from 'sequelize';
import { config } from './config';

export const sequelize = new Sequelize(config.databaseUrl, {
  dialect: 'postgres',
  logging: false,
  pool: { max: config.databasePoolMax },
  define: { underscored: true },
});

/** Socket errors of a lost or refused connection. */
const SOCKET_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'EHOSTUNREACH']);
/**
 * PostgreSQL's SQLSTATEs of a server going away or not taking connections: class 08
 * (connection exception), 57P01–57P03 (admin shutdown, crash shutdown, cannot connect now: "the
 * database system is shutting down / starting up"), 53300 (too many connections).
 */
const SERVER_CODES = /^(08...|57P0[123]|53300)$/;
/** Errors node-postgres raises without a code when a connection ends under it. */
const LOST =
  /Connection terminated|connection is closed|Client has encountered a connection error|Connection ended/i;

/**
 * Whether an error means the database cannot be reached at the moment (as opposed to a query
 * it refused): the same operation may succeed once it is back. Looks through Sequelize's
 * wrappers (`parent`, `original`) and `cause`.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  const seen = new Set<unknown>();
  let e: unknown = error;
  while (e && typeof e === 'object' && !seen.has(e)) {
    seen.add(e);
    if (e instanceof ConnectionError) return true;
    const o = e as { code?: unknown; message?: unknown; parent?: unknown; original?: unknown };
    if (typeof o.code === 'string' && (SOCKET_CODES.has(o.code) || SERVER_CODES.test(o.code))) {
      return true;
    }
    if (typeof o.message === 'string' && LOST.test(o.message)) return true;
    e = o.parent ?? o.original ?? (e as { cause?: unknown }).cause;
  }
  return false;
}

/**
 * Runs `operation`, and again after a pause (0.2 s doubling to 5 s) for as long as it fails
 * because the database is unavailable; any other error is thrown at once. `onWait` is told of
 * each failure (to log the first). Stops with the abort reason when `signal` aborts.
 */
export async function whenDatabaseIsBack<T>(
  operation: () => Promise<T>,
  options: { signal?: AbortSignal; onWait?: (error: unknown, attempt: number) => void } = {},
): Promise<T> {
  let pause = 200;
  for (let attempt = 1; ; attempt++) {
    options.signal?.throwIfAborted();
    try {
      return await operation();
    } catch (e) {
      if (!isDatabaseUnavailable(e)) throw e;
      options.onWait?.(e, attempt);
    }
    await delay(pause, undefined, { signal: options.signal });
    pause = Math.min(pause * 2, 5000);
  }
}
