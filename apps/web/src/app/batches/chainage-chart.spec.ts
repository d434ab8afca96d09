import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { SectionListItem } from './batch-types';
import { chainageMarker, CHAINAGE_STYLE } from '@scarpline/core/draw';
import { ChainageChart, chainagePoints } from './chainage-chart';
import type { Units } from './scales';
import { aCase, CASE_STATIONS, stationOf } from '../testing/case-fixtures';

function item(
  id: number,
  station: number | null,
  fs: number | null,
  required: number | null = 1.5,
  units: Units = 'si',
): SectionListItem {
  return {
    id,
    key: `wcb-test@${station}`,
    station,
    stationLabel:
      station === null
        ? null
        : `${Math.floor(station / 1000)}+${String(station % 1000).padStart(3, '0')}`,
    title: `Test corridor, station ${station}`,
    units,
    status: fs === null ? 'queued' : 'done',
    run: 1,
    failReason: null,
    reviewState: 'pending',
    geometry: null,
    result:
      fs === null
        ? null
        : {
            verdict: required === null ? 'no-requirement' : fs >= required ? 'meets' : 'below',
            governingMethod: 'bishop',
            governingFs: fs,
            requiredFs: required,
            warnings: [],
          },
  };
}

async function render(sections: SectionListItem[]): Promise<ComponentFixture<ChainageChart>> {
  const fixture = TestBed.createComponent(ChainageChart);
  fixture.componentRef.setInput('sections', sections);
  fixture.componentRef.setInput('width', 640);
  fixture.componentRef.setInput('height', 300);
  await fixture.whenStable();
  return fixture;
}

const num = (el: Element, attr: string) => Number(el.getAttribute(attr));

/** The axis as drawn: value → pixel, read from two of its tick labels and their positions. */
function axisFromTicks(svg: SVGElement, which: 'x' | 'y'): (v: number) => number {
  const ticks = Array.from(svg.querySelectorAll('text.tick')).filter((t) =>
    which === 'x'
      ? t.getAttribute('text-anchor') === 'middle'
      : t.getAttribute('text-anchor') === 'end',
  );
  // x ticks are written as chainage (1+020): back to metres
  const value = (t: Element) => {
    const s = (t.textContent ?? '').trim();
    const m = /^(\d+)\+(\d+)$/.exec(s);
    return m ? Number(m[1]) * 1000 + Number(m[2]) : Number(s);
  };
  const pos = (t: Element) => (which === 'x' ? num(t, 'x') : num(t, 'y') - 4);
  const [a, b] = [ticks[0], ticks[ticks.length - 1]];
  const k = (pos(b) - pos(a)) / (value(b) - value(a));
  return (v) => pos(a) + (v - value(a)) * k;
}

/** The drawn centre of a station's marker (circle, or the triangle's apex and base). */
function centre(g: Element): [number, number] {
  const c = g.querySelector('circle:not(.hit)');
  if (c) return [num(c, 'cx'), num(c, 'cy')];
  const hit = g.querySelector('circle.hit') as Element;
  return [num(hit, 'cx'), num(hit, 'cy')];
}

describe('ChainageChart', () => {
  const sections = [
    item(4, 1060, 1.3),
    item(1, 1000, 2.0),
    item(3, 1040, 1.8, 1.6),
    item(2, 1020, 1.2),
    item(5, 1080, 2.2),
  ];

  it('places each station by chainage and FS through the axes it draws', async () => {
    const f = await render(sections);
    const svg = f.nativeElement.querySelector('[data-testid=chainage-chart]') as SVGElement;
    const x = axisFromTicks(svg, 'x');
    const y = axisFromTicks(svg, 'y');
    const pts = Array.from(svg.querySelectorAll('g.pt'));
    expect(pts).toHaveLength(5);
    for (const g of pts) {
      const station = Number(g.getAttribute('data-station'));
      const fs = sections.find((s) => s.station === station)?.result?.governingFs as number;
      const [cx, cy] = centre(g);
      expect(cx).toBeCloseTo(x(station), 1);
      expect(cy).toBeCloseTo(y(fs), 1);
    }
  });

  it('draws the points sorted by chainage whatever the order given', async () => {
    const f = await render(sections);
    const stations = Array.from(f.nativeElement.querySelectorAll('g.pt')).map((g) =>
      Number((g as Element).getAttribute('data-station')),
    );
    expect(stations).toEqual([1000, 1020, 1040, 1060, 1080]);
    const xs = Array.from(f.nativeElement.querySelectorAll('g.pt')).map(
      (g) => centre(g as Element)[0],
    );
    expect([...xs].sort((a, b) => a - b)).toEqual(xs);
  });

  it('draws the required FS as a step line at its height, stepping halfway between stations', async () => {
    const f = await render(sections);
    const svg = f.nativeElement.querySelector('[data-testid=chainage-chart]') as SVGElement;
    const y = axisFromTicks(svg, 'y');
    const x = axisFromTicks(svg, 'x');
    const d = svg.querySelector('[data-testid=required-line]')?.getAttribute('d') ?? '';
    // M x y, then H x (level) and V y (step): walk it into horizontal runs
    const runs: { x0: number; x1: number; y: number }[] = [];
    let cx = 0;
    let cy = 0;
    for (const [, cmd, a, b] of d.matchAll(/([MHV])\s*(-?[\d.]+)(?:\s+(-?[\d.]+))?/g)) {
      if (cmd === 'M') [cx, cy] = [Number(a), Number(b)];
      else if (cmd === 'V') cy = Number(a);
      else {
        runs.push({ x0: cx, x1: Number(a), y: cy });
        cx = Number(a);
      }
    }
    expect(runs.length).toBeGreaterThanOrEqual(3);
    const at = (station: number) => runs.find((r) => r.x0 <= x(station) && x(station) <= r.x1);
    expect(at(1000)?.y).toBeCloseTo(y(1.5), 1);
    expect(at(1020)?.y).toBeCloseTo(y(1.5), 1);
    expect(at(1040)?.y).toBeCloseTo(y(1.6), 1);
    expect(at(1060)?.y).toBeCloseTo(y(1.5), 1);
    // the 1.6 of station 1040 holds from halfway to 1020 to halfway to 1060
    const high = runs.find((r) => Math.abs(r.y - y(1.6)) < 0.1);
    expect(high?.x0).toBeCloseTo(x(1030), 1);
    expect(high?.x1).toBeCloseTo(x(1050), 1);
  });

  it('marks exactly the failing stations, once each, labelled, and names them in the summary', async () => {
    const f = await render(sections);
    const el = f.nativeElement as HTMLElement;
    const markers = Array.from(el.querySelectorAll('[data-testid=fail-marker]'));
    expect(markers).toHaveLength(2); // 1020 (1.2 < 1.5) and 1060 (1.3 < 1.5)
    expect(markers.map((m) => m.closest('g.pt')?.getAttribute('data-station'))).toEqual([
      '1020',
      '1060',
    ]);
    const labels = Array.from(el.querySelectorAll('.fail-labels text'));
    expect(labels.map((t) => t.getAttribute('data-station'))).toEqual(['1020', '1060']);
    expect(labels.map((t) => t.textContent?.trim())).toEqual(['1+020', '1+060']);
    expect(el.querySelector('.summary')?.textContent).toContain(
      '2 of 5 stations below the required FS: 1+020, 1+060.',
    );
    const describedBy = el
      .querySelector('[data-testid=chainage-chart]')
      ?.getAttribute('aria-describedby');
    expect(describedBy).toMatch(/^chainage-summary-\d+$/);
    expect(el.querySelector(`#${describedBy}`)).toBe(el.querySelector('.summary'));
  });

  it('gives every point a title and opens its section on click and on Enter', async () => {
    const f = await render(sections);
    const opened: number[] = [];
    f.componentInstance.open.subscribe((id) => opened.push(id));
    const pts = Array.from<SVGGElement>(f.nativeElement.querySelectorAll('g.pt'));
    expect(pts[1].querySelector('title')?.textContent).toBe(
      'Station 1+020: FS 1.20, required 1.50 (below the required FS)',
    );
    pts[1].dispatchEvent(new MouseEvent('click', { bubbles: true }));
    pts[3].dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter', bubbles: true }));
    expect(opened).toEqual([2, 4]);
  });

  it('writes the chainage in the units each section gives, not in a guess from its label', async () => {
    const inFeet = (s: SectionListItem): SectionListItem => ({
      ...s,
      units: 'us',
      stationLabel: null,
    });
    const f = await render(sections.map(inFeet));
    const svg = f.nativeElement.querySelector('[data-testid=chainage-chart]') as SVGElement;
    expect(svg.querySelector('text.axis-title')?.textContent?.trim()).toBe('Chainage (ft)');
    const xTicks = Array.from(svg.querySelectorAll('text.tick[text-anchor=middle]')).map((t) =>
      t.textContent?.trim(),
    );
    expect(xTicks.length).toBeGreaterThan(1);
    for (const t of xTicks) expect(t).toMatch(/^\d+\+\d{2}$/); // 10+20: hundreds of feet
    expect(f.nativeElement.querySelector('.summary')?.textContent).toContain('10+20, 10+60');

    const m = await render(sections);
    expect(m.nativeElement.querySelector('text.axis-title')?.textContent?.trim()).toBe(
      'Chainage (m)',
    );
  });

  it('names no length unit for a batch that mixes files in m and in ft', () => {
    const mixed = [item(1, 1000, 1.8), item(2, 15000, 1.7, 1.5, 'us')];
    expect(chainagePoints(mixed).units).toBeNull();
    expect(chainagePoints([item(1, 1000, 1.8)]).units).toBe('si');
    expect(chainagePoints([]).units).toBeNull();
  });

  it("draws the core's marks (the command's chainage.svg has the same): shape and colour by verdict", async () => {
    const withNone = [
      ...sections,
      {
        ...item(6, 1100, 1.0),
        result: { ...item(6, 1100, 1.0).result!, verdict: 'no-fs' as const, governingFs: null },
      },
    ];
    const f = await render(withNone);
    const pts = Array.from<SVGGElement>(f.nativeElement.querySelectorAll('g.pt'));
    expect(pts.map((g) => g.getAttribute('data-mark'))).toEqual([
      'meets',
      'below',
      'meets',
      'below',
      'meets',
      'no-fs',
    ]);
    for (const g of pts) {
      const mark = g.getAttribute('data-mark') as 'meets' | 'below' | 'no-fs';
      const hit = g.querySelector('circle.hit') as Element;
      const path = g.querySelector('path.mark') as Element;
      expect(path.getAttribute('d')).toBe(chainageMarker(mark, num(hit, 'cx'), num(hit, 'cy')));
      expect(path.getAttribute('fill')).toBe(CHAINAGE_STYLE[mark].fill);
    }
    expect(f.nativeElement.querySelector('.summary')?.textContent).toContain(
      '1: no factor of safety',
    );
  });

  it('says there is nothing to plot when no section has a result yet', async () => {
    const f = await render([item(1, 1000, null), item(2, null, 1.7)]);
    const el = f.nativeElement as HTMLElement;
    expect(el.querySelector('svg')).toBeNull();
    expect(el.textContent).toContain('No results to plot yet');
  });

  it("charts one case: each station's FS and required FS in that case, its own failures marked", async () => {
    const { points } = chainagePoints(CASE_STATIONS, 'long term');
    expect(points.map((p) => [p.station, p.fs, p.requiredFs, p.verdict, p.hidden])).toEqual([
      [1000, 1.71, 1.5, 'meets', false],
      [1020, 1.62, 1.5, 'meets', false],
      [1040, 1.38, 1.5, 'below', false],
      [1060, null, null, 'no-slope', true],
    ]);
    const f = TestBed.createComponent(ChainageChart);
    f.componentRef.setInput('sections', CASE_STATIONS);
    f.componentRef.setInput('caseName', 'end of construction');
    f.componentRef.setInput('width', 640);
    await f.whenStable();
    const el = f.nativeElement as HTMLElement;
    const pts = Array.from(el.querySelectorAll('g.pt'));
    // the station with no significant slope holds the axis but is not drawn
    expect(pts.map((g) => [g.getAttribute('data-station'), g.getAttribute('data-mark')])).toEqual([
      ['1000', 'meets'],
      ['1020', 'below'],
      ['1040', 'meets'],
    ]);
    expect(pts[1].querySelector('title')?.textContent).toBe(
      'Station 1+020, case end of construction: FS 1.21, required 1.30 (below the required FS)',
    );
    expect(el.querySelector('svg')?.getAttribute('aria-label')).toBe(
      'Factor of safety of the case end of construction along the chainage',
    );
    expect(el.querySelector('.summary')?.textContent).toBe(
      '1 of 3 stations below the required FS: 1+020. 1: no significant slope (not plotted).',
    );
    expect(el.querySelector('.legend')?.textContent).toContain('FS of the case');
  });

  it('lays every case out on the same chainage axis, a station without the case left undrawn', async () => {
    const added = stationOf(9, 1100, [aCase('long term', 'long-term', 1.6, 1.5)]);
    const all = [...CASE_STATIONS, added];
    const tickTexts = async (caseName: string) => {
      const f = TestBed.createComponent(ChainageChart);
      f.componentRef.setInput('sections', all);
      f.componentRef.setInput('caseName', caseName);
      f.componentRef.setInput('width', 640);
      await f.whenStable();
      const el = f.nativeElement as HTMLElement;
      return {
        ticks: Array.from(el.querySelectorAll('text.tick[text-anchor=middle]')).map((t) => [
          t.textContent?.trim(),
          t.getAttribute('x'),
        ]),
        drawn: Array.from(el.querySelectorAll('g.pt')).map((g) => g.getAttribute('data-station')),
        summary: el.querySelector('.summary')?.textContent ?? '',
      };
    };
    const quake = await tickTexts('earthquake');
    const longTerm = await tickTexts('long term');
    expect(quake.ticks).toEqual(longTerm.ticks);
    expect(quake.drawn).toEqual(['1000', '1020', '1040']);
    expect(longTerm.drawn).toEqual(['1000', '1020', '1040', '1100']);
    expect(quake.summary).toContain('1 without this case (not plotted).');
  });
});
