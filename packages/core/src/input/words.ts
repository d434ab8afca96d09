/** Small helpers that put data into the plain words of messages. */
import { UNIT_LABELS, type QuantityKind } from '../model/units';
import type { UnitSystem } from '../model/types';
import { INPUT_LIMITS } from './limits';
import type { PathKey } from './types';

/**
 * A path as written in messages: `materials.clay.strength.frictionAngle`, `strata[1].top`.
 *
 * @example pathText(['strata', 1, 'top']) // → 'strata[1].top'
 */
export function pathText(path: readonly PathKey[]): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else if (/^[A-Za-z0-9_][A-Za-z0-9_+@-]*$/.test(key)) out += out ? `.${key}` : key;
    else out += `[${quoteText(key)}]`;
  }
  return out;
}

/**
 * A number for messages: at most three decimals, no trailing zeros.
 *
 * @example num(12.50001) // → '12.5'
 */
export function num(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  const s = value.toFixed(3).replace(/\.?0+$/, '');
  return s === '-0' ? '0' : s;
}

/**
 * A text as quoted in a message: in JSON quotes, and shortened to its first 40 characters
 * (with its length) when it is longer than 60.
 *
 * @example quoteText('bishopp') // → '"bishopp"'
 */
export function quoteText(text: string): string {
  if (text.length <= 60) return JSON.stringify(text);
  return `${JSON.stringify(text.slice(0, 40)).slice(0, -1)}…" (${text.length} characters)`;
}

/**
 * A value as quoted in a message.
 *
 * @example quote('bishopp') // → '"bishopp"'
 */
export function quote(value: unknown): string {
  if (value === null || value === undefined) return 'nothing';
  if (typeof value === 'string') return quoteText(value);
  if (typeof value === 'number') return num(value);
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a group of settings';
  // eslint-disable-next-line @typescript-eslint/no-base-to-string -- a boolean: all that is left of YAML or JSON data
  return String(value);
}

const FIELD_KINDS: Record<string, QuantityKind | 'angle'> = {
  frictionAngle: 'angle',
  angle: 'angle',
  cohesion: 'pressure',
  su: 'pressure',
  pressure: 'pressure',
  suRate: 'pressurePerLength',
  unitWeight: 'unitWeight',
  saturatedUnitWeight: 'unitWeight',
  force: 'forcePerLength',
  radius: 'length',
  depth: 'length',
  waterDepth: 'length',
  from: 'length',
  to: 'length',
  x: 'length',
  station: 'length',
  offset: 'length',
  suDatum: 'length',
  elevation: 'length',
  dR: 'pressure',
  psiR: 'angle',
  allowableDisplacement: 'displacement',
  intactStrength: 'pressure',
  minimum: 'pressure',
  pop: 'pressure',
  breakStress: 'pressure',
  frictionAngleBeyond: 'angle',
};

/**
 * The unit suffix of a setting, by its name: `°` for angles, ` kPa` for a cohesion in si…;
 * empty for ratios and counts.
 *
 * @example unitSuffix('frictionAngle', 'si') // → '°'
 */
export function unitSuffix(field: PathKey | undefined, units: UnitSystem): string {
  if (typeof field !== 'string') return '';
  const kind = FIELD_KINDS[field];
  if (!kind) return '';
  if (kind === 'angle') return '°';
  return ` ${UNIT_LABELS[units][kind]}`;
}

/**
 * The length unit symbol of a unit system.
 *
 * @example lengthUnit('us') // → 'ft'
 */
export function lengthUnit(units: UnitSystem): string {
  return UNIT_LABELS[units].length;
}

/**
 * Edit distance counting a swap of two neighbouring letters as one edit; `limit + 1` for any
 * distance above `limit`, found from a band of the table `limit` wide on each side of its
 * diagonal (the cells outside it are further than that), and as soon as a whole row is
 * beyond it.
 */
function editDistance(a: string, b: string, limit: number): number {
  const far = limit + 1;
  if (Math.abs(a.length - b.length) > limit) return far;
  const n = b.length;
  let before = new Int32Array(n + 1).fill(far);
  let row = new Int32Array(n + 1).fill(far);
  for (let j = 0; j <= Math.min(n, limit); j++) row[j] = j;
  let next = new Int32Array(n + 1);
  for (let i = 1; i <= a.length; i++) {
    next.fill(far);
    next[0] = i <= limit ? i : far;
    let least = next[0];
    const ai = a.charCodeAt(i - 1);
    for (let j = Math.max(1, i - limit); j <= Math.min(n, i + limit); j++) {
      const bj = b.charCodeAt(j - 1);
      let d = Math.min(row[j] + 1, next[j - 1] + 1, row[j - 1] + (ai === bj ? 0 : 1));
      if (i > 1 && j > 1 && ai === b.charCodeAt(j - 2) && a.charCodeAt(i - 2) === bj) {
        d = Math.min(d, before[j - 2] + 1);
      }
      next[j] = Math.min(d, far);
      if (d < least) least = d;
    }
    if (least > limit) return far;
    [before, row, next] = [row, next, before];
  }
  return row[n];
}

/**
 * The option closest to a misspelt word, if one is close enough to be a likely typo. A word of
 * more than INPUT_LIMITS.suggestion characters, or a choice among more than a hundred
 * options, gets none: no one misspells that much, and the search stays cheap.
 *
 * @example closest('frictionangle', ['cohesion', 'frictionAngle']) // → 'frictionAngle'
 */
export function closest(word: string, options: readonly string[]): string | null {
  if (word.length > INPUT_LIMITS.suggestion || options.length > 100) return null;
  const allowed = Math.max(1, Math.floor(word.length / 3));
  const lower = word.toLowerCase();
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const option of options) {
    if (Math.abs(option.length - word.length) > allowed) continue;
    const distance = editDistance(lower, option.toLowerCase(), allowed);
    if (distance < bestDistance) {
      best = option;
      bestDistance = distance;
    }
  }
  return best !== null && bestDistance <= allowed ? best : null;
}

/**
 * A list in words: `a, b and c`; with `most`, the first `most` and how many more.
 *
 * @example listWords(['a', 'b', 'c']) // → 'a, b and c'
 * @example listWords(['a', 'b', 'c'], 1) // → 'a and 2 more'
 */
export function listWords(items: readonly string[], most = Infinity): string {
  if (items.length > most)
    return `${items.slice(0, most).join(', ')} and ${items.length - most} more`;
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
