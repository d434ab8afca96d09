import { brent } from '../numeric/brent';
import type { ReportedSurface, Warning } from '../result';

/** What one pseudo-static analysis at a given kh gives: the least FS of the whole search and its surface. */
export interface PseudoStaticAnalysis {
  fs: number | null;
  surface: ReportedSurface | null;
}

/** The caller's analysis of the case at a horizontal seismic coefficient kh (everything else, kv included, as the case gives it). */
export type FsAtKh = (kh: number) => PseudoStaticAnalysis;

export interface YieldOptions {
  /** The largest kh tried (1.0: a horizontal acceleration of 1 g). */
  cap?: number;
  /** F counts as 1 within this (5e-4: F reads 1.000 to three decimals). */
  fsTolerance?: number;
  /** Where the least FS jumps across 1, the bracket of kh is narrowed to this width (1e-4). */
  khTolerance?: number;
  /** The most analyses (full searches) the root finding may run (40). */
  maxAnalyses?: number;
}

/**
 * `found`: ky in [0, cap]; `statically-unstable`: F < 1 already at kh = 0 (ky = 0);
 * `above-cap`: F > 1 still at kh = cap (ky > cap, reported null); `no-factor-of-safety`: an
 * analysis gave no FS (ky null); `not-converged`: the analyses ran out before F = 1 was
 * found (ky is the highest kh known to give F > 1).
 */
export type YieldOutcome =
  'found' | 'statically-unstable' | 'above-cap' | 'no-factor-of-safety' | 'not-converged';

export interface YieldCoefficient {
  outcome: YieldOutcome;
  /** The yield coefficient (a fraction of g); null when none was found in [0, cap]. */
  ky: number | null;
  /** The least FS at ky and its critical surface (at kh = 0 when statically unstable). */
  fs: number | null;
  surface: ReportedSurface | null;
  /** Analyses (full searches) run. */
  analyses: number;
  /** The highest kh known to give F > 1 and the lowest known to give F < 1, when both are known. */
  bracket: [number, number] | null;
  /** The cap and the tolerance the root was found to. */
  cap: number;
  fsTolerance: number;
  warnings: Warning[];
}

class OutOfAnalyses extends Error {}
class NoFactorOfSafety extends Error {
  constructor(readonly kh: number) {
    super(`no factor of safety at kh = ${kh}`);
  }
}

const f3 = (x: number) => x.toFixed(3);

/**
 * The yield coefficient ky: the horizontal seismic coefficient at which the least factor of
 * safety of the whole search is 1.0 (Newmark 1965, Géotechnique 15(2): the yield acceleration
 * of the sliding mass; Kramer & Stewart, Geotechnical Earthquake Engineering, 2nd ed. 2024,
 * §10.9). `fsAt(kh)` runs the case's full analysis — the search repeated — at each kh asked;
 * the vertical coefficient kv stays as the case gives it, so ky is the kh at F = 1 with that kv.
 *
 * The least FS as a function of kh is continuous but not smooth (the critical surface jumps
 * from one place to another), and decreasing: F(0) is computed first; F < 1 there means the
 * slope is not stable statically (ky = 0). Otherwise kh steps upward — first to ½(F(0) − 1),
 * then by the secant through the last two points, overshot by half — until F < 1 or the cap;
 * then Brent's method (numeric/brent.ts) narrows the bracket, stopping when |F − 1| ≤
 * fsTolerance, or, where F jumps across 1, when the bracket is khTolerance wide (with a
 * warning that says so).
 *
 * @example yieldCoefficient((kh) => ({ fs: 1.5 - 2 * kh, surface: null })).ky // ≈ 0.25
 */
export function yieldCoefficient(fsAt: FsAtKh, options: YieldOptions = {}): YieldCoefficient {
  const cap = options.cap ?? 1;
  const fsTol = options.fsTolerance ?? 5e-4;
  const khTol = options.khTolerance ?? 1e-4;
  const maxAnalyses = options.maxAnalyses ?? 40;
  const memo = new Map<number, PseudoStaticAnalysis>();
  let analyses = 0;
  // the highest kh known with F > 1 and the lowest with F < 1
  let lo = 0;
  let hi: number | null = null;
  const at = (kh: number): PseudoStaticAnalysis => {
    const known = memo.get(kh);
    if (known) return known;
    if (analyses >= maxAnalyses) throw new OutOfAnalyses();
    const r = fsAt(kh);
    analyses++;
    if (r.fs === null || !Number.isFinite(r.fs)) throw new NoFactorOfSafety(kh);
    memo.set(kh, r);
    if (r.fs > 1 && kh > lo) lo = kh;
    if (r.fs < 1 && (hi === null || kh < hi)) hi = kh;
    return r;
  };
  const result = (
    outcome: YieldOutcome,
    ky: number | null,
    r: PseudoStaticAnalysis | null,
    warnings: Warning[] = [],
  ): YieldCoefficient => ({
    outcome,
    ky,
    fs: r?.fs ?? null,
    surface: r?.surface ?? null,
    analyses,
    bracket: hi === null ? null : [lo, hi],
    cap,
    fsTolerance: fsTol,
    warnings,
  });

  try {
    const r0 = at(0);
    const f0 = r0.fs!;
    if (Math.abs(f0 - 1) <= fsTol) return result('found', 0, r0);
    if (f0 < 1) {
      return result('statically-unstable', 0, r0, [
        {
          code: 'statically-unstable',
          message: `the least FS is ${f3(f0)} < 1 already without the earthquake (kh = 0): the slope is not stable statically, so ky = 0 and no sliding-block displacement can be estimated`,
        },
      ]);
    }
    // step upward until F < 1 or the cap
    let prev: [number, number] = [0, f0];
    let kh = Math.min(cap, Math.max(0.01, 0.5 * (f0 - 1)));
    for (;;) {
      const r = at(kh);
      const f = r.fs!;
      if (Math.abs(f - 1) <= fsTol) return result('found', kh, r);
      if (f < 1) break;
      if (kh >= cap) {
        return result('above-cap', null, r, [
          {
            code: 'yield-above-cap',
            message: `the least FS is still ${f3(f)} > 1 at kh = ${f3(cap)}: the yield coefficient is above ${f3(cap)}`,
          },
        ]);
      }
      const slope = (f - prev[1]) / (kh - prev[0]);
      const step = slope < 0 ? (1 - f) / slope : kh + 0.05;
      prev = [kh, f];
      kh = Math.min(cap, kh + Math.max(1.5 * step, 0.01));
    }
    // Brent's method on [lo, hi]: F − 1, taken as 0 within the FS tolerance
    const g = (x: number) => {
      const f = at(x).fs!;
      return Math.abs(f - 1) <= fsTol ? 0 : f - 1;
    };
    const a = lo;
    const b = hi!;
    const root = brent(g, a, b, khTol, maxAnalyses, g(a), g(b));
    const r = at(root.x);
    const f = r.fs!;
    if (Math.abs(f - 1) <= fsTol) return result('found', root.x, r);
    if (root.converged) {
      const below = memo.get(lo)?.fs ?? NaN;
      const above = memo.get(hi!)?.fs ?? NaN;
      return result('found', root.x, r, [
        {
          code: 'yield-fs-jump',
          message: `the least FS jumps from ${f3(below)} to ${f3(above)} between kh = ${lo.toFixed(4)} and ${hi!.toFixed(4)} (the critical surface changes there): ky = ${root.x.toFixed(4)} is taken at the jump, where F = ${f3(f)}`,
        },
      ]);
    }
    throw new OutOfAnalyses();
  } catch (e) {
    if (e instanceof NoFactorOfSafety) {
      return result('no-factor-of-safety', null, null, [
        {
          code: 'yield-not-found',
          message: `the analysis at kh = ${f3(e.kh)} gave no factor of safety: the yield coefficient could not be found`,
        },
      ]);
    }
    if (e instanceof OutOfAnalyses) {
      const r = memo.get(lo) ?? null;
      const where = hi === null ? `above ${f3(lo)}` : `between ${f3(lo)} and ${f3(hi)}`;
      return result('not-converged', lo, r, [
        {
          code: 'yield-not-converged',
          message: `${maxAnalyses} analyses did not find F = 1: ky lies ${where}; the lower value is reported`,
        },
      ]);
    }
    throw e;
  }
}
