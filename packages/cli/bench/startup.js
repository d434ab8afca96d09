#!/usr/bin/env node
// Benchmark (not a test): how fast the `scarpline` command starts, against a bare `node -e 0`
// measured in the same run. Each command runs RUNS times, the commands taken in turn so that
// a busy moment of the machine falls on all of them alike; the figure is the median wall time
// of a run (spawn to exit). Targets: `--version` at most 2 × `node -e 0`, `analyze` of a
// given-circle example at most 4 ×. Then it lists which heavy modules each command loaded:
// `--version` none, `analyze` of plain numbers neither the ajv compiler (the build compiles the
// schemas ahead of time) nor mathjs (loaded only for values written with their unit).
//
//   npm run bench:startup                              builds the core and the CLI first
//   node packages/cli/bench/startup.js [runs]          default 15 runs of each command
//   BENCH_SMOKE=1 node packages/cli/bench/startup.js   one run each: checks the bench works
'use strict';

const { spawnSync } = require('node:child_process');
const fs = require('node:fs');
const os = require('node:os');
const path = require('node:path');

const ROOT = path.join(__dirname, '..', '..', '..');
const BIN = path.join(__dirname, '..', 'bin', 'scarpline.js');
const SMOKE = process.env.BENCH_SMOKE === '1';
const RUNS = SMOKE ? 1 : Number(process.argv[2] ?? 15);

/** The commands timed: label, arguments to node, exit codes that mean it worked, target. */
const COMMANDS = [
  { label: 'node -e 0', args: ['-e', '0'], ok: [0], target: null },
  { label: 'scarpline --version', args: [BIN, '--version'], ok: [0], target: 2 },
  {
    label: 'scarpline analyze examples/cut-homogeneous.yaml',
    args: [BIN, 'analyze', 'examples/cut-homogeneous.yaml'],
    ok: [0, 2], // 2: a section below its required FS
    target: 4,
  },
  {
    label: 'scarpline analyze examples/cut-mixed-units.yaml',
    args: [BIN, 'analyze', 'examples/cut-mixed-units.yaml'],
    ok: [0, 2],
    target: null,
    note: 'values written with their unit: loads mathjs',
  },
];

/** Heavy modules, by the path of a file they load. */
const GROUPS = [
  ['solver', /packages[\\/]core[\\/]dist[\\/](analyze|search|methods|slices)[\\/.]/],
  ['yaml', /node_modules[\\/]yaml[\\/]/],
  ['ajv compiler', /node_modules[\\/]ajv[\\/]dist[\\/](core|2020|ajv|compile)[\\/.]/],
  ['mathjs', /node_modules[\\/]mathjs[\\/]/],
];
/** What each command may load (true: must load, false: must not). */
const EXPECTED = {
  'scarpline --version': { solver: false, yaml: false, 'ajv compiler': false, mathjs: false },
  'scarpline analyze examples/cut-homogeneous.yaml': { 'ajv compiler': false, mathjs: false },
  'scarpline analyze examples/cut-mixed-units.yaml': { mathjs: true },
};

function run(command, env = {}) {
  const t0 = performance.now();
  const r = spawnSync(process.execPath, command.args, {
    cwd: ROOT,
    encoding: 'utf8',
    env: { ...process.env, ...env },
  });
  const seconds = (performance.now() - t0) / 1000;
  if (!command.ok.includes(r.status)) {
    throw new Error(`${command.label} exited with ${r.status}: ${r.stderr || r.stdout}`);
  }
  return seconds;
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : 0.5 * (s[s.length / 2 - 1] + s[s.length / 2]);
};

function main() {
  if (!fs.existsSync(path.join(__dirname, '..', 'dist', 'main.js'))) {
    throw new Error('packages/cli/dist is missing: run npm run build (or npm run bench:startup)');
  }
  const times = COMMANDS.map(() => []);
  run(COMMANDS[1]); // the first start reads the files from disk: not counted
  for (let r = 0; r < RUNS; r++) COMMANDS.forEach((c, i) => times[i].push(run(c)));
  const medians = times.map(median);
  const base = medians[0];

  const out = [];
  out.push(
    `Scarpline start-up — node ${process.version}, ${os.cpus().length} cores (${os.cpus()[0].model.trim()})`,
  );
  out.push(
    SMOKE
      ? 'smoke run (BENCH_SMOKE=1): one run of each command; the figures are not a measurement'
      : `median wall time of ${RUNS} runs of each command, taken in turn`,
  );
  out.push('');
  const width = Math.max(...COMMANDS.map((c) => c.label.length)) + 2;
  out.push(`  ${'command'.padEnd(width)}median    × node -e 0   target`);
  COMMANDS.forEach((c, i) => {
    const ratio = medians[i] / base;
    const target =
      c.target === null
        ? (c.note ?? '')
        : `≤ ${c.target}: ${ratio <= c.target ? 'met' : 'not met'}`;
    out.push(
      `  ${c.label.padEnd(width)}${medians[i].toFixed(3)} s   ${ratio.toFixed(2).padStart(5)}         ${target}`.trimEnd(),
    );
  });

  out.push('');
  out.push(`modules loaded (${GROUPS.map(([g]) => g).join(', ')}):`);
  const problems = [];
  const list = path.join(fs.mkdtempSync(path.join(os.tmpdir(), 'scarpline-startup-')), 'loaded');
  for (const c of COMMANDS.slice(1)) {
    run(
      { ...c, args: ['-r', path.join(__dirname, 'loaded-modules.js'), ...c.args] },
      {
        SCARPLINE_LOADED_MODULES: list,
      },
    );
    const files = fs.readFileSync(list, 'utf8').split('\n');
    const loaded = GROUPS.filter(([, re]) => files.some((f) => re.test(f))).map(([g]) => g);
    out.push(`  ${c.label.padEnd(width)}${loaded.length ? loaded.join(', ') : 'none'}`);
    for (const [group, must] of Object.entries(EXPECTED[c.label] ?? {})) {
      if (loaded.includes(group) !== must) {
        problems.push(`${c.label} ${must ? 'did not load' : 'loaded'} ${group}`);
      }
    }
  }
  fs.rmSync(path.dirname(list), { recursive: true, force: true });
  console.log(out.join('\n'));
  if (problems.length) {
    console.error(`start-up: ${problems.join('; ')}`);
    process.exitCode = 1;
  }
}

main();
