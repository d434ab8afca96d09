/**
 * A TCP relay between the API and the test database, for tests that take the database away:
 * `down()` drops every connection and refuses new ones, `up()` relays again on the same port.
 * Imports nothing of the API, so that a test can point DATABASE_URL at it before the API's
 * modules are loaded (they read it once).
 */
import net from 'node:net';

export interface DbRelay {
  /** DATABASE_URL through the relay. */
  url: string;
  up(): Promise<void>;
  down(): Promise<void>;
  close(): Promise<void>;
}

export async function dbRelay(databaseUrl: string): Promise<DbRelay> {
  const target = new URL(databaseUrl);
  const sockets = new Set<net.Socket>();
  let server: net.Server | null = null;
  let port = 0;
  const up = () =>
    new Promise<void>((resolve) => {
      const s = net.createServer((client) => {
        const db = net.connect(Number(target.port || 5432), target.hostname);
        for (const end of [client, db]) {
          sockets.add(end);
          end.on('close', () => sockets.delete(end));
          end.on('error', () => undefined);
        }
        client.pipe(db).pipe(client);
      });
      server = s;
      s.listen(port, '127.0.0.1', () => {
        port = (s.address() as net.AddressInfo).port;
        resolve();
      });
    });
  const down = () =>
    new Promise<void>((resolve) => {
      for (const s of sockets) s.destroy();
      const s = server;
      server = null;
      if (s) s.close(() => resolve());
      else resolve();
    });
  await up();
  const url = new URL(databaseUrl);
  url.port = String(port);
  return { url: url.toString(), up, down, close: down };
}
