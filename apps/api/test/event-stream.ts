/**
 * A client of the API's server-sent events for tests that read a stream while it is open:
 * collects the events as they come and waits for one that matches, with a bound.
 */
import http from 'node:http';

export interface SseEvent {
  event: string;
  data: Record<string, unknown>;
}

export interface OpenStream {
  events: SseEvent[];
  /** Resolves with the first event (already come or to come) that matches; rejects after `limitMs`. */
  waitFor(match: (e: SseEvent) => boolean, limitMs?: number): Promise<SseEvent>;
  /** Resolves when the server ends the stream. */
  ended: Promise<void>;
  close(): void;
}

export function openStream(url: string, headers: Record<string, string> = {}): OpenStream {
  const events: SseEvent[] = [];
  const waiters = new Set<() => void>();
  let buffer = '';
  let endStream: () => void = () => {};
  const ended = new Promise<void>((resolve) => (endStream = resolve));
  const req = http.get(url, { headers: { accept: 'text/event-stream', ...headers } }, (res) => {
    res.setEncoding('utf8');
    res.on('data', (chunk: string) => {
      buffer += chunk;
      let cut: number;
      while ((cut = buffer.indexOf('\n\n')) >= 0) {
        const block = buffer.slice(0, cut);
        buffer = buffer.slice(cut + 2);
        const lines = block.split('\n');
        const event = lines.find((l) => l.startsWith('event: '))?.slice(7);
        const data = lines.find((l) => l.startsWith('data: '))?.slice(6);
        if (event && data !== undefined) {
          events.push({ event, data: JSON.parse(data) as Record<string, unknown> });
          for (const w of waiters) w();
        }
      }
    });
    res.on('end', endStream);
    res.on('close', endStream);
  });
  req.on('error', endStream);
  return {
    events,
    ended,
    waitFor(match, limitMs = 20000) {
      return new Promise((resolve, reject) => {
        const check = () => {
          const found = events.find(match);
          if (!found) return;
          clearTimeout(timer);
          waiters.delete(check);
          resolve(found);
        };
        const timer = setTimeout(() => {
          waiters.delete(check);
          reject(new Error(`no matching event in ${limitMs} ms: ${JSON.stringify(events)}`));
        }, limitMs);
        waiters.add(check);
        check();
      });
    },
    close: () => req.destroy(),
  };
}
