/**
 * The names Scarpline writes into files and ids: the two file formats and the id of a section
 * of a corridor. Written here once; free of imports, so that the web app can use it too.
 */

/** The format of a section file (schemas/section.schema.json). */
export const SECTION_FORMAT = 'scarpline/1';

/** The format of a corridor batch file (schemas/batch.schema.json). */
export const BATCH_FORMAT = 'scarpline-batch/1';

/**
 * The id of the section a corridor makes at a station: `<batch id>@<station>`. The same id
 * names the section's result, its drawing and its row in every export.
 *
 * @example corridorSectionId('wcb-main', 1240) // → 'wcb-main@1240'
 */
export function corridorSectionId(batchId: string, station: number): string {
  return `${batchId}@${station}`;
}
