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
 * Counts trials by stage and keeps the few lowest, and the lowest circle made tangent to
 * each stratum boundary (a family the polish starts from).
 */
export class Trials {
  count = 0;
  valid = 0;
  stage: TrialStage = 'grid';
  readonly byStage: Record<TrialStage, number> = { grid: 0, 'ground-ranges': 0, polish: 0 };
  readonly lowest: CircleTrial[] = [];
  /** The lowest trial tangent to each boundary, by boundary index. */
  readonly tangent: (CircleTrial | null)[] = [];
  constructor(private readonly keep = 10) {}

  /** Evaluate and record one circle; returns its FS (NaN when inadmissible). */
  try(evaluate: CircleEvaluator, xc: number, yc: number, r: number, boundary = -1): number {
    this.count++;
    this.byStage[this.stage]++;
    const fs = evaluate(xc, yc, r);
    if (!(fs > 0)) return NaN;
    this.valid++;
    const low = this.lowest;
    if (low.length < this.keep || fs < low[low.length - 1].fs) {
      let i = low.length;
      while (i > 0 && low[i - 1].fs > fs) i--;
      low.splice(i, 0, { center: [xc, yc], radius: r, fs, stage: this.stage, boundary });
      if (low.length > this.keep) low.pop();
    }
    if (boundary >= 0) {
      const t = this.tangent[boundary];
      if (!t || fs < t.fs)
        this.tangent[boundary] = { center: [xc, yc], radius: r, fs, stage: this.stage, boundary };
    }
    return fs;
  }

  get best(): CircleTrial | null {
    return this.lowest[0] ?? null;
  }
}
