#!/usr/bin/env node
/**
 * Benchmark (not a test): a 300-section corridor through the API with 2 worker processes.
 *
 *   npm run bench:api                                    builds the core, CLI and API first
 *   node apps/api/bench/batch-300.js                     on a build of them
 *   BENCH_SMOKE=1 node apps/api/bench/batch-300.js       4 sections: checks the bench works
 *
 * Builds the corridor from examples/corridor/corridor.json (its 61 stations repeated at new
 * chainages, 20 m apart), uses a fresh database `scarpline_bench` on the local cluster (or
 * DATABASE_URL, which it migrates but does not empty), starts the built API and two workers
 * (WORKER_CONCURRENCY=1 each), waits until the API answers (GET /api/schemas/openapi.json,
 * not a start message, which may change), signs in, posts a batch the API refuses (so that its
 * intake thread has loaded the core before the clock), posts the batch and follows its event
 * stream until `done`. Prints the wall time from the POST to `done` and sections per second.
 * A child that exits early, or no `done` within BENCH_TIMEOUT_S (600 s), ends it with an error.
 *
 * The reference, in the same run: the same sections through the core alone on as many worker
 * threads as there are worker processes (chunks of CORE_CHUNK, loading the core not counted),
 * once before the service starts and once after it has stopped; the ratio of the service's
 * throughput to the core's (their mean) is the figure that a busy machine disturbs least.
 * Also prints each worker process's resident memory after the batch (from /proc).
 *
 *   BENCH_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/prof"   node options for the API and workers
 *   BENCH_FETCH=n                                           WORKER_FETCH of the workers
 */
// the corridor as every bench runs it (a bench script, not the API: it may reach into the
// core's bench folder)
// eslint-disable-next-line no-restricted-syntax
const { oneCaseCorridor } = require('../../../packages/core/bench/one-case-corridor');
// The solver bench's own thread runner, so that both benches time the core alone the same way
// (a bench script, not the API: it may reach into the core's bench folder).
// eslint-disable-next-line no-restricted-syntax
const { timeOnThreads } = require('../../../packages/core/bench/threads');
const fs = require('node:fs');
const path = require('node:path');
const {
  apiReady,
  childProcesses,
  followToDone,
  freePort,
  poster,
  prepareDatabase,
} = require('./service');

const SMOKE = process.env.BENCH_SMOKE === '1';
const SECTIONS = Number(process.env.BENCH_SECTIONS ?? (SMOKE ? 4 : 300));
const WORKERS = Number(process.env.BENCH_WORKERS ?? 2);
const TIMEOUT_S = Number(process.env.BENCH_TIMEOUT_S ?? 600);
const CORE_CHUNK = SMOKE ? 1 : 5;
const { start, stop: stopChildren, failure: childFailure } = childProcesses();

function corridor(n) {
  // each station in one case (its own settings): the workload the figures have always measured
  const c = oneCaseCorridor();
  const first = c.sections[0].station;
  const sections = Array.from({ length: n }, (_, i) => ({
    ...c.sections[i % c.sections.length],
    station: first + 20 * i,
  }));
  return { ...c, id: `bench-${n}`, title: `${c.title} (benchmark, ${n} sections)`, sections };
}

/** Milliseconds the core alone takes for `sections` on `threads` worker threads, CORE_CHUNK a message. */
const coreRun = (sections, threads) => timeOnThreads(sections, threads, CORE_CHUNK);

/** Resident memory of a process in MB (Linux /proc), or null where it cannot be read. */
function residentMb(pid) {
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, 'utf8');
    const kb = Number(/^VmRSS:\s+(\d+) kB/m.exec(status)?.[1]);
    return Number.isFinite(kb) ? kb / 1024 : null;
  } catch {
    return null;
  }
}

/** CPU seconds (user + system) a process has used (Linux /proc; ticks of 1/100 s), or 0. */
function cpuSeconds(pid) {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) / 100;
  } catch {
    return 0;
  }
}

/** The local cluster's server processes (its postmaster and its children), or [] when not ours. */
function postgresPids() {
  if (process.env.BENCH_EXTERNAL_DB) return [];
  try {
    const dir = require('../scripts/pg.js').dataDir();
    const postmaster = Number(
      fs.readFileSync(path.join(dir, 'postmaster.pid'), 'utf8').split('\n')[0],
    );
    const pids = [postmaster];
    for (const entry of fs.readdirSync('/proc')) {
      if (!/^\d+$/.test(entry)) continue;
      try {
        const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
        if (Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === postmaster) {
          pids.push(Number(entry));
        }
      } catch {
        // gone meanwhile
      }
    }
    return pids;
  } catch {
    return [];
  }
}

/** When the batch's first analysis started, its last ended and it closed: seconds after `wall0`. */
async function timelineOf(url, batchId, wall0) {
  const { Client } = require('pg');
  const client = new Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query(
      `SELECT min(r.started_at) AS first, max(r.finished_at) AS last, b.finished_at AS closed
         FROM batches b JOIN sections s ON s.batch_id = b.id JOIN results r ON r.section_id = s.id
        WHERE b.id = $1 GROUP BY b.finished_at`,
      [batchId],
    );
    const at = (d) => (d ? `${((d.getTime() - wall0) / 1000).toFixed(2)} s` : '—');
    return { first: at(rows[0]?.first), last: at(rows[0]?.last), closed: at(rows[0]?.closed) };
  } finally {
    await client.end();
  }
}

async function main() {
  const { url, email, password } = await prepareDatabase();

  const body = corridor(SECTIONS);
  const { parseSections } = require('@scarpline/core');
  const coreSections = parseSections(JSON.stringify(body), 'bench.json').sections;
  if (coreSections.length !== SECTIONS) throw new Error('the corridor did not parse');
  const cpu0 = process.cpuUsage();
  const coreBefore = await coreRun(coreSections, WORKERS);

  const port = await freePort();
  const env = { DATABASE_URL: url, NODE_ENV: 'development', LOGIN_LIMIT: '1000' };
  const api = start('api', 'server.js', { ...env, PORT: String(port) });
  const base = `http://127.0.0.1:${port}`;
  await Promise.race([apiReady(base), childFailure]);
  const fetchSize = process.env.BENCH_FETCH ? { WORKER_FETCH: process.env.BENCH_FETCH } : {};
  const workers = [];
  for (let i = 0; i < WORKERS; i++) {
    workers.push(
      start(`worker ${i + 1}`, 'worker-main.js', {
        ...env,
        WORKER_CONCURRENCY: '1',
        ...fetchSize,
      }),
    );
  }
  const post = poster(base);
  const { token } = await post('/api/v1/auth/login', { email, password });
  const project = await post('/api/v1/projects', { name: 'Benchmark' }, token);
  // Let the workers connect to the queue before the clock starts (a smoke run has no clock).
  if (!SMOKE) await new Promise((r) => setTimeout(r, 3000));
  // The API's intake thread loads the core at its first request (as the core's reference
  // threads do before their clock): a batch it refuses starts it, and makes no jobs.
  const refused = await fetch(`${base}/api/v1/projects/${project.id}/batches`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', authorization: `Bearer ${token}` },
    body: JSON.stringify({ ...corridor(1), sections: [{ id: 'warm-up', station: 'none' }] }),
  });
  if (refused.status !== 422) throw new Error(`the warm-up batch: ${refused.status}, not 422`);

  const cpuOf = (pids) => pids.reduce((sum, pid) => sum + cpuSeconds(pid), 0);
  const pg0 = new Map(postgresPids().map((pid) => [pid, cpuSeconds(pid)]));
  const cpuAt0 = [cpuOf(workers.map((c) => c.pid)), cpuSeconds(api.pid), 0];
  const t0 = performance.now();
  const wall0 = Date.now();
  const mono0 = process.hrtime.bigint() / 1000n;
  const batch = await post(`/api/v1/projects/${project.id}/batches`, body, token);
  const tPosted = performance.now();
  const monoPosted = process.hrtime.bigint() / 1000n;
  const timeout = new Promise((_, reject) =>
    setTimeout(() => reject(new Error(`no done in ${TIMEOUT_S} s`)), TIMEOUT_S * 1000).unref(),
  );
  const progress = await Promise.race([followToDone(base, token, batch.id), childFailure, timeout]);
  const t1 = performance.now();
  // Profiles (BENCH_NODE_ARGS=--cpu-prof) are stamped on the same clock: the measured window.
  if (process.env.BENCH_NODE_ARGS) {
    console.log(
      `  window (monotonic µs): ${mono0} ${process.hrtime.bigint() / 1000n}; POST ${monoPosted}`,
    );
  }
  // PostgreSQL's processes that ended meanwhile are not counted (the pools keep theirs open).
  const cpuAt1 = [
    cpuOf(workers.map((c) => c.pid)),
    cpuSeconds(api.pid),
    postgresPids().reduce((sum, pid) => sum + cpuSeconds(pid) - (pg0.get(pid) ?? 0), 0),
  ];
  const wall = (t1 - t0) / 1000;
  const memory = workers.map((w) => residentMb(w.pid));
  const timeline = await timelineOf(url, batch.id, wall0);
  await stopChildren();
  const cpu1 = process.cpuUsage(cpu0);
  const cpu2 = process.cpuUsage();
  const coreAfter = await coreRun(coreSections, WORKERS);
  const cpu3 = process.cpuUsage(cpu2);
  const coreCpuMs = (cpu1.user + cpu1.system + cpu3.user + cpu3.system) / 2000 / SECTIONS;
  const [workerMs, apiMs, pgMs] = cpuAt1.map((c, i) => ((c - cpuAt0[i]) * 1000) / SECTIONS);
  const coreS = (coreBefore + coreAfter) / 2000;
  const serviceRate = progress.total / wall;
  const coreRate = SECTIONS / coreS;
  if (SMOKE) console.log('smoke run (BENCH_SMOKE=1): the figures are not a measurement');
  console.log(
    `batch-300: ${progress.total} sections (${progress.done} done, ${progress.failed} failed, ` +
      `${progress.belowRequiredFs} below the required FS) with ${WORKERS} worker processes`,
  );
  console.log(`  POST (validate, store, enqueue): ${((tPosted - t0) / 1000).toFixed(2)} s`);
  console.log(
    `  wall time POST → done: ${wall.toFixed(1)} s; ${serviceRate.toFixed(1)} sections/s`,
  );
  console.log(
    `  the core alone, ${WORKERS} worker threads, chunks of ${CORE_CHUNK}: ` +
      `${coreS.toFixed(2)} s (before ${(coreBefore / 1000).toFixed(2)} s, after ` +
      `${(coreAfter / 1000).toFixed(2)} s); ${coreRate.toFixed(1)} sections/s`,
  );
  console.log(`  ratio service / core throughput: ${(serviceRate / coreRate).toFixed(2)}`);
  console.log(
    `  CPU a section: service ${(workerMs + apiMs + pgMs).toFixed(1)} ms (workers ` +
      `${workerMs.toFixed(1)}, API ${apiMs.toFixed(1)}, PostgreSQL ${pgMs.toFixed(1)}); ` +
      `the core alone ${coreCpuMs.toFixed(1)} ms`,
  );
  console.log(
    `  timeline from the POST: first analysis started ${timeline.first}, last ended ` +
      `${timeline.last}, batch closed ${timeline.closed}, done event ${wall.toFixed(2)} s`,
  );
  console.log(
    `  worker processes' resident memory after the batch: ${memory
      .map((mb) => (mb === null ? 'unknown' : `${mb.toFixed(0)} MB`))
      .join(', ')}`,
  );
}

main()
  .catch((e) => {
    console.error(e);
    process.exitCode = 1;
  })
  .finally(() => stopChildren());
