import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { forkJoin, map, of, switchMap, type Observable } from 'rxjs';
import type { Project } from '../core/models';
import type { Batch } from '../batches/batch-types';
import type { ReviewBody, ReviewRecorded } from './review-types';

const BASE = '/api/v1';

/** A batch with the project it belongs to, for the review queue. */
export interface QueuedBatch {
  project: Project;
  batch: Batch;
}

/** Reviews: record a decision on a section or a batch; the batches that wait for one. */
@Injectable({ providedIn: 'root' })
export class ReviewsApi {
  private readonly http = inject(HttpClient);

  review(kind: 'batch' | 'section', id: number, body: ReviewBody): Observable<ReviewRecorded> {
    const path = kind === 'batch' ? 'batches' : 'sections';
    return this.http.post<ReviewRecorded>(`${BASE}/${path}/${id}/reviews`, body);
  }

  /** Every batch of every project the user may see, newest first within each project. */
  allBatches(): Observable<QueuedBatch[]> {
    return this.http.get<Project[]>(`${BASE}/projects`).pipe(
      switchMap((projects) =>
        projects.length === 0
          ? of([] as QueuedBatch[][])
          : forkJoin(
              projects.map((project) =>
                this.http
                  .get<Batch[]>(`${BASE}/projects/${project.id}/batches`)
                  .pipe(map((batches) => batches.map((batch) => ({ project, batch })))),
              ),
            ),
      ),
      map((lists) => lists.flat()),
    );
  }

  /** The finished batches whose review is still pending. */
  pending(): Observable<QueuedBatch[]> {
    return this.allBatches().pipe(
      map((all) =>
        all.filter(({ batch }) => batch.status === 'done' && batch.review.state === 'pending'),
      ),
    );
  }
}
