import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import type { Project } from '../core/models';
import type { Batch } from '../batches/batch-types';

const API = '/api/v1';

export interface NewProject {
  name: string;
  description?: string;
}

/** Projects and their batches, over HttpClient. */
@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);

  /** The projects the signed-in user can see. */
  list(): Observable<Project[]> {
    return this.http.get<Project[]>(`${API}/projects`);
  }

  get(id: number): Observable<Project> {
    return this.http.get<Project>(`${API}/projects/${id}`);
  }

  create(p: NewProject): Observable<Project> {
    return this.http.post<Project>(`${API}/projects`, p);
  }

  /** The batches of a project, newest first. */
  batches(projectId: number): Observable<Batch[]> {
    return this.http.get<Batch[]>(`${API}/projects/${projectId}/batches`);
  }
}
