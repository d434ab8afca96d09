import type { Point } from '../model/types';

/** Where a trial circle came from: a stage of the search. */
export type TrialStage = 'grid' | 'ground-ranges' | 'polish';

/** A trial circle and its factor of safety (section coordinates, SI). */
export interface CircleTrial {
  center: Point;
  radius: number;
  fs: number;
  /** The stage that made it, and the stratum boundary it was made tangent to (−1 when none). */
  stage: TrialStage;
  boundary: number;
}

/** Evaluates a circle: its factor of safety, or NaN when it is not admissible. */
export type CircleEvaluator = (xc: number, yc: number, r: number) => number;

/**
 * Counts trials by stage, keeps the best circle, the circles within `band` of the least FS
 * (FS ≤ (1 + band)·least, pruned as the least falls) and the lowest circle made tangent to each
 * stratum boundary (a family the polish starts from).
 */
export class Trials {
  count = 0;
  valid = 0;
  stage: TrialStage = 'grid';
  readonly byStage: Record<TrialStage, number> = { grid: 0, 'ground-ranges': 0, polish: 0 };
  best: CircleTrial | null = null;
  /** The lowest trial tangent to each boundary, by boundary index. */
  readonly tangent: (CircleTrial | null)[] = [];
  private near: CircleTrial[] = [];
  private pruned = 0;
  constructor(private readonly band = 0) {}

  /** Evaluate and record one circle; returns its FS (NaN when inadmissible). */
  try(evaluate: CircleEvaluator, xc: number, yc: number, r: number, boundary = -1): number {
    this.count++;
    this.byStage[this.stage]++;
    const fs = evaluate(xc, yc, r);
    if (!(fs > 0)) return NaN;
    this.valid++;
    const best = this.best;
    if (!best || fs < best.fs || (this.band > 0 && fs <= (1 + this.band) * best.fs)) {
      const t: CircleTrial = { center: [xc, yc], radius: r, fs, stage: this.stage, boundary };
      if (!best || fs < best.fs) this.best = t;
      if (this.band > 0) {
        this.near.push(t);
        if (this.near.length > 2 * this.pruned + 64) this.prune();
      }
    }
    if (boundary >= 0) {
      const t = this.tangent[boundary];
      if (!t || fs < t.fs)
        this.tangent[boundary] = { center: [xc, yc], radius: r, fs, stage: this.stage, boundary };
    }
    return fs;
  }

  /** The trials within the band of the least FS, lowest first. */
  withinBand(): CircleTrial[] {
    this.prune();
    return [...this.near].sort((a, b) => a.fs - b.fs);
  }

  private prune(): void {
    const limit = (1 + this.band) * (this.best?.fs ?? Infinity);
    this.near = this.near.filter((t) => t.fs <= limit);
    this.pruned = this.near.length;
  }
}
