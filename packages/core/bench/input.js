// What the reading of an input file costs (npm run bench:input): the files that once hurt the
// service, and the largest files within the limits of packages/core/src/input/limits.ts. Each
// file is written to a temporary folder first and read in a fresh process (parseSections or
// parseGeoJsonCorridor of the built core), which reports the time of the reading and how much
// its peak memory (resident set) grew. Medians of 3 processes; never part of the tests. With
// BENCH_SMOKE=1 each file is read once and the large ones are small: the same lines,
// meaningless numbers.
const { spawnSync } = require('node:child_process');
const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');

const ROOT = path.join(__dirname, '..', '..', '..');
const SMOKE = Boolean(process.env.BENCH_SMOKE);
const REPEATS = SMOKE ? 1 : 3;

// --- the child: read one file, say what it cost
if (process.argv[2] === '--read') {
  const core = require('../dist/index.js');
  const file = process.argv[3];
  const text = fs.readFileSync(file, 'utf8');
  const name = path.basename(file);
  const before = process.resourceUsage().maxRSS;
  const t0 = performance.now();
  const parsed = core.isGeoJsonCorridor(text)
    ? core.parseGeoJsonCorridor(text, name)
    : core.parseSections(text, name);
  const ms = performance.now() - t0;
  const grew = process.resourceUsage().maxRSS - before;
  const m = parsed.messages;
  process.stdout.write(
    JSON.stringify({
      ms,
      mb: grew / 1024,
      sections: parsed.sections.length,
      messages: m.length,
      bytes: JSON.stringify(m).length,
      first: m[0] ? m[0].code : 'none',
    }),
  );
  process.exit(0);
}

// --- the files
const corridor = JSON.parse(fs.readFileSync(path.join(ROOT, 'examples/corridor/corridor.json')));
/** The demo corridor's sections repeated at new stations, n in all. */
const corridorOf = (n) => ({
  ...corridor,
  sections: Array.from({ length: n }, (_, i) => ({
    ...corridor.sections[i % corridor.sections.length],
    station: 1000 + 20 * i,
  })),
});
const rows = (count, width) =>
  Array.from({ length: count }, () => `[${'1.5,'.repeat(width - 1)}1.5]`);
const big = SMOKE ? 100 : 1000;

const FILES = [
  ['10 000 nested lists (YAML)', 'deep.yaml', () => '['.repeat(10000) + ']'.repeat(10000)],
  ['10 000 nested lists (JSON)', 'deep.json', () => '['.repeat(10000) + ']'.repeat(10000)],
  ['five million numbers, 10 MB', 'numbers.json', () => `[${'1,'.repeat(4_999_999)}1]`],
  [
    'one list of 1.3 million numbers, 5 MB',
    'one-list.json',
    () => `[${'1.5,'.repeat(1_299_999)}1.5]`,
  ],
  [
    'lists of 2 000 numbers, 650 of them, 5 MB',
    'many-lists.json',
    () => `[${rows(650, 2000).join(',\n')}]`,
  ],
  [
    'a method name of 1 MB',
    'method.json',
    () =>
      JSON.stringify({
        format: 'scarpline/1',
        id: 'a',
        units: 'si',
        analysis: { methods: ['x'.repeat(1_000_000)] },
      }),
  ],
  [
    'a batch of 20 000 sections',
    'batch-20000.json',
    () =>
      JSON.stringify({
        ...corridor,
        sections: Array.from({ length: 20000 }, (_, i) => ({
          station: i,
          ground: [
            [0, 0],
            [10, 5],
          ],
        })),
      }),
  ],
  [
    'a batch of 150 sections with 30 wrong points each, 45 kB',
    'errors.json',
    () =>
      JSON.stringify({
        ...corridor,
        sections: Array.from({ length: 150 }, (_, i) => ({
          station: i,
          ground: Array.from({ length: 30 }, (_, j) => [30 - j, 'x']),
        })),
      }),
  ],
  [
    '199 000 numbers in lists of 2 000 (JSON, within the limits)',
    'values.json',
    () => `[${rows(SMOKE ? 9 : 99, 2000).join(',\n')}]`,
  ],
  [
    '199 000 numbers in lists of 2 000 (YAML, within the limits)',
    'values.yaml',
    () =>
      rows(SMOKE ? 9 : 99, 2000)
        .map((r) => `- ${r}`)
        .join('\n'),
  ],
  [
    `the demo corridor as ${big} sections (JSON, valid)`,
    'corridor.json',
    () => JSON.stringify(corridorOf(big), null, 2),
  ],
  [
    `the demo corridor as ${big} sections (YAML, valid)`,
    'corridor.yaml',
    () => require('yaml').stringify(corridorOf(big), { aliasDuplicateObjects: false }),
  ],
];

const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const fmt = (v, d = 0) =>
  v.toLocaleString('en-GB', { maximumFractionDigits: d, minimumFractionDigits: d });

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-bench-input-'));
try {
  console.log(`Scarpline input benchmarks — node ${process.version}, ${os.cpus().length} cores`);
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): meaningless numbers');
  console.log(`reading a file: median of ${REPEATS} fresh processes`);
  for (const [what, name, make] of FILES) {
    const file = path.join(dir, name);
    const text = make();
    fs.writeFileSync(file, text);
    const runs = [];
    for (let r = 0; r < REPEATS; r++) {
      const child = spawnSync(process.execPath, [__filename, '--read', file], {
        encoding: 'utf8',
      });
      if (child.status !== 0) throw new Error(`${name}: ${child.stderr}`);
      runs.push(JSON.parse(child.stdout));
    }
    const last = runs[runs.length - 1];
    console.log(
      `  ${what}, ${fmt(text.length / 1e6, 2)} MB: ${fmt(median(runs.map((x) => x.ms)))} ms, ` +
        `peak memory +${fmt(median(runs.map((x) => x.mb)))} MB; ${last.sections} sections, ` +
        `${last.messages} messages (${fmt(last.bytes)} bytes), the first ${last.first}`,
    );
    fs.rmSync(file);
  }
} finally {
  fs.rmSync(dir, { recursive: true, force: true });
}
