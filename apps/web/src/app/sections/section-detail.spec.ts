import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { Role } from '../core/models';
import { POLL_MS, SectionDetail } from './section-detail';
import type { InputWarning, RunResult, SectionInput, SectionView } from './section-types';
import { WARNING_EXPLANATIONS } from './warning-codes';
import { apiTestProviders } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';
import { caseResult } from '../testing/section-case-fixtures';

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
  reinforcement: [],
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
    verdict: fs >= 1.5 ? 'meets' : 'below',
    governing: { method: 'bishop', fs },
    requiredFs: 1.5,
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

const HEAVY: InputWarning = {
  severity: 'warning',
  file: 'batch.json',
  line: 14,
  column: 21,
  path: 'sections[1].materials.clay.unitWeight',
  code: 'unit-weight-unusual',
  message: '45 kN/m³ is unusual for soil (12 to 25)',
  text: 'batch.json:14:21 warning: sections[1].materials.clay.unitWeight: 45 kN/m³ is unusual for soil (12 to 25)',
};

function view(
  run: number,
  status: SectionView['status'],
  fs: number | null,
  more: Partial<SectionView> = {},
): SectionView {
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
    submitter: { id: 2, name: 'Evan Engineer' },
    input: INPUT,
    inputWarnings: [],
    result: fs === null ? null : result(run, fs),
    previous: [],
    review: { state: 'pending', latest: null, history: [] },
    caution: 'c',
    ...more,
  };
}

describe('SectionDetail', () => {
  let fixture: ComponentFixture<SectionDetail>;
  let backend: HttpTestingController;

  async function open(role: Role): Promise<void> {
    signInAs(role, { id: 5 });
    TestBed.configureTestingModule({ providers: apiTestProviders() });
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
  const q = (id: string) => el().querySelector<HTMLElement>(`[data-testid="${id}"]`);

  async function flushSide(): Promise<void> {
    await fixture.whenStable();
    for (const r of backend.match('/api/v1/batches/3')) {
      r.flush({ id: 3, name: 'wcb-main', title: null, submittedBy: 2, review: null });
    }
    for (const r of backend.match('/api/v1/sections/7/runs')) {
      r.flush({ sectionId: 7, key: 'wcb-main@1000', run: 1, runs: [], caution: 'c' });
    }
    for (const r of backend.match('/api/v1/sections/7/studies')) r.flush([]);
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
    expect(q('section-verdict')?.textContent?.trim()).toContain('below the required FS');
    expect(el().querySelector('sl-caution')?.textContent).toContain('Caution.');
    // the studies of the section: read for every role, the form only for those who may ask
    expect(q('section-studies')?.textContent).toContain('No study has been made');
    expect(q('study-form')).toBeNull();
    expect(q('batch-back-link')?.getAttribute('href')).toBe('/batches/3');
    expect(q('batch-back-link')?.textContent).toContain('wcb-main');
    expect(q('method-table')).not.toBeNull();
    // a viewer cannot run it again
    expect(q('rerun-form')).toBeNull();
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it("says how the search found the critical circle, in the core's words", async () => {
    await open('viewer');
    const v = view(1, 'done', 1.595);
    v.result!.search = {
      type: 'auto',
      method: 'bishop',
      trials: 2469,
      moves: [],
      grid: null,
      map: null,
      trialBand: { within: 0.05, count: 0, surfaces: [] },
      howFound: {
        candidates: { grid: 1400, groundRanges: 512, polish: 557 },
        boundaries: ['seam', 'stiff-clay-below'],
        polishes: [],
        critical: { stage: 'polish', touching: 'stiff-clay-below' },
        confirmation: { method: 'bishop', searched: 1.5951, exact: 1.5951 },
      },
    };
    backend.expectOne('/api/v1/sections/7').flush(v);
    await flushSide();
    const lines = [...(q('how-found')?.querySelectorAll('li') ?? [])].map((li) =>
      li.textContent?.trim(),
    );
    expect(lines).toEqual([
      'search: 2,469 trial circles: grid 1,400 (with the circles touching the top of seam, stiff-clay-below), ground ranges 512, polishes 557',
      'critical circle: from a polish of a circle touching the top of stiff-clay-below',
      'confirmed: bishop FS 1.595 as searched, 1.595 cut afresh and solved in full',
    ]);
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('offers the re-run to an engineer', async () => {
    await open('engineer');
    backend.expectOne('/api/v1/sections/7').flush(view(1, 'done', 2.1));
    await flushSide();
    expect(q('rerun-form')).not.toBeNull();
    expect(q('section-verdict')?.textContent).toContain('meets the required FS');
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
    // (the studies card reads its own list again every LIST_MS while the page is in view)
    expect(backend.match('/api/v1/sections/7/studies').length).toBeLessThanOrEqual(1);
    backend.verify();
  });

  it('names who submitted the batch and who started each run, "(you)" for oneself', async () => {
    await open('engineer'); // user 5
    backend.expectOne('/api/v1/sections/7').flush(view(2, 'done', 1.7));
    await fixture.whenStable();
    backend.expectOne('/api/v1/sections/7/runs').flush({
      sectionId: 7,
      key: 'wcb-main@1000',
      run: 2,
      runs: [
        {
          run: 2,
          current: true,
          changes: { materials: { clay: { strength: { frictionAngle: 28 } } } },
          editedBy: 5,
          editor: { id: 5, name: 'Una User' },
          input: INPUT,
          result: result(2, 1.7),
        },
        {
          run: 1,
          current: false,
          changes: null,
          editedBy: null,
          editor: null,
          input: INPUT,
          result: result(1, 1.2),
        },
      ],
      caution: 'c',
    });
    await flushSide();
    expect(q('section-submitter')?.textContent?.trim()).toBe('Evan Engineer');
    const byOf = (run: number) =>
      el()
        .querySelector(`[data-testid="run-history"] tr[data-run="${run}"] td:nth-of-type(2)`)
        ?.textContent?.trim();
    expect(byOf(2)).toBe('Una User (you)');
    expect(byOf(1)).toBe('submitted with the batch');
    expect(el().textContent).not.toContain('user #');
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('says "(you)" after the name when the signed-in user submitted the batch', async () => {
    await open('engineer'); // user 5
    backend
      .expectOne('/api/v1/sections/7')
      .flush(view(1, 'done', 1.7, { submittedBy: 5, submitter: { id: 5, name: 'Una User' } }));
    await flushSide();
    expect(q('section-submitter')?.textContent?.trim()).toBe('Una User (you)');
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('lists the warnings of the input, explained and located in the file', async () => {
    await open('viewer');
    backend.expectOne('/api/v1/sections/7').flush(view(1, 'done', 1.7, { inputWarnings: [HEAVY] }));
    await flushSide();
    const item = el().querySelector('[data-testid="warning-list"] li.warning') as HTMLElement;
    expect(item.dataset['code']).toBe('unit-weight-unusual');
    expect(item.textContent).toContain(WARNING_EXPLANATIONS['unit-weight-unusual'].title);
    expect(item.textContent).toContain(WARNING_EXPLANATIONS['unit-weight-unusual'].check);
    expect(item.textContent).toContain(HEAVY.message);
    const where = item.querySelector('[data-testid="warning-location"]')?.textContent ?? '';
    expect(where.replace(/\s+/g, ' ')).toContain(
      'batch.json:14:21 at sections[1].materials.clay.unitWeight',
    );
    backend.expectOne('/api/v1/sections/7/plot.svg').flush('<svg></svg>');
    backend.verify();
  });

  it('shows the warnings of the input while the run has no result yet', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    await open('viewer');
    backend
      .expectOne('/api/v1/sections/7')
      .flush(view(1, 'queued', null, { inputWarnings: [HEAVY] }));
    await flushSide();
    expect(q('run-following')).not.toBeNull();
    expect(q('warning-list')?.textContent).toContain('batch.json:14:21');
    fixture.destroy();
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

  it('shows a station of one case as it always was: no cases, no case in the drawing’s request', async () => {
    await open('viewer');
    const v = view(1, 'done', 1.7);
    // the API of design cases lists the one case too
    const r = v.result!;
    r.governingCase = 'long-term';
    r.cases = [
      {
        name: 'long-term',
        kind: 'long-term',
        requiredFs: 1.5,
        governs: ['bishop'],
        governing: r.governing,
        ratio: 1.7 / 1.5,
        verdict: 'meets',
        warnings: [],
        methods: r.methods,
        criticalSurface: r.criticalSurface,
        search: null,
      },
    ];
    backend.expectOne('/api/v1/sections/7').flush(v);
    await flushSide();
    expect(q('case-table')).toBeNull();
    expect(q('section-governing-case')).toBeNull();
    expect(q('drawing-case')).toBeNull();
    expect(el().querySelector('#drawing-title')?.textContent?.trim()).toBe('Cross-section');
    const plot = backend.expectOne((req) => req.url === '/api/v1/sections/7/plot.svg');
    expect(plot.request.params.has('case')).toBe(false);
    plot.flush('<svg></svg>');
    backend.verify();
  });

  it('shows the cases side by side, the governing marked, and the drawing, methods and slices of the case picked', async () => {
    await open('viewer');
    const earthquake = {
      ...INPUT,
      name: 'earthquake',
      kind: 'seismic' as const,
      requiredFs: 1.1,
      governs: null,
      seismic: { kh: 0.1, kv: 0 },
      drawdown: null,
      earthquake: { pga: 0.25, magnitude: 6.5, allowableDisplacement: 0.15 },
    };
    const input: SectionInput = { ...INPUT, cases: [earthquake] };
    backend
      .expectOne('/api/v1/sections/7')
      .flush(view(1, 'done', null, { result: caseResult(), input }));
    await flushSide();
    const rows = Array.from(q('case-table')?.querySelectorAll('tbody tr') ?? []);
    const cells = rows.map((r) =>
      Array.from(r.children).map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    expect(cells).toEqual([
      [
        'radio_button_unchecked long term',
        'long term',
        "Spencer's method",
        '1.682',
        '1.5',
        '1.121',
        'check_circle meets the required FS',
      ],
      [
        'radio_button_checked river drawdown star governing',
        'rapid drawdown',
        "Spencer's method",
        '1.104',
        '1.2',
        '0.920',
        'cancel below the required FS',
      ],
      [
        'radio_button_unchecked earthquake',
        'seismic',
        "Spencer's method",
        '1.163',
        '1.1',
        '1.057',
        'check_circle meets the required FS',
      ],
    ]);
    expect(q('section-governing-case')?.textContent?.trim()).toBe('river drawdown');
    expect(q('section-verdict')?.textContent).toContain('below the required FS');
    // the governing case is shown first: its drawing, its stages
    let plot = backend.expectOne((req) => req.url === '/api/v1/sections/7/plot.svg');
    expect(plot.request.params.get('case')).toBe('river drawdown');
    plot.flush('<svg><text>river drawdown</text></svg>');
    expect(q('drawing-case')?.textContent?.trim()).toBe('· case river drawdown');
    expect(q('drawdown-report')).not.toBeNull();
    expect(q('seismic-report')).toBeNull();
    expect(q('method-table')?.querySelector('td.fs')?.textContent?.trim()).toBe('1.104');
    const stages = Array.from(q('slice-table')?.querySelectorAll('td[data-stage]') ?? []).map(
      (td) => td.getAttribute('data-stage'),
    );
    expect(stages).toEqual(['undrained', 'drained-lower', 'drained']);

    // pick the earthquake case
    const pick = Array.from(el().querySelectorAll<HTMLButtonElement>('[data-testid=pick-case]'));
    expect(pick.map((b) => b.getAttribute('aria-pressed'))).toEqual(['false', 'true', 'false']);
    pick[2].click();
    await fixture.whenStable();
    expect(pick.map((b) => b.getAttribute('aria-pressed'))).toEqual(['false', 'false', 'true']);
    plot = backend.expectOne((req) => req.url === '/api/v1/sections/7/plot.svg');
    expect(plot.request.params.get('case')).toBe('earthquake');
    plot.flush('<svg><text>earthquake</text></svg>');
    await fixture.whenStable();
    expect(q('section-drawing')?.textContent).toBe('earthquake');
    expect(q('section-drawing')?.getAttribute('aria-label')).toBe(
      'Cross-section drawing of the case earthquake',
    );
    expect(q('method-table')?.querySelector('td.fs')?.textContent?.trim()).toBe('1.163');
    expect(q('drawdown-report')).toBeNull();
    expect(q('seismic-report')?.textContent).toContain('Yield coefficient');
    expect(q('seismic-report')?.textContent).toContain(
      'The factors of safety above are pseudo-static, with the horizontal seismic coefficient kh = 0.1.',
    );
    expect(q('input-cases')?.textContent?.replace(/\s+/g, ' ').trim()).toBe(
      'earthquake (seismic): required FS 1.1; every method governs; kh 0.1; design PGA 0.25 g',
    );
    expect(q('slice-table')?.querySelector('td[data-stage]')).toBeNull();
    // the header stays the station's: the governing case
    expect(q('section-fs')?.textContent).toContain('1.104');
    expect(el().querySelector('sl-caution')).not.toBeNull();
    backend.verify();
  });
});
