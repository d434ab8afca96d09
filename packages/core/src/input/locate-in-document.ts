import { isAlias, isMap, isScalar, isSeq, type Document, type LineCounter } from 'yaml';
import type { PathKey } from './types';

/** A 1-based line and column. */
export interface Location {
  line: number;
  column: number;
}

function start(node: unknown): number | null {
  if (node && typeof node === 'object' && 'range' in node) {
    const range = (node as { range?: [number, number, number] | null }).range;
    if (range) return range[0];
  }
  return null;
}

function keyMatches(key: unknown, wanted: PathKey): boolean {
  return isScalar(key) && String(key.value) === String(wanted);
}

/**
 * Where a path into a document's data is written: the start of the value's node (or of the
 * property's name when `atKey`), or, when the path does not exist in the file, of the nearest
 * existing parent. Aliases are followed, and so are merge keys (`<<`).
 *
 * @example locateInDocument(doc, counter, ['materials', 'clay', 'strength']) // → { line: 7, column: 9 }
 */
export function locateInDocument(
  doc: Document,
  counter: LineCounter,
  path: readonly PathKey[],
  atKey = false,
): Location {
  let node: unknown = doc.contents;
  let offset = start(node) ?? 0;
  for (let i = 0; i < path.length; i++) {
    const key = path[i];
    const last = i === path.length - 1;
    if (isAlias(node)) node = node.resolve(doc);
    if (isMap(node)) {
      let pair = node.items.find((p) => keyMatches(p.key, key));
      if (!pair) {
        // Look in merged mappings: `<<: *base` or `<<: [*a, *b]`.
        for (const merge of node.items.filter((p) => keyMatches(p.key, '<<'))) {
          const sources = isSeq(merge.value) ? merge.value.items : [merge.value];
          for (const source of sources) {
            const resolved = isAlias(source) ? source.resolve(doc) : source;
            if (isMap(resolved)) pair = resolved.items.find((p) => keyMatches(p.key, key));
            if (pair) break;
          }
          if (pair) break;
        }
      }
      if (!pair) break;
      const keyStart = start(pair.key);
      const valueStart = start(pair.value);
      if (last && atKey && keyStart !== null) {
        offset = keyStart;
        break;
      }
      if (valueStart === null) {
        if (keyStart !== null) offset = keyStart;
        break;
      }
      offset = valueStart;
      node = pair.value;
    } else if (isSeq(node) && typeof key === 'number') {
      const item: unknown = node.items[key];
      const itemStart = start(item);
      if (itemStart === null) break;
      offset = itemStart;
      node = item;
    } else break;
  }
  const { line, col } = counter.linePos(offset);
  return { line, column: col };
}
