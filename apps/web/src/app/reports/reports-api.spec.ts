import { HttpErrorResponse } from '@angular/common/http';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { firstValueFrom } from 'rxjs';
import type { Download } from '../shared/download';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { ReportsApi } from './reports-api';

describe('ReportsApi', () => {
  let api: ReportsApi;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    api = TestBed.inject(ReportsApi);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => verifyAndReset(backend));

  it("fetches a section's report.pdf as a blob under the server's file name", async () => {
    const got = firstValueFrom(api.sectionPdf(7));
    const req = backend.expectOne('/api/v1/sections/7/report.pdf');
    expect(req.request.method).toBe('GET');
    expect(req.request.responseType).toBe('blob');
    req.flush(new Blob(['%PDF-1.7'], { type: 'application/pdf' }), {
      headers: {
        'Content-Disposition': 'attachment; filename="wcb-main-1+000-run2-report-2026-12-02.pdf"',
      },
    });
    const d: Download = await got;
    expect(d.fileName).toBe('wcb-main-1+000-run2-report-2026-12-02.pdf');
    expect(d.blob.size).toBe(8);
  });

  it('names a file itself when the header is missing', async () => {
    const got = firstValueFrom(api.file(31));
    backend.expectOne('/api/v1/reports/31/file').flush(new Blob(['%PDF']));
    expect((await got).fileName).toBe('report-31.pdf');
  });

  it("reads a refused file's problem+json out of the Blob", async () => {
    const got = firstValueFrom(api.file(31)).catch((e: unknown) => e);
    const problem = { title: 'Not found', status: 404, detail: 'Report 31 failed.' };
    backend
      .expectOne('/api/v1/reports/31/file')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 404,
        statusText: 'Not Found',
      });
    const err = await got;
    expect(err).toBeInstanceOf(HttpErrorResponse);
    expect((err as HttpErrorResponse).error).toEqual(problem);
  });

  it('posts the appendix, and reads a batch list and a report', () => {
    api.ask(5, 'none').subscribe();
    const post = backend.expectOne('/api/v1/batches/5/reports');
    expect(post.request.method).toBe('POST');
    expect(post.request.body).toEqual({ appendix: 'none' });
    post.flush({});
    api.batchReports(5).subscribe();
    expect(backend.expectOne('/api/v1/batches/5/reports').request.method).toBe('GET');
    api.report(31).subscribe();
    expect(backend.expectOne('/api/v1/reports/31').request.method).toBe('GET');
  });
});
