// Times sections through the built core on worker threads (bench/worker.js), fed `chunk`
// sections a message to whichever thread answers first; loading the core is not counted (each
// thread first answers an empty chunk). Shared by the solver's bench (run.js) and the API's
// (apps/api/bench/batch-300.js), which compares the service with it.
const { join } = require('node:path');
const { Worker } = require('node:worker_threads');

/** Milliseconds the core takes for `sections` on `threads` worker threads. */
async function timeOnThreads(sections, threads, chunk) {
  const pool = Array.from({ length: threads }, () => new Worker(join(__dirname, 'worker.js')));
  await Promise.all(
    pool.map((w) => new Promise((resolve) => (w.once('message', resolve), w.postMessage([])))),
  );
  const t0 = performance.now();
  let next = 0;
  let done = 0;
  await new Promise((resolve, reject) => {
    const feed = (w) => {
      if (next >= sections.length) return;
      w.postMessage(sections.slice(next, next + chunk));
      next += chunk;
    };
    for (const w of pool) {
      w.on('message', (fs) => {
        done += fs.length;
        if (done === sections.length) resolve();
        else feed(w);
      });
      w.on('error', reject);
      feed(w);
    }
  });
  const ms = performance.now() - t0;
  await Promise.all(pool.map((w) => w.terminate()));
  return ms;
}

module.exports = { timeOnThreads };
