import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { SectionListItem, SectionPage } from './batch-types';
import { filterSections, SectionTable } from './section-table';
import { apiTestProviders } from '../testing/api-testing';
import { CASE_STATIONS, caseFields } from '../testing/case-fixtures';
import { batchCases } from './design-cases';

function item(id: number, station: number | null, fs: number | null): SectionListItem {
  return {
    id,
    key: `wcb@${station}`,
    station,
    stationLabel: station === null ? null : `1+${String(station - 1000).padStart(3, '0')}`,
    // A failed one whose title only repeats its key.
    title: fs === null ? `wcb@${station}` : `Main line, right-hand side, station ${station}`,
    units: 'si',
    status: fs === null ? 'failed' : 'done',
    run: 1,
    failReason: fs === null ? 'no method converged' : null,
    reviewState: 'pending',
    geometry: null,
    result:
      fs === null
        ? null
        : {
            verdict: fs >= 1.5 ? 'meets' : 'below',
            governingMethod: 'spencer',
            governingFs: fs,
            requiredFs: 1.5,
            warnings: [{ code: 'w', message: 'a warning' }],
          },
  };
}

const ALL = [item(1, 1000, 2.1), item(2, 1020, 1.3), item(3, 1040, null), item(4, 1240, 1.4)];

function pageOf(items: SectionListItem[], total = items.length): SectionPage {
  return { page: 1, pageSize: 50, total, items, caution: 'c' };
}

describe('SectionTable', () => {
  let fixture: ComponentFixture<SectionTable>;
  let backend: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionTable);
    fixture.componentRef.setInput('batchId', 7);
    fixture.componentRef.setInput('all', ALL);
    await fixture.whenStable();
    el = fixture.nativeElement as HTMLElement;
  });

  afterEach(() => backend.verify());

  const request = () => backend.expectOne((r) => r.url === '/api/v1/batches/7/sections');

  it('shows a page from the server with links, the verdict in words and icons', async () => {
    const req = request();
    expect(req.request.urlWithParams).toBe(
      '/api/v1/batches/7/sections?sort=station&order=asc&page=1&pageSize=50',
    );
    req.flush(pageOf(ALL, 61));
    await fixture.whenStable();
    const rows = Array.from(el.querySelectorAll('[data-testid=section-row]'));
    expect(rows).toHaveLength(4);
    expect(rows[0].querySelector('a')?.getAttribute('href')).toBe('/sections/1');
    expect(rows[0].textContent).toContain('meets');
    expect(rows[1].textContent).toContain('below');
    expect(rows[1].querySelector('mat-icon')?.textContent).toBe('cancel');
    expect(rows[2].textContent).toContain('no FS');
    expect(el.textContent).toContain('1 – 50 of 61');
  });

  it('shows each section’s title under its key, whole in the tooltip', async () => {
    request().flush(pageOf(ALL));
    await fixture.whenStable();
    const rows = Array.from(el.querySelectorAll('[data-testid=section-row]'));
    const cell = rows[0].querySelector('td.section-cell') as HTMLElement;
    expect(cell.querySelector('a')?.textContent?.trim()).toBe('wcb@1000');
    const title = cell.querySelector('[data-testid=section-title]') as HTMLElement;
    expect(title.textContent?.trim()).toBe('Main line, right-hand side, station 1000');
    expect(title.getAttribute('title')).toBe('Main line, right-hand side, station 1000');
    // a title that only repeats the key is not shown twice
    expect(rows[2].querySelector('[data-testid=section-title]')).toBeNull();
  });

  it('writes a station without a label as chainage in the section’s own units', async () => {
    const feet: SectionListItem = {
      ...item(9, 15000, 1.7),
      key: 'wfs@15000',
      stationLabel: null,
      units: 'us',
    };
    const metres: SectionListItem = { ...item(10, 1240, 1.7), stationLabel: null };
    request().flush(pageOf([feet, metres]));
    await fixture.whenStable();
    const stations = Array.from(el.querySelectorAll('[data-testid=section-row]')).map((r) =>
      r.querySelector('td')?.textContent?.trim(),
    );
    expect(stations).toEqual(['150+00', '1+240']);
  });

  it('finds a section by its title too', async () => {
    request().flush(pageOf(ALL));
    await fixture.whenStable();
    const input = el.querySelector('input[type=search]') as HTMLInputElement;
    input.value = 'station 1020';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    backend.expectNone((r) => r.url === '/api/v1/batches/7/sections');
    const rows = Array.from(el.querySelectorAll('[data-testid=section-row]'));
    expect(rows.map((r) => r.querySelector('a')?.textContent?.trim())).toEqual(['wcb@1020']);
  });

  it('asks the server for the failing ones only when the filter says Below', async () => {
    request().flush(pageOf(ALL));
    await fixture.whenStable();
    const fail = Array.from(el.querySelectorAll('[data-testid=pass-filter] button')).find(
      (b) => b.textContent?.trim() === 'Below',
    ) as HTMLButtonElement;
    fail.click();
    await fixture.whenStable();
    const req = request();
    expect(req.request.params.get('verdict')).toBe('below');
    expect(req.request.params.get('page')).toBe('1');
    req.flush(pageOf([ALL[1], ALL[3]]));
    await fixture.whenStable();
    expect(el.querySelectorAll('[data-testid=section-row]')).toHaveLength(2);
  });

  it('filters by text over every section without asking the server', async () => {
    request().flush(pageOf(ALL));
    await fixture.whenStable();
    const input = el.querySelector('input[type=search]') as HTMLInputElement;
    input.value = '1+2';
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
    backend.expectNone((r) => r.url === '/api/v1/batches/7/sections');
    const rows = Array.from(el.querySelectorAll('[data-testid=section-row]'));
    expect(rows.map((r) => r.querySelector('a')?.textContent?.trim())).toEqual(['wcb@1240']);
  });

  it('sorts and filters a list as the server does (nulls last)', () => {
    request().flush(pageOf(ALL)); // the table's own first page
    const by = (sort: 'station' | 'fs', direction: 'asc' | 'desc') =>
      filterSections(
        ALL,
        { text: '', verdict: 'all', status: '' },
        { active: sort, direction },
      ).map((s) => s.id);
    expect(by('fs', 'asc')).toEqual([2, 4, 1, 3]);
    expect(by('fs', 'desc')).toEqual([1, 4, 2, 3]);
    expect(by('station', 'desc')).toEqual([4, 3, 2, 1]);
    expect(
      filterSections(
        ALL,
        { text: '', verdict: 'below', status: '' },
        { active: 'station', direction: 'asc' },
      ).map((s) => s.id),
    ).toEqual([2, 4]);
    expect(
      filterSections(
        ALL,
        { text: '1040', verdict: 'all', status: 'failed' },
        { active: 'station', direction: 'asc' },
      ).map((s) => s.id),
    ).toEqual([3]);
  });

  it('shows a batch of one case as it always was: no governing case, no ratio, nothing to open', async () => {
    request().flush(pageOf(ALL));
    await fixture.whenStable();
    const heads = Array.from(el.querySelectorAll('th.mat-mdc-header-cell')).map((h) =>
      h.textContent?.trim(),
    );
    expect(heads).toEqual([
      'Station',
      'Section',
      'Governing method',
      'FS',
      'Required FS',
      'Verdict',
      'Warnings',
      'Review',
      'Run status',
    ]);
    expect(el.querySelector('[data-testid=expand-cases]')).toBeNull();
    expect(el.querySelector('[data-testid=case-filter]')).toBeNull();
  });
});

describe('SectionTable of a batch with design cases', () => {
  let fixture: ComponentFixture<SectionTable>;
  let backend: HttpTestingController;
  let el: HTMLElement;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionTable);
    fixture.componentRef.setInput('batchId', 7);
    fixture.componentRef.setInput('all', CASE_STATIONS);
    fixture.componentRef.setInput('cases', batchCases(caseFields(), CASE_STATIONS));
    await fixture.whenStable();
    el = fixture.nativeElement as HTMLElement;
  });

  afterEach(() => backend.verify());

  const request = () => backend.expectOne((r) => r.url === '/api/v1/batches/7/sections');
  const rows = () => Array.from(el.querySelectorAll('[data-testid=section-row]'));

  it('shows the governing case and its FS over the required FS in each row', async () => {
    request().flush(pageOf(CASE_STATIONS));
    await fixture.whenStable();
    const cells = (r: Element) =>
      Array.from(r.querySelectorAll('td')).map((td) => td.textContent?.replace(/\s+/g, ' ').trim());
    // expand, station, section, case, method, FS, required, ratio, verdict, …
    expect(cells(rows()[1]).slice(1, 9)).toEqual([
      '1+020',
      'wcb-main@1020Main line, station 1020',
      'end of construction',
      "Spencer's method",
      '1.21',
      '1.30',
      '0.931',
      'cancelbelow',
    ]);
    // no significant slope: no FS written, whatever large FS the service sums it up with
    expect(cells(rows()[3]).slice(3, 9)).toEqual([
      '—',
      "Spencer's method",
      '—',
      '1.30',
      '—',
      'horizontal_ruleno slope',
    ]);
  });

  it('opens a row to every case: name, kind, method, FS, required, ratio, verdict, the governing marked', async () => {
    request().flush(pageOf(CASE_STATIONS));
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=case-rows]')).toBeNull();
    const button = rows()[2].querySelector('[data-testid=expand-cases]') as HTMLButtonElement;
    expect(button.getAttribute('aria-expanded')).toBe('false');
    expect(button.getAttribute('aria-label')).toBe('Every case of station 1+040');
    button.click();
    await fixture.whenStable();
    expect(button.getAttribute('aria-expanded')).toBe('true');
    const table = el.querySelector('[data-testid=case-rows]') as HTMLTableElement;
    expect(table.id).toBe(button.getAttribute('aria-controls'));
    const lines = Array.from(table.querySelectorAll(':scope > tbody > tr')).map((r) =>
      Array.from(r.children).map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    expect(lines).toEqual([
      [
        'end of construction',
        'end of construction',
        "Spencer's method",
        '1.40',
        '1.30',
        '1.077',
        'check_circlemeets',
      ],
      [
        'long term star governing',
        'long term',
        "Spencer's method",
        '1.38',
        '1.50',
        '0.920',
        'cancelbelow',
      ],
      ['earthquake', 'seismic', "Spencer's method", '1.02', '1.10', '0.927', 'cancelbelow'],
    ]);
    button.click();
    await fixture.whenStable();
    expect(el.querySelector('[data-testid=case-rows]')).toBeNull();
  });

  it('asks the server for the stations whose chosen case is below (case with verdict)', async () => {
    request().flush(pageOf(CASE_STATIONS));
    await fixture.whenStable();
    const select = el.querySelector('[data-testid=case-filter]') as HTMLElement;
    // whose verdict: only once a verdict is chosen
    expect(select.getAttribute('aria-disabled')).toBe('true');
    const below = Array.from(el.querySelectorAll('[data-testid=pass-filter] button')).find(
      (b) => b.textContent?.trim() === 'Below',
    ) as HTMLButtonElement;
    below.click();
    await fixture.whenStable();
    let req = request();
    expect(req.request.params.get('verdict')).toBe('below');
    expect(req.request.params.has('case')).toBe(false);
    req.flush(pageOf([CASE_STATIONS[1], CASE_STATIONS[2]]));
    await fixture.whenStable();
    expect(select.getAttribute('aria-disabled')).toBe('false');

    select.click();
    await fixture.whenStable();
    const option = Array.from(document.querySelectorAll('mat-option')).find(
      (o) => o.textContent?.trim() === 'case earthquake',
    ) as HTMLElement;
    option.click();
    await fixture.whenStable();
    req = request();
    expect(req.request.params.get('verdict')).toBe('below');
    expect(req.request.params.get('case')).toBe('earthquake');
    req.flush(pageOf([CASE_STATIONS[2]]));
    await fixture.whenStable();
    expect(rows()).toHaveLength(1);
  });

  it('offers the verdict no significant slope when a station has it', async () => {
    request().flush(pageOf(CASE_STATIONS));
    await fixture.whenStable();
    const labels = Array.from(el.querySelectorAll('[data-testid=pass-filter] button')).map((b) =>
      b.textContent?.trim(),
    );
    expect(labels).toEqual(['All', 'Meets', 'Below', 'No slope']);
  });

  it('sorts by FS over required FS on the server', async () => {
    request().flush(pageOf(CASE_STATIONS));
    await fixture.whenStable();
    const header = el.querySelector('th[mat-sort-header=ratio] .mat-sort-header-container');
    (header as HTMLElement).click();
    await fixture.whenStable();
    const req = request();
    expect(req.request.params.get('sort')).toBe('ratio');
    req.flush(pageOf(CASE_STATIONS));
  });

  it('filters by a case’s verdict and sorts by ratio over every section here, as the server does', () => {
    request().flush(pageOf(CASE_STATIONS));
    const ids = (caseName: string | null, verdict: 'below' | 'no-slope') =>
      filterSections(
        CASE_STATIONS,
        { text: '', verdict, status: '', caseName },
        { active: 'station', direction: 'asc' },
      ).map((s) => s.id);
    expect(ids(null, 'below')).toEqual([2, 3]);
    expect(ids('end of construction', 'below')).toEqual([2]);
    expect(ids('earthquake', 'below')).toEqual([3]);
    expect(ids('long term', 'no-slope')).toEqual([4]);
    expect(
      filterSections(
        CASE_STATIONS,
        { text: '', verdict: 'all', status: '' },
        { active: 'ratio', direction: 'asc' },
      ).map((s) => s.id),
    ).toEqual([3, 2, 1, 4]);
  });
});

describe('SectionTable with a probability of failure', () => {
  let fixture: ComponentFixture<SectionTable>;
  let backend: HttpTestingController;
  let el: HTMLElement;

  const pf = (name: string, p: number, betaNormal: number | null) => ({
    case: name,
    realisations: 10_000,
    valid: 10_000,
    meanFs: 1.4,
    sdFs: 0.15,
    pFailure: { p, standardError: Math.sqrt((p * (1 - p)) / 10_000) },
    pBelowRequired: null,
    betaNormal,
    betaLognormal: betaNormal === null ? null : betaNormal + 0.25,
  });
  /** Station 1+020 with P_f of two of its cases (the earthquake's the greater); the others none. */
  const STATIONS: SectionListItem[] = CASE_STATIONS.map((s) =>
    s.id === 2
      ? {
          ...s,
          probability: [pf('long term', 0.0016, 2.95), pf('earthquake', 0.0213, 2.03)],
        }
      : s,
  );

  async function open(all: SectionListItem[]) {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SectionTable);
    fixture.componentRef.setInput('batchId', 7);
    fixture.componentRef.setInput('all', all);
    fixture.componentRef.setInput('cases', batchCases(caseFields(), all));
    await fixture.whenStable();
    el = fixture.nativeElement as HTMLElement;
    backend.expectOne((r) => r.url === '/api/v1/batches/7/sections').flush(pageOf(all));
    await fixture.whenStable();
  }

  afterEach(() => {
    backend.verify();
    TestBed.resetTestingModule();
  });

  const rows = () => Array.from(el.querySelectorAll('[data-testid=section-row]'));
  const text = (e: Element | null | undefined) => e?.textContent?.replace(/\s+/g, ' ').trim();

  it('adds P(FS < 1) and β columns: the case of the greatest P_f in the row, each case when opened', async () => {
    await open(STATIONS);
    const heads = Array.from(el.querySelectorAll('th')).map(text);
    expect(heads).toContain('P(FS < 1), greatest');
    expect(heads).toContain('β (normal / lognormal)');
    expect(text(rows()[1].querySelector('[data-testid=row-pf]'))).toBe('0.0213 earthquake');
    expect(text(rows()[1].querySelector('[data-testid=row-beta]'))).toBe('2.03 / 2.28');
    expect(text(rows()[0].querySelector('[data-testid=row-pf]'))).toBe('—');

    (rows()[1].querySelector('[data-testid=expand-cases]') as HTMLButtonElement).click();
    await fixture.whenStable();
    const table = el.querySelector('[data-testid=case-rows]')!;
    const lines = Array.from(table.querySelectorAll(':scope > tbody > tr')).map((r) =>
      Array.from(r.children)
        .slice(-2)
        .map((c) => text(c)),
    );
    expect(lines).toEqual([
      ['—', '—'],
      ['0.00160 ± 0.000400', '2.95 / 3.20'],
      ['0.0213 ± 0.00144', '2.03 / 2.28'],
    ]);
  });

  it('has no such columns when no station carries a probability', async () => {
    await open(CASE_STATIONS);
    const heads = Array.from(el.querySelectorAll('th')).map(text);
    expect(heads.some((h) => h?.includes('P(FS'))).toBe(false);
    expect(el.querySelector('[data-testid=row-pf]')).toBeNull();
  });
});
