import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { Download, SectionListItem, SectionPage } from './batch-types';
import { BatchesApi, fileNameOf } from './batches-api';

function page(n: number, size: number, total: number): SectionPage {
  const first = (n - 1) * size;
  const count = Math.max(0, Math.min(size, total - first));
  return {
    page: n,
    pageSize: size,
    total,
    caution: 'Results need review.',
    items: Array.from({ length: count }, (_, i) => ({ id: first + i + 1 }) as SectionListItem),
  };
}

describe('BatchesApi', () => {
  let api: BatchesApi;
  let backend: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    api = TestBed.inject(BatchesApi);
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => backend.verify());

  it('reads a batch', () => {
    api.batch(12).subscribe();
    const req = backend.expectOne('/api/v1/batches/12');
    expect(req.request.method).toBe('GET');
    req.flush({});
  });

  it('sends the sort, order, page, size and filters of the sections query', () => {
    api
      .sections(12, {
        sort: 'fs',
        order: 'desc',
        page: 3,
        pageSize: 25,
        status: 'done',
        verdict: 'below',
      })
      .subscribe();
    const req = backend.expectOne((r) => r.url === '/api/v1/batches/12/sections');
    const p = req.request.params;
    expect(p.get('sort')).toBe('fs');
    expect(p.get('order')).toBe('desc');
    expect(p.get('page')).toBe('3');
    expect(p.get('pageSize')).toBe('25');
    expect(p.get('status')).toBe('done');
    expect(p.get('verdict')).toBe('below');
    expect(req.request.urlWithParams).toBe(
      '/api/v1/batches/12/sections?sort=fs&order=desc&page=3&pageSize=25&status=done&verdict=below',
    );
    req.flush(page(3, 25, 61));
  });

  it('asks for the verdict of one design case (case with verdict), sorted by FS over required FS', () => {
    api.sections(12, { sort: 'ratio', verdict: 'below', case: 'end of construction' }).subscribe();
    let req = backend.expectOne((r) => r.url === '/api/v1/batches/12/sections');
    expect(req.request.urlWithParams).toBe(
      '/api/v1/batches/12/sections?sort=ratio&verdict=below&case=end%20of%20construction',
    );
    req.flush(page(1, 50, 0));
    // a case without a verdict filters nothing: it is not sent
    api.sections(12, { case: 'long term' }).subscribe();
    req = backend.expectOne((r) => r.url === '/api/v1/batches/12/sections');
    expect(req.request.params.keys()).toEqual([]);
    req.flush(page(1, 50, 0));
  });

  it('leaves out what the query does not set', () => {
    api.sections(12).subscribe();
    const req = backend.expectOne('/api/v1/batches/12/sections');
    expect(req.request.params.keys()).toEqual([]);
    req.flush(page(1, 50, 0));
  });

  it('reads every section, 500 a page, until the total is reached', () => {
    let all: SectionListItem[] = [];
    api.allSections(5).subscribe((items) => (all = items));
    for (const n of [1, 2, 3]) {
      const req = backend.expectOne((r) => r.url === '/api/v1/batches/5/sections');
      expect(req.request.params.get('page')).toBe(String(n));
      expect(req.request.params.get('pageSize')).toBe('500');
      expect(req.request.params.get('sort')).toBe('station');
      expect(req.request.params.get('order')).toBe('asc');
      req.flush(page(n, 500, 1203));
    }
    backend.expectNone((r) => r.url === '/api/v1/batches/5/sections');
    expect(all).toHaveLength(1203);
    expect(all.at(-1)?.id).toBe(1203);
  });

  it('asks once when one page holds every section', () => {
    let all: SectionListItem[] = [];
    api.allSections(5).subscribe((items) => (all = items));
    backend.expectOne((r) => r.url === '/api/v1/batches/5/sections').flush(page(1, 500, 61));
    expect(all).toHaveLength(61);
  });

  it('reads the results GeoJSON', () => {
    api.resultsGeoJson(9).subscribe();
    backend
      .expectOne('/api/v1/batches/9/results.geojson')
      .flush({ type: 'FeatureCollection', features: [] });
  });

  it('downloads an export as a blob named by Content-Disposition', () => {
    let got: Download | null = null;
    api.download(9, 'csv').subscribe((d) => (got = d));
    const req = backend.expectOne('/api/v1/batches/9/results.csv');
    expect(req.request.responseType).toBe('blob');
    req.flush(new Blob(['station,id\r\n'], { type: 'text/csv' }), {
      headers: { 'Content-Disposition': 'attachment; filename="wcb-main-results.csv"' },
    });
    expect(got).not.toBeNull();
    expect((got as unknown as Download).fileName).toBe('wcb-main-results.csv');
    expect((got as unknown as Download).blob.size).toBe(12);
  });

  it('names a download itself when the header is missing', () => {
    let name = '';
    api.download(9, 'geojson').subscribe((d) => (name = d.fileName));
    backend.expectOne('/api/v1/batches/9/results.geojson').flush(new Blob(['{}']));
    expect(name).toBe('batch-9-results.geojson');
  });

  it('downloads the spreadsheet, with its slice sheets when asked', () => {
    const names: string[] = [];
    api.download(9, 'xlsx').subscribe((d) => names.push(d.fileName));
    api.download(9, 'xlsx', { slices: true }).subscribe((d) => names.push(d.fileName));
    const plain = backend.expectOne('/api/v1/batches/9/results.xlsx');
    expect(plain.request.params.has('slices')).toBe(false);
    plain.flush(new Blob(['PK']), {
      headers: { 'Content-Disposition': 'attachment; filename="wcb-main-results-2026-12-02.xlsx"' },
    });
    const withSlices = backend.expectOne('/api/v1/batches/9/results.xlsx?slices=true');
    expect(withSlices.request.responseType).toBe('blob');
    withSlices.flush(new Blob(['PK']));
    expect(names).toEqual(['wcb-main-results-2026-12-02.xlsx', 'batch-9-results.xlsx']);
  });

  it('reads file names from Content-Disposition', () => {
    expect(fileNameOf('attachment; filename="a b.csv"')).toBe('a b.csv');
    expect(fileNameOf('attachment; filename=plain.geojson')).toBe('plain.geojson');
    expect(fileNameOf("attachment; filename*=UTF-8''caf%C3%A9.csv")).toBe('café.csv');
    expect(fileNameOf('inline')).toBeNull();
    expect(fileNameOf(null)).toBeNull();
  });

  it('posts files as multipart in the field "files"', async () => {
    const a = new File(['id: a\n'], 'a.yaml');
    const b = new File(['{"type":"FeatureCollection"}'], 'line.geojson');
    api.upload(4, [a, b]).subscribe();
    const req = backend.expectOne('/api/v1/projects/4/uploads');
    expect(req.request.method).toBe('POST');
    const body = req.request.body as FormData;
    expect(body).toBeInstanceOf(FormData);
    const files = body.getAll('files') as File[];
    expect(files.map((f) => f.name)).toEqual(['a.yaml', 'line.geojson']);
    expect(await files[0].text()).toBe('id: a\n');
    req.flush({});
  });

  it('posts a JSON batch as the text given, so line numbers match', () => {
    const text = '{\n  "format": "scarpline-batch/1",\n  "id": "x"\n}';
    api.submitJson(4, text).subscribe();
    const req = backend.expectOne('/api/v1/projects/4/batches');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toBe(text);
    expect(req.request.headers.get('Content-Type')).toBe('application/json');
    req.flush({});
  });

  it('asks for a review with a comment', () => {
    api.requestReview(8, 'Please check 1+240').subscribe();
    const req = backend.expectOne('/api/v1/batches/8/review-requests');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ comment: 'Please check 1+240' });
    req.flush({});
  });
});
