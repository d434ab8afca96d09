import type { Point } from '../model/types';

/** A trial circle and its factor of safety (section coordinates, SI). */
export interface CircleTrial {
  center: Point;
  radius: number;
  fs: number;
}

/** Evaluates a circle: its factor of safety, or NaN when it is not admissible. */
export type CircleEvaluator = (xc: number, yc: number, r: number) => number;

/** Counts trials and keeps the few lowest. */
export class Trials {
  count = 0;
  valid = 0;
  readonly lowest: CircleTrial[] = [];
  constructor(private readonly keep = 10) {}

  /** Evaluate and record one circle; returns its FS (NaN when inadmissible). */
  try(evaluate: CircleEvaluator, xc: number, yc: number, r: number): number {
    this.count++;
    const fs = evaluate(xc, yc, r);
    if (!(fs > 0)) return NaN;
    this.valid++;
    const low = this.lowest;
    if (low.length < this.keep || fs < low[low.length - 1].fs) {
      let i = low.length;
      while (i > 0 && low[i - 1].fs > fs) i--;
      low.splice(i, 0, { center: [xc, yc], radius: r, fs });
      if (low.length > this.keep) low.pop();
    }
    return fs;
  }

  get best(): CircleTrial | null {
    return this.lowest[0] ?? null;
  }
}
