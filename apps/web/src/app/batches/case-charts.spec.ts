import { TestBed } from '@angular/core/testing';
import { CaseCharts } from './case-charts';
import { batchCases } from './design-cases';
import { CASE_STATIONS, caseFields } from '../testing/case-fixtures';

describe('CaseCharts', () => {
  async function render() {
    const f = TestBed.createComponent(CaseCharts);
    f.componentRef.setInput('sections', CASE_STATIONS);
    f.componentRef.setInput('cases', batchCases(caseFields(), CASE_STATIONS));
    f.componentRef.setInput('width', 640);
    await f.whenStable();
    return f;
  }

  it('draws one chart per case, in the batch’s order, each with its own failing stations marked', async () => {
    const el = (await render()).nativeElement as HTMLElement;
    const charts = Array.from(el.querySelectorAll('[data-testid=case-chart]'));
    expect(charts.map((c) => c.getAttribute('data-case'))).toEqual([
      'end of construction',
      'long term',
      'earthquake',
    ]);
    const failing = charts.map((c) =>
      Array.from(c.querySelectorAll('[data-testid=fail-marker]')).map((m) =>
        m.closest('g.pt')?.getAttribute('data-station'),
      ),
    );
    expect(failing).toEqual([['1020'], ['1040'], ['1040']]);
    const captions = charts.map((c) =>
      Array.from(c.querySelectorAll('figcaption span')).map((x) => x.textContent?.trim()),
    );
    expect(captions).toEqual([
      ['end of construction', 'end of construction', '1 station below the required FS'],
      ['long term', 'long term', '1 station below the required FS'],
      ['earthquake', 'seismic', '1 station below the required FS'],
    ]);
    // every chart's words are its own (ids unique on the page)
    const ids = charts.map((c) => c.querySelector('svg')?.getAttribute('aria-describedby'));
    expect(new Set(ids).size).toBe(3);
  });

  it('names the stations below the required FS in any case, and which cases', async () => {
    const el = (await render()).nativeElement as HTMLElement;
    expect(el.querySelector('[data-testid=cases-below]')?.textContent?.trim()).toBe(
      '3 design cases: 2 of 4 stations below the required FS in at least one case: 1+020 (end of construction); 1+040 (long term, earthquake).',
    );
  });

  it('opens the section of a station clicked in any chart', async () => {
    const f = await render();
    const opened: number[] = [];
    f.componentInstance.open.subscribe((id) => opened.push(id));
    const third = (f.nativeElement as HTMLElement).querySelectorAll('[data-testid=case-chart]')[2];
    third.querySelector('g.pt[data-station="1040"]')?.dispatchEvent(new MouseEvent('click'));
    expect(opened).toEqual([3]);
  });
});

describe('batchCases', () => {
  it('takes the batch’s list of cases, with each case’s kind from its stations', () => {
    expect(batchCases(caseFields(), CASE_STATIONS)).toEqual([
      { name: 'end of construction', kind: 'end-of-construction' },
      { name: 'long term', kind: 'long-term' },
      { name: 'earthquake', kind: 'seismic' },
    ]);
  });

  it('falls back on the cases the stations name, in the order first seen', () => {
    expect(batchCases(null, CASE_STATIONS.slice(0, 1)).map((c) => c.name)).toEqual([
      'end of construction',
      'long term',
      'earthquake',
    ]);
    expect(batchCases({}, [])).toEqual([]);
  });
});
