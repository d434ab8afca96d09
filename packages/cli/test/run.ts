import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

// The tests run the built command (`npm test` builds first).
export const ROOT = join(__dirname, '..', '..', '..');
export const MAIN = join(ROOT, 'packages', 'cli', 'dist', 'main.js');
export const FIXTURES = join(__dirname, 'fixtures');

/** Runs `scarpline ARGS` (optionally with standard input) from the repository root. */
export function run(args: string[], input?: string) {
  const r = spawnSync(process.execPath, [MAIN, ...args], { cwd: ROOT, encoding: 'utf8', input });
  return { code: r.status, out: r.stdout, err: r.stderr };
}
