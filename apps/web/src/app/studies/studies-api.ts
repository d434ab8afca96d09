import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { Study, StudyRequest } from './study-types';

const API = '/api/v1';

/** A section's studies over HttpClient: ask for one, list them, follow one, its drawing. */
@Injectable({ providedIn: 'root' })
export class StudiesApi {
  private readonly http = inject(HttpClient);

  /** The section's studies, newest first. */
  list(sectionId: number): Observable<Study[]> {
    return this.http.get<Study[]>(`${API}/sections/${sectionId}/studies`);
  }

  /** Asks for a study of the section's current run (202: queued). */
  ask(sectionId: number, request: StudyRequest): Observable<Study> {
    return this.http.post<Study>(`${API}/sections/${sectionId}/studies`, request);
  }

  /** One study: its state and progress (read again while it is queued or running). */
  study(id: number): Observable<Study> {
    return this.http.get<Study>(`${API}/studies/${id}`);
  }
}
