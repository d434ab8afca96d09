/**
 * Solving for a value: the value of one input (a target, target.ts) at which a case's
 * critical FS, with the full analysis (the search where the case asks for one) at every step,
 * equals a target FS: 1.0 for a back-analysis of a slope that failed, the required FS for a
 * design. The critical FS as a function of one input is continuous but not smooth (the
 * critical surface jumps), so the root is bracketed on a scan of the range and then refined
 * by Brent's method (Brent 1973), which never leaves its bracket.
 */
import { CAUTION } from '../caution';
import type { Section } from '../model/types';
import { brent } from '../numeric/brent';
import type { AnalyzeOptions } from '../work-limit';
import { type Critical, caseModels, criticalOf } from './case-fs';
import { applyValue, parseTarget, targetValue } from './target';
import type { SolveResult, SolveStep, SolvedSurface } from './types';

export interface SolveRequest {
  /** The input to solve for, e.g. `materials.clay.frictionAngle`. */
  target: string;
  /** The FS to reach. */
  targetFs: number;
  /** The range of values to look in (SI; water.level: the shift). */
  range: [number, number];
  /** The case (by name); the first when not given. */
  caseName?: string;
  /** Points the range is scanned at to bracket the root (at least 2; 9 when not given). */
  scan?: number;
  /** The value's tolerance (a 10⁻⁵ part of the range when not given). */
  tolerance?: number;
}

export interface SolveOptions extends AnalyzeOptions {
  /** Called after each analysis with the count so far. */
  onProgress?: (analyses: number) => void;
}

function surfaceOf(c: Critical): SolvedSurface | null {
  const s = c.surface;
  if (!s) return null;
  if (s.type === 'circle')
    return { type: 'circle', center: [s.center[0], s.center[1]], radius: s.radius };
  if (s.type === 'polyline' || s.type === 'log-spiral')
    return { type: 'polyline', points: s.points.map((p): [number, number] => [p[0], p[1]]) };
  return { type: 'plane', angle: s.angle, depth: s.depth };
}

/**
 * The value of the target in the range at which the case's critical FS equals targetFs, with
 * the analyses it took; `found: false` and the reason when the range holds no such value (the
 * FS over the scan stays on one side of the target) or the input cannot take the values.
 *
 * @example solveForValue(section, { target: 'materials.sand.frictionAngle', targetFs: 1, range: [20, 45] }).value // → 33.69
 */
export function solveForValue(
  section: Section,
  request: SolveRequest,
  options: SolveOptions = {},
): SolveResult {
  const [a, b] =
    request.range[0] <= request.range[1] ? request.range : [request.range[1], request.range[0]];
  const steps: SolveStep[] = [];
  const model = caseModels(section, request.caseName)[0] ?? caseModels(section)[0];
  const result = (
    found: boolean,
    reason: string | null,
    value: number | null,
    c: Critical | null,
  ): SolveResult => ({
    id: section.id,
    title: section.title,
    case: model.name,
    target: request.target,
    targetFs: request.targetFs,
    range: [a, b],
    found,
    value,
    fs: c?.fs ?? null,
    method: c?.method ?? null,
    surface: c ? surfaceOf(c) : null,
    analyses: steps.length,
    steps,
    reason,
    caution: CAUTION,
  });
  const parsed = parseTarget(request.target);
  if (!parsed.ok) return result(false, parsed.reason, null, null);
  const has = targetValue(model.section, parsed.target);
  if (!has.ok) return result(false, has.reason, null, null);
  const cache = new Map<number, Critical | null>();
  const analyze = (x: number): Critical | null => {
    if (cache.has(x)) return cache.get(x)!;
    const applied = applyValue(model.section, parsed.target, x);
    const c = applied.ok ? criticalOf(applied.section, options) : null;
    cache.set(x, c);
    steps.push({ value: x, fs: c?.fs ?? null });
    options.onProgress?.(steps.length);
    return c;
  };
  const g = (x: number) => {
    const fs = analyze(x)?.fs;
    return fs === null || fs === undefined ? NaN : fs - request.targetFs;
  };
  const n = Math.max(2, request.scan ?? 9);
  const xs = Array.from({ length: n }, (_, k) => a + ((b - a) * k) / (n - 1));
  const gs = xs.map(g);
  const tol = request.tolerance ?? Math.max(1e-12, (b - a) * 1e-5);
  for (let k = 0; k < n; k++) {
    if (gs[k] === 0) return result(true, null, xs[k], analyze(xs[k]));
    if (
      k + 1 < n &&
      Number.isFinite(gs[k]) &&
      Number.isFinite(gs[k + 1]) &&
      gs[k] * gs[k + 1] < 0
    ) {
      const r = brent(g, xs[k], xs[k + 1], tol, 100, gs[k], gs[k + 1]);
      if (r.converged) return result(true, null, r.x, analyze(r.x));
    }
  }
  const v = (x: number) => String(Number(x.toPrecision(6)));
  const seen = steps.filter((s) => s.fs !== null).map((s) => s.fs!);
  const reason =
    seen.length === 0
      ? `no analysis in ${v(a)} … ${v(b)} gave a factor of safety (the input cannot take these values, or no admissible surface was found)`
      : `no value in ${v(a)} … ${v(b)} gives FS = ${request.targetFs}: over the range the critical FS lies between ${Math.min(...seen).toFixed(3)} and ${Math.max(...seen).toFixed(3)}; widen the range or change the target`;
  return result(false, reason, null, null);
}
