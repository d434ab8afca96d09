import { boundaryOverGround } from '../model/boundary-over-ground';
import type { Polyline, UnitSystem } from '../model/types';
import type { AboveInterval } from './above-intervals';
import { isNumber, isPointList } from './guards';
import type { Issue, PathKey } from './types';
import { lengthUnit, num } from './words';

/**
 * The ground of a section as read, when it is a list of points with x strictly increasing;
 * null otherwise (checkSettings says what is wrong with it).
 */
export function readGround(data: Record<string, unknown>): Polyline | null {
  const g = data.ground;
  if (!isPointList(g)) return null;
  for (let i = 1; i < g.length; i++) if (!(g[i][0] > g[i - 1][0])) return null;
  return g;
}

/**
 * A boundary or piezometric line as read (a constant elevation or a polyline): its errors
 * (x going back, not spanning the ground) added to `issues` at `path`, and the line over the
 * ground's x-range when it has none (null without a ground to span).
 *
 * @example checkBoundary(12, ['water', 'piezometric'], 'the piezometric line', ground, 'si', issues) // → [[x0, 12], [x1, 12]]
 */
export function checkBoundary(
  b: unknown,
  path: PathKey[],
  what: string,
  ground: Polyline | null,
  units: UnitSystem,
  issues: Issue[],
): Polyline | null {
  const L = lengthUnit(units);
  const err = (at: PathKey[], code: string, message: string): void => {
    issues.push({ severity: 'error', path: at, code, message });
  };
  if (isNumber(b)) return ground ? boundaryOverGround(b, ground) : null;
  if (!isPointList(b)) return null;
  let ordered = true;
  for (let j = 1; j < b.length; j++) {
    if (b[j][0] < b[j - 1][0]) {
      ordered = false;
      err(
        [...path, j],
        'boundary-x-order',
        `x = ${num(b[j][0])} goes back from the point before (x = ${num(b[j - 1][0])}); x may not decrease along ${what}`,
      );
    }
  }
  if (!ordered || !ground) return null;
  const gx0 = ground[0][0];
  const gx1 = ground[ground.length - 1][0];
  const tol = 1e-9 * Math.max(1, Math.abs(gx0), Math.abs(gx1));
  const bx0 = b[0][0];
  const bx1 = b[b.length - 1][0];
  let spans = true;
  if (bx0 > gx0 + tol) {
    spans = false;
    err(
      path,
      'boundary-short',
      `${what} starts at x = ${num(bx0)} ${L}, ${num(bx0 - gx0)} ${L} right of the ground's left end (x = ${num(gx0)} ${L}); it must span the whole ground`,
    );
  }
  if (bx1 < gx1 - tol) {
    spans = false;
    err(
      path,
      'boundary-short',
      `${what} ends at x = ${num(bx1)} ${L}, ${num(gx1 - bx1)} ${L} left of the ground's right end (x = ${num(gx1)} ${L}); it must span the whole ground`,
    );
  }
  return spans ? boundaryOverGround(b, ground) : null;
}

/**
 * Where one line is above another, in words: `between x = 3 and 8 m (by up to 0.5 m)`.
 *
 * @example betweenWords([{ from: 3, to: 8, rise: 0.5 }], 'si') // → 'between x = 3 and 8 m (by up to 0.5 m)'
 */
export function betweenWords(spans: readonly AboveInterval[], units: UnitSystem): string {
  const L = lengthUnit(units);
  const parts = spans.slice(0, 3).map((s) => `x = ${num(s.from)} and ${num(s.to)} ${L}`);
  const more = spans.length > 3 ? ` and ${spans.length - 3} more places` : '';
  const rise = Math.max(...spans.map((s) => s.rise));
  return `between ${parts.join(' and between ')}${more} (by up to ${num(rise)} ${L})`;
}
