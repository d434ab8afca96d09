/**
 * The time limit of a section's analysis is kept (issue 13, item 3): the analysis runs in a
 * worker thread, is asked to stop itself before the limit (the core's shouldStop) and the
 * thread is terminated at the limit when it does not; either way the section's reason says
 * what to change. A crash of the thread is an error (retried by the queue), and the next
 * section gets a new thread. Runs the API's build of the thread (npm run build:node).
 */
import path from 'node:path';
import { parseSections, type Section } from '@scarpline/core';
import { Solver } from '../src/solver';
import { HEAVY_ANALYSIS, HEAVY_CENTRES, corridorBatch } from './sections';

function section(analysis: object = {}): Section {
  // one case a station: with the corridor's earthquake case the heavy one asks more than a file may
  const batch = corridorBatch('solver', 1, analysis, { oneCase: true });
  const parsed = parseSections(JSON.stringify(batch), 'solver.json');
  const s = parsed.entries[0].section;
  if (!s) throw new Error(JSON.stringify(parsed.entries[0].messages));
  return s;
}

const solvers: Solver[] = [];
const solver = (options?: ConstructorParameters<typeof Solver>[0]) => {
  const s = new Solver(options);
  solvers.push(s);
  return s;
};

afterAll(async () => {
  await Promise.all(solvers.map((s) => s.close()));
});

test('a light section is analysed in the thread and its result comes back', async () => {
  const s = solver();
  const outcome = await s.solve(section(), 60000);
  expect(outcome.kind).toBe('result');
  if (outcome.kind === 'result') {
    expect(outcome.result.governing?.fs).toEqual(expect.any(Number));
    expect(outcome.result.caution).toMatch(/qualified/);
  }
});

test('a heavy section stops itself at its time limit with what to change, and the thread goes on', async () => {
  const s = solver();
  await s.warm();
  const heavy = section(HEAVY_ANALYSIS);
  const surface = heavy.analysis.surface;
  if (surface?.type !== 'grid') throw new Error('a grid search');
  surface.centers = { ...(surface.centers as object), nx: HEAVY_CENTRES, ny: HEAVY_CENTRES };
  // Asked to stop after 2 s, ended at 3 s if it has not: it stops itself first.
  const outcome = await s.solve(heavy, 3000);
  expect(outcome).toEqual({
    kind: 'stopped',
    reason: expect.stringMatching(
      /^stopped at its time limit after [\d,]+ trial surfaces: use fewer grid centres, radii, moves, ground-range points or slices, or give the surface \(the time limit is 3 s a section\)$/,
    ),
  });
  // The same thread takes the next section.
  expect((await s.solve(section(), 60000)).kind).toBe('result');
});

test('an analysis that never stops itself is terminated at the limit; the next gets a new thread', async () => {
  const s = solver({ file: path.join(__dirname, 'fixtures/hanging-thread.js') });
  const outcome = await s.solve({}, 300);
  expect(outcome).toEqual({
    kind: 'stopped',
    reason:
      'the analysis did not end within the time limit of 0.3 s a section and was stopped: use fewer grid centres, radii, moves, ground-range points or slices, or give the surface',
  });
  // The hanging thread is gone: the next section runs in a new one (which hangs again here).
  expect((await s.solve({}, 200)).kind).toBe('stopped');
});

test('a thread that crashes is an error (worth a retry), and the next section gets a new one', async () => {
  const s = solver({ file: path.join(__dirname, 'fixtures/crashing-thread.js') });
  expect(await s.solve({}, 60000)).toEqual({
    kind: 'error',
    reason: 'the analysis thread failed: thread crashed on purpose',
  });
  expect(await s.solve({}, 60000)).toEqual({
    kind: 'error',
    reason: 'the analysis thread failed: thread crashed on purpose',
  });
});

test('closing the solver while it analyses ends the section aborted (the worker is stopping)', async () => {
  const s = solver({ file: path.join(__dirname, 'fixtures/hanging-thread.js') });
  await s.warm();
  const running = s.solve({}, 60000);
  await new Promise((r) => setTimeout(r, 50));
  await s.close();
  expect(await running).toEqual({ kind: 'aborted' });
  expect(await s.solve({}, 1000)).toEqual({ kind: 'aborted' });
});
