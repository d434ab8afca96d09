import { count, INPUT_LIMITS } from './limits';
import type { Issue, PathKey } from './types';

/**
 * The character of a text that no stored text may hold, in words: U+0000, or half of a
 * surrogate pair on its own (text that is not valid Unicode); null when there is none.
 *
 * @example badCharacter('a\u0000b') // → 'the character U+0000 (NUL)'
 */
export function badCharacter(text: string): string | null {
  // most texts hold neither: one search, then a closer look
  if (!/[\0\ud800-\udfff]/.test(text)) return null;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return 'the character U+0000 (NUL)';
    if (c >= 0xd800 && c <= 0xdbff) {
      const d = text.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) {
        i++;
        continue;
      }
    }
    if (c >= 0xd800 && c <= 0xdfff) {
      const hex = c.toString(16).toUpperCase();
      return `half of a character on its own (U+${hex}, a lone surrogate: the text is not valid Unicode)`;
    }
  }
  return null;
}

/** A value met in the walk, with the way to it (kept as links: paths are built only when needed). */
interface Step {
  value: unknown;
  depth: number;
  parent: Step | null;
  key: PathKey;
}

function pathOf(step: Step | null): PathKey[] {
  const path: PathKey[] = [];
  for (let s = step; s && s.parent; s = s.parent) path.push(s.key);
  return path.reverse();
}

/**
 * Checks data read from a file (or sent as JSON) for what the text's own check cannot see
 * or what no part of a file may be: nesting, entries of a list or group and of the whole, and
 * length of a text or a name beyond INPUT_LIMITS (`refusal`: the data is not read further),
 * and texts or names holding U+0000 or half of a surrogate pair (`issues`: errors at their
 * place; the rest is read). One walk without recursion, however deep the data.
 *
 * @example screenData({ title: 'a\u0000b' }).issues[0].path // → ['title']
 */
export function screenData(data: unknown): { refusal: Issue | null; issues: Issue[] } {
  const L = INPUT_LIMITS;
  const issues: Issue[] = [];
  const refuse = (step: Step | null, code: string, message: string, key = false) => ({
    refusal: {
      severity: 'error' as const,
      path: pathOf(step),
      code,
      message,
      ...(key ? { key } : {}),
    },
    issues,
  });
  const stack: Step[] = [{ value: data, depth: 0, parent: null, key: '' }];
  let values = 0;
  while (stack.length > 0) {
    const step = stack.pop() as Step;
    const { value } = step;
    if (typeof value === 'string') {
      if (value.length > L.textLength) {
        return refuse(
          step,
          'too-long',
          `is a text of ${count(value.length)} characters; at most ${count(L.textLength)} are read`,
        );
      }
      const bad = badCharacter(value);
      if (bad) {
        issues.push({
          severity: 'error',
          path: pathOf(step),
          code: 'bad-character',
          message: `holds ${bad}: remove it`,
        });
      }
      continue;
    }
    if (value === null || typeof value !== 'object') continue;
    if (step.depth >= L.depth) {
      return refuse(
        step,
        'too-deep',
        `lists and groups are nested more than ${L.depth} deep here; a section file needs far fewer: is this the right file?`,
      );
    }
    const list = Array.isArray(value);
    const keys = list ? null : Object.keys(value);
    const size = list ? (value as unknown[]).length : (keys as string[]).length;
    if (size > L.entries) {
      return refuse(
        step,
        'too-many',
        list
          ? `is a list of ${count(size)} entries; at most ${count(L.entries)} are read`
          : `is a group of ${count(size)} settings; at most ${count(L.entries)} are read`,
      );
    }
    values += size;
    if (values > L.values) {
      return refuse(
        step,
        'too-many-values',
        `the data holds more than ${count(L.values)} values (numbers, texts, lists and groups); at most ${count(L.values)} are read`,
      );
    }
    const depth = step.depth + 1;
    if (list) {
      const items = value as unknown[];
      for (let i = items.length - 1; i >= 0; i--) {
        stack.push({ value: items[i], depth, parent: step, key: i });
      }
    } else {
      const record = value as Record<string, unknown>;
      const names = keys as string[];
      for (let i = names.length - 1; i >= 0; i--) {
        const name = names[i];
        const child: Step = { value: record[name], depth, parent: step, key: name };
        if (name.length > L.textLength) {
          return refuse(
            child,
            'too-long',
            `is a name of ${count(name.length)} characters; at most ${count(L.textLength)} are read`,
            true,
          );
        }
        const bad = badCharacter(name);
        if (bad) {
          issues.push({
            severity: 'error',
            path: pathOf(child),
            code: 'bad-character',
            message: `the name holds ${bad}: remove it`,
            key: true,
          });
        }
        stack.push(child);
      }
    }
  }
  return { refusal: null, issues };
}

/**
 * The values a piece of data holds: every entry of every list and group in it, counted
 * without recursion.
 *
 * @example countValues({ ground: [[0, 1], [2, 3]] }) // → 7
 */
export function countValues(data: unknown): number {
  let n = 0;
  const stack: unknown[] = [data];
  while (stack.length > 0) {
    const v = stack.pop();
    if (v === null || typeof v !== 'object') continue;
    const items = Array.isArray(v) ? (v as unknown[]) : Object.values(v);
    n += items.length;
    for (const item of items) if (item !== null && typeof item === 'object') stack.push(item);
  }
  return n;
}
