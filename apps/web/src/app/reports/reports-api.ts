import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import type { Observable } from 'rxjs';
import { asDownload, type Download } from '../shared/download';
import type { Appendix, Report, ReportList } from './report-types';

const API = '/api/v1';

/** PDF reports over HttpClient: a batch's corridor reports, made by a worker, and a section's. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  /** The batch's corridor reports, newest first. */
  batchReports(batchId: number): Observable<ReportList> {
    return this.http.get<ReportList>(`${API}/batches/${batchId}/reports`);
  }

  /** Asks for a corridor report of a finished batch with the chosen section pages (202: queued). */
  ask(batchId: number, appendix: Appendix): Observable<Report> {
    return this.http.post<Report>(`${API}/batches/${batchId}/reports`, { appendix });
  }

  /** One report: its state and progress (read again while it is queued or running). */
  report(id: number): Observable<Report> {
    return this.http.get<Report>(`${API}/reports/${id}`);
  }

  /** A made report's PDF, under the file name the server gives it. */
  file(id: number): Observable<Download> {
    return this.http
      .get(`${API}/reports/${id}/file`, { responseType: 'blob', observe: 'response' })
      .pipe(asDownload(`report-${id}.pdf`));
  }

  /** The section's report for its current run, under the file name the server gives it. */
  sectionPdf(sectionId: number): Observable<Download> {
    return this.http
      .get(`${API}/sections/${sectionId}/report.pdf`, { responseType: 'blob', observe: 'response' })
      .pipe(asDownload(`section-${sectionId}-report.pdf`));
  }
}
