import { yAt } from '../geometry/y-at';
import { defaultPivot } from '../methods/pivot';
import { spencer } from '../methods/spencer';
import type { Polyline, SearchSurface } from '../model/types';
import type { PreparedSection } from '../slices/prepare-section';
import { sliceSurface } from '../slices/slice-surface';
import { bishopCircle } from './bishop-circle';
import { fastSection } from './fast-section';
import { type GridOutcome, gridSearch } from './grid-search';
import { groundRangesSearch } from './ground-ranges-search';
import { noncircularSearch } from './noncircular-search';
import { refineCircle } from './refine-circle';
import { type SearchSettings, searchSettings } from './search-settings';
import { type CircleEvaluator, type CircleTrial, Trials } from './trials';

/** The infinite slope that governs when no material on the slope has cohesion. */
export interface CohesionlessSlope {
  /** Steepest ground angle (degrees), its tan φ′ and the infinite-slope F there. */
  angle: number;
  tanPhi: number;
  waterRatio: number;
  fs: number;
}

/** What a search found, in SI and the section's coordinates. */
export interface SearchOutcome {
  settings: SearchSettings;
  circle: CircleTrial | null;
  polyline: { points: Polyline; fs: number } | null;
  trials: number;
  grid: GridOutcome | null;
  lowest: CircleTrial[];
  cohesionless: CohesionlessSlope | null;
  onEdge: boolean;
}

/**
 * A circle evaluator for the search: Bishop's simplified method on the one-pass fast
 * slicing (bishopCircle), each trial warm-started from the previous one's F.
 */
export function fastBishopEvaluator(prepared: PreparedSection, slices: number): CircleEvaluator {
  const fast = fastSection(prepared);
  const ends = { xa: 0.5, xb: 0.5 };
  let guess = 1;
  return (xc, yc, r) => {
    if (!(r > 0)) return NaN;
    const f = bishopCircle(fast, xc, yc, r, slices, guess, ends);
    if (f > 0) guess = f;
    return f;
  };
}

/** When every soil stratum is Mohr–Coulomb with c′ = 0: the infinite slope on the steepest ground. */
export function cohesionlessSlope(prepared: PreparedSection): CohesionlessSlope | null {
  const g = prepared.normal;
  let tanPhiMin = Infinity;
  for (let k = 0; k < g.soilStrata; k++) {
    const st = prepared.materials[g.stratumMaterial[k]].strength;
    if (st.model !== 'mohr-coulomb' || st.cohesion > 0) return null;
    tanPhiMin = Math.min(tanPhiMin, Math.tan((st.frictionAngle * Math.PI) / 180));
  }
  if (!(tanPhiMin > 0) || !Number.isFinite(tanPhiMin)) return null;
  const ground = g.ground;
  let beta = 0;
  let at = 0;
  for (let i = 0; i + 1 < ground.length; i++) {
    const b = Math.atan(
      Math.abs(ground[i + 1][1] - ground[i][1]) / (ground[i + 1][0] - ground[i][0]),
    );
    if (b > beta) {
      beta = b;
      at = 0.5 * (ground[i][0] + ground[i + 1][0]);
    }
  }
  if (!(beta > 0)) return null;
  const water = prepared.section.water;
  const mat = prepared.materials[g.stratumMaterial[0]];
  let factor = 1;
  let m = 0;
  if (water.kind === 'ru') factor = 1 - water.ru / Math.cos(beta) ** 2;
  else if (water.kind === 'piezometric' && yAt(water.line, at) >= yAt(ground, at)) {
    // seepage parallel to the slope with the water table at the surface (Skempton & DeLory 1957)
    m = 1;
    factor = (mat.saturatedUnitWeight - water.unitWeight) / mat.saturatedUnitWeight;
  }
  return {
    angle: (beta * 180) / Math.PI,
    tanPhi: tanPhiMin,
    waterRatio: m,
    fs: Math.max(0, factor) * (tanPhiMin / Math.tan(beta)),
  };
}

/**
 * Search a section for its critical slip surface (DESIGN §5): a grid of circle centres with
 * radii (moved automatically while its minimum is on the edge) and circles through ground
 * ranges, polished by a simplex search on (xc, yc, R), all evaluated with the fast slicing
 * and Bishop's method; then, when asked, a noncircular polyline started from the best
 * circle and evaluated with Spencer's method on the exact slicing. When no soil has
 * cohesion the circles would drift toward an infinite radius: the infinite slope of the
 * steepest ground is reported instead and the grid is not chased.
 *
 * @example searchSection(prepareSection(section), { type: 'auto' }).circle
 */
export function searchSection(prepared: PreparedSection, spec: SearchSurface): SearchOutcome {
  const section = prepared.section;
  const slices = section.analysis.slices;
  const g = prepared.normal;
  let deepest = Infinity;
  if (g.rigidTop) for (const p of g.rigidTop) deepest = Math.min(deepest, p[1]);
  else deepest = -Infinity;
  const settings = searchSettings(spec, section.units, section.ground, deepest);
  const cohesionless = cohesionlessSlope(prepared);
  if (cohesionless && settings.grid) settings.grid.moves = 0;
  const evaluate = fastBishopEvaluator(prepared, slices);
  const trials = new Trials(10);
  let grid: GridOutcome | null = null;
  if (settings.grid) grid = gridSearch(settings.grid, evaluate, trials);
  if (settings.groundRanges) {
    groundRangesSearch(settings.groundRanges, (x) => yAt(section.ground, x), evaluate, trials);
  }
  let circle = trials.best;
  if (circle) {
    const c = settings.grid?.centers;
    const step = c
      ? Math.max(
          (c.x[1] - c.x[0]) / Math.max(1, c.nx - 1),
          (c.y[1] - c.y[0]) / Math.max(1, c.ny - 1),
        )
      : circle.radius / 10;
    circle = refineCircle(circle, step, evaluate, trials);
  }
  let polyline: SearchOutcome['polyline'] = null;
  let count = trials.count;
  if (settings.noncircular && circle) {
    const cut = sliceSurface(
      prepared,
      { type: 'circle', center: circle.center, radius: circle.radius },
      slices,
    );
    if (cut.ok) {
      const ends: [number, number] = [
        Math.min(cut.lowerEnd[0], cut.upperEnd[0]),
        Math.max(cut.lowerEnd[0], cut.upperEnd[0]),
      ];
      const found = noncircularSearch(
        section.ground,
        circle,
        ends,
        settings.noncircular,
        (points) => {
          const s = sliceSurface(prepared, { type: 'polyline', points }, slices);
          if (!s.ok) return NaN;
          const r = spencer(s.slices, { seismic: section.seismic, pivot: defaultPivot(s.slices) });
          return r.converged ? r.fs : NaN;
        },
      );
      if (found) {
        polyline = { points: found.points, fs: found.fs };
        count += found.trials;
      }
    }
  }
  return {
    settings,
    circle,
    polyline,
    trials: count,
    grid,
    lowest: trials.lowest,
    cohesionless,
    onEdge: grid?.onEdge ?? false,
  };
}
