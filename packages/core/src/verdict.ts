/**
 * Scarpline's one vocabulary for results: the verdict of a section against its required factor
 * of safety, the state of a section's job in the service, and how a factor of safety is
 * written. The command line, the API, its e-mails and the web app all use these codes and
 * words. Free of imports, so that the web app can use it without bundling the solver.
 */

/**
 * The verdict of a section, as stable machine codes (in files, the API and its filters), in the
 * order reports list them:
 * - `meets`: the governing FS is at or above the required FS;
 * - `below`: the governing FS is below the required FS;
 * - `no-fs`: no method gave a factor of safety (none converged, none applied, or the solver
 *   stopped), so there is nothing to compare;
 * - `no-requirement`: a factor of safety, but the section gives no required FS;
 * - `no-slope`: no significant slope (station-result.ts: the ground hardly rises, or the least
 *   FS is so large that no slip surface matters), said instead of a meaningless FS;
 * - `input-error`: the section did not read (the file or the batch has errors about it).
 */
export const VERDICTS = [
  'meets',
  'below',
  'no-fs',
  'no-requirement',
  'no-slope',
  'input-error',
] as const;
export type Verdict = (typeof VERDICTS)[number];

/** The verdict in words, as sentences, tables and legends print it. */
export const VERDICT_WORDS: Readonly<Record<Verdict, string>> = {
  meets: 'meets the required FS',
  below: 'below the required FS',
  'no-fs': 'no factor of safety',
  'no-requirement': 'no requirement given',
  'no-slope': 'no significant slope',
  'input-error': 'input error',
};

/** The verdict in a word or two, where there is little room (a table cell, a filter button). */
export const VERDICT_SHORT: Readonly<Record<Verdict, string>> = {
  meets: 'meets',
  below: 'below',
  'no-fs': 'no FS',
  'no-requirement': 'no requirement',
  'no-slope': 'no slope',
  'input-error': 'input error',
};

/**
 * The state of a section's job in the service (the `status` of a section): `queued`, then
 * `running`, then `done` (a result was written; its verdict says how it came out) or `failed`
 * (no result: no method gave a factor of safety, or the job ran out of time or retries).
 * Distinct from every verdict code and word.
 */
export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];

/** The job state in words. */
export const JOB_STATE_WORDS: Readonly<Record<JobState, string>> = {
  queued: 'queued',
  running: 'running',
  done: 'done',
  failed: 'failed',
};

/**
 * The verdict of an analysed section: its governing FS (null when no method gave one) against
 * its required FS (null when none is given). A section that did not read is `input-error`,
 * which only the reader of the input can say.
 *
 * @example verdictOf(1.42, 1.5) // → 'below'
 */
export function verdictOf(fs: number | null, requiredFs: number | null): Verdict {
  if (fs === null || !Number.isFinite(fs)) return 'no-fs';
  if (requiredFs === null) return 'no-requirement';
  return fs >= requiredFs ? 'meets' : 'below';
}

/**
 * Decimals of a factor of safety wherever Scarpline writes one for people or other programs:
 * exports, tables, e-mails, drawings. Three: required factors of safety are given to one or
 * two decimals, so a third keeps a written FS next to its requirement readable (1.498 against
 * 1.5, where two decimals would write 1.50 beside "below the required FS"), while more digits
 * would claim a precision that neither the soil data nor the search for the critical surface
 * have. The verdict is always decided on the unrounded value.
 */
export const FS_DECIMALS = 3;

/**
 * A factor of safety as written: three decimals.
 *
 * @example fsText(1.274871643) // → '1.275'
 */
export function fsText(fs: number): string {
  return fs.toFixed(FS_DECIMALS);
}

/**
 * A factor of safety rounded as written, as a number (for JSON such as GeoJSON properties).
 *
 * @example fsRounded(1.274871643) // → 1.275
 */
export function fsRounded(fs: number): number {
  return Number(fs.toFixed(FS_DECIMALS));
}
