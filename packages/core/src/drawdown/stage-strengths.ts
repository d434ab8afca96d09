import type { DrawdownStage } from '../result';
import { type BaseStrengths, baseStrengths } from '../slices/base-strengths';
import type { SliceSet } from '../slices/slice-set';
import type { MaterialDrainage } from './drainage';
import { undrainedStrength } from './undrained-strength';

/** The stage that set a base's strength, as a code (STAGE_NAMES gives its name). */
export const DRAINED = 0;
export const UNDRAINED = 1;
export const DRAINED_LOWER = 2;
export const STAGE_NAMES: readonly DrawdownStage[] = ['drained', 'undrained', 'drained-lower'];

/**
 * The per-slice numbers of the three stages on one surface, kept from surface to surface (the
 * search's evaluator reuses one): the consolidation stresses of the first stage by slice before
 * drawdown, which slice before drawdown lies under each slice after it, the strengths of the
 * slices after drawdown and the stage that set each.
 */
export interface StageScratch {
  sigma: Float64Array;
  tau: Float64Array;
  under: Int32Array;
  strengths: BaseStrengths;
  stage: Uint8Array;
}

/** Scratch for surfaces of up to `n` slices: `into` when it is large enough, else a new one. */
export function stageScratch(n: number, into?: StageScratch): StageScratch {
  if (into && into.sigma.length >= n) return into;
  const m = Math.max(2 * n, 64);
  return {
    sigma: new Float64Array(m),
    tau: new Float64Array(m),
    under: new Int32Array(m),
    strengths: baseStrengths(m),
    stage: new Uint8Array(m),
  };
}

/** Base length of slice i (the chord). */
export const baseLength = (s: SliceSet, i: number): number =>
  Math.hypot(s.xr[i] - s.xl[i], s.yBaseR[i] - s.yBaseL[i]);

/**
 * Stage 1: the consolidation stresses on each base before drawdown, σ′fc = N′/l and
 * τfc = S/l, from a method's effective base normal force N′ and mobilised shear S.
 */
export function consolidationStresses(
  before: SliceSet,
  normal: ArrayLike<number>,
  shear: ArrayLike<number>,
  out: StageScratch,
): void {
  for (let i = 0; i < before.n; i++) {
    const l = baseLength(before, i);
    out.sigma[i] = normal[i] / l;
    out.tau[i] = shear[i] / l;
  }
}

/**
 * For each slice after drawdown, the slice before drawdown under the middle of its base (the
 * same index when both were cut alike, as drawdownSections makes them: then this is only a
 * walk along both).
 */
export function matchSlices(before: SliceSet, after: SliceSet, out: StageScratch): void {
  let j = 0;
  for (let i = 0; i < after.n; i++) {
    const x = 0.5 * (after.xl[i] + after.xr[i]);
    while (j + 1 < before.n && before.xr[j] <= x) j++;
    out.under[i] = j;
  }
}

/**
 * Stage 2: the strength of each base after drawdown. A base in a slowly draining soil takes
 * the undrained strength of its consolidation stresses (φ = 0, total stress: its pore pressure
 * does not count); every other base keeps its own strength (a freely draining soil drained
 * with the pore pressures after drawdown; a soil with Su keeps Su).
 */
export function undrainedStage(
  after: SliceSet,
  drainage: readonly MaterialDrainage[],
  out: StageScratch,
): void {
  const { cohesion, tanPhi, porePressureCounts } = out.strengths;
  for (let i = 0; i < after.n; i++) {
    const d = drainage[after.material[i]];
    if (d && d.drains === 'slow') {
      const j = out.under[i];
      cohesion[i] = undrainedStrength(out.sigma[j], out.tau[j], d.envelopes);
      tanPhi[i] = 0;
      porePressureCounts[i] = 0;
      out.stage[i] = UNDRAINED;
    } else {
      cohesion[i] = after.cohesion[i];
      tanPhi[i] = after.tanPhi[i];
      porePressureCounts[i] = 1;
      out.stage[i] = d && d.drains === 'total' ? UNDRAINED : DRAINED;
    }
  }
}

/**
 * Stage 3: a base in a slowly draining soil whose drained strength — c′ + σ′ tan φ′, with σ′
 * the effective normal stress of the second stage (its total normal force N, less the pore
 * pressure after drawdown) — is lower than its undrained strength takes the drained strength.
 * Returns how many bases changed (none: the second stage stands).
 */
export function drainedWhereLower(
  after: SliceSet,
  drainage: readonly MaterialDrainage[],
  normalTotal: ArrayLike<number>,
  out: StageScratch,
): number {
  const { cohesion, tanPhi, porePressureCounts } = out.strengths;
  let changed = 0;
  for (let i = 0; i < after.n; i++) {
    const d = drainage[after.material[i]];
    if (!d || d.drains !== 'slow' || out.stage[i] !== UNDRAINED) continue;
    const l = baseLength(after, i);
    const sigma = normalTotal[i] / l - after.porePressure[i];
    const drained = after.cohesion[i] + sigma * after.tanPhi[i];
    if (drained < cohesion[i]) {
      cohesion[i] = after.cohesion[i];
      tanPhi[i] = after.tanPhi[i];
      porePressureCounts[i] = 1;
      out.stage[i] = DRAINED_LOWER;
      changed++;
    }
  }
  return changed;
}
