import type { Material } from '../model/types';
import { STRENGTH_WORDS, strengthEnvelope, verticalStressStrength } from '../strength/registry';
import type { NormalStressEnvelope } from '../strength/types';
import { type BaseStrengths, baseStrengths, withBaseStrengths } from './base-strengths';
import type { SliceSet } from './slice-set';

/**
 * The strengths of a section that vary from slice base to slice base with the stresses on it,
 * by material index: the τ–σ′n envelope of a strength that depends on the effective normal
 * stress (Hoek–Brown, a shear–normal function, a bilinear envelope), or Su from the vertical
 * effective stress; null where the material's own linear strength holds.
 */
export interface StrengthRules {
  envelope: (NormalStressEnvelope | null)[];
  vertical: (((sigmaV: number) => number) | null)[];
  /** Material names and their model's words, for the warnings. */
  names: string[];
  words: string[];
  /** Some material has an envelope: the strengths depend on F and are iterated. */
  iterates: boolean;
}

/** The rules of a section's materials; null when every one is linear (Mohr–Coulomb, Su, rigid): the methods then run as they are. */
export function strengthRules(materials: readonly Material[]): StrengthRules | null {
  const envelope = materials.map((m) => strengthEnvelope(m.strength));
  const vertical = materials.map((m) => verticalStressStrength(m.strength));
  if (envelope.every((e) => !e) && vertical.every((v) => !v)) return null;
  return {
    envelope,
    vertical,
    names: materials.map((m) => m.name),
    words: materials.map((m) => STRENGTH_WORDS[m.strength.model]),
    iterates: envelope.some((e) => e !== null),
  };
}

/** Whether any base of these slices takes a strength by the rules (else the slices' own strengths stand). */
export function touchesRules(s: SliceSet, rules: StrengthRules | null): boolean {
  if (!rules) return false;
  for (let i = 0; i < s.n; i++) {
    const m = s.material[i];
    if (rules.envelope[m] || rules.vertical[m]) return true;
  }
  return false;
}

/** The least of what a solution must give for the iteration: F, and the effective base normal forces N′. */
export interface NormalForces {
  fs: number;
  converged: boolean;
  normal: ArrayLike<number>;
}

/** A warning of the iteration (the codes join those of the methods). */
export interface StressWarning {
  code: 'stress-iteration' | 'stress-range';
  message: string;
}

/** A solution with strengths that vary with stress. */
export interface StressSolution<T extends NormalForces> {
  /** The method's last solution: with the strengths each base took at `stressAt`. */
  result: T;
  strengths: BaseStrengths;
  /** The stress each base's strength was taken at (kPa): σ′n for an envelope, σ′v for Su from σ′v, NaN for a fixed strength. */
  stressAt: Float64Array;
  /** Solutions of the method (1 where nothing depends on F). */
  iterations: number;
  converged: boolean;
  warnings: StressWarning[];
}

/** The arrays of one solution, for surfaces of up to their length in slices. */
export interface StressScratch {
  strengths: BaseStrengths;
  stressAt: Float64Array;
  next: Float64Array;
  len: Float64Array;
  out: Float64Array;
}

/**
 * Arrays for solveWithStresses on surfaces of up to `n` slices. The search's evaluator keeps
 * one and passes it to every trial (the solution's strengths and stresses then live only until
 * the next trial); without one, each solution has arrays of its own.
 */
export function stressScratch(n: number): StressScratch {
  const m = Math.max(n, 1);
  return {
    strengths: baseStrengths(m),
    stressAt: new Float64Array(m),
    next: new Float64Array(m),
    len: new Float64Array(m),
    out: new Float64Array(2),
  };
}

/** At most this many solutions of the method; from the tenth the normal stresses are under-relaxed by half. */
export const STRESS_ITERATIONS = 40;
const RELAX_AFTER = 10;
/** Settled when F changes by less than this, relatively, and every σ′n by less than STRESS_TOL of the largest. */
const FS_TOL = 1e-6;
const STRESS_TOL = 1e-5;

/**
 * Solve slices whose strengths vary with stress (one mechanism for every method of slices and
 * the search). Each base in a material with a rule takes:
 * - Su from the vertical effective stress σ′v = W/b + p − u (the slice's weight over its width,
 *   the pressure p of water ponded on its top, the pore pressure u at the base: common
 *   practice), once, since it does not depend on F;
 * - the tangent of its envelope at its effective normal stress σ′n, c + σ′n tan φ (equal to
 *   the envelope there), starting from σ′n = W cos²α/b − u (the ordinary method's, loads on
 *   the top included), then σ′n = N′/l from the method's own normal forces, solved again until
 *   F and every σ′n settle (STRESS_ITERATIONS at most; under-relaxed after RELAX_AFTER). A σ′n
 *   below the envelope's floor is taken at the floor.
 * Every other base keeps the strength the slicer gave it. `solve` is the method on the slices
 * with the given base strengths (withBaseStrengths). With no envelope on the surface the method
 * runs once. Bases whose stress falls outside the envelope's range are named in a warning,
 * numbered from the left as in the slice table.
 *
 * @example solveWithStresses(cut.slices, prepared.rules!, 9.81, (b) => bishop(withBaseStrengths(cut.slices, b), opts))
 */
export function solveWithStresses<T extends NormalForces>(
  s: SliceSet,
  rules: StrengthRules,
  waterUnitWeight: number,
  solve: (b: BaseStrengths) => T,
  scratch?: StressScratch,
): StressSolution<T> {
  const n = s.n;
  const own = scratch ?? stressScratch(n);
  if (own.len.length < n) Object.assign(own, stressScratch(n));
  const { strengths: b, stressAt, next, len, out } = own;
  stressAt.fill(NaN, 0, n);
  let any = false;
  for (let i = 0; i < n; i++) {
    const m = s.material[i];
    const w = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    len[i] = Math.hypot(w, dy);
    const u = s.porePressure[i];
    b.porePressureCounts[i] = 1;
    const env = rules.envelope[m];
    const vertical = rules.vertical[m];
    if (env) {
      any = true;
      const cos2 = (w * w) / (len[i] * len[i]);
      const sigma = Math.max(env.floor, ((s.weight[i] - s.qy[i]) * cos2) / w - u);
      stressAt[i] = sigma;
      env.tangent(sigma, out);
      b.cohesion[i] = out[0];
      b.tanPhi[i] = out[1];
    } else if (vertical) {
      const ybm = 0.5 * (s.yBaseL[i] + s.yBaseR[i]);
      const ytm = 0.5 * (s.yTopL[i] + s.yTopR[i]);
      const ponded = Math.max(0, u - waterUnitWeight * (ytm - ybm));
      const sv = s.weight[i] / w + ponded - u;
      stressAt[i] = sv;
      b.cohesion[i] = vertical(sv);
      b.tanPhi[i] = 0;
    } else {
      b.cohesion[i] = s.cohesion[i];
      b.tanPhi[i] = s.tanPhi[i];
    }
  }
  let result = solve(b);
  let iterations = 1;
  let converged = result.converged;
  if (any && result.converged) {
    converged = false;
    let fPrev = result.fs;
    for (; iterations < STRESS_ITERATIONS;) {
      let scale = 1;
      let change = 0;
      const w = iterations >= RELAX_AFTER ? 0.5 : 1;
      for (let i = 0; i < n; i++) {
        const env = rules.envelope[s.material[i]];
        if (!env) continue;
        const sigma = Math.max(env.floor, result.normal[i] / len[i]);
        next[i] = stressAt[i] + w * (sigma - stressAt[i]);
        scale = Math.max(scale, Math.abs(sigma));
        change = Math.max(change, Math.abs(sigma - stressAt[i]));
      }
      if (
        iterations > 1 &&
        change <= STRESS_TOL * scale &&
        Math.abs(result.fs - fPrev) <= FS_TOL * result.fs
      ) {
        converged = true;
        break;
      }
      for (let i = 0; i < n; i++) {
        const env = rules.envelope[s.material[i]];
        if (!env) continue;
        stressAt[i] = next[i];
        env.tangent(next[i], out);
        b.cohesion[i] = out[0];
        b.tanPhi[i] = out[1];
      }
      fPrev = result.fs;
      result = solve(b);
      iterations++;
      if (!result.converged) break;
    }
  }
  const warnings: StressWarning[] = [];
  if (any && result.converged && !converged) {
    warnings.push({
      code: 'stress-iteration',
      message: `the strengths that depend on the normal stress did not settle in ${STRESS_ITERATIONS} solutions of the method: F is that of the last one, with each base's strength at the normal stress before it`,
    });
  }
  if (result.converged) warnings.push(...rangeWarnings(s, rules, stressAt));
  return {
    result,
    strengths: b,
    stressAt,
    iterations,
    converged: result.converged && (converged || !any),
    warnings,
  };
}

/** For each material, the bases whose σ′n is outside its envelope's range, numbered from the left. */
function rangeWarnings(s: SliceSet, rules: StrengthRules, stressAt: Float64Array): StressWarning[] {
  const byMaterial = new Map<number, number[]>();
  for (let i = 0; i < s.n; i++) {
    const m = s.material[i];
    const env = rules.envelope[m];
    if (!env) continue;
    const sigma = stressAt[i];
    if (sigma >= env.range[0] && sigma <= env.range[1]) continue;
    const list = byMaterial.get(m) ?? [];
    list.push(s.mirrored ? s.n - i : i + 1);
    byMaterial.set(m, list);
  }
  const warnings: StressWarning[] = [];
  for (const [m, list] of byMaterial) {
    list.sort((a, b) => a - b);
    const env = rules.envelope[m]!;
    warnings.push({
      code: 'stress-range',
      message: `the effective normal stress on ${list.length} slice base${list.length > 1 ? 's' : ''} in "${rules.names[m]}" (${rules.words[m]}) is ${env.rangeWords}: slice${list.length > 1 ? 's' : ''} ${runs(list)}, numbered from the left as in the slice table`,
    });
  }
  return warnings;
}

/** 1, 2, 3, 5 → "1–3, 5". */
function runs(list: number[]): string {
  const parts: string[] = [];
  for (let i = 0; i < list.length;) {
    let j = i;
    while (j + 1 < list.length && list[j + 1] === list[j] + 1) j++;
    parts.push(j > i ? `${list[i]}–${list[j]}` : `${list[i]}`);
    i = j + 1;
  }
  return parts.join(', ');
}

/**
 * A method on slices, with the section's rules when some base takes a strength by them, else
 * as it is (the fast path: Mohr–Coulomb sections are solved exactly as before).
 */
export function solveSlices<T extends NormalForces>(
  s: SliceSet,
  rules: StrengthRules | null,
  waterUnitWeight: number,
  run: (slices: SliceSet) => T,
): T {
  if (!touchesRules(s, rules)) return run(s);
  let view: SliceSet | undefined;
  return solveWithStresses(s, rules!, waterUnitWeight, (b) => {
    view = withBaseStrengths(s, b, view);
    return run(view);
  }).result;
}
