import { Router } from 'express';
import { ALL, allow, principal } from '../middleware/auth';
import { loadBatch } from '../services/batches';
import { followBatch } from '../services/events';
import { idParam } from './params';

export const eventRoutes = Router();

/** Live progress as server-sent events; also takes ?access_token= (see middleware/auth). */
eventRoutes.get('/batches/:id/events', allow(...ALL), async (req, res) => {
  const b = await loadBatch(principal(req), idParam(req.params.id));
  res.status(200).set({
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  res.write('retry: 2000\n\n');
  const stop = new AbortController();
  res.on('close', () => stop.abort());
  await followBatch(
    b.id,
    (e) => void res.write(`event: ${e.event}\ndata: ${JSON.stringify(e.data)}\n\n`),
    stop.signal,
  );
  res.end();
});
