import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { provideRouter } from '@angular/router';
import type { Role, Session } from '../core/models';
import { POLL_MS, SectionDetail } from './section-detail';
import type { RunResult, SectionInput, SectionView } from './section-types';

const INPUT: SectionInput = {
  format: 'scarpline/1',
  id: 'wcb-main@1000',
  title: 'Station 1000',
  station: 1000,
  offset: 0,
  units: 'si',
  ground: [
    [0, 41],
    [50, 42],
  ],
  materials: {
    clay: {
      name: 'clay',
      unitWeight: 19,
      saturatedUnitWeight: 20,
      strength: { model: 'mohr-coulomb', cohesion: 5, frictionAngle: 26 },
    },
  },
  strata: [{ material: 'clay', top: [] }],
  water: { kind: 'none', unitWeight: 9.81 },
  loads: [],
  seismic: { kh: 0, kv: 0 },
  crack: null,
  analysis: {
    methods: ['bishop'],
    slices: 30,
    surface: { type: 'auto' },
    infiniteSlope: null,
    case: 'long-term',
    requiredFs: 1.5,
  },
};

function result(run: number, fs: number): RunResult {
  return {
    run,
    status: fs >= 1.5 ? 'pass' : 'fail',
    governing: { method: 'bishop', fs },
    requiredFs: 1.5,
    passes: fs >= 1.5,
    reason: null,
    criticalSurface: { type: 'circle', center: [8, 45], radius: 6 },
    methods: [
      {
        method: 'bishop',
        fs,
        converged: true,
        iterations: 8,
        surface: { type: 'circle', center: [8, 45], radius: 6 },
        slices: [],
        warnings: [],
      },
    ],
    warnings: [],
    solverVersion: '0.1.0',
    inputHash: 'h',
    timings: {
      startedAt: '2026-12-02T00:00:00.000Z',
      finishedAt: `2026-12-02T00:0${run}:00.000Z`,
      durationMs: 4,
    },
    attempt: 1,
    caution: 'c',
  };
}

function view(run: number, status: SectionView['status'], fs: number | null): SectionView {
  return {
    id: 7,
    batchId: 3,
    key: 'wcb-main@1000',
    station: 1000,
    stationLabel: '1+000',
    status,
    run,
    failReason: null,
    submittedBy: 2,
    input: INPUT,
    result: fs === null ? null : result(run, fs),
    previous: [],
    review: { state: 'pending', latest: null, history: [] },
    caution: 'c',
  };
}

describe('SectionDetail', () => {
  let fixture: ComponentFixture<SectionDetail>;
  let backend: HttpTestingController;

  async function open(role: Role): Promise<void> {
    const s: Session = {
      token: 't',
      expiresAt: new Date(Date.now() + 3600_000).toISOString(),
      user: { id: 5, email: 'u@x.example', name: 'U', role },
    };
    sessionStorage.setItem('scarpline.session', JSON.stringify(s));
    TestBed.configureTestingModule({
      providers: [
        provideZonelessChangeDetection(),
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
      ],
    });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionDetail);
    fixture.componentRef.setInput('id', '7');
    await fixture.whenStable();
  }

  afterEach(() => {
    vi.useRealTimers();
    sessionStorage.clear();
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const q = (id: string) => el().querySelector(`[data-testid="${id}"]`) as HTMLElement | null;

  async function flushSide(): Promise<void> {
    await fixture.whenStable();
    for (const r of backend.match('/api/v1/batches/3')) {
      r.flush({ id: 3, name: 'wcb-main', title: null, submittedBy: 2, review: null });
    }
    for (const r of backend.match('/api/v1/sections/7/runs')) {
      r.flush({ sectionId: 7, key: 'wcb-main@1000', run: 1, runs: [], caution: 'c' });
    }
    await fixture.whenStable();
  }

  it('shows the header with FS against the required FS in words, and the caution', async () => {
    await open('viewer');
    expect(el().querySelector('[role="status"]')?.textContent).toContain('Loading the section');
    backend.expectOne('/api/v1/sections/7').flush(view(1, 'done', 1.234));
    await flushSide();
    expect(el().querySelector('h1')?.textContent).toContain('Station 1+000');
    expect(q('section-fs')?.textContent).toContain('1.234');
    expect(q('section-fs')?.textContent).toContain('1.5');
    expect(q('section-verdict')?.textContent?.trim()).toContain('fail');
    expect(el().querySelector('sl-caution')?.textContent).toContain('Caution.');
    expect(q('batch-back-link')?.getAttribute('href')).toBe('/batches/3');
    expect(q('batch-back-link')?.textContent).toContain('wcb-main');
    expect(q('method-table')).not.toBeNull();
    // a viewer cannot run it again
    expect(q('rerun-form')).toBeNull();
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('offers the re-run to an engineer', async () => {
    await open('engineer');
    backend.expectOne('/api/v1/sections/7').flush(view(1, 'done', 2.1));
    await flushSide();
    expect(q('rerun-form')).not.toBeNull();
    expect(q('section-verdict')?.textContent).toContain('pass');
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('follows a queued run until it is done, then shows its result', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    await open('engineer');
    backend.expectOne('/api/v1/sections/7').flush(view(2, 'queued', null));
    await flushSide();
    expect(q('run-following')?.textContent).toContain('Run 2 is queued');
    expect(q('method-table')).toBeNull();
    backend.expectNone('/api/v1/sections/7/plot.svg');

    vi.advanceTimersByTime(POLL_MS);
    backend.expectOne('/api/v1/sections/7').flush(view(2, 'running', null));
    await flushSide();
    expect(q('run-following')?.textContent).toContain('Run 2 is running');

    vi.advanceTimersByTime(POLL_MS);
    backend.expectOne('/api/v1/sections/7').flush(view(2, 'done', 1.71));
    await flushSide();
    expect(q('run-following')).toBeNull();
    expect(q('section-fs')?.textContent).toContain('1.710');
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');

    // done: no more polling
    vi.advanceTimersByTime(POLL_MS * 3);
    backend.expectNone('/api/v1/sections/7');
    backend.verify();
  });

  it('shows the problem of a missing section', async () => {
    await open('viewer');
    backend
      .expectOne('/api/v1/sections/7')
      .flush(
        { title: 'Not found', status: 404, detail: 'No such section.' },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();
    expect(el().querySelector('[role="alert"]')?.textContent).toContain('No such section.');
    backend.verify();
  });
});
