// Benchmarks of the probabilistic analysis (npm run bench, after run.js; npm run
// bench:probability alone). Medians over repeated runs on this machine; never part of the
// tests. Runs on the built core (packages/core/dist). With BENCH_SMOKE=1 every figure is
// measured once on a tiny size (the test command runs it so): the same lines, meaningless
// numbers.
const { readFileSync } = require('node:fs');
const { join } = require('node:path');
const { Worker } = require('node:worker_threads');
const core = require('../dist/index.js');

const ROOT = join(__dirname, '..', '..', '..');
const SMOKE = Boolean(process.env.BENCH_SMOKE);
const REPEATS = SMOKE ? 1 : 5;
const N_CRITICAL = SMOKE ? 200 : 10_000;
const N_SEARCH = SMOKE ? 8 : 1_000;
const THREADS = 2;

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : 0.5 * (s[s.length / 2 - 1] + s[s.length / 2]);
};
const fmt = (v, d = 0) =>
  v.toLocaleString('en-GB', { maximumFractionDigits: d, minimumFractionDigits: d });

// the layered section with water: the flood bank with five random variables (examples/levee-probability.yaml)
const file = 'levee-probability.yaml';
const section = core.parseSections(readFileSync(join(ROOT, 'examples', file), 'utf8'), file)
  .sections[0];
const spec = section.probability;

/** Median ms of `fn` over REPEATS runs after one run not counted (the compiler settles). */
function timed(fn) {
  fn();
  const ts = [];
  for (let r = 0; r < REPEATS; r++) {
    const t0 = performance.now();
    fn();
    ts.push(performance.now() - t0);
  }
  return median(ts);
}

/** Ms for N realisations with the search in each on `threads` worker threads, in chunks. */
async function searchedOnThreads(n, threads, chunk) {
  const s = { ...spec, surface: 'search', realisations: n };
  const run = core.probabilityRun(section, s);
  const criticals = { [run.cases[0].model.name]: run.cases[0].critical };
  const pool = Array.from(
    { length: threads },
    () => new Worker(join(__dirname, 'probability-worker.js')),
  );
  await Promise.all(
    pool.map((w) => new Promise((ok) => (w.once('message', ok), w.postMessage(null)))),
  );
  const t0 = performance.now();
  let next = 0;
  const fs = new Array(n);
  await Promise.all(
    pool.map(
      (w) =>
        new Promise((resolve, reject) => {
          const feed = () => {
            if (next >= n) return resolve();
            const from = next;
            const to = Math.min(n, from + chunk);
            next = to;
            w.once('message', (out) => {
              out.forEach((v, k) => (fs[from + k] = v));
              feed();
            });
            w.postMessage({ section, spec: s, criticals, from, to });
          };
          w.once('error', reject);
          feed();
        }),
    ),
  );
  const ms = performance.now() - t0;
  await Promise.all(pool.map((w) => w.terminate()));
  return { ms, p: core.caseProbability(run.cases[0], s, fs) };
}

async function main() {
  const out = [];
  out.push(
    `Scarpline probability benchmarks — node ${process.version}, ${require('node:os').cpus().length} cores`,
  );
  if (SMOKE)
    out.push('smoke run (BENCH_SMOKE=1): tiny sizes, one repeat; the figures mean nothing');
  out.push(
    `${section.id} (${file}): two soils over sand, a piezometric line with ponded water; ${spec.variables.length} random variables (${spec.variables.map((v) => v.target).join(', ')}), ${spec.method}`,
  );
  const onSurface = (variables) => () =>
    core.analyzeProbability(section, { ...spec, variables, realisations: N_CRITICAL });
  const all = timed(onSurface(spec.variables));
  const props = spec.variables.filter((v) => v.target.startsWith('materials.'));
  const only = timed(onSurface(props));
  out.push(
    `${fmt(N_CRITICAL)} realisations on the critical surface, one core: ${fmt(all)} ms (median of ${REPEATS}; target ≤ 1 000 ms)`,
  );
  out.push(
    `  the same with the ${props.length} material variables only (the geometry prepared once): ${fmt(only)} ms`,
  );
  const runs = [];
  for (let r = 0; r < (SMOKE ? 1 : 3); r++)
    runs.push(await searchedOnThreads(N_SEARCH, THREADS, SMOKE ? 2 : 25));
  const c = runs[0].p;
  out.push(
    `${fmt(N_SEARCH)} realisations with the critical surface searched again in each, ${THREADS} worker threads: ${fmt(median(runs.map((x) => x.ms)))} ms (median of ${runs.length}; target ≤ 30 000 ms); mean FS ${c.meanFs.toFixed(3)}, P(FS < 1) ${(100 * c.pFailure.p).toFixed(2)} %`,
  );
  console.log(out.join('\n'));
}

main().catch((e) => {
  console.error(e);
  process.exitCode = 1;
});
