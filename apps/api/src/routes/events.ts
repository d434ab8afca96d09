import { Router } from 'express';
import { config } from '../config';
import { tooMany } from '../errors';
import { ALL, allow, principal } from '../middleware/auth';
import { loadBatch } from '../services/batches';
import { followBatch } from '../services/events';
import { idParam } from './params';

export const eventRoutes = Router();

/** Streams open now, by user: at most STREAMS_PER_USER each. */
const open = new Map<number, number>();

/** Live progress as server-sent events; also takes ?access_token= (see middleware/auth). */
eventRoutes.get('/batches/:id/events', allow(...ALL), async (req, res) => {
  const p = principal(req);
  const b = await loadBatch(p, idParam(req.params.id));
  const held = open.get(p.userId) ?? 0;
  if (held >= config.streamsPerUser) {
    throw tooMany(
      `You have ${held} live-progress streams open, the most one user may; close one (EventSource.close) first.`,
    );
  }
  open.set(p.userId, held + 1);
  const stop = new AbortController();
  res.on('close', () => {
    stop.abort();
  });
  try {
    res.status(200).set({
      'Content-Type': 'text/event-stream; charset=utf-8',
      'Cache-Control': 'no-store, no-transform',
      Connection: 'keep-alive',
      'X-Accel-Buffering': 'no',
    });
    res.flushHeaders();
    res.write('retry: 2000\n\n');
    await followBatch(
      b.id,
      (e) => void res.write(`event: ${e.event}\ndata: ${JSON.stringify(e.data)}\n\n`),
      stop.signal,
    );
    res.end();
  } finally {
    const left = (open.get(p.userId) ?? 1) - 1;
    if (left > 0) open.set(p.userId, left);
    else open.delete(p.userId);
  }
});
