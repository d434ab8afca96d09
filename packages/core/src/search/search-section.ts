import { yAt } from '../geometry/y-at';
import { reinforcementHeads } from '../reinforcement/heads';
import type { Polyline, SearchSurface } from '../model/types';
import { linearStrength, variesWithStress } from '../strength/registry';
import type { PreparedSection } from '../slices/prepare-section';
import { sliceSurface } from '../slices/slice-surface';
import { type Boundary, boundaries } from './boundaries';
import { type GridOutcome, gridMinima, gridSearch } from './grid-search';
import { groundRangesSearch } from './ground-ranges-search';
import { noncircularSearch } from './noncircular-search';
import { type Polish, refineCircle, refineTouching } from './refine-circle';
import { type SearchEvaluation, bishopSearchEvaluation } from './search-evaluation';
import { type SearchSettings, searchSettings } from './search-settings';
import { type CircleTrial, type TrialStage, Trials } from './trials';
import { WorkMeter } from '../work-limit';

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
  /** Trial circles by the stage that made them. */
  candidates: Record<TrialStage, number>;
  /** The stratum boundaries circles were made tangent to. */
  boundaries: Boundary[];
  /** The polishes run from the best candidates, in order. */
  polishes: Polish[];
  /** The critical circle evaluated again on its own, with Bishop's method in full (bishop()). */
  confirmation: { searched: number; exact: number | null } | null;
  grid: GridOutcome | null;
  /** The band asked for (analysis.trialBand) and the trial circles within it of the least FS, lowest first. */
  band: number;
  withinBand: CircleTrial[];
  cohesionless: CohesionlessSlope | null;
  onEdge: boolean;
}

/** When no soil stratum has cohesion (frictional, c′ = 0): the infinite slope on the steepest ground. */
export function cohesionlessSlope(prepared: PreparedSection): CohesionlessSlope | null {
  const g = prepared.normal;
  let tanPhiMin = Infinity;
  for (let k = 0; k < g.soilStrata; k++) {
    const strength = prepared.materials[g.stratumMaterial[k]].strength;
    if (variesWithStress(strength)) return null;
    const l = linearStrength(strength);
    if (!l || l.c > 0 || l.rate > 0 || !(l.tanPhi > 0)) return null;
    tanPhiMin = Math.min(tanPhiMin, l.tanPhi);
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
 * Search a section for its critical slip surface (DESIGN §5). Candidates: a grid of circle
 * centres with radii (moved automatically while its minimum is on the edge), at every centre
 * also the circles tangent to each stratum boundary, and circles through ground ranges; all
 * evaluated with Bishop's method on the exact slicing (bishopCircleEvaluator). Polish: the
 * best circle by a simplex on (xc, yc, R); the best circle touching each boundary by a simplex
 * on its centre, keeping it touching, and the best of those again on (xc, yc, R). Confirmation:
 * the critical circle cut afresh and solved by bishop() in full. Then, when asked, a
 * noncircular polyline started from the best circle and evaluated with Spencer's method. When
 * no soil has cohesion the circles would drift toward an infinite radius: the infinite slope
 * of the steepest ground is reported instead and the grid is not chased. `evaluation` judges
 * the trials (search-evaluation.ts): Bishop's method on the section as it is unless another is
 * given (a rapid drawdown's three stages).
 *
 * @example searchSection(prepareSection(section), { type: 'auto' }).circle
 */
export function searchSection(
  prepared: PreparedSection,
  spec: SearchSurface,
  meter: WorkMeter = new WorkMeter(),
  evaluation: SearchEvaluation = bishopSearchEvaluation(prepared, meter),
): SearchOutcome {
  const section = prepared.section;
  const slices = section.analysis.slices;
  const g = prepared.normal;
  let deepest = Infinity;
  if (g.rigidTop) for (const p of g.rigidTop) deepest = Math.min(deepest, p[1]);
  else deepest = -Infinity;
  const settings = searchSettings(
    spec,
    section.units,
    section.ground,
    deepest,
    reinforcementHeads(section),
  );
  const cohesionless = evaluation.cohesionless ? cohesionlessSlope(prepared) : null;
  if (cohesionless && settings.grid) settings.grid.moves = 0;
  const evaluate = evaluation.circle;
  const bounds = boundaries(prepared);
  const band = section.analysis.trialBand ?? 0.05;
  const trials = new Trials(band);
  let grid: GridOutcome | null = null;
  trials.stage = 'grid';
  if (settings.grid) grid = gridSearch(settings.grid, bounds, evaluate, trials);
  trials.stage = 'ground-ranges';
  const groundAt = (x: number) => yAt(section.ground, x);
  if (settings.groundRanges) groundRangesSearch(settings.groundRanges, groundAt, evaluate, trials);
  // each slope face's own lowest circle, polished whatever its FS (a separate valley), after
  // the whole slope's lowest circle and the grid's valleys near it
  const slopeBest = trials.best;
  const faceStarts: CircleTrial[] = [];
  for (const face of settings.faceRanges) {
    const best = groundRangesSearch(face, groundAt, evaluate, trials);
    if (best) faceStarts.push(best);
  }
  trials.stage = 'polish';
  const polishes: Polish[] = [];
  let circle = slopeBest ?? trials.best;
  if (circle) {
    const c = settings.grid?.centers;
    const step = c
      ? Math.max(
          (c.x[1] - c.x[0]) / Math.max(1, c.nx - 1),
          (c.y[1] - c.y[0]) / Math.max(1, c.ny - 1),
        )
      : circle.radius / 10;
    // free polishes from the best circle and from the grid's other valleys close to it
    const free: CircleTrial[] = [circle];
    for (const m of grid ? gridMinima(grid, 3) : []) {
      const apart = free.every(
        (t) => Math.hypot(t.center[0] - m.center[0], t.center[1] - m.center[1]) > 1.5 * step,
      );
      if (apart && free.length < 3 && m.fs < 1.1 * circle.fs) free.push(m);
    }
    const apartFrom = (t: CircleTrial, s: CircleTrial) =>
      Math.hypot(t.center[0] - s.center[0], t.center[1] - s.center[1]) > 0.5 * s.radius;
    for (const start of free) polishes.push(refineCircle(start, step, evaluate, trials));
    // on a reinforced slope a face's start near another is polished too where it is as low as
    // the best polished so far: across a reinforcement head F steps (the element is crossed or
    // not), so circles close together may lie in separate valleys
    const rugged = section.reinforcement.length > 0;
    for (const start of faceStarts) {
      const lowSoFar = polishes.reduce((best, p) => Math.min(best, p.to.fs), circle.fs);
      const near = !free.every((t) => apartFrom(t, start));
      if (near && (!rugged || start.fs > 1.05 * lowSoFar)) continue;
      free.push(start);
      polishes.push(refineCircle(start, Math.min(step, 0.5 * start.radius), evaluate, trials));
    }
    const freeBest = polishes.reduce((best, p) => (p.to.fs < best.fs ? p.to : best), circle);
    // polishes that keep touching each boundary (from the best circle touching it, unless far
    // above), and the best of them polished freely when it comes near the best free circle
    let touching: CircleTrial | null = null;
    bounds.forEach((b, k) => {
      const start = trials.tangent[k];
      if (!start || start.fs > 1.5 * freeBest.fs) return;
      const p = refineTouching(start, b, k, step, evaluate, trials);
      polishes.push(p);
      if (!touching || p.to.fs < touching.fs) touching = p.to;
    });
    if (touching && (touching as CircleTrial).fs < 1.02 * freeBest.fs)
      polishes.push(refineCircle(touching, 0.25 * step, evaluate, trials));
    const lowest = faceStarts.reduce((best, t) => (t.fs < best.fs ? t : best), circle);
    circle = polishes.reduce((best, p) => (p.to.fs < best.fs ? p.to : best), lowest);
  }
  let confirmation: SearchOutcome['confirmation'] = null;
  if (circle) {
    const exact = evaluation.exact({
      type: 'circle',
      center: circle.center,
      radius: circle.radius,
    });
    confirmation = { searched: circle.fs, exact };
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
        evaluation.polyline,
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
    candidates: { ...trials.byStage },
    boundaries: bounds,
    polishes,
    confirmation,
    grid,
    band,
    withinBand: trials.withinBand(),
    cohesionless,
    onEdge: grid?.onEdge ?? false,
  };
}
