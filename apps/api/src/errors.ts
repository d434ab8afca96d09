/** Errors that become RFC 9457 problem details in the one error middleware. */
export class Problem extends Error {
  constructor(
    readonly status: number,
    readonly title: string,
    readonly detail?: string,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(detail ?? title);
  }
}

export const badRequest = (detail: string, extra?: Record<string, unknown>) =>
  new Problem(400, 'Bad request', detail, extra);
export const unauthorized = (detail = 'Sign in or send a valid bearer token.') =>
  new Problem(401, 'Unauthorized', detail);
export const forbidden = (detail = 'Your role does not allow this.') =>
  new Problem(403, 'Forbidden', detail);
export const notFound = (what = 'resource') => new Problem(404, 'Not found', `No such ${what}.`);
export const conflict = (detail: string) => new Problem(409, 'Conflict', detail);
export const invalid = (detail: string, extra?: Record<string, unknown>) =>
  new Problem(422, 'Invalid input', detail, extra);
export const tooMany = (detail: string, extra?: Record<string, unknown>) =>
  new Problem(429, 'Too many requests', detail, extra);
export const unavailable = (detail: string, extra?: Record<string, unknown>) =>
  new Problem(503, 'Service unavailable', detail, extra);
