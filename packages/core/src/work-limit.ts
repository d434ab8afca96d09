/**
 * Bounds on the work of one analysis. The core has no clock: a caller with a deadline passes
 * `shouldStop` (asked every few hundred trial surfaces); a caller that must be sure of the
 * time also runs the analysis where it can be stopped (a worker thread it terminates).
 */
export interface AnalyzeOptions {
  /**
   * The most slice evaluations the analysis may use: a trial surface cut into n slices costs
   * n (a refused one 1). Default WORK_LIMIT.
   */
  workLimit?: number;
  /** Asked now and then during the search: true stops the analysis. */
  shouldStop?: () => boolean;
}

/**
 * The default bound on slice evaluations: about 10⁸, some two hundred times what the default
 * automatic search uses, a few tens of seconds on one core. The section schema's checks refuse
 * settings whose estimate (estimateWork) is above it before any work starts.
 */
export const WORK_LIMIT = 1e8;

/** An analysis stopped by its bound (`work-limit`) or by its caller (`stopped`), with what to change. */
export class AnalysisStopped extends Error {
  constructor(
    readonly code: 'work-limit' | 'stopped',
    message: string,
  ) {
    super(message);
    this.name = 'AnalysisStopped';
  }
}

/** Counts the slice evaluations of an analysis and stops it at its bound. */
export class WorkMeter {
  used = 0;
  trials = 0;
  private readonly limit: number;
  constructor(private readonly options: AnalyzeOptions = {}) {
    this.limit = options.workLimit ?? WORK_LIMIT;
  }

  /** Charge one trial surface of `slices` slices; throws AnalysisStopped past the bound. */
  charge(slices: number): void {
    this.used += slices;
    this.trials++;
    if (this.used > this.limit) {
      throw new AnalysisStopped(
        'work-limit',
        `the search used up its bound of ${this.limit.toExponential(0)} slice evaluations after ${this.trials.toLocaleString('en-GB')} trial surfaces: use fewer grid centres, radii, moves, ground-range points or slices, or give the surface`,
      );
    }
    if ((this.trials & 255) === 0 && this.options.shouldStop?.()) {
      throw new AnalysisStopped(
        'stopped',
        `stopped at its time limit after ${this.trials.toLocaleString('en-GB')} trial surfaces: use fewer grid centres, radii, moves, ground-range points or slices, or give the surface`,
      );
    }
  }
}
