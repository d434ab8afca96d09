import { count, INPUT_LIMITS } from './limits';
import type { Location } from './locate-in-document';

/** Why a text is refused before it is parsed, and where. */
export interface Refusal extends Location {
  code: 'too-large' | 'too-deep' | 'too-many' | 'too-many-values' | 'too-long';
  message: string;
}

/** What the screen of a text found: a reason to refuse it, or none and the values it holds. */
export interface Screened {
  refusal: Refusal | null;
  /**
   * The entries of all the lists and groups of the text, as far as it was read: for valid JSON
   * exactly countValues of what JSON.parse makes of it, unless a group names a setting twice.
   */
  values: number;
}

/** The line and column of an offset (1-based). */
function locationOf(text: string, offset: number): Location {
  let line = 1;
  let start = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, column: offset - start + 1 };
}

const LF = 10;
const CR = 13;
const SPACE = 32;
const TAB = 9;
const HASH = 35;
const DQUOTE = 34;
const SQUOTE = 39;
const BACKSLASH = 92;
const COMMA = 44;
const COLON = 58;
const DASH = 45;
const QUESTION = 63;
const PIPE = 124;
const GREATER = 62;
const AMPERSAND = 38;
const BANG = 33;
const PERCENT = 37;
const DOT = 46;
const OPEN_SQUARE = 91;
const CLOSE_SQUARE = 93;
const OPEN_CURLY = 123;
const CLOSE_CURLY = 125;

const isBlank = (c: number): boolean => c === SPACE || c === TAB;
/** End of a line (or of the text: NaN). */
const isBreak = (c: number): boolean => c === LF || c === CR || Number.isNaN(c);

/** An open list or group: where it starts, whether it is a group, how many entries so far. */
interface Open {
  at: number;
  group: boolean;
  entries: number;
}

/** A list or group of YAML's block style: its indentation as well. */
interface Block extends Open {
  indent: number;
}

/**
 * Checks a file's text for what would make reading it cost far more than any section file
 * needs, in one pass over its characters and before any parser sees it: its length, the
 * nesting of its lists and groups, the entries of each list or group and of all of them
 * together, and the length of each text written in quotes or plain on a line (INPUT_LIMITS).
 * JSON is read as JSON; anything else as YAML, in block or flow style, with comments, quoted
 * texts and block texts (`|`, `>`) told apart from structure. Returns the first limit passed,
 * with where, or none and the count of entries. The count of a YAML file's entries is close,
 * not exact: the parser and the schema judge the file in detail; this only keeps them from a
 * file too big to judge.
 *
 * @example screenText('['.repeat(10000) + ']'.repeat(10000), true).refusal?.code // → 'too-deep'
 */
export function screenText(text: string, json: boolean): Screened {
  let values = 0;
  const refusal = scan(text, json, () => ++values);
  return { refusal, values };
}

/** The scan of screenText: `counted` is told of every entry and says how many so far. */
function scan(text: string, json: boolean, counted: () => number): Refusal | null {
  const L = INPUT_LIMITS;
  if (text.length > L.characters) {
    return {
      line: 1,
      column: 1,
      code: 'too-large',
      message: `the file has ${count(text.length)} characters; at most ${count(L.characters)} are read (split a long corridor into several batches)`,
    };
  }
  const refuse = (at: number, code: Refusal['code'], message: string): Refusal => ({
    ...locationOf(text, at),
    code,
    message,
  });
  const tooDeep = (at: number) =>
    refuse(
      at,
      'too-deep',
      `lists and groups are nested more than ${L.depth} deep here; a section file needs far fewer: is this the right file?`,
    );
  const tooMany = (o: Open) =>
    refuse(
      o.at,
      'too-many',
      o.group
        ? `a group of more than ${count(L.entries)} settings; at most ${count(L.entries)} are read`
        : `a list of more than ${count(L.entries)} entries; at most ${count(L.entries)} are read`,
    );
  const tooLong = (at: number) =>
    refuse(
      at,
      'too-long',
      `a text of more than ${count(L.textLength)} characters; at most ${count(L.textLength)} are read`,
    );
  /** One more entry in a list or group: null, or why that is one too many. */
  const entry = (o: Open, at: number): Refusal | null => {
    o.entries++;
    if (o.entries > L.entries) return tooMany(o);
    if (counted() > L.values) {
      return refuse(
        at,
        'too-many-values',
        `the file holds more than ${count(L.values)} values (numbers, texts, lists and groups); at most ${count(L.values)} are read`,
      );
    }
    return null;
  };

  const n = text.length;
  const flow: (Open & { content: boolean })[] = [];
  const block: Block[] = [];
  /** Opens a list of the block style at a column (`- - x` opens two on one line). */
  const openBlock = (at: number, indent: number, group: boolean): Refusal | null => {
    const opened: Block = { at, group, entries: 0, indent };
    block.push(opened);
    if (block.length > L.depth) return tooDeep(at);
    return entry(opened, at);
  };
  /**
   * Where a node may start: a quote or a bracket there opens a text, a list or a group. Where
   * YAML would not open one (inside plain text) a bracket is text; everywhere else this errs
   * on the side of counting it.
   */
  let nodeStart = true;
  /** The plain text being read: where it started (-1: none) and its characters so far. */
  let plainAt = -1;
  let plainLength = 0;
  /** The current line: where it starts, the column of its setting's name and of its last `- `. */
  let lineOffset = 0;
  let keyColumn = -1;
  let itemColumn = -1;
  /** A quoted text or a list just ended: a colon right after it is a setting's (`"a":[1]`). */
  let afterClosed = false;
  let lineStart = true;
  let i = 0;

  /** Reads a quoted text from its opening quote; returns the offset after it, or a refusal. */
  const quoted = (at: number, quote: number): number | Refusal => {
    let length = 0;
    let k = at + 1;
    while (k < n) {
      const c = text.charCodeAt(k);
      if (c === quote) {
        if (quote === SQUOTE && text.charCodeAt(k + 1) === SQUOTE) {
          k += 2;
        } else return k + 1;
      } else if (c === BACKSLASH && quote === DQUOTE) {
        const e = text.charCodeAt(k + 1);
        k += e === 117 ? 6 : e === 120 ? 4 : e === 85 ? 10 : 2; // \uXXXX, \xXX, \UXXXXXXXX
      } else k++;
      if (++length > L.textLength) return tooLong(at);
    }
    return n;
  };

  while (i < n) {
    // --- YAML's block style: a line's indentation opens and closes lists and groups
    if (!json && lineStart && flow.length === 0) {
      lineStart = false;
      lineOffset = i;
      keyColumn = -1;
      itemColumn = -1;
      afterClosed = false;
      plainAt = -1;
      let p = i;
      while (p < n && isBlank(text.charCodeAt(p))) p++;
      const c = text.charCodeAt(p);
      if (isBreak(c) || c === HASH) {
        // a blank line or a comment: skip it
        while (p < n && text.charCodeAt(p) !== LF) p++;
        i = p + 1;
        lineStart = true;
        continue;
      }
      const indent = p - i;
      const marker =
        indent === 0 &&
        (c === DASH || c === DOT) &&
        text.charCodeAt(p + 1) === c &&
        text.charCodeAt(p + 2) === c &&
        (isBlank(text.charCodeAt(p + 3)) || isBreak(text.charCodeAt(p + 3)));
      if ((indent === 0 && c === PERCENT) || (marker && c === DOT)) {
        // a directive or the end of a document
        block.length = 0;
        while (p < n && text.charCodeAt(p) !== LF) p++;
        i = p + 1;
        lineStart = true;
        continue;
      }
      if (marker) {
        // a new document; what follows on the line is its root
        block.length = 0;
        i = p + 3;
        nodeStart = true;
        continue;
      }
      const item =
        c === DASH && (isBlank(text.charCodeAt(p + 1)) || isBreak(text.charCodeAt(p + 1)));
      while (block.length > 0 && block[block.length - 1].indent > indent) block.pop();
      let top = block[block.length - 1];
      // a list given as a setting's value may sit at the setting's own indentation
      if (top && top.indent === indent && !top.group && !item) {
        block.pop();
        top = block[block.length - 1];
      }
      const r =
        top && top.indent === indent && top.group === !item
          ? entry(top, p)
          : openBlock(p, indent, !item);
      if (r) return r;
      if (item) {
        itemColumn = indent;
        p++;
      }
      i = p;
      nodeStart = true;
      continue;
    }

    const c = text.charCodeAt(i);
    if (c === LF) {
      i++;
      plainAt = -1;
      // inside a list or group of the flow style, lines and indentation mean nothing
      if (flow.length === 0) {
        lineStart = true;
        nodeStart = true;
      }
      continue;
    }
    if (isBlank(c) || c === CR) {
      if (plainAt >= 0 && ++plainLength > L.textLength) return tooLong(plainAt);
      i++;
      continue;
    }
    // a comment: to the end of the line
    if (!json && c === HASH && (i === 0 || isBlank(text.charCodeAt(i - 1)) || plainAt < 0)) {
      while (i < n && text.charCodeAt(i) !== LF) i++;
      continue;
    }
    const inFlow = flow.length > 0;
    const next = text.charCodeAt(i + 1);
    if (
      !json &&
      !inFlow &&
      nodeStart &&
      (c === DASH || c === QUESTION) &&
      (isBlank(next) || isBreak(next))
    ) {
      // `- - x`, `? - x`: lists opened on the same line, each one level deeper
      if (c === DASH) {
        const r = openBlock(i, i - lineOffset, false);
        if (r) return r;
      }
      itemColumn = i - lineOffset;
      i++;
      continue;
    }
    if ((c === DQUOTE || (!json && c === SQUOTE)) && (json || nodeStart)) {
      if (!inFlow && keyColumn < 0) keyColumn = i - lineOffset;
      const end = quoted(i, c);
      if (typeof end !== 'number') return end;
      if (inFlow) flow[flow.length - 1].content = true;
      i = end;
      // YAML allows nothing but a colon or a comment here; a bracket would still open a list
      nodeStart = !inFlow;
      afterClosed = true;
      plainAt = -1;
      continue;
    }
    if ((c === OPEN_SQUARE || c === OPEN_CURLY) && (json || inFlow || nodeStart)) {
      if (inFlow) flow[flow.length - 1].content = true;
      flow.push({ at: i, group: c === OPEN_CURLY, entries: 0, content: false });
      if (flow.length + block.length > L.depth) return tooDeep(i);
      i++;
      nodeStart = true;
      afterClosed = false;
      plainAt = -1;
      continue;
    }
    if (inFlow && (c === CLOSE_SQUARE || c === CLOSE_CURLY)) {
      const closed = flow.pop() as Open & { content: boolean };
      if (closed.content) {
        const r = entry(closed, i);
        if (r) return r;
      }
      i++;
      nodeStart = flow.length === 0;
      afterClosed = true;
      plainAt = -1;
      continue;
    }
    if (inFlow && c === COMMA) {
      const top = flow[flow.length - 1];
      const r = entry(top, i);
      if (r) return r;
      top.content = false;
      i++;
      nodeStart = true;
      afterClosed = false;
      plainAt = -1;
      continue;
    }
    if (c === COLON && (inFlow || json || afterClosed || isBlank(next) || isBreak(next))) {
      // a setting's name ends: its value follows
      i++;
      nodeStart = true;
      afterClosed = false;
      plainAt = -1;
      continue;
    }
    afterClosed = false;
    if (!json && !inFlow && nodeStart) {
      if ((c === PIPE || c === GREATER) && plainAt < 0) {
        // a block text: the lines below indented more than the setting (or `- `) it belongs to
        const parent =
          keyColumn >= 0
            ? keyColumn
            : itemColumn >= 0
              ? itemColumn
              : block.length > 0
                ? block[block.length - 1].indent
                : -1;
        let k = text.indexOf('\n', i);
        let length = 0;
        while (k >= 0 && k < n) {
          let p = k + 1;
          while (p < n && text.charCodeAt(p) === SPACE) p++;
          if (!isBreak(text.charCodeAt(p)) && p - (k + 1) <= parent) break;
          if (p === k + 1 && /^(?:---|\.\.\.)(?:[ \t\r\n]|$)/.test(text.slice(p, p + 4))) break;
          const end = text.indexOf('\n', p);
          length += (end < 0 ? n : end) - p + 1;
          if (length > L.textLength) return tooLong(i);
          k = end;
        }
        i = k < 0 ? n : k;
        nodeStart = false;
        continue;
      }
      if (c === AMPERSAND || c === BANG) {
        // an anchor or a tag before the node
        while (i < n && !isBlank(text.charCodeAt(i)) && !isBreak(text.charCodeAt(i))) i++;
        continue;
      }
    }
    // plain text (a number, a word, a name)
    if (inFlow) flow[flow.length - 1].content = true;
    else if (keyColumn < 0) keyColumn = i - lineOffset;
    if (plainAt < 0) {
      plainAt = i;
      plainLength = 0;
    }
    if (++plainLength > L.textLength) return tooLong(plainAt);
    nodeStart = false;
    i++;
  }
  return null;
}
