import { METHODS, type MethodOutput, methodsFor } from './methods/registry';
import { defaultPivot } from './methods/pivot';
import type { SliceMethodResult } from './methods/types';
import type { CircleSurface, MethodId, Point, PolylineSurface } from './model/types';
import type { MethodReport, ReportedSurface, SliceReport, Warning } from './result';
import type { BaseStrengths } from './slices/base-strengths';
import type { PreparedSection } from './slices/prepare-section';
import type { SliceOutcome, SliceSet } from './slices/slice-surface';
import { solveWithStresses, touchesRules } from './slices/stress-dependent';
import { reinforcementReport } from './reinforcement/reinforcement-report';

const deg = (r: number) => (r * 180) / Math.PI;

/** A number safe for JSON: never NaN or infinite. */
const finite = (v: number) => (Number.isFinite(v) ? v : 0);

/** The slices as reported, in the section's coordinates (SI), left to right. */
function reportSlices(
  prepared: PreparedSection,
  s: SliceSet,
  r: SliceMethodResult | null,
  computes: { E: boolean; X: boolean },
  stressAt: Float64Array | null,
  reinforcement: Float64Array | null,
): SliceReport[] {
  const out: SliceReport[] = [];
  for (let i = 0; i < s.n; i++) {
    const b = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    // the right side in section coordinates: the left side in sliding orientation when mirrored
    const j = s.mirrored ? i - 1 : i;
    // at the surface's end there is no interslice force: 0 wherever the method computes it
    const E = !computes.E ? null : r && j >= 0 ? finite(r.E[j]) : 0;
    const X = !computes.X ? null : r && j >= 0 ? finite(r.X[j]) : 0;
    const thrust = computes.E && r && j >= 0 && Number.isFinite(r.thrust[j]) ? r.thrust[j] : null;
    out.push({
      x: (s.mirrored ? -1 : 1) * 0.5 * (s.xl[i] + s.xr[i]),
      width: b,
      alpha: (s.mirrored ? -1 : 1) * deg(Math.atan2(dy, b)),
      baseLength: Math.hypot(b, dy),
      weight: s.weight[i],
      porePressure: s.porePressure[i],
      normal: r ? finite(r.normal[i]) : 0,
      shear: r ? finite(r.shear[i]) : 0,
      interslice: { E, X, thrust },
      material: prepared.materials[s.material[i]].name,
      cohesion: s.cohesion[i],
      frictionAngle: deg(Math.atan(s.tanPhi[i])),
      strengthAt:
        stressAt && Number.isFinite(stressAt[i])
          ? {
              stress: stressAt[i],
              kind: prepared.rules?.envelope[s.material[i]] ? 'normal' : 'vertical',
            }
          : null,
      ...(reinforcement ? { reinforcement: reinforcement[i] } : {}),
    });
  }
  if (s.mirrored) out.reverse();
  return out;
}

function surfaceReport(surface: CircleSurface | PolylineSurface): ReportedSurface {
  return surface.type === 'circle'
    ? { type: 'circle', center: [...surface.center], radius: surface.radius }
    : { type: 'polyline', points: surface.points.map((p): Point => [p[0], p[1]]) };
}

/** With c′ = 0 along a circle: the infinite-slope F of the steepest ground within the mass (dry or with ru). */
function cohesionlessWarning(prepared: PreparedSection, s: SliceSet): Warning | null {
  let allFrictional = true;
  for (let i = 0; i < s.n; i++) if (s.cohesion[i] > 0 || !(s.tanPhi[i] > 0)) allFrictional = false;
  if (!allFrictional) return null;
  let beta = 0;
  let tanPhi = Infinity;
  for (let i = 0; i < s.n; i++) {
    const b = Math.atan(Math.abs(s.yTopR[i] - s.yTopL[i]) / (s.xr[i] - s.xl[i]));
    if (b > beta) beta = b;
    tanPhi = Math.min(tanPhi, s.tanPhi[i]);
  }
  if (!(beta > 0)) return null;
  const water = prepared.section.water;
  const ru = water.kind === 'ru' ? water.ru : 0;
  const fInf = ((1 - ru / Math.cos(beta) ** 2) * tanPhi) / Math.tan(beta);
  return {
    code: 'cohesionless-circle',
    message: `c′ = 0 along this surface: the critical circle tends to a shallow slide parallel to the steepest ground (β = ${deg(beta).toFixed(1)}°), whose infinite-slope factor of safety is ${fInf.toFixed(3)}${ru > 0 ? ` with ru = ${ru}` : ' (no pore pressure)'}; that value governs`,
  };
}

/** Why a method that takes one strength for each material does not run where a base's strength varies with stress. */
function takesMaterialStrength(method: MethodId, prepared: PreparedSection, s: SliceSet): string {
  const rules = prepared.rules!;
  const seen = new Set<number>();
  for (let i = 0; i < s.n; i++) {
    const m = s.material[i];
    if (rules.envelope[m] || rules.vertical[m]) seen.add(m);
  }
  const which = [...seen].map((m) => `"${rules.names[m]}" (${rules.words[m]})`).join(', ');
  return `${method}: takes one strength for each material, but the strength of ${which} varies from slice base to slice base with the stress on it; use a method of slices (ordinary, Bishop, Janbu, Spencer, Morgenstern–Price)`;
}

/** A `no-convergence` warning for each method that applies but found no solution. */
export function convergenceWarnings(results: readonly MethodReport[]): Warning[] {
  const warnings: Warning[] = [];
  for (const r of results) {
    const applies = !r.warnings.some((w) => w.code === 'not-applicable');
    if (!r.converged && applies) {
      warnings.push({
        code: 'no-convergence',
        message: `${r.method}: ${r.reason ?? 'no solution'}`,
      });
    }
  }
  return warnings;
}

/** A method that did not run, and why (in its report and as a not-applicable warning). */
export function notRun(
  method: MethodId,
  reason: string,
  surface: ReportedSurface | null = null,
): MethodReport {
  return {
    method,
    fs: null,
    converged: false,
    iterations: 0,
    reason,
    surface,
    slices: [],
    warnings: [{ code: 'not-applicable', message: reason }],
  };
}

/** A method that works on the section's own plane (the infinite slope), reported. */
export function runOnPlane(method: MethodId, prepared: PreparedSection): MethodReport {
  const entry = METHODS[method];
  if (!('runPlane' in entry)) return notRun(method, `${method}: needs a slip surface`);
  return { method, iterations: 0, slices: [], ...entry.runPlane(prepared.section) };
}

/** The point a method takes moments about (sliding orientation): a circle's centre, or one above a polyline (defaultPivot). */
export function pivotOf(surface: CircleSurface | PolylineSurface, s: SliceSet): Point {
  return surface.type === 'circle'
    ? [(s.mirrored ? -1 : 1) * surface.center[0], surface.center[1]]
    : defaultPivot(s);
}

/** One method on one slip surface: its report, and (for a method that ran) its solution and the slices it solved. */
export interface SurfaceRun {
  report: MethodReport;
  /** The method's solution in the sliding orientation of `slices`; null where it did not run. */
  result: SliceMethodResult | null;
  slices: SliceSet | null;
}

/**
 * One method on one slip surface, reported in SI (section coordinates): the method from the
 * registry, refused with its reason where it does not take the surface, with the slices, the
 * surface actually used, its ends, the crack and the warnings. With `strengths`, each slice
 * base takes the strength given for it instead of its material's (slices/base-strengths.ts;
 * the methods that are not methods of slices refuse them).
 */
export function runOnSurface(
  method: MethodId,
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  cut: SliceOutcome,
  strengths?: BaseStrengths,
): MethodReport {
  return solveOnSurface(method, prepared, surface, cut, strengths).report;
}

/** runOnSurface, with the method's solution and the slices it solved beside the report. */
export function solveOnSurface(
  method: MethodId,
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  cut: SliceOutcome,
  strengths?: BaseStrengths,
): SurfaceRun {
  const entry = METHODS[method];
  const reported = surfaceReport(surface);
  const refused = (report: MethodReport): SurfaceRun => ({ report, result: null, slices: null });
  if (!('run' in entry))
    return refused(notRun(method, `${method}: not a method of a slip surface`));
  if (!entry.surfaces.includes(surface.type)) {
    const ids = methodsFor(surface.type);
    const others =
      ids.length > 1 ? `${ids.slice(0, -1).join(', ')} or ${ids[ids.length - 1]}` : ids[0];
    return refused(
      notRun(
        method,
        `${method}: applies to ${entry.surfaces.map((k) => (k === 'circle' ? 'circular' : 'polyline')).join(' and ')} surfaces; use ${others} on a ${surface.type}`,
        reported,
      ),
    );
  }
  if (!cut.ok)
    return refused(notRun(method, `the slip surface was rejected: ${cut.reason}`, reported));
  const s = cut.slices;
  const pivot = pivotOf(surface, s);
  const varies = !strengths && touchesRules(s, prepared.rules);
  if (varies && !entry.slices)
    return refused(notRun(method, takesMaterialStrength(method, prepared, s), reported));
  let output: MethodOutput | undefined;
  const stress = varies
    ? solveWithStresses(s, prepared.rules!, prepared.section.water.unitWeight, (b) => {
        output = entry.run({ prepared, surface, cut, pivot, strengths: b });
        return output.result;
      })
    : null;
  if (!output) output = entry.run({ prepared, surface, cut, pivot, strengths });
  const { result: r, slices = s } = output;
  const extra = {
    ...(output.extra ?? {}),
    ...(stress ? { strengthIterations: stress.iterations } : {}),
  };
  const warnings: Warning[] = [...r.warnings, ...(stress?.warnings ?? [])];
  const elements = prepared.section.reinforcement;
  const reinforced =
    elements.length > 0
      ? reinforcementReport(
          elements,
          output.crossings ?? cut.crossings,
          slices.mirrored,
          slices.n,
          r.converged ? (r.fsUncorrected ?? r.fs) : null,
        )
      : null;
  if (reinforced && r.converged) warnings.push(...reinforced.warnings);
  if (surface.type === 'circle' && entry.slices) {
    const w = cohesionlessWarning(prepared, slices);
    if (w) warnings.push(w);
  }
  const report: MethodReport = {
    method,
    fs: r.converged ? r.fs : null,
    converged: r.converged,
    iterations: r.iterations,
    ...(r.reason ? { reason: r.reason } : {}),
    surface: reported,
    base: cut.base.map((p): Point => [p[0], p[1]]),
    ends: { upper: cut.upperEnd, lower: cut.lowerEnd },
    crack: cut.crack ? { ...cut.crack } : null,
    slices: reportSlices(
      prepared,
      slices,
      r.converged ? r : null,
      entry.interslice,
      stress ? stress.stressAt : null,
      reinforced && r.converged ? reinforced.perSlice : null,
    ),
    warnings,
    ...(reinforced ? { reinforcement: reinforced.elements } : {}),
    ...extra,
  };
  return { report, result: r, slices };
}
