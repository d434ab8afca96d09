#!/usr/bin/env node
// Manual check, not a test: a 300-section corridor through `scarpline batch` with every output
// written (results.json/csv/geojson, an SVG per section, the chainage plot). The sections are
// those of examples/corridor/corridor.json (the invented Wendlecombe bypass) repeated at new
// stations. Prints the wall time and the peak resident memory of the process (the worker
// threads included), and the peak memory sampled every 200 ms, to show it stays flat.
//
//   npm run bench:corridor                                  builds the core and the CLI first
//   node packages/cli/bench/corridor-300.js [sections] [out-dir]
//   BENCH_SMOKE=1 node packages/cli/bench/corridor-300.js   4 sections: checks the bench works
'use strict';

const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');
const { runBatch } = require('../dist/batch/run-batch');

const { oneCaseCorridor } = require('../../core/bench/one-case-corridor');
const SMOKE = process.env.BENCH_SMOKE === '1';
const count = process.argv[2] ? Number(process.argv[2]) : SMOKE ? 4 : 300;
const out = process.argv[3] ?? fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-300-'));
// each station in one case (its own settings): the workload the figures have always measured
const corridor = oneCaseCorridor();
const base = corridor.sections;
corridor.sections = Array.from({ length: count }, (_, i) => ({
  ...base[i % base.length],
  station: 1000 + 20 * i,
}));
fs.mkdirSync(out, { recursive: true });
const file = path.join(out, `corridor-${count}.json`);
fs.writeFileSync(file, JSON.stringify(corridor));

const samples = [];
const timer = setInterval(() => samples.push(process.memoryUsage().rss), 200);
const t0 = Date.now();
runBatch(
  file,
  { out: path.join(out, 'results') },
  () => undefined,
  () => undefined,
).then((code) => {
  clearInterval(timer);
  const s = (Date.now() - t0) / 1000;
  const mb = (b) => `${(b / 1048576).toFixed(0)} MB`;
  const q = (f) => samples[Math.floor(f * (samples.length - 1))] ?? 0;
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): the figures are not a measurement');
  console.log(`${count} sections in ${s.toFixed(1)} s (exit code ${code}), results in ${out}`);
  console.log(`peak resident memory ${mb(process.resourceUsage().maxRSS * 1024)}`);
  console.log(
    `resident memory at 25/50/75/100% of the run: ${[0.25, 0.5, 0.75, 1].map((f) => mb(q(f))).join(' / ')}`,
  );
  // 2 only says that a section is below its required FS; 1 is an invalid input or no FS
  if (code !== 0 && code !== 2) process.exitCode = 1;
});
