import { notRun, pivotOf, solveOnSurface } from '../method-report';
import { METHODS } from '../methods/registry';
import type { SliceMethodResult } from '../methods/types';
import type { CircleSurface, MethodId, PolylineSurface } from '../model/types';
import type { DrawdownReport, MethodReport } from '../result';
import { type BaseStrengths, baseStrengths } from '../slices/base-strengths';
import type { PreparedSection } from '../slices/prepare-section';
import { type SlicedSurface, sliceSurface } from '../slices/slice-surface';
import type { MaterialDrainage } from './drainage';
import type { DrawdownSections } from './drawdown-sections';
import {
  STAGE_NAMES,
  baseLength,
  consolidationStresses,
  drainedWhereLower,
  matchSlices,
  stageScratch,
  undrainedStage,
} from './stage-strengths';

/** The three stages of one method on one slip surface. */
export interface ThreeStages {
  method: MethodId;
  /** F of stage 1 (before drawdown), 2 (undrained) and 3 (drained where lower: F of stage 2 when no base changed); null where a stage found none. */
  stages: [number | null, number | null, number | null];
  /** The three-stage F: that of the last stage, null when a stage found none. */
  fs: number | null;
  /** Why there is no F (absent when there is one). */
  reason?: string;
  /** Slices cut, before and after drawdown together (0 when the surface was rejected). */
  sliced: number;
  /** Bases whose strength stage 3 turned to drained. */
  drainedLower: number;
  /** With reports: F after drawdown with drained strengths everywhere (the same surface, the same method). */
  drainedFs: number | null;
  /** With reports: the method's report of the last stage (each base with the strength it took). */
  report: MethodReport | null;
  /** With reports: each slice's strength and the stage that set it, section coordinates, left to right. */
  slices: DrawdownReport['slices'];
}

/** What a method of slices gives on a cut, with base strengths or without. */
function solve(
  method: MethodId,
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  cut: SlicedSurface,
  strengths?: BaseStrengths,
): SliceMethodResult {
  const entry = METHODS[method];
  if (!('run' in entry)) throw new Error(`${method} is not a method of a slip surface`);
  const pivot = pivotOf(surface, cut.slices);
  return entry.run({ prepared, surface, cut, pivot, strengths }).result;
}

/** Why a method that is not a method of slices does not run a drawdown. */
export const NOT_SLICES =
  'not available for a rapid drawdown, whose stages give each slice base a strength of its own: use a method of slices (ordinary, Bishop, Janbu, Spencer, Morgenstern–Price)';

/**
 * The three stages of Duncan, Wright & Wong (1990) on one slip surface with one method of
 * slices (EM 1110-2-1902, 2003, App. G, sets out the same sequence):
 * 1. the method with the water before drawdown and drained strengths gives each base its
 *    consolidation stresses σ′fc = N′/l and τfc = S/l;
 * 2. each base in a slowly draining soil takes the undrained strength of those stresses
 *    (undrained-strength.ts; φ = 0, total stress), every other base its own strength, and the
 *    method solves the surface with the water after drawdown — its ponded water, if any, still
 *    loads the slope;
 * 3. where a slow base's drained strength (c′ + σ′ tan φ′, σ′ from the normal force of stage 2
 *    and the pore pressure after drawdown) is lower than its undrained strength, it takes the
 *    drained one, and the method solves the surface again.
 * Beside them, the drained drawdown on the same surface: the water after drawdown, every base
 * drained. Stage 3 keeps on each base the lesser of the two strengths, so the three-stage F is
 * not above the drained drawdown F on the surface (up to the redistribution of normal
 * forces). With `reports`, the method's report of the last stage and the slice table of
 * strengths and stages are built too (the search asks only for F).
 *
 * @example threeStages('spencer', drawdownSections(section, spec), drainage.byMaterial, circle, 30, true).fs
 */
export function threeStages(
  method: MethodId,
  sections: DrawdownSections,
  drainage: readonly MaterialDrainage[],
  surface: CircleSurface | PolylineSurface,
  count: number,
  reports: boolean,
): ThreeStages {
  const empty = {
    method,
    stages: [null, null, null] as ThreeStages['stages'],
    fs: null,
    sliced: 0,
    drainedLower: 0,
    drainedFs: null,
    report: null,
    slices: [],
  };
  const refused = (reason: string, report?: MethodReport): ThreeStages => ({
    ...empty,
    reason,
    report: reports ? (report ?? notRun(method, reason)) : null,
  });
  const entry = METHODS[method];
  if (!entry.slices) return refused(`${method}: ${NOT_SLICES}`);
  const cutBefore = sliceSurface(sections.before, surface, count);
  const cutAfter = sliceSurface(sections.after, surface, count);
  if (!(entry.surfaces as readonly string[]).includes(surface.type)) {
    // the method's own refusal of this kind of surface, in its words
    const report = solveOnSurface(method, sections.after, surface, cutAfter).report;
    return refused(report.reason ?? `${method}: not for this surface`, report);
  }
  if (!cutBefore.ok) return refused(`the slip surface was rejected: ${cutBefore.reason}`);
  if (!cutAfter.ok) return refused(`the slip surface was rejected: ${cutAfter.reason}`);
  const before = cutBefore.slices;
  const after = cutAfter.slices;
  const sliced = before.n + after.n;
  const scratch = stageScratch(Math.max(before.n, after.n));
  /** A stage that found no F: the method's report of that stage, its reason naming the stage. */
  const failed = (
    words: string,
    r: SliceMethodResult,
    prepared: PreparedSection,
    cut: SlicedSurface,
    stages: ThreeStages['stages'],
    strengths?: BaseStrengths,
  ): ThreeStages => {
    const reason = `${words}: ${r.reason ?? 'no solution'}`;
    const report = reports
      ? { ...solveOnSurface(method, prepared, surface, cut, strengths).report, reason }
      : null;
    return { ...empty, stages, reason, sliced, report };
  };
  // stage 1
  const r1 = solve(method, sections.before, surface, cutBefore);
  if (!r1.converged)
    return failed('stage 1 (before drawdown)', r1, sections.before, cutBefore, [null, null, null]);
  consolidationStresses(before, r1.normal, r1.shear, scratch);
  // stage 2
  matchSlices(before, after, scratch);
  undrainedStage(after, drainage, scratch);
  const strengths = copyStrengths(scratch.strengths, after.n);
  const r2 = solve(method, sections.after, surface, cutAfter, strengths);
  if (!r2.converged) {
    const words = 'stage 2 (undrained, after drawdown)';
    return failed(words, r2, sections.after, cutAfter, [r1.fs, null, null], strengths);
  }
  // stage 3
  const drainedLower = drainedWhereLower(after, drainage, r2.normalTotal, scratch);
  const final = drainedLower > 0 ? copyStrengths(scratch.strengths, after.n) : strengths;
  const r3 = drainedLower > 0 ? solve(method, sections.after, surface, cutAfter, final) : r2;
  if (!r3.converged) {
    const words = 'stage 3 (drained where lower)';
    return failed(words, r3, sections.after, cutAfter, [r1.fs, r2.fs, null], final);
  }
  const out: ThreeStages = {
    ...empty,
    stages: [r1.fs, r2.fs, r3.fs],
    fs: r3.fs,
    sliced,
    drainedLower,
  };
  if (!reports) return out;
  const drained = solve(method, sections.after, surface, cutAfter);
  out.drainedFs = drained.converged ? drained.fs : null;
  out.report = solveOnSurface(method, sections.after, surface, cutAfter, final).report;
  const names = sections.after.materials;
  const sx = after.mirrored ? -1 : 1;
  for (let i = 0; i < after.n; i++) {
    const sigma = r3.normal[i] / baseLength(after, i);
    out.slices.push({
      x: sx * 0.5 * (after.xl[i] + after.xr[i]),
      material: names[after.material[i]].name,
      strength: final.cohesion[i] + sigma * final.tanPhi[i],
      stage: STAGE_NAMES[scratch.stage[i]],
    });
  }
  if (after.mirrored) out.slices.reverse();
  return out;
}

/** The first n base strengths, in arrays of their own (the scratch changes at the next stage). */
function copyStrengths(b: BaseStrengths, n: number): BaseStrengths {
  const out = baseStrengths(n);
  out.cohesion.set(b.cohesion.subarray(0, n));
  out.tanPhi.set(b.tanPhi.subarray(0, n));
  out.porePressureCounts.set(b.porePressureCounts.subarray(0, n));
  return out;
}
