import { type Boundary, touchRadius } from './boundaries';
import type { CenterGrid, GridSettings } from './search-settings';
import type { CircleEvaluator, CircleTrial, Trials } from './trials';

export interface GridMove {
  reason: string;
  grid: CenterGrid;
}

export interface GridOutcome {
  grid: CenterGrid;
  moves: GridMove[];
  /** fs[j][i]: the lowest FS over the radii at centre (xs[i], ys[j]); NaN where no circle was admissible. */
  xs: number[];
  ys: number[];
  fs: number[][];
  /** radius[j][i] and boundary[j][i]: the radius of that lowest circle, and the boundary it touches (−1 when none). */
  radius: number[][];
  boundary: number[][];
  /** True when the minimum is still on the grid's edge after the last allowed move. */
  onEdge: boolean;
}

const spaced = (a: number, b: number, n: number) =>
  n === 1 ? [0.5 * (a + b)] : Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));

/**
 * Circle-centre grid search: every centre of the grid with every radius (given radii, or the
 * radii that make the circle tangent to each given elevation), and the circle that touches
 * each stratum boundary (tangent to it from above, however it is inclined), so that a thin
 * layer whose bottom governs is never stepped over. When the lowest FS lies on
 * the edge of the grid, the grid is moved so that this centre is in its middle, and searched
 * again, until the minimum is inside or `moves` is used up — what an engineer does by hand.
 *
 * @example gridSearch(settings.grid, boundaries(prepared), evaluate, trials).fs
 */
export function gridSearch(
  settings: GridSettings,
  bounds: readonly Boundary[],
  evaluate: CircleEvaluator,
  trials: Trials,
): GridOutcome {
  let grid = { ...settings.centers };
  const moves: GridMove[] = [];
  const radiiAt = (yc: number): number[] => {
    const r = settings.radii;
    const vals = spaced(r.from, r.to, r.count);
    return r.kind === 'radii' ? vals : vals.map((t) => yc - t).filter((v) => v > 0);
  };
  for (;;) {
    const xs = spaced(grid.x[0], grid.x[1], grid.nx);
    const ys = spaced(grid.y[0], grid.y[1], grid.ny);
    const fs = ys.map(() => xs.map(() => NaN));
    const radius = ys.map(() => xs.map(() => NaN));
    const touching = ys.map(() => xs.map(() => -1));
    let bi = -1;
    let bj = -1;
    let best = Infinity;
    for (let j = 0; j < ys.length; j++) {
      for (let i = 0; i < xs.length; i++) {
        let low = Infinity;
        for (const r of radiiAt(ys[j])) {
          const f = trials.try(evaluate, xs[i], ys[j], r);
          if (f < low) {
            low = f;
            radius[j][i] = r;
          }
        }
        for (let b = 0; b < bounds.length; b++) {
          const r = touchRadius(bounds[b], xs[i], ys[j]);
          if (!(r > 0)) continue;
          const f = trials.try(evaluate, xs[i], ys[j], r, b);
          if (f < low) {
            low = f;
            radius[j][i] = r;
            touching[j][i] = b;
          }
        }
        if (low < Infinity) {
          fs[j][i] = low;
          if (low < best) {
            best = low;
            bi = i;
            bj = j;
          }
        }
      }
    }
    const edgeX = grid.nx > 2 && (bi === 0 || bi === grid.nx - 1);
    const edgeY = grid.ny > 2 && (bj === 0 || bj === grid.ny - 1);
    const onEdge = bi >= 0 && (edgeX || edgeY);
    if (!onEdge || moves.length >= settings.moves) {
      return { grid, moves, xs, ys, fs, radius, boundary: touching, onEdge };
    }
    const w = grid.x[1] - grid.x[0];
    const h = grid.y[1] - grid.y[0];
    const cx = edgeX ? xs[bi] : 0.5 * (grid.x[0] + grid.x[1]);
    const cy = edgeY ? ys[bj] : 0.5 * (grid.y[0] + grid.y[1]);
    const side = [
      edgeX ? (bi === 0 ? 'left' : 'right') : '',
      edgeY ? (bj === 0 ? 'bottom' : 'top') : '',
    ]
      .filter(Boolean)
      .join(' and ');
    grid = { ...grid, x: [cx - w / 2, cx + w / 2], y: [cy - h / 2, cy + h / 2] };
    moves.push({
      reason: `the lowest FS (${best.toFixed(3)}) was on the ${side} edge of the grid`,
      grid,
    });
  }
}

/**
 * The grid's local minima (centres no higher than any admissible neighbour), lowest first, at
 * most `count` of them, each with its radius: the starts of separate polishes, so that a
 * second valley of the FS map is not left unexplored.
 */
export function gridMinima(grid: GridOutcome, count: number): CircleTrial[] {
  const { xs, ys, fs } = grid;
  const out: CircleTrial[] = [];
  for (let j = 0; j < ys.length; j++) {
    for (let i = 0; i < xs.length; i++) {
      const f = fs[j][i];
      if (!(f > 0)) continue;
      let lowest = true;
      for (let dj = -1; dj <= 1 && lowest; dj++) {
        for (let di = -1; di <= 1; di++) {
          const v = fs[j + dj]?.[i + di];
          if ((di !== 0 || dj !== 0) && v !== undefined && v < f) lowest = false;
        }
      }
      if (lowest) {
        out.push({
          center: [xs[i], ys[j]],
          radius: grid.radius[j][i],
          fs: f,
          stage: 'grid',
          boundary: grid.boundary[j][i],
        });
      }
    }
  }
  return out.sort((a, b) => a.fs - b.fs).slice(0, count);
}
