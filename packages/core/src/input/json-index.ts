import type { Location } from './locate-in-document';
import type { PathKey } from './types';

/** The entries of a list or group of a JSON text: where each is written. */
interface Entries {
  /** A list's indices, or a group's names, in the order written. */
  keys: PathKey[];
  /** Where each entry starts: a group's entry at its name, a list's at its value. */
  starts: number[];
  /** Where each value starts, and the offset after it. */
  values: number[];
  ends: number[];
  /** A group's names → their entry. */
  names?: Map<string, number>;
}

const isSpace = (c: number): boolean => c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09;

/**
 * Where the parts of a valid JSON text are written: what locates the messages about a JSON
 * file at the place they concern, as the YAML parser's nodes do for YAML (locateInDocument), at
 * a small part of its cost. A list or group is looked into only when a path goes through it,
 * once. The text must be valid JSON (JSON.parse read it) and name no setting twice in a group
 * (a duplicate would be found at its first place).
 *
 * @example new JsonIndex('{"a": [1, 2]}').locate(['a', 1]) // → { line: 1, column: 11 }
 */
export class JsonIndex {
  private readonly entries = new Map<number, Entries>();
  private readonly root: number;
  private lineStarts: number[] | null = null;

  constructor(private readonly text: string) {
    let i = 0;
    while (i < text.length && isSpace(text.charCodeAt(i))) i++;
    this.root = i;
  }

  /** The offset after the string whose opening quote is at `i`. */
  private skipString(i: number): number {
    const { text } = this;
    for (let k = i + 1; k < text.length; k++) {
      const c = text.charCodeAt(k);
      if (c === 0x5c) k++;
      else if (c === 0x22) return k + 1;
    }
    return text.length;
  }

  /** The offset after the value that starts at `i`. */
  private skipValue(i: number): number {
    const { text } = this;
    const c = text.charCodeAt(i);
    if (c === 0x22) return this.skipString(i);
    if (c === 0x7b || c === 0x5b) {
      let depth = 0;
      for (let k = i; k < text.length; k++) {
        const d = text.charCodeAt(k);
        if (d === 0x22) k = this.skipString(k) - 1;
        else if (d === 0x7b || d === 0x5b) depth++;
        else if (d === 0x7d || d === 0x5d) {
          if (--depth === 0) return k + 1;
        }
      }
      return text.length;
    }
    let k = i;
    while (k < text.length) {
      const d = text.charCodeAt(k);
      if (isSpace(d) || d === 0x2c || d === 0x5d || d === 0x7d) break;
      k++;
    }
    return k;
  }

  /** The entries of the list or group that starts at `at` (null for any other value). */
  private entriesAt(at: number): Entries | null {
    const known = this.entries.get(at);
    if (known) return known;
    const { text } = this;
    const open = text.charCodeAt(at);
    if (open !== 0x7b && open !== 0x5b) return null;
    const group = open === 0x7b;
    const found: Entries = { keys: [], starts: [], values: [], ends: [] };
    if (group) found.names = new Map();
    let i = at + 1;
    const skipSpace = (): void => {
      while (i < text.length && isSpace(text.charCodeAt(i))) i++;
    };
    for (;;) {
      skipSpace();
      const c = text.charCodeAt(i);
      if (i >= text.length || c === 0x7d || c === 0x5d) break;
      if (c === 0x2c) {
        i++;
        skipSpace();
      }
      const start = i;
      let key: PathKey = found.keys.length;
      if (group) {
        const end = this.skipString(i);
        const raw = text.slice(i, end);
        key = raw.includes('\\') ? (JSON.parse(raw) as string) : raw.slice(1, -1);
        i = end;
        skipSpace();
        i++; // the colon
        skipSpace();
        found.names?.set(key, found.keys.length);
      }
      found.keys.push(key);
      found.starts.push(start);
      found.values.push(i);
      i = this.skipValue(i);
      found.ends.push(i);
    }
    this.entries.set(at, found);
    return found;
  }

  /** The offset of the value at a path, or of its name (`atKey`); of the nearest parent when absent. */
  offset(path: readonly PathKey[], atKey = false): number {
    let at = this.root;
    for (let k = 0; k < path.length; k++) {
      const found = this.entriesAt(at);
      if (!found) break;
      const key = path[k];
      let entry: number | undefined;
      if (found.names) entry = found.names.get(String(key));
      else if (typeof key === 'number' && key >= 0 && key < found.keys.length) entry = key;
      if (entry === undefined) break;
      if (atKey && k === path.length - 1 && found.names) return found.starts[entry];
      at = found.values[entry];
    }
    return at;
  }

  /** The 1-based line and column of an offset. */
  position(offset: number): Location {
    const starts = this.lines();
    let lo = 0;
    let hi = starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (starts[mid] <= offset) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo + 1, column: offset - starts[lo] + 1 };
  }

  /** The offset of a 1-based line and column. */
  offsetAt(location: Location): number {
    const starts = this.lines();
    return (starts[location.line - 1] ?? this.text.length) + location.column - 1;
  }

  private lines(): number[] {
    if (!this.lineStarts) {
      const starts = [0];
      for (let i = this.text.indexOf('\n'); i >= 0; i = this.text.indexOf('\n', i + 1)) {
        starts.push(i + 1);
      }
      this.lineStarts = starts;
    }
    return this.lineStarts;
  }

  /**
   * Where a path into the data is written (as locateInDocument says it for a JSON text): the
   * start of the value, or of its name with `atKey`, or of the nearest parent that exists.
   */
  locate(path: readonly PathKey[], atKey = false): Location {
    return this.position(this.offset(path, atKey));
  }

  /** The path of the deepest entry written at an offset (a name gives its setting). */
  pathAt(offset: number): PathKey[] {
    const path: PathKey[] = [];
    let at = this.root;
    for (;;) {
      const found = this.entriesAt(at);
      if (!found || found.starts.length === 0) return path;
      // the last entry that starts at or before the offset
      let lo = 0;
      let hi = found.starts.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (found.starts[mid] <= offset) lo = mid;
        else hi = mid - 1;
      }
      if (found.starts[lo] > offset || found.ends[lo] < offset) return path;
      path.push(found.keys[lo]);
      if (offset < found.values[lo]) return path;
      at = found.values[lo];
    }
  }
}
