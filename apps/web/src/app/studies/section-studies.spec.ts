import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { CAUTION } from '@scarpline/core/caution';
import axe from 'axe-core';
import type { Role } from '../core/models';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { signInAs } from '../testing/sign-in-as';
import { aStudy, doneProbability, sectionWithVariables } from '../testing/study-fixtures';
import { LIST_MS, POLL_MS, SectionStudies } from './section-studies';
import type { ProbabilitySummary, Study } from './study-types';

const LIST = '/api/v1/sections/9/studies';

describe('SectionStudies', () => {
  let fixture: ComponentFixture<SectionStudies>;
  let backend: HttpTestingController;

  async function open(role: Role, studies: Study[], summary: ProbabilitySummary[] | null = null) {
    signInAs(role, { id: 2, name: role === 'engineer' ? 'Evan Engineer' : `The ${role}` });
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionStudies);
    fixture.componentRef.setInput('sectionId', 9);
    fixture.componentRef.setInput('section', sectionWithVariables());
    fixture.componentRef.setInput('run', 3);
    fixture.componentRef.setInput('summary', summary);
    await fixture.whenStable();
    backend.expectOne(LIST).flush(studies);
    await fixture.whenStable();
  }

  afterEach(() => {
    vi.useRealTimers();
    vi.restoreAllMocks();
    fixture?.destroy();
    verifyAndReset(backend);
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const byId = (id: string) => el().querySelector<HTMLElement>(`[data-testid="${id}"]`);
  const all = (id: string) =>
    Array.from(el().querySelectorAll<HTMLElement>(`[data-testid="${id}"]`));
  const text = (e: Element | null | undefined) => {
    if (!e) return undefined;
    const copy = e.cloneNode(true) as Element;
    copy.querySelectorAll('mat-icon').forEach((i) => i.remove());
    return copy.textContent?.replace(/\s+/g, ' ').trim();
  };

  it('shows a done probabilistic analysis: its numbers by case, the Taylor check, the drawing and the caution', async () => {
    await open('viewer', [doneProbability()]);
    expect(text(byId('study-status'))).toBe('done');
    const rows = all('probability-row');
    expect(rows).toHaveLength(2);
    const cell = (id: string) => text(rows[0].querySelector(`[data-testid="${id}"]`));
    expect(cell('mean-fs')).toBe('1.468');
    expect(cell('sd-fs')).toBe('0.161');
    expect(cell('p-failure')).toBe('0.0125 ± 0.00248');
    expect(cell('p-below-required')).toBe('0.184 ± 0.00866 required 1.5');
    expect(cell('beta-normal')).toBe('2.91');
    expect(cell('beta-lognormal')).toBe('3.36');
    expect(cell('taylor')).toBe('1.478, 0.155, 3.08, 3.50 5 analyses');
    // the second case has no Taylor check in the fixture
    expect(text(rows[1].querySelector('[data-testid="taylor"]'))).toBe('—');
    // the core's drawing of the first case, drawn here
    const drawing = byId('study-drawing')!;
    expect(drawing.querySelector('svg')).not.toBeNull();
    expect(drawing.querySelectorAll('svg .bar')).toHaveLength(3);
    expect(byId('study-result')!.textContent).toContain(CAUTION);
    // saved as the SVG drawn
    const saved: string[] = [];
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (
      this: HTMLAnchorElement,
    ) {
      saved.push(this.download);
    });
    const created = vi.spyOn(URL, 'createObjectURL').mockImplementation(() => 'blob:svg');
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    byId('save-study-drawing')!.click();
    expect(saved).toEqual(['study-41-distribution-long_term.svg']);
    const blob = created.mock.calls[0][0] as Blob;
    expect(blob.type).toBe('image/svg+xml');
    expect(await blob.text()).toContain('<svg');
    // a viewer sees results, never the form
    expect(byId('study-form')).toBeNull();
  });

  it('draws the case picked', async () => {
    await open('viewer', [doneProbability()]);
    const pick = byId('drawn-case') as HTMLSelectElement;
    pick.value = 'design flood';
    pick.dispatchEvent(new Event('change'));
    await fixture.whenStable();
    expect(byId('study-drawing')!.getAttribute('aria-label') ?? '').toBe('');
    expect(
      byId('study-drawing')!.querySelector('[role="img"]')!.getAttribute('aria-label'),
    ).toContain('case design flood');
  });

  it('shows a failed study’s problem', async () => {
    await open('engineer', [
      aStudy({
        status: 'failed',
        problem: { title: 'No factor of safety', detail: 'Every realisation failed to converge.' },
      }),
    ]);
    expect(text(byId('study-status'))).toBe('failed');
    expect(text(byId('study-failed'))).toBe(
      'No factor of safety. Every realisation failed to converge.',
    );
    expect(byId('study-result')).toBeNull();
    expect(byId('study-form')).not.toBeNull();
  });

  it('shows a solve’s value, its FS and analyses; and why none was found', async () => {
    const solve = (found: boolean): Study =>
      aStudy({
        id: found ? 44 : 45,
        kind: 'solve',
        status: 'done',
        request: { kind: 'solve', target: 'materials.core.frictionAngle', range: [15, 35] },
        result: {
          kind: 'solve',
          solve: {
            id: 'wc-0520',
            title: 'Wendle flood bank 0+520',
            case: 'long term',
            target: 'materials.core.frictionAngle',
            targetFs: 1.5,
            range: [15, 35],
            found,
            value: found ? 29.4172 : null,
            fs: found ? 1.5001 : null,
            method: found ? 'spencer' : null,
            surface: null,
            analyses: found ? 9 : 2,
            steps: [],
            reason: found ? null : 'The FS stays above 1.5 over the whole range (2.1 at 15).',
            caution: 'c',
          },
        },
      });
    await open('engineer', [solve(true), solve(false)]);
    expect(text(byId('solve-value'))).toBe('29.4172');
    expect(text(byId('solve-fs'))).toBe("1.500 (Spencer's method)");
    expect(text(byId('solve-analyses'))).toBe('9');
    all('open-study')[1].click();
    await fixture.whenStable();
    expect(text(byId('solve-reason'))).toBe(
      'Not found. The FS stays above 1.5 over the whole range (2.1 at 15).',
    );
    expect(text(byId('solve-analyses'))).toBe('2');
  });

  it('follows a running study every POLL_MS, moving its progress, until it is done', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
    await open('engineer', [aStudy({ status: 'running', progress: { done: 500, total: 2000 } })]);
    expect(text(byId('study-progress'))).toBe('500 of 2000');

    vi.advanceTimersByTime(POLL_MS);
    backend
      .expectOne('/api/v1/studies/41')
      .flush(aStudy({ status: 'running', progress: { done: 1500, total: 2000 } }));
    await fixture.whenStable();
    expect(text(byId('study-progress'))).toBe('1500 of 2000');

    vi.advanceTimersByTime(POLL_MS);
    backend.expectOne('/api/v1/studies/41').flush(doneProbability());
    await fixture.whenStable();
    expect(text(byId('study-status'))).toBe('done');
    expect(all('probability-row')).toHaveLength(2);

    vi.advanceTimersByTime(3 * POLL_MS);
    backend.expectNone('/api/v1/studies/41');
  });

  describe('reads the list again while the page is in view', () => {
    let state: DocumentVisibilityState;
    const show = (s: DocumentVisibilityState) => {
      state = s;
      document.dispatchEvent(new Event('visibilitychange'));
    };
    const reads = () => backend.match((r) => r.method === 'GET' && r.url === LIST);

    beforeEach(() => {
      vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] });
      state = 'visible';
      Object.defineProperty(document, 'visibilityState', { configurable: true, get: () => state });
    });
    afterEach(() => {
      delete (document as { visibilityState?: unknown }).visibilityState;
    });

    it('every LIST_MS: a study asked elsewhere appears, opened, and is followed while it runs', async () => {
      await open('viewer', [doneProbability()]);
      expect(all('study-row')).toHaveLength(1);

      vi.advanceTimersByTime(LIST_MS - 1);
      expect(reads()).toHaveLength(0);
      vi.advanceTimersByTime(1);
      const elsewhere = aStudy({ id: 52, status: 'running', progress: { done: 100, total: 2000 } });
      const [read] = reads();
      read.flush([elsewhere, doneProbability()]);
      await fixture.whenStable();
      expect(all('study-row')).toHaveLength(2);
      expect(text(all('study-status')[0])).toBe('running');
      expect(text(byId('study-progress'))).toBe('100 of 2000');
      expect(text(byId('study-shown'))).toContain('The study is running');

      // now running, it is read every POLL_MS as any running study is
      vi.advanceTimersByTime(POLL_MS);
      backend
        .expectOne('/api/v1/studies/52')
        .flush(aStudy({ id: 52, status: 'running', progress: { done: 900, total: 2000 } }));
      await fixture.whenStable();
      expect(text(byId('study-progress'))).toBe('900 of 2000');
    });

    it('reads nothing while the page is hidden, and at once when it is seen again', async () => {
      await open('viewer', [doneProbability()]);
      show('hidden');
      vi.advanceTimersByTime(5 * LIST_MS);
      expect(reads()).toHaveLength(0);

      show('visible');
      vi.advanceTimersByTime(0);
      const [read] = reads();
      read.flush([aStudy({ id: 53, status: 'done' }), doneProbability()]);
      await fixture.whenStable();
      expect(all('study-row')).toHaveLength(2);

      vi.advanceTimersByTime(LIST_MS);
      reads()[0].flush([aStudy({ id: 53, status: 'done' }), doneProbability()]);
      await fixture.whenStable();
      expect(all('study-row')).toHaveLength(2);
    });

    it('says when a read again fails, keeps the list, and clears the problem on the next', async () => {
      await open('viewer', [doneProbability()]);
      vi.advanceTimersByTime(LIST_MS);
      reads()[0].flush(
        { type: 'about:blank', title: 'Service unavailable', status: 503 },
        { status: 503, statusText: 'Service Unavailable' },
      );
      await fixture.whenStable();
      expect(text(byId('studies-refresh-problem'))).toContain(
        'The list of studies could not be read again (trying again)',
      );
      expect(all('study-row')).toHaveLength(1);

      vi.advanceTimersByTime(LIST_MS);
      reads()[0].flush([doneProbability()]);
      await fixture.whenStable();
      expect(byId('studies-refresh-problem')).toBeNull();
    });

    it('waits for Try again after a failed first read (no reads again of a list never read)', async () => {
      signInAs('viewer', { id: 2, name: 'The viewer' });
      TestBed.configureTestingModule({ providers: apiTestProviders() });
      backend = TestBed.inject(HttpTestingController);
      fixture = TestBed.createComponent(SectionStudies);
      fixture.componentRef.setInput('sectionId', 9);
      fixture.componentRef.setInput('section', sectionWithVariables());
      await fixture.whenStable();
      backend
        .expectOne(LIST)
        .flush({ title: 'Service unavailable' }, { status: 503, statusText: 'Unavailable' });
      await fixture.whenStable();
      vi.advanceTimersByTime(3 * LIST_MS);
      expect(reads()).toHaveLength(0);
      expect(el().textContent).toContain('The studies could not be read');
    });

    it('keeps a study just asked when a read already on its way answers without it', async () => {
      await open('engineer', []);
      vi.advanceTimersByTime(LIST_MS);
      const [read] = reads();
      byId('ask-study')!.click();
      await fixture.whenStable();
      backend
        .expectOne((r) => r.method === 'POST' && r.url === LIST)
        .flush(aStudy({ id: 60 }), { status: 202, statusText: 'Accepted' });
      await fixture.whenStable();
      read.flush([]);
      await fixture.whenStable();
      expect(all('study-row')).toHaveLength(1);
      expect(text(byId('study-shown'))).toContain('The study is queued');
    });
  });

  it('lists a study asked for from the form, and opens it', async () => {
    await open('engineer', []);
    expect(text(byId('no-studies'))).toContain('No study');
    byId('ask-study')!.click();
    await fixture.whenStable();
    const req = backend.expectOne(LIST);
    expect(req.request.method).toBe('POST');
    req.flush(aStudy({ id: 50 }), { status: 202, statusText: 'Accepted' });
    await fixture.whenStable();
    expect(all('study-row')).toHaveLength(1);
    expect(text(byId('study-status'))).toBe('queued');
    expect(text(byId('study-shown'))).toContain('The study is queued');
  });

  it('passes axe’s rules on names, labels and roles (colour contrast is the browser tests’)', async () => {
    await open('engineer', [
      doneProbability(),
      aStudy({ id: 42, status: 'failed', problem: { title: 'No factor of safety' } }),
    ]);
    document.body.appendChild(el());
    try {
      const results = await axe.run(el(), {
        runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa'] },
        rules: { 'color-contrast': { enabled: false } },
      });
      expect(results.passes.map((r) => r.id)).toEqual(
        expect.arrayContaining(['label', 'button-name', 'aria-allowed-attr']),
      );
      expect(
        results.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.html).join(' | ')}`),
      ).toEqual([]);
    } finally {
      el().remove();
    }
  }, 60_000);

  it('shows the run’s own probability of failure by case, and what each study asked', async () => {
    await open(
      'viewer',
      [
        aStudy({
          request: {
            kind: 'probability',
            probability: {
              variables: [
                { target: 'materials.core.cohesion', distribution: 'normal', mean: 5, sd: 1 },
              ],
              method: 'latin-hypercube',
              realisations: 2000,
              seed: 7,
              surface: 'critical',
            },
          },
        }),
      ],
      [
        {
          case: 'long term',
          realisations: 10000,
          valid: 9998,
          meanFs: 1.62,
          sdFs: 0.18,
          pFailure: { p: 0.0004, standardError: 0.0002 },
          pBelowRequired: { p: 0.26, standardError: 0.0044 },
          betaNormal: 3.44,
          betaLognormal: 4.01,
        },
      ],
    );
    const table = byId('run-probability')!;
    expect(text(table.querySelector('caption'))).toBe(
      "Probability of failure of run 3, from the section's own variables on the critical surface of each case",
    );
    const cells = Array.from(all('run-probability-row')[0].children).map((c) => text(c));
    expect(cells).toEqual([
      'long term',
      '9998 / 10000',
      '1.620',
      '0.180',
      '0.000400 ± 0.000200',
      '0.260 ± 0.00440',
      '3.44 / 4.01',
    ]);
    expect(text(byId('study-request'))).toBe(
      'Asked: Latin hypercube, N = 2000, seed 7, critical surface, 1 variable.',
    );
  });

  it('shows a done sensitivity: each variable’s FS range, the tornado and the one-at-a-time drawing', async () => {
    const series = (variable: string, target: string, lo: number, hi: number) => ({
      variable,
      target,
      points: [
        [0, lo],
        [1, hi],
      ] as [number, number | null][],
      fsLow: lo,
      fsHigh: hi,
      from: 0,
      to: 1,
    });
    await open('viewer', [
      aStudy({
        id: 46,
        kind: 'sensitivity',
        status: 'done',
        request: { kind: 'sensitivity' },
        result: {
          kind: 'sensitivity',
          sensitivity: {
            id: 'wc-0520',
            title: 'Wendle flood bank 0+520',
            station: 520,
            cases: [
              {
                case: 'long term',
                fsAtMeans: 1.47,
                series: [
                  series('core φ′', 'materials.core.frictionAngle', 1.21, 1.74),
                  series('core c′', 'materials.core.cohesion', 1.38, 1.56),
                ],
              },
            ],
            caution: 'c',
          },
        },
      }),
    ]);
    const rows = all('sensitivity-row').map((r) => Array.from(r.children).map((c) => text(c)));
    expect(rows).toEqual([
      ['core φ′', 'materials.core.frictionAngle', '0 – 1', '1.210 – 1.740'],
      ['core c′', 'materials.core.cohesion', '0 – 1', '1.380 – 1.560'],
    ]);
    const drawings = all('study-drawing');
    expect(drawings).toHaveLength(2);
    expect(drawings.every((d) => d.querySelector('svg') !== null)).toBe(true);
    expect(text(byId('study-request'))).toBe('Asked: every case.');
    expect(byId('study-result')!.textContent).toContain(CAUTION);
  });
});
