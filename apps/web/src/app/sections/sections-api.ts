import { HttpClient, HttpErrorResponse, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { catchError, throwError, type Observable } from 'rxjs';
import type { Batch } from '../batches/batch-types';
import type { RunsView, SectionPatch, SectionView } from './section-types';

const BASE = '/api/v1';

/** A text request's error carries the problem+json as a string: parse it for toProblem. */
function withJsonBody(err: unknown): unknown {
  if (!(err instanceof HttpErrorResponse) || typeof err.error !== 'string') return err;
  try {
    return new HttpErrorResponse({
      error: JSON.parse(err.error) as unknown,
      headers: err.headers,
      status: err.status,
      statusText: err.statusText,
      url: err.url ?? undefined,
    });
  } catch {
    return err;
  }
}

/** The section page's side of the API: a section, its drawing, its runs, a re-run. */
@Injectable({ providedIn: 'root' })
export class SectionsApi {
  private readonly http = inject(HttpClient);

  section(id: number): Observable<SectionView> {
    return this.http.get<SectionView>(`${BASE}/sections/${id}`);
  }

  /** The batch the section belongs to (its name for the way back, its review, its submitter). */
  batch(id: number): Observable<Batch> {
    return this.http.get<Batch>(`${BASE}/batches/${id}`);
  }

  /**
   * The drawing of the current run as SVG text (the server's drawing of the solver's result):
   * of one design case when named (the section as that case sees it, with its result).
   */
  plotSvg(id: number, caseName: string | null = null): Observable<string> {
    const params = caseName === null ? undefined : new HttpParams().set('case', caseName);
    return this.http
      .get(`${BASE}/sections/${id}/plot.svg`, { responseType: 'text', params })
      .pipe(catchError((err: unknown) => throwError(() => withJsonBody(err))));
  }

  /** The same drawing rendered to PNG by the server, as a file to save. */
  plotPng(id: number, caseName: string | null = null): Observable<Blob> {
    const params = caseName === null ? undefined : new HttpParams().set('case', caseName);
    return this.http.get(`${BASE}/sections/${id}/plot.png`, { responseType: 'blob', params });
  }

  runs(id: number): Observable<RunsView> {
    return this.http.get<RunsView>(`${BASE}/sections/${id}/runs`);
  }

  /** Queues the next run with the changes (a JSON merge patch, SI); answers the section. */
  rerun(id: number, changes: SectionPatch): Observable<SectionView> {
    return this.http.post<SectionView>(`${BASE}/sections/${id}/runs`, changes);
  }
}
