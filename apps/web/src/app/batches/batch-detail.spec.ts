import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Subject } from 'rxjs';
import { BatchDetail } from './batch-detail';
import { BatchEvents, type LiveProgress } from './batch-events';
import type { UserRef } from '../core/models';
import type { Batch, BatchProgress, SectionListItem } from './batch-types';
import { aBatch, progressOf } from '../testing/batch-fixtures';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';
import { CASE_STATIONS, caseFields } from '../testing/case-fixtures';

/** Of three sections unless said otherwise. */
function progress(done: number, failed = 0, total = 3): BatchProgress {
  return progressOf(done, total, failed);
}

const GINA: UserRef = { id: 9, name: 'Gina Gis' };

function batch(status: 'running' | 'done', p: BatchProgress, submitter = GINA): Batch {
  return aBatch({ id: 5, name: 'wcb-live', title: 'Live test', status, progress: p, submitter });
}

describe('BatchDetail', () => {
  let backend: HttpTestingController;
  let live: Subject<LiveProgress>;
  let followed: number[];

  beforeEach(() => {
    signInAs('engineer', { id: 2 });
    live = new Subject<LiveProgress>();
    followed = [];
    TestBed.configureTestingModule({
      providers: [
        ...apiTestProviders(),
        {
          provide: BatchEvents,
          useValue: {
            follow: (id: number) => {
              followed.push(id);
              return live.asObservable();
            },
          },
        },
      ],
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => sessionStorage.clear());

  /** Answers every request for the batch's sections and results (empty batch data). */
  function flushData(): void {
    for (const r of backend.match((req) => req.url === '/api/v1/batches/5/sections')) {
      r.flush({ page: 1, pageSize: 50, total: 0, items: [], caution: 'c' });
    }
    for (const r of backend.match('/api/v1/batches/5/results.geojson')) {
      r.flush({ type: 'FeatureCollection', name: 'wcb-live', caution: 'c', features: [] });
    }
    for (const r of backend.match('/api/v1/projects/1')) {
      r.flush({ id: 1, name: 'Wendlecombe', description: null, createdAt: '' });
    }
  }

  it('follows a running batch live, then reads it again once it is done', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('running', progress(0)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const text = (id: string) =>
      el.querySelector(`[data-testid=${id}]`)?.textContent?.replace(/\s+/g, ' ').trim();
    expect(followed).toEqual([5]);
    expect(text('batch-status')).toBe('running');
    expect(text('batch-progress')).toBe('0 done · 0 failed · 3 total');
    expect(el.querySelector('sl-caution')).not.toBeNull();

    live.next({ status: 'running', progress: progress(1, 1), finishedAt: null, via: 'events' });
    await fixture.whenStable();
    expect(text('batch-progress')).toBe('1 done · 1 failed · 3 total');

    live.next({
      status: 'done',
      progress: progress(2, 1),
      finishedAt: '2026-01-01T00:05:00Z',
      via: 'events',
    });
    live.complete();
    await fixture.whenStable();
    expect(text('batch-status')).toBe('done');
    expect(text('batch-progress')).toBe('2 done · 1 failed · 3 total');
    // the end of the stream reads the batch and its results once more
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(2, 1)));
    await fixture.whenStable();
    expect(backend.match((r) => r.url === '/api/v1/batches/5/sections').length).toBeGreaterThan(0);
    flushData();
    await fixture.whenStable();
    expect(text('batch-status')).toBe('done');
    expect(followed).toEqual([5]); // a finished batch is not followed again
    fixture.destroy();
  });

  it('says in words when the batch has stalled (no worker running), and stops saying it', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('running', progress(1)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const banner = () => el.querySelector('[data-testid=batch-stalled]');
    expect(banner()).toBeNull();

    live.next({
      status: 'running',
      progress: { ...progress(1), stalled: true },
      finishedAt: null,
      via: 'events',
    });
    await fixture.whenStable();
    expect(banner()?.getAttribute('role')).toBe('alert');
    expect(banner()?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      'hourglass_disabled Stalled: no worker is running, so 2 sections are waiting. They go on by themselves once a worker is back; administrators are told by e-mail.',
    );

    live.next({ status: 'running', progress: progress(2), finishedAt: null, via: 'events' });
    await fixture.whenStable();
    expect(banner()).toBeNull();
    fixture.destroy();
  });

  it('does not follow a batch that has finished', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    expect(followed).toEqual([]);
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=batch-progress]')?.textContent).toContain('3 total');
    expect(el.querySelector('[data-testid=download-csv]')).not.toBeNull();
    expect(el.querySelector('[data-testid=download-geojson]')).not.toBeNull();
    expect(el.querySelector('[data-testid=download-xlsx]')).not.toBeNull();
    fixture.destroy();
  });

  it('asks for the spreadsheet with slice sheets, and says why when the service refuses', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3)));
    await fixture.whenStable();
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const button = el.querySelector<HTMLButtonElement>('[data-testid=download-xlsx-slices]')!;
    expect(button.textContent).toContain('Spreadsheet with slice tables');
    button.click();
    await fixture.whenStable();
    expect(button.textContent).toContain('Preparing spreadsheet…');
    const detail = 'Slice sheets are given for batches of at most 100 sections; this one has 300.';
    const problem = { type: 'about:blank', title: 'Invalid input', status: 422, detail };
    backend
      .expectOne('/api/v1/batches/5/results.xlsx?slices=true')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 422,
        statusText: 'Unprocessable Entity',
      });
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
    expect(el.querySelector('[role=alert]')?.textContent).toContain(detail);
    expect(button.disabled).toBe(false);
    fixture.destroy();
  });

  it('lists the submitted files and fetches one with the name the service gives it', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3)));
    await fixture.whenStable();
    flushData();
    const sha = 'ab'.repeat(32);
    backend.expectOne('/api/v1/batches/5/inputs').flush([
      {
        id: 41,
        kind: 'batch-input',
        name: 'corridor.geojson',
        contentType: 'application/geo+json',
        size: 12345,
        sha256: sha,
        createdBy: 9,
        creator: GINA,
        createdAt: '2026-01-01T00:00:00Z',
      },
    ]);
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const items = el.querySelectorAll('[data-testid=batch-input]');
    expect(items.length).toBe(1);
    const line = items[0].textContent?.replace(/\s+/g, ' ') ?? '';
    expect(line).toContain('corridor.geojson');
    expect(line).toContain('12.3 kB');
    expect(line).toContain('Gina Gis');
    expect(items[0].querySelector('abbr')?.getAttribute('title')).toBe(`SHA-256 ${sha}`);

    const saved: string[] = [];
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push(this.download);
    });
    const button = items[0].querySelector<HTMLButtonElement>('button')!;
    button.click();
    await fixture.whenStable();
    expect(button.textContent).toContain('Fetching corridor.geojson…');
    backend.expectOne('/api/v1/batches/5/inputs/41').flush(new Blob(['{}']), {
      headers: {
        'Content-Disposition':
          'attachment; filename="wcb-live-batch-5-input-2026-01-01-corridor.geojson"',
      },
    });
    await fixture.whenStable();
    expect(saved).toEqual(['wcb-live-batch-5-input-2026-01-01-corridor.geojson']);
    expect(button.disabled).toBe(false);
    click.mockRestore();

    // Storage away: the service's words, and the button back.
    button.click();
    await fixture.whenStable();
    const problem = {
      type: 'about:blank',
      title: 'Service unavailable',
      status: 503,
      detail: 'File storage cannot be reached just now; try again in a little while.',
    };
    backend
      .expectOne('/api/v1/batches/5/inputs/41')
      .flush(new Blob([JSON.stringify(problem)], { type: 'application/problem+json' }), {
        status: 503,
        statusText: 'Service Unavailable',
      });
    await new Promise((r) => setTimeout(r, 0));
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=batch-inputs] [role=alert]')?.textContent).toContain(
      'File storage cannot be reached',
    );
    expect(button.disabled).toBe(false);
    fixture.destroy();
  });

  it('names who submitted the batch, with "(you)" for the signed-in user', async () => {
    const submitterOf = async (by: UserRef) => {
      const fixture = TestBed.createComponent(BatchDetail);
      fixture.componentRef.setInput('id', '5');
      await fixture.whenStable();
      backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3), by));
      await fixture.whenStable();
      flushData();
      await fixture.whenStable();
      const el = fixture.nativeElement as HTMLElement;
      const text = el.querySelector('[data-testid=batch-submitter]')?.textContent?.trim();
      fixture.destroy();
      return text;
    };
    expect(await submitterOf(GINA)).toBe('Gina Gis');
    expect(await submitterOf({ id: 2, name: 'Evan Engineer' })).toBe('Evan Engineer (you)');
  });

  it('draws the chart and the plan in the units the sections give', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(2, 0, 2)));
    await fixture.whenStable();
    // Stations in ft: 150+00 and 152+00 (no label, so nothing to read the units from but the field).
    const items: SectionListItem[] = [15000, 15200].map((station, i) => ({
      id: i + 1,
      key: `wfs@${station}`,
      station,
      stationLabel: null,
      title: `Freight spur, station ${station}`,
      units: 'us',
      status: 'done',
      run: 1,
      failReason: null,
      reviewState: 'pending',
      geometry: null,
      result: {
        verdict: 'meets',
        governingMethod: 'bishop',
        governingFs: 1.6 + i / 10,
        requiredFs: 1.5,
        warnings: [],
      },
    }));
    for (const r of backend.match((req) => req.url === '/api/v1/batches/5/sections')) {
      r.flush({ page: 1, pageSize: 500, total: 2, items, caution: 'c' });
    }
    backend.expectOne('/api/v1/batches/5/results.geojson').flush({
      type: 'FeatureCollection',
      name: 'wfs',
      caution: 'c',
      features: items.map((s, i) => ({
        type: 'Feature',
        id: s.key,
        geometry: {
          type: 'LineString',
          coordinates: [
            [1000, 200 * i],
            [1100, 200 * i],
          ],
        },
        properties: {
          station: s.station,
          chainage: null,
          section_id: s.key,
          case: null,
          governing_method: 'bishop',
          fs: s.result?.governingFs ?? null,
          required_fs: 1.5,
          verdict: 'meets',
          warnings: 0,
          note: null,
          caution: 'c',
          review_state: 'pending',
          job_state: 'done',
        },
      })),
    });
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const chart = el.querySelector('[data-testid=chainage-chart]')?.textContent ?? '';
    expect(chart).toContain('Chainage (ft)');
    expect(chart).toContain('150+00');
    const bar = el.querySelector('.scale-bar text[text-anchor=middle]')?.textContent?.trim();
    expect(bar).toMatch(/^\d+(\.\d+)? ft$/);
    // one case: the page as it always was, no chart per case, no counts by case
    expect(el.querySelectorAll('[data-testid=chainage-chart]')).toHaveLength(1);
    expect(el.querySelector('[data-testid=case-chart]')).toBeNull();
    expect(el.querySelector('[data-testid=case-counts]')).toBeNull();
    expect(el.querySelector('#chart-title')?.textContent?.trim()).toBe('FS along the chainage');
    // no station carries a probability: no chart of it
    expect(el.querySelector('[data-testid=pf-chart]')).toBeNull();
    fixture.destroy();
  });

  it('draws P(FS < 1) along the chainage when the stations carry a probability', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend.expectOne('/api/v1/batches/5').flush(batch('done', progress(3, 0, 3)));
    await fixture.whenStable();
    const items: SectionListItem[] = [500, 520, 540].map((station, i) => ({
      id: i + 1,
      key: `wcb@${station}`,
      station,
      stationLabel: `0+${station}`,
      title: `Wendle flood bank ${station}`,
      units: 'si',
      status: 'done',
      run: 1,
      failReason: null,
      reviewState: 'pending',
      geometry: null,
      result: {
        verdict: 'meets',
        governingMethod: 'spencer',
        governingFs: 1.6,
        requiredFs: 1.5,
        warnings: [],
      },
      // the middle station's file has no probability block
      probability:
        i === 1
          ? null
          : [
              {
                case: 'long term',
                realisations: 10000,
                valid: 10000,
                meanFs: 1.6,
                sdFs: 0.2,
                pFailure: { p: 0.002 * (i + 1), standardError: 0.0004 },
                pBelowRequired: { p: 0.3, standardError: 0.0046 },
                betaNormal: 3,
                betaLognormal: 3.3,
              },
            ],
    }));
    for (const r of backend.match((req) => req.url === '/api/v1/batches/5/sections')) {
      r.flush({ page: 1, pageSize: 500, total: 3, items, caution: 'c' });
    }
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=pf-title]')?.textContent?.trim()).toBe(
      'Probability of failure along the chainage',
    );
    const points = Array.from(el.querySelectorAll('[data-testid=pf-point]'));
    expect(points.map((p) => p.getAttribute('data-station'))).toEqual(['500', '540']);
    fixture.destroy();
  });

  it('shows a batch of several design cases by case: counts, a chart per case, the governing case', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/batches/5')
      .flush({ ...batch('done', progress(4, 0, 4)), ...caseFields() });
    await fixture.whenStable();
    for (const r of backend.match((req) => req.url === '/api/v1/batches/5/sections')) {
      r.flush({ page: 1, pageSize: 500, total: 4, items: CASE_STATIONS, caution: 'c' });
    }
    flushData();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('#chart-title')?.textContent?.trim()).toBe(
      'FS along the chainage, by design case',
    );
    expect(el.querySelectorAll('[data-testid=case-chart]')).toHaveLength(3);
    const counts = Array.from(el.querySelectorAll('[data-testid=case-counts] tr')).map((r) =>
      Array.from(r.children).map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    const each = 'check_circle2 meets · cancel1 below · horizontal_rule1 no slope';
    expect(counts).toEqual([
      ['end of construction', each],
      ['long term', each],
      ['earthquake', each],
    ]);
    const governing = Array.from(el.querySelectorAll('[data-testid=governing-case]')).map((c) =>
      c.textContent?.trim(),
    );
    expect(governing).toEqual(['earthquake', 'end of construction', 'long term', '—']);
    fixture.destroy();
  });

  it('shows the problem when the batch cannot be read', async () => {
    const fixture = TestBed.createComponent(BatchDetail);
    fixture.componentRef.setInput('id', '5');
    await fixture.whenStable();
    backend
      .expectOne('/api/v1/batches/5')
      .flush(
        { title: 'Not found', status: 404, detail: 'No such batch.' },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
    expect(
      (fixture.nativeElement as HTMLElement).querySelector('[role=alert]')?.textContent,
    ).toContain('No such batch.');
    fixture.destroy();
  });
});
