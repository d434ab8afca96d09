/**
 * The most the API takes of the texts and numbers people send it beside the section and batch
 * files (whose limits are in the schemas and the core's INPUT_LIMITS): checked in the routes
 * before any service or the database sees them, and stated in schemas/openapi.json.
 */
export const API_LIMITS = Object.freeze({
  /** Characters of a project's, a user's or an API token's name. */
  name: 200,
  /** Characters of an e-mail address (RFC 5321's path limit, less the angle brackets). */
  email: 254,
  /** Characters of a project's description. */
  description: 10_000,
  /** Characters of a review's or a review request's comment. */
  comment: 5000,
  /** Characters of a password: at least, at most (a longer one is refused, never cut). */
  passwordMin: 8,
  passwordMax: 256,
  /** Characters of a design case's name in a query (the section schema's bound). */
  caseName: 100,
  /** The highest page of a paged list, and the most items on one page. */
  page: 100_000,
  pageSize: 500,
  /** The most sections of a batch whose results.xlsx takes a slice sheet each (?slices=true). */
  sliceSheetSections: 100,
  /** The largest id (PostgreSQL's integer). */
  id: 2_147_483_647,
});
