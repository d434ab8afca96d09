import { HttpClient, HttpHeaders, HttpParams, type HttpResponse } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import {
  catchError,
  EMPTY,
  expand,
  from,
  map,
  mergeMap,
  reduce,
  throwError,
  type Observable,
} from 'rxjs';
import type {
  Batch,
  Download,
  ResultCollection,
  ReviewRequestResult,
  SectionListItem,
  SectionPage,
  SectionQuery,
  StoredInput,
  SubmittedBatch,
} from './batch-types';
import { fileNameOf, problemOfBlob } from '../shared/download';

/** The download helpers live in shared/download.ts; this one is still exported from here too. */
export { fileNameOf };

const API = '/api/v1';

/** The exports of a batch's results: the results table as CSV, GeoJSON or a spreadsheet. */
export type ExportKind = 'csv' | 'geojson' | 'xlsx';
/** The largest page GET /batches/:id/sections gives. */
export const MAX_PAGE_SIZE = 500;

/** Batches, their sections and their exports, over HttpClient. */
@Injectable({ providedIn: 'root' })
export class BatchesApi {
  private readonly http = inject(HttpClient);

  batch(id: number): Observable<Batch> {
    return this.http.get<Batch>(`${API}/batches/${id}`);
  }

  /** One page of the sections of a batch, sorted and filtered by the server. */
  sections(batchId: number, q: SectionQuery = {}): Observable<SectionPage> {
    let params = new HttpParams();
    if (q.sort) params = params.set('sort', q.sort);
    if (q.order) params = params.set('order', q.order);
    if (q.page !== undefined) params = params.set('page', q.page);
    if (q.pageSize !== undefined) params = params.set('pageSize', q.pageSize);
    if (q.status) params = params.set('status', q.status);
    if (q.verdict) params = params.set('verdict', q.verdict);
    if (q.case !== undefined && q.verdict) params = params.set('case', q.case);
    return this.http.get<SectionPage>(`${API}/batches/${batchId}/sections`, { params });
  }

  /** Every section of a batch by station, a page of 500 at a time until all are read. */
  allSections(batchId: number): Observable<SectionListItem[]> {
    const page = (n: number) =>
      this.sections(batchId, { sort: 'station', order: 'asc', page: n, pageSize: MAX_PAGE_SIZE });
    return page(1).pipe(
      expand((p) =>
        p.page * p.pageSize < p.total && p.items.length > 0 ? page(p.page + 1) : EMPTY,
      ),
      reduce((all, p) => all.concat(p.items), [] as SectionListItem[]),
    );
  }

  resultsGeoJson(batchId: number): Observable<ResultCollection> {
    return this.http.get<ResultCollection>(`${API}/batches/${batchId}/results.geojson`);
  }

  /**
   * The CSV, GeoJSON or spreadsheet export as a file (the bearer token goes with it, unlike a
   * plain link); the spreadsheet with a sheet of slices per section when `slices` is set.
   */
  download(
    batchId: number,
    kind: ExportKind,
    options: { slices?: boolean } = {},
  ): Observable<Download> {
    const params = options.slices ? new HttpParams().set('slices', 'true') : undefined;
    return this.http
      .get(`${API}/batches/${batchId}/results.${kind}`, {
        params,
        responseType: 'blob',
        observe: 'response',
      })
      .pipe(
        map((res: HttpResponse<Blob>) => ({
          blob: res.body ?? new Blob([]),
          fileName:
            fileNameOf(res.headers.get('Content-Disposition')) ??
            `batch-${batchId}-results.${kind}`,
        })),
        catchError((err: unknown) =>
          from(problemOfBlob(err)).pipe(mergeMap((e) => throwError(() => e))),
        ),
      );
  }

  /** The files the batch was submitted with (their metadata). */
  inputs(batchId: number): Observable<StoredInput[]> {
    return this.http.get<StoredInput[]>(`${API}/batches/${batchId}/inputs`);
  }

  /** One submitted file's bytes as kept, with the file name the API gives it. */
  downloadInput(batchId: number, file: StoredInput): Observable<Download> {
    return this.http
      .get(`${API}/batches/${batchId}/inputs/${file.id}`, {
        responseType: 'blob',
        observe: 'response',
      })
      .pipe(
        map((res: HttpResponse<Blob>) => ({
          blob: res.body ?? new Blob([]),
          fileName: fileNameOf(res.headers.get('Content-Disposition')) ?? file.name,
        })),
        catchError((err: unknown) =>
          from(problemOfBlob(err)).pipe(mergeMap((e) => throwError(() => e))),
        ),
      );
  }

  /** A batch as JSON text, sent as written so that the API's line numbers match it. */
  submitJson(projectId: number, text: string): Observable<SubmittedBatch> {
    return this.http.post<SubmittedBatch>(`${API}/projects/${projectId}/batches`, text, {
      headers: new HttpHeaders({ 'Content-Type': 'application/json' }),
    });
  }

  /** Files as multipart/form-data in the field "files" (a batch, a corridor or sections). */
  upload(projectId: number, files: readonly File[]): Observable<SubmittedBatch> {
    const body = new FormData();
    for (const f of files) body.append('files', f, f.name);
    return this.http.post<SubmittedBatch>(`${API}/projects/${projectId}/uploads`, body);
  }

  /**
   * A terrain job (scarpline-terrain/1, as text in the field "job") with the files it names
   * (rasters, alignment) in "files": the sections are cut from the terrain and submitted.
   */
  uploadTerrain(
    projectId: number,
    job: string,
    files: readonly File[],
  ): Observable<SubmittedBatch> {
    const body = new FormData();
    body.append('job', job);
    for (const f of files) body.append('files', f, f.name);
    return this.http.post<SubmittedBatch>(`${API}/projects/${projectId}/terrain`, body);
  }

  requestReview(batchId: number, comment: string): Observable<ReviewRequestResult> {
    return this.http.post<ReviewRequestResult>(`${API}/batches/${batchId}/review-requests`, {
      comment,
    });
  }
}
