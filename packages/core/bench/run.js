// Benchmarks of the solver (npm run bench). Medians over repeated runs on this machine;
// never part of the tests. Runs on the built core (packages/core/dist). With BENCH_SMOKE=1
// every figure is measured once on a tiny size (the test command runs it so, to keep the
// script working): the same lines, meaningless numbers.
const { readFileSync, readdirSync } = require('node:fs');
const { join } = require('node:path');
const os = require('node:os');
const core = require('../dist/index.js');
const { timeOnThreads } = require('./threads');
const { oneCaseCorridor } = require('./one-case-corridor');

const ROOT = join(__dirname, '..', '..', '..');
const EXAMPLES = join(ROOT, 'examples');
const SMOKE = Boolean(process.env.BENCH_SMOKE);
const REPEATS = SMOKE ? 1 : 7;
const WINDOW_MS = SMOKE ? 20 : 400;

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : 0.5 * (s[s.length / 2 - 1] + s[s.length / 2]);
};
const fmt = (v, d = 0) =>
  v.toLocaleString('en-GB', { maximumFractionDigits: d, minimumFractionDigits: d });
const readExample = (file) =>
  core.parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file).sections;

/** Rate (per second) of `fn(k)` over about `ms` milliseconds; returns the median of REPEATS runs. */
function rate(fn, batch, ms = WINDOW_MS) {
  // warm-up, not counted: let the compiler settle first
  for (let t0 = performance.now(), n = 0; performance.now() - t0 < ms; n += batch)
    for (let k = 0; k < batch; k++) fn(n + k);
  const rates = [];
  for (let r = 0; r < REPEATS; r++) {
    let n = 0;
    const t0 = performance.now();
    let t = t0;
    while (t - t0 < ms) {
      for (let k = 0; k < batch; k++) fn(n + k);
      n += batch;
      t = performance.now();
    }
    rates.push((n / (t - t0)) * 1000);
  }
  return median(rates);
}

function timeMs(fn, repeats = REPEATS) {
  const ts = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    fn();
    ts.push(performance.now() - t0);
  }
  return median(ts);
}

// --- a layered section with water: the flood bank (two soils, piezometric line, ponded water)
const levee = readExample('levee-land-side.yaml')[0];
const SLICES = 50;
const prepared = core.prepareSection(levee);
const evaluate = core.bishopCircleEvaluator(prepared, SLICES);
const c0 = levee.analysis.surface;
// trial circles around the given one: every one is admissible
const circles = [];
for (let i = 0; i < 40; i++) {
  for (let j = 0; j < 25; j++) {
    const xc = c0.center[0] + (i - 20) * 0.08;
    const yc = c0.center[1] + (j - 12) * 0.08;
    const r = c0.radius + (j - 12) * 0.06;
    if (evaluate(xc, yc, r) > 0) circles.push([xc, yc, r]);
  }
}

// the search's evaluator: each circle cut exactly into a reused workspace, then Bishop's iteration
const bishopRate = rate((k) => {
  const [xc, yc, r] = circles[k % circles.length];
  evaluate(xc, yc, r);
}, 200);

// the same arithmetic, hand-minimal, on precomputed slice arrays: the fixed-point iteration
// F = Σ(C + N tan φ′)·aS / Σ −(N·aN + M0), N = (W′ − C sin α / F) / (cos α + sin α tan φ′ / F)
const ws = core.sliceWorkspace(prepared);
const pre = circles.map(([xc, yc, r]) => {
  core.cutCircle(ws, xc, yc, r, SLICES);
  const st = core.statics(ws.slices, levee.seismic, [ws.mirrored ? -xc : xc, yc]);
  const n = st.n;
  const Wv = new Float64Array(n);
  for (let i = 0; i < n; i++) Wv[i] = -st.Hy[i];
  return {
    n,
    sin: st.sin.slice(0, n),
    cos: st.cos.slice(0, n),
    C: st.C.slice(0, n),
    t: st.t.slice(0, n),
    Wv,
    aN: st.aN.slice(0, n),
    aS: st.aS.slice(0, n),
    M0: st.M0.slice(0, n),
  };
});
function kernel(p, F) {
  for (let it = 0; it < 60; it++) {
    const iF = 1 / F;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < p.n; i++) {
      const N = (p.Wv[i] - p.C[i] * iF * p.sin[i]) / (p.t[i] * iF * p.sin[i] + p.cos[i]);
      resist += (p.C[i] + N * p.t[i]) * p.aS[i];
      drive -= N * p.aN[i] + p.M0[i];
    }
    const next = resist / drive;
    if (Math.abs(next - F) <= 1e-7 * next) return next;
    F = next;
  }
  return F;
}
let kg = 1.2;
const kernelRate = rate((k) => {
  kg = kernel(pre[k % pre.length], kg);
}, 200);
const slicesPerCircle = pre.reduce((a, p) => a + p.n, 0) / pre.length;

const spencerRate = rate(
  (k) => {
    const [xc, yc, r] = circles[k % circles.length];
    core.cutCircle(ws, xc, yc, r, SLICES);
    core.spencer(ws.slices, { seismic: levee.seismic, pivot: [ws.mirrored ? -xc : xc, yc] });
  },
  SMOKE ? 5 : 50,
);

// --- a 5 000-circle grid search plus rigorous refinement (Spencer and Morgenstern–Price, exact slicing)
const grid5000 = {
  ...levee,
  analysis: {
    ...levee.analysis,
    methods: ['bishop', 'spencer', 'morgenstern-price'],
    slices: SLICES,
    surface: SMOKE
      ? { type: 'grid', centers: { nx: 4, ny: 4 }, tangents: { count: 3 }, moves: 0 }
      : { type: 'grid', centers: { nx: 20, ny: 25 }, tangents: { count: 10 }, moves: 0 },
  },
};
let trials5000 = 0;
const search5000 = timeMs(() => {
  const r = core.caseView(core.analyzeSection(grid5000));
  trials5000 = r.search.trials;
});

// --- a full auto search with rigorous evaluation on each example
const autoRows = [];
for (const file of readdirSync(EXAMPLES).filter((f) => f.endsWith('.yaml'))) {
  for (const s of readExample(file)) {
    const auto = (a) => ({
      ...a,
      methods: ['bishop', 'spencer', 'morgenstern-price'],
      surface: { type: 'auto' },
    });
    // each design case on its own: the section with that one case (a seismic case's
    // yield-coefficient searches and a drawdown case's stages included in its time)
    const cases = s.cases && s.cases.length ? s.cases : [null];
    for (const c of cases) {
      const section = {
        ...s,
        analysis: auto(s.analysis),
        ...(c ? { cases: [{ ...c, analysis: auto(c.analysis) }] } : {}),
      };
      let result;
      const ms = timeMs(
        () => {
          result = core.caseView(core.analyzeSection(section));
        },
        SMOKE ? 1 : 5,
      );
      const k = result.search.howFound?.candidates ?? { grid: 0, groundRanges: 0, polish: 0 };
      autoRows.push([
        cases.length > 1 ? `${s.id} ${c.name}` : s.id,
        ms,
        result.search.trials,
        k,
        result.governing ? result.governing.fs : NaN,
        ['seismic', 'rapid-drawdown'].find(
          (k) => k === (c ? c.kind : core.caseKindOf(s.analysis.case ?? null)),
        ) ?? '',
      ]);
    }
  }
}

// --- a 300-section corridor through the core alone, on all cores (worker_threads)
// each station in one case (its own settings): the workload the figures have always measured
const corridor = core.parseSections(JSON.stringify(oneCaseCorridor()), 'corridor.json').sections;
const many = Array.from({ length: SMOKE ? 6 : 300 }, (_, i) => ({
  ...corridor[i % corridor.length],
  id: `bench-${i}`,
}));
// one section a message: a worker never waits while another still has a queue of its own
const CHUNK = 1;
const corridorRun = (threads) => timeOnThreads(many, threads, CHUNK, { warm: true });
// the demo corridor as it ships: its 61 stations with their design cases (2.6 a station)
const shipped = core.parseSections(
  readFileSync(join(EXAMPLES, 'corridor', 'corridor.json'), 'utf8'),
  'corridor.json',
).sections;
const shippedRun = (threads) =>
  timeOnThreads(SMOKE ? shipped.slice(0, 4) : shipped, threads, CHUNK);

(async () => {
  const cores = os.cpus().length;
  // one thread and all cores in turn, so that a change in the machine's load touches both
  const pairs = [];
  for (let r = 0; r < (SMOKE ? 1 : 5); r++) {
    const one = await corridorRun(1);
    const all = await corridorRun(cores);
    pairs.push({ one, all, ratio: one.cold / all.cold, warmRatio: one.warm / all.warm });
  }
  const shippedPairs = [];
  for (let r = 0; r < (SMOKE ? 1 : 3); r++) {
    const one = await shippedRun(1);
    const all = await shippedRun(cores);
    shippedPairs.push({ one, all, ratio: one / all });
  }
  const range = (xs) => `${fmt(Math.min(...xs), 2)}–${fmt(Math.max(...xs), 2)}`;
  const out = [];
  out.push(
    `Scarpline solver benchmarks — node ${process.version}, ${cores} cores (${os.cpus()[0].model.trim()})`,
  );
  out.push(
    `medians of ${REPEATS} runs unless said otherwise; ${SLICES} slices; section: ${levee.id} (two soils, piezometric line, ponded water)`,
  );
  if (SMOKE)
    out.push(
      'smoke run (BENCH_SMOKE=1): one run of each figure on a tiny size; the figures are not a measurement',
    );
  out.push('');
  out.push(
    `Bishop circles per second, one core (exact slicing + Bishop, the search's evaluator; ${fmt(slicesPerCircle, 1)} slices a circle): ${fmt(bishopRate)}`,
  );
  out.push(
    `hand-minimal Bishop kernel on precomputed slice arrays:                      ${fmt(kernelRate)}`,
  );
  out.push(
    `ratio solver / kernel:                                          ${fmt(bishopRate / kernelRate, 2)}`,
  );
  out.push(
    `Spencer circles per second, one core (exact slicing + Spencer):              ${fmt(spencerRate)}`,
  );
  out.push(
    `grid search of ${fmt(trials5000)} trial surfaces + Spencer and Morgenstern–Price on the critical circle: ${fmt(search5000, 1)} ms`,
  );
  out.push('');
  out.push(
    'auto search (grid with boundary tangents + ground ranges + polishes) with Bishop, Spencer, Morgenstern–Price on each design case of each example (median of 5; a seismic case with its yield-coefficient searches, a rapid drawdown with its stages):',
  );
  for (const [id, ms, trials, c, fs, kind] of autoRows)
    out.push(
      `  ${id.padEnd(32)} ${fmt(ms, 1).padStart(7)} ms  ${fmt(trials).padStart(6)} trials (grid ${c.grid}, ground ranges ${c.groundRanges}, polish ${c.polish})  FS ${fs.toFixed(3)}${kind ? `  (${kind})` : ''}`,
    );
  out.push('');
  out.push(
    `${many.length}-section corridor through the core (auto search; Bishop and Spencer), one section a message, start-up excluded; one thread and ${cores} threads in turn, ${pairs.length} pairs:`,
  );
  for (const [label, key, ratio] of [
    ['fresh threads (each compiles the solver as it works)', 'cold', 'ratio'],
    ['the same threads again, compiled', 'warm', 'warmRatio'],
  ]) {
    const xs = pairs.map((p) => p[ratio]);
    out.push(
      `  ${label}: one thread ${fmt(median(pairs.map((p) => p.one[key])), 0)} ms, ${cores} threads ${fmt(median(pairs.map((p) => p.all[key])), 0)} ms (medians); speed-up ${fmt(median(xs), 2)} (median of the pairs' ratios; range ${range(xs)}; target ≥ ${fmt(0.9 * cores, 1)}, 0.9 × ${cores})`,
    );
  }
  const sr = shippedPairs.map((p) => p.ratio);
  out.push(
    `  the demo corridor as it ships (${shipped.length} stations, each with its design cases), fresh threads, ${shippedPairs.length} pairs: one thread ${fmt(median(shippedPairs.map((p) => p.one)), 0)} ms, ${cores} threads ${fmt(median(shippedPairs.map((p) => p.all)), 0)} ms (medians); speed-up ${fmt(median(sr), 2)} (range ${range(sr)})`,
  );
  console.log(out.join('\n'));
})();
