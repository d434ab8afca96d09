/**
 * Words a file of an earlier version may still hold, and what to write instead: a method id
 * that was renamed, and the Morgenstern–Price interslice shapes that became one
 * piecewise-linear form. The input's messages, the command line and the service's migration
 * all take them from here.
 */
import type { IntersliceFunction, IntersliceOrdinate, MethodId } from './types';

/** Method ids of earlier versions → today's. */
export const RENAMED_METHODS: Readonly<Record<string, MethodId>> = {
  'swedish-circle': 'phi-zero-circle',
};

/** Interslice shapes of earlier versions: each is now written as points of a piecewise-linear f(ξ). */
export const FORMER_INTERSLICE_SHAPES: readonly string[] = ['clipped-sine', 'trapezoid'];

/** The settings only the former shapes had. */
export const FORMER_INTERSLICE_SETTINGS: readonly string[] = ['end', 'ramp'];

const round = (v: number) => Number(v.toFixed(3));
const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/**
 * A former interslice function as the piecewise-linear function of today: the trapezoid
 * exactly (f rising linearly from `end` to 1 over `ramp` of the length at each end), the
 * clipped sine sin(a + (π − 2a)ξ), sin a = `end`, through eleven points (ξ = 0, 0.1 … 1;
 * linear between them, within 0.013 of the sine). Null for any other shape.
 *
 * @example formerInterslice({ shape: 'trapezoid', end: 0.2, ramp: 0.25 })
 * // → { shape: 'piecewise-linear', points: [[0, 0.2], [0.25, 1], [0.75, 1], [1, 0.2]] }
 */
export function formerInterslice(fn: {
  shape?: unknown;
  end?: unknown;
  ramp?: unknown;
}): IntersliceFunction | null {
  const end = typeof fn.end === 'number' && Number.isFinite(fn.end) ? fn.end : null;
  if (fn.shape === 'trapezoid') {
    const e = clamp(end ?? 0, 0, 1);
    const r =
      typeof fn.ramp === 'number' && Number.isFinite(fn.ramp) ? clamp(fn.ramp, 1e-6, 0.5) : 0.25;
    const points: IntersliceOrdinate[] =
      r >= 0.5
        ? [
            [0, round(e)],
            [0.5, 1],
            [1, round(e)],
          ]
        : [
            [0, round(e)],
            [round(r), 1],
            [round(1 - r), 1],
            [1, round(e)],
          ];
    return { shape: 'piecewise-linear', points };
  }
  if (fn.shape === 'clipped-sine') {
    const a = Math.asin(clamp(end ?? 0.5, 0, 0.999));
    const points: IntersliceOrdinate[] = [];
    for (let k = 0; k <= 10; k++) {
      const xi = k / 10;
      points.push([xi, round(Math.sin(a + (Math.PI - 2 * a) * xi))]);
    }
    return { shape: 'piecewise-linear', points };
  }
  return null;
}

/** A piecewise-linear function as a file writes it: `{ shape: piecewise-linear, points: [[0, 0.2], …] }`. */
export function intersliceText(fn: IntersliceFunction): string {
  if (fn.shape !== 'piecewise-linear') return `{ shape: ${fn.shape} }`;
  const pts = fn.points.map(([x, f]) => `[${x}, ${f}]`).join(', ');
  return `{ shape: piecewise-linear, points: [${pts}] }`;
}

/**
 * What to write instead of a word of an earlier version at `path` of a file (`root` is the
 * whole data read), or null when the value is not one: a renamed method id anywhere a method is
 * named, or a former interslice shape (its replacement computed from its own settings).
 *
 * @example renamedWords(['analysis', 'methods', 0], 'swedish-circle', data)
 * // → 'swedish-circle is now called phi-zero-circle (the φ = 0 circle): write phi-zero-circle'
 */
export function renamedWords(
  path: readonly (string | number)[],
  value: unknown,
  root: unknown,
): string | null {
  if (typeof value !== 'string') return null;
  const renamed = RENAMED_METHODS[value];
  if (renamed) return `${value} is now called ${renamed} (the φ = 0 circle): write ${renamed}`;
  if (path[path.length - 1] === 'shape' && FORMER_INTERSLICE_SHAPES.includes(value)) {
    const fn = formerInterslice(at(root, path.slice(0, -1)) ?? { shape: value });
    if (!fn) return null;
    const exact = value === 'trapezoid' ? 'exactly' : 'through eleven points, within 0.013 of it';
    return `the interslice shape ${value} is no longer offered: give f(ξ) as points of a piecewise-linear function; this ${value} is, ${exact}, interslice: ${intersliceText(fn)}`;
  }
  return null;
}

/** Whether `name` at `path` is a setting of a former interslice shape (its message is the shape's). */
export function isFormerIntersliceSetting(
  path: readonly (string | number)[],
  name: string,
  root: unknown,
): boolean {
  if (!FORMER_INTERSLICE_SETTINGS.includes(name)) return false;
  const group = at(root, path);
  return group !== null && FORMER_INTERSLICE_SHAPES.includes(String(group.shape));
}

/** The group of settings at a path of the data read, or null. */
function at(root: unknown, path: readonly (string | number)[]): Record<string, unknown> | null {
  let v: unknown = root;
  for (const k of path) {
    if (v === null || typeof v !== 'object') return null;
    v = (v as Record<string | number, unknown>)[k];
  }
  return v !== null && typeof v === 'object' && !Array.isArray(v)
    ? (v as Record<string, unknown>)
    : null;
}
