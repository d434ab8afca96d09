import { lookupY } from '../geometry/lookup';
import { NumberList } from '../geometry/number-list';
import { type BasePiece, curveY } from './base-curve';
import { crackDepthIn } from '../strength/registry';
import type { Geometry, PreparedSection } from './prepare-section';

/**
 * Depth of the tension crack at x (the upper end of a slide): the section's given depth, or
 * with `auto` the Rankine depth of the first stratum present at x (its strength model's
 * crackDepth: 2c′·tan(45° + φ′/2)/γ, 2Su/γ undrained). Zero when the section has no crack.
 *
 * @example crackDepth(prepared, prepared.normal, 38) // → 1.29
 */
export function crackDepth(prepared: PreparedSection, g: Geometry, x: number): number {
  const spec = prepared.section.crack;
  if (!spec) return 0;
  if (spec.depth !== 'auto') return spec.depth;
  const tops = g.at.tops;
  for (let i = 0; i < g.soilStrata; i++) {
    const below = i + 1 < tops.length ? lookupY(tops[i + 1], x) : -Infinity;
    if (lookupY(tops[i], x) - below > prepared.tol) {
      const mat = prepared.materials[g.stratumMaterial[i]];
      return crackDepthIn(mat.strength, mat.unitWeight);
    }
  }
  return 0;
}

/**
 * x of the crack: the point nearest the upper end xb where the surface lies `depth` below
 * the ground, found by sampling each interval between ground vertices and surface joints
 * eight times from the right and bisecting; NaN when the surface is nowhere that deep.
 * `scratch` is reused for the sample points.
 */
export function crackX(
  g: Geometry,
  pieces: readonly BasePiece[],
  xa: number,
  xb: number,
  depth: number,
  tol: number,
  scratch: NumberList = new NumberList(),
): number {
  const ground = g.at.ground;
  const f = (x: number) => lookupY(ground, x) - curveY(pieces, x) - depth;
  const c = scratch;
  c.clear();
  c.push(xa);
  c.push(xb);
  for (let i = 0; i <= ground.last; i++) {
    const x = ground.xs[i];
    if (x > xa && x < xb) c.push(x);
  }
  for (const p of pieces) if (p.x0 > xa && p.x0 < xb) c.push(p.x0);
  c.sort();
  // from the right: the first sample where the surface is deep enough, then bisection
  let right = xb;
  for (let i = c.length - 1; i > 0; i--) {
    const a = c.values[i - 1];
    const b = c.values[i];
    if (b - a <= tol) continue;
    for (let k = 7; k >= 0; k--) {
      const x = a + ((b - a) * k) / 8;
      if (f(x) >= 0) {
        let lo = x;
        let hi = right;
        for (let it = 0; it < 200 && hi - lo > 1e-6 * tol; it++) {
          const m = 0.5 * (lo + hi);
          if (m === lo || m === hi) break;
          if (f(m) >= 0) lo = m;
          else hi = m;
        }
        return lo;
      }
      right = x;
    }
  }
  return NaN;
}
