// Times sections through the built core on worker threads (bench/worker.js), fed `chunk`
// sections a message to whichever thread answers first; loading the core is not counted (each
// thread first answers an empty chunk). Shared by the solver's bench (run.js) and the API's
// (apps/api/bench/batch-300.js), which compares the service with it.
const { join } = require('node:path');
const { Worker } = require('node:worker_threads');

/** Milliseconds the pool takes to analyse every section once. */
function pass(pool, sections, chunk) {
  const t0 = performance.now();
  let next = 0;
  let done = 0;
  return new Promise((resolve, reject) => {
    const feed = (w) => {
      if (next >= sections.length) return;
      w.postMessage(sections.slice(next, next + chunk));
      next += chunk;
    };
    for (const w of pool) {
      w.removeAllListeners('message');
      w.on('message', (fs) => {
        done += fs.length;
        if (done === sections.length) resolve(performance.now() - t0);
        else feed(w);
      });
      w.once('error', reject);
      feed(w);
    }
  });
}

/**
 * Milliseconds the core takes for `sections` on `threads` fresh worker threads (`cold`: each
 * thread's V8 compiles the solver while it works, as in one `scarpline batch`), and, with
 * `warm: true`, for a second pass on the same threads once compiled (`warm`, as in a
 * long-running worker).
 */
async function timeOnThreads(sections, threads, chunk, { warm = false } = {}) {
  const pool = Array.from({ length: threads }, () => new Worker(join(__dirname, 'worker.js')));
  await Promise.all(
    pool.map((w) => new Promise((resolve) => (w.once('message', resolve), w.postMessage([])))),
  );
  const cold = await pass(pool, sections, chunk);
  const second = warm ? await pass(pool, sections, chunk) : undefined;
  await Promise.all(pool.map((w) => w.terminate()));
  return warm ? { cold, warm: second } : cold;
}

module.exports = { timeOnThreads };
