import { HttpErrorResponse } from '@angular/common/http';
import type { LocatedError, Problem } from './models';

/**
 * What went wrong, in words a user can act on, from any error the HttpClient raises: the
 * API's problem+json when there is one, a plain sentence otherwise.
 */
export function toProblem(err: unknown): Problem {
  if (err instanceof HttpErrorResponse) {
    const body: unknown = err.error;
    if (body && typeof body === 'object' && 'title' in body) {
      const p = body as Partial<Problem>;
      return {
        title: p.title ?? err.statusText,
        status: p.status ?? err.status,
        detail: p.detail,
        errors: Array.isArray(p.errors) ? p.errors : undefined,
      };
    }
    if (err.status === 0) {
      return { title: 'No connection', status: 0, detail: 'The Scarpline service did not answer.' };
    }
    return { title: err.statusText || 'Request failed', status: err.status, detail: err.message };
  }
  const detail = err instanceof Error ? err.message : String(err);
  return { title: 'Something went wrong', status: 0, detail };
}

/** One line for a located error: `batch.yaml:12:5 sections[0].water.line — message`. */
export function locatedText(e: LocatedError): string {
  const where = [e.file, e.line, e.column].filter((v) => v !== undefined && v !== '').join(':');
  return `${where}${e.path ? ` ${e.path}` : ''} — ${e.message}`;
}
