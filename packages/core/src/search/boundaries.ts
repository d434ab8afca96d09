import { yAt } from '../geometry/y-at';
import type { PreparedSection } from '../slices/prepare-section';

/** A stratum boundary below the ground (the top of stratum `stratum`), as flat arrays, section coordinates. */
export interface Boundary {
  stratum: number;
  /** The material below the boundary. */
  material: string;
  xs: Float64Array;
  ys: Float64Array;
  /** Per segment: 1 where some of it lies below the ground, 0 where it runs along or above it. */
  below: Uint8Array;
}

/**
 * The stratum boundaries a slip circle can be made to touch: the top of every stratum below
 * the first, down to and including the top of a rigid base, where it lies below the ground.
 * Thin weak layers govern through circles that touch such a boundary (common practice: the
 * critical circle runs along the bottom of the weakest layer it can reach).
 *
 * @example boundaries(prepareSection(section)).map((b) => b.material) // → ['seam', 'clay']
 */
export function boundaries(prepared: PreparedSection): Boundary[] {
  const g = prepared.normal;
  const tol = prepared.tol;
  const out: Boundary[] = [];
  for (let k = 1; k <= Math.min(g.soilStrata, g.tops.length - 1); k++) {
    const line = g.tops[k];
    const below = new Uint8Array(Math.max(0, line.length - 1));
    let any = false;
    for (let i = 0; i + 1 < line.length; i++) {
      const [x0, y0] = line[i];
      const [x1, y1] = line[i + 1];
      const xm = 0.5 * (x0 + x1);
      const deep = [
        [x0, y0],
        [xm, 0.5 * (y0 + y1)],
        [x1, y1],
      ].some(([x, y]) => yAt(g.ground, x) - y > 10 * tol);
      if (x1 > x0 && deep) {
        below[i] = 1;
        any = true;
      }
    }
    if (!any) continue;
    out.push({
      stratum: k,
      material: prepared.materials[g.stratumMaterial[k]]?.name ?? '',
      xs: Float64Array.from(line, (p) => p[0]),
      ys: Float64Array.from(line, (p) => p[1]),
      below,
    });
  }
  return out;
}

/**
 * Radius of the circle centred at (xc, yc) that touches the boundary from above: the
 * distance to its nearest point below the centre (on a segment that lies below the ground);
 * NaN when none.
 */
export function touchRadius(b: Boundary, xc: number, yc: number): number {
  let best = Infinity;
  const { xs, ys, below } = b;
  for (let i = 0; i + 1 < xs.length; i++) {
    if (!below[i]) continue;
    const dx = xs[i + 1] - xs[i];
    const dy = ys[i + 1] - ys[i];
    const t0 = ((xc - xs[i]) * dx + (yc - ys[i]) * dy) / (dx * dx + dy * dy);
    const t = t0 < 0 ? 0 : t0 > 1 ? 1 : t0;
    const px = xs[i] + t * dx;
    const py = ys[i] + t * dy;
    if (py >= yc) continue;
    const d = Math.hypot(px - xc, py - yc);
    if (d < best) best = d;
  }
  return best < Infinity ? best : NaN;
}
