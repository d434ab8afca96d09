/** Small helpers that put data into the plain words of messages. */
import { UNIT_LABELS, type QuantityKind } from '../model/units';
import type { UnitSystem } from '../model/types';
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
    else out += `[${JSON.stringify(key)}]`;
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
 * A value as quoted in a message.
 *
 * @example quote('bishopp') // → '"bishopp"'
 */
export function quote(value: unknown): string {
  if (value === null || value === undefined) return 'nothing';
  if (typeof value === 'string') return JSON.stringify(value);
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

/** Edit distance counting a swap of two neighbouring letters as one edit. */
function editDistance(a: string, b: string): number {
  const d: number[][] = [];
  for (let i = 0; i <= a.length; i++) d.push([i]);
  for (let j = 1; j <= b.length; j++) d[0][j] = j;
  for (let i = 1; i <= a.length; i++) {
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      d[i][j] = Math.min(d[i - 1][j] + 1, d[i][j - 1] + 1, d[i - 1][j - 1] + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) {
        d[i][j] = Math.min(d[i][j], d[i - 2][j - 2] + 1);
      }
    }
  }
  return d[a.length][b.length];
}

/**
 * The option closest to a misspelt word, if one is close enough to be a likely typo.
 *
 * @example closest('frictionangle', ['cohesion', 'frictionAngle']) // → 'frictionAngle'
 */
export function closest(word: string, options: readonly string[]): string | null {
  let best: string | null = null;
  let bestDistance = Infinity;
  for (const option of options) {
    const distance = editDistance(word.toLowerCase(), option.toLowerCase());
    if (distance < bestDistance) {
      best = option;
      bestDistance = distance;
    }
  }
  const allowed = Math.max(1, Math.floor(word.length / 3));
  return best !== null && bestDistance <= allowed ? best : null;
}

/**
 * A list in words: `a, b and c`.
 *
 * @example listWords(['a', 'b', 'c']) // → 'a, b and c'
 */
export function listWords(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}
