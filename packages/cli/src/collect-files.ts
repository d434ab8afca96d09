import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

const SECTION_FILE = /\.(ya?ml|json)$/i;

/**
 * The files named on the command line, with each directory replaced by every .yaml, .yml and
 * .json file under it (recursively, sorted; hidden folders and node_modules skipped). A path
 * that does not exist is returned in `missing`.
 *
 * @example collectFiles(['examples']) // → { files: ['examples/cut-homogeneous.yaml', …], missing: [] }
 */
export function collectFiles(paths: readonly string[]): { files: string[]; missing: string[] } {
  const files: string[] = [];
  const missing: string[] = [];
  const walk = (dir: string): void => {
    const entries = readdirSync(dir, { withFileTypes: true }).sort((a, b) =>
      a.name.localeCompare(b.name),
    );
    for (const entry of entries) {
      const full = join(dir, entry.name);
      if (entry.isDirectory()) {
        if (!entry.name.startsWith('.') && entry.name !== 'node_modules') walk(full);
      } else if (SECTION_FILE.test(entry.name)) files.push(full);
    }
  };
  for (const path of paths) {
    let isDirectory: boolean;
    try {
      isDirectory = statSync(path).isDirectory();
    } catch {
      missing.push(path);
      continue;
    }
    if (isDirectory) walk(path);
    else files.push(path);
  }
  return { files, missing };
}
