/**
 * `npm start` keeps its processes running (scripts/supervise.js): a child that ends is started
 * again after a pause, with one line that says so, and never takes the others down; Ctrl-C
 * ends them all. Children here are small Node processes, pauses tens of milliseconds.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

type Spec = { name: string; command: string; args: string[] };
type Supervisor = {
  current(name: string): ChildProcess | null;
  starts(name: string): number;
  stop(signal?: NodeJS.Signals): Promise<void>;
};
// eslint-disable-next-line @typescript-eslint/no-require-imports
const { supervise } = require('../scripts/supervise.js') as {
  supervise: (
    specs: Spec[],
    settings?: {
      firstDelayMs?: number;
      longestDelayMs?: number;
      steadyMs?: number;
      log?: (line: string) => void;
    },
  ) => Supervisor;
};

const SCRIPT = path.resolve(__dirname, '../scripts/supervise.js');
const node = (name: string, code: string): Spec => ({
  name,
  command: process.execPath,
  args: ['-e', code],
});
const forever = 'setInterval(() => {}, 1000)';

/** Waits until `check` holds (every 10 ms, at most 10 s). */
async function until(what: string, check: () => boolean): Promise<void> {
  const end = Date.now() + 10000;
  while (!check()) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 10));
  }
}
const gone = (pid: number): boolean => {
  try {
    process.kill(pid, 0);
    return false;
  } catch {
    return true;
  }
};

let running: Supervisor | null = null;
afterEach(async () => {
  await running?.stop('SIGKILL');
  running = null;
});

test('a worker killed with SIGKILL is started again; the API keeps running', async () => {
  const lines: string[] = [];
  const s = supervise([node('API', forever), node('worker', forever)], {
    firstDelayMs: 50,
    log: (l) => lines.push(l),
  });
  running = s;
  const api = s.current('API') as ChildProcess;
  const worker = s.current('worker') as ChildProcess;
  worker.kill('SIGKILL');
  await until('the worker started again', () => s.starts('worker') === 2);
  expect(lines).toEqual(['worker killed by SIGKILL; starting it again in 0.05 s']);
  expect(s.current('worker')?.pid).not.toBe(worker.pid);
  expect(s.current('API')).toBe(api);
  expect(api.exitCode).toBeNull();
  expect(s.starts('API')).toBe(1);

  // the API too, when it ends
  api.kill('SIGTERM');
  await until('the API started again', () => s.starts('API') === 2);
  expect(lines[1]).toBe('API killed by SIGTERM; starting it again in 0.05 s');

  // stopped: every child ends, and none is started again
  const [a, w] = [s.current('API') as ChildProcess, s.current('worker') as ChildProcess];
  await s.stop();
  expect([gone(a.pid as number), gone(w.pid as number)]).toEqual([true, true]);
  await new Promise((r) => setTimeout(r, 150));
  expect([s.starts('API'), s.starts('worker')]).toEqual([2, 2]);
});

test('a child that keeps failing waits twice as long each time, up to the longest pause', async () => {
  const lines: string[] = [];
  const s = supervise([node('worker', 'process.exit(3)')], {
    firstDelayMs: 20,
    longestDelayMs: 80,
    log: (l) => lines.push(l),
  });
  running = s;
  await until('five ends', () => lines.length >= 5);
  await s.stop();
  expect(lines.slice(0, 5)).toEqual(
    ['0.02', '0.04', '0.08', '0.08', '0.08'].map(
      (t) => `worker exited with code 3; starting it again in ${t} s`,
    ),
  );
});

test('a child that ran steadily before it ended waits the first pause again', async () => {
  const lines: string[] = [];
  const s = supervise([node('worker', 'setTimeout(() => process.exit(1), 120)')], {
    firstDelayMs: 20,
    steadyMs: 100,
    log: (l) => lines.push(l),
  });
  running = s;
  await until('three ends', () => lines.length >= 3);
  await s.stop();
  expect(new Set(lines.slice(0, 3))).toEqual(
    new Set(['worker exited with code 1; starting it again in 0.02 s']),
  );
});

test('a command that cannot start is tried again, said in one line', async () => {
  const lines: string[] = [];
  const s = supervise([{ name: 'worker', command: '/nonexistent/node', args: [] }], {
    firstDelayMs: 20,
    log: (l) => lines.push(l),
  });
  running = s;
  await until('two tries', () => lines.length >= 2);
  await s.stop();
  expect(lines[0]).toMatch(/^worker could not start \(.*ENOENT.*\); starting it again in 0.02 s$/);
});

test('Ctrl-C stops every child and the launcher', async () => {
  const launcher = spawn(
    process.execPath,
    [
      '-e',
      `const { supervise, stopOnSignals } = require(${JSON.stringify(SCRIPT)});
       const spec = (name) => ({ name, command: process.execPath, args: ['-e', ${JSON.stringify(forever)}] });
       const s = supervise([spec('API'), spec('worker')]);
       stopOnSignals(s);
       setTimeout(() => console.log('pids', s.current('API').pid, s.current('worker').pid), 100);`,
    ],
    { stdio: ['ignore', 'pipe', 'pipe'] },
  );
  let out = '';
  launcher.stdout?.on('data', (c: Buffer) => (out += c.toString()));
  await until('the children', () => /pids \d+ \d+/.test(out));
  const pids = (/pids (\d+) (\d+)/.exec(out) as RegExpExecArray).slice(1).map(Number);
  const exited = new Promise<number | null>((r) => launcher.once('exit', (code) => r(code)));
  launcher.kill('SIGINT');
  expect(await exited).toBe(0);
  expect(out).toMatch(/SIGINT: stopping/);
  expect(pids.map(gone)).toEqual([true, true]);
});
