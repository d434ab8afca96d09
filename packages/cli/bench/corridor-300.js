#!/usr/bin/env node
// Manual check, not a test: a 300-section corridor through `scarpline batch` with every output
// written (results.json/csv/geojson, an SVG per section, the chainage plot). The sections are
// those of examples/corridor/corridor.json (the invented Wendlecombe bypass) repeated at new
// stations. Prints the wall time and the peak resident memory of the process (the worker
// threads included), and the peak memory sampled every 200 ms, to show it stays flat.
//
//   npm run build && node packages/cli/bench/corridor-300.js [sections] [out-dir]
'use strict';

const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');
const { runBatch } = require('../dist/batch/run-batch');

const count = Number(process.argv[2] ?? 300);
const out = process.argv[3] ?? fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-300-'));
const corridor = JSON.parse(
  fs.readFileSync(
    path.join(__dirname, '..', '..', '..', 'examples', 'corridor', 'corridor.json'),
    'utf8',
  ),
);
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
  console.log(`${count} sections in ${s.toFixed(1)} s (exit code ${code}), results in ${out}`);
  console.log(`peak resident memory ${mb(process.resourceUsage().maxRSS * 1024)}`);
  console.log(
    `resident memory at 25/50/75/100% of the run: ${[0.25, 0.5, 0.75, 1].map((f) => mb(q(f))).join(' / ')}`,
  );
});
