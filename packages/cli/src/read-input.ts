import { readFileSync } from 'node:fs';

/** The name messages give to standard input. */
export const STDIN_NAME = '<stdin>';

/**
 * The text of a file, or of standard input for `-`. Throws a UserError (a plain message, no
 * stack trace) when the file cannot be read.
 *
 * @example readInput('examples/cut-homogeneous.yaml') // → { name: 'examples/…', text: '# Wendlecombe…' }
 */
export function readInput(path: string): { name: string; text: string } {
  if (path === '-') return { name: STDIN_NAME, text: readFileSync(0, 'utf8') };
  try {
    return { name: path, text: readFileSync(path, 'utf8') };
  } catch (e) {
    const code = e instanceof Error && 'code' in e ? String(e.code) : '';
    if (code === 'ENOENT') throw new UserError(`${path}: no such file or directory`);
    if (code === 'EISDIR') throw new UserError(`${path}: is a directory; give a file`);
    throw new UserError(`${path}: cannot read the file${code ? ` (${code})` : ''}`);
  }
}

/** An error in what the user asked for: printed as one line, without a stack trace. */
export class UserError extends Error {}
