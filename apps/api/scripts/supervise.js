/**
 * Keeps the processes of `npm start` running: each child (the API, a worker) that ends is
 * started again after a pause that doubles with every quick failure (1 s, 2 s, 4 s … at most
 * 30 s; back to 1 s once it has run for a minute), with one line that says so. One child
 * ending never stops another. `stop()` (Ctrl-C, SIGTERM) ends them all and starts none again.
 */
const { spawn } = require('node:child_process');

const DEFAULTS = {
  /** The first pause before a start again, and the longest. */
  firstDelayMs: 1000,
  longestDelayMs: 30000,
  /** A child that has run this long has its pause back to the first. */
  steadyMs: 60000,
  /** How long stop() waits for a child after SIGTERM before SIGKILL. */
  graceMs: 10000,
  log: (line) => console.log(line),
};

/** A pause in words: `1 s`, `0.05 s`. */
function seconds(ms) {
  return `${Number((ms / 1000).toFixed(3))} s`;
}

/** Why a child ended, in words. */
function ending(code, signal) {
  if (signal) return `killed by ${signal}`;
  return code === 0 ? 'exited' : `exited with code ${code}`;
}

/**
 * Starts the children and keeps them running. Each spec: `{ name, command, args, options }`
 * (as child_process.spawn takes them). Returns `current(name)` (the running ChildProcess, or
 * null between a child's end and its start again), `starts(name)` (how many times it has been
 * started) and `stop(signal)`, which resolves once every child has ended.
 */
function supervise(specs, settings = {}) {
  const o = { ...DEFAULTS, ...settings };
  let stopping = false;
  const kids = specs.map((spec) => ({
    spec,
    child: null,
    starts: 0,
    startedAt: 0,
    delay: o.firstDelayMs,
    timer: null,
  }));

  const launch = (kid) => {
    kid.timer = null;
    if (stopping) return;
    const { command, args = [], options = {} } = kid.spec;
    const child = spawn(command, args, options);
    kid.child = child;
    kid.starts++;
    kid.startedAt = Date.now();
    let ended = false;
    const end = (code, signal, error) => {
      if (ended) return;
      ended = true;
      kid.child = null;
      if (stopping) return;
      if (Date.now() - kid.startedAt >= o.steadyMs) kid.delay = o.firstDelayMs;
      const why = error ? `could not start (${error.message})` : ending(code, signal);
      o.log(`${kid.spec.name} ${why}; starting it again in ${seconds(kid.delay)}`);
      kid.timer = setTimeout(() => launch(kid), kid.delay);
      kid.delay = Math.min(kid.delay * 2, o.longestDelayMs);
    };
    child.once('exit', (code, signal) => end(code, signal));
    child.once('error', (e) => end(null, null, e));
  };
  kids.forEach(launch);

  const find = (name) => kids.find((k) => k.spec.name === name);
  return {
    current: (name) => find(name)?.child ?? null,
    starts: (name) => find(name)?.starts ?? 0,
    /** Ends every child (SIGTERM, then SIGKILL after the grace) and starts none again. */
    stop(signal = 'SIGTERM') {
      stopping = true;
      const waits = kids.map((kid) => {
        if (kid.timer) clearTimeout(kid.timer);
        const child = kid.child;
        if (!child || child.exitCode !== null || child.signalCode !== null) {
          return Promise.resolve();
        }
        return new Promise((resolve) => {
          const kill = setTimeout(() => child.kill('SIGKILL'), o.graceMs);
          child.once('exit', () => {
            clearTimeout(kill);
            resolve();
          });
          child.kill(signal);
        });
      });
      return Promise.all(waits).then(() => undefined);
    },
  };
}

/**
 * Stops the supervised children on Ctrl-C (SIGINT) or SIGTERM, once, and then ends the process
 * (exit code 0); a second Ctrl-C while they stop kills them at once.
 */
function stopOnSignals(supervisor, log = DEFAULTS.log) {
  let stopping = false;
  const onSignal = (signal) => {
    if (stopping) {
      log(`${signal} again: killing what is left`);
      supervisor.stop('SIGKILL');
      return;
    }
    stopping = true;
    log(`${signal}: stopping`);
    supervisor.stop().then(() => process.exit(0));
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
}

module.exports = { supervise, stopOnSignals };
