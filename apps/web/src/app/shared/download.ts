import { HttpErrorResponse, type HttpResponse } from '@angular/common/http';
import { catchError, from, map, mergeMap, pipe, throwError, type OperatorFunction } from 'rxjs';

/** A file fetched for saving, with the name the API gave it. */
export interface Download {
  blob: Blob;
  fileName: string;
}

/** The file name in a Content-Disposition header (`attachment; filename="x.csv"`), or null. */
export function fileNameOf(disposition: string | null): string | null {
  if (!disposition) return null;
  const star = /filename\*\s*=\s*(?:UTF-8'')?([^;]+)/i.exec(disposition);
  if (star) {
    try {
      return decodeURIComponent(star[1].trim().replace(/^"|"$/g, ''));
    } catch {
      // fall through to the plain parameter
    }
  }
  const plain = /filename\s*=\s*("([^"]*)"|[^;]+)/i.exec(disposition);
  if (!plain) return null;
  return (plain[2] ?? plain[1]).trim() || null;
}

/**
 * A refused download's problem+json, which arrives as a Blob since the file was asked for as
 * one, read back into the error as JSON so that its title and detail can be shown.
 */
export async function problemOfBlob(err: unknown): Promise<unknown> {
  if (!(err instanceof HttpErrorResponse) || !(err.error instanceof Blob)) return err;
  try {
    return new HttpErrorResponse({
      error: JSON.parse(await err.error.text()) as unknown,
      headers: err.headers,
      status: err.status,
      statusText: err.statusText,
      url: err.url ?? undefined,
    });
  } catch {
    return err;
  }
}

/** Rethrows a blob request's error with its problem+json read (see problemOfBlob). */
export function withBlobProblem<T>(): OperatorFunction<T, T> {
  return catchError((err: unknown) =>
    from(problemOfBlob(err)).pipe(mergeMap((e) => throwError(() => e))),
  );
}

/**
 * A blob response (`observe: 'response'`) as a Download named by its Content-Disposition, or
 * by `fallback` without one; a refusal as its problem.
 */
export function asDownload(fallback: string): OperatorFunction<HttpResponse<Blob>, Download> {
  return pipe(
    map((res: HttpResponse<Blob>) => ({
      blob: res.body ?? new Blob([]),
      fileName: fileNameOf(res.headers.get('Content-Disposition')) ?? fallback,
    })),
    withBlobProblem<Download>(),
  );
}

/** Saves a fetched file through an object URL (the download carried the bearer token). */
export function saveFile(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.style.display = 'none';
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
