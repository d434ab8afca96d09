import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import axe from 'axe-core';
import type { ProbabilitySummary } from '../studies/study-types';
import type { SectionListItem } from './batch-types';
import { ChainageChart } from './chainage-chart';
import { caseMarker, pfPoints, ProbabilityChart } from './probability-chart';

function summary(
  name: string,
  p: number,
  realisations = 10_000,
  beta: number | null = 2.5,
): ProbabilitySummary {
  return {
    case: name,
    realisations,
    valid: realisations,
    meanFs: 1.5,
    sdFs: 0.2,
    pFailure: { p, standardError: Math.sqrt((p * (1 - p)) / realisations) },
    pBelowRequired: null,
    betaNormal: beta,
    betaLognormal: beta === null ? null : beta + 0.3,
  };
}

/** A station of the invented Wendlecombe corridor, solved, with its probability by case (or none). */
function item(id: number, station: number | null, probability: ProbabilitySummary[] | null) {
  const s: SectionListItem = {
    id,
    key: `wcb-pf@${station}`,
    station,
    stationLabel: station === null ? null : `0+${String(station).padStart(3, '0')}`,
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
    probability,
  };
  return s;
}

const STATIONS = [
  item(1, 100, [summary('long term', 0.01), summary('flood', 0.1)]),
  item(2, 200, [summary('long term', 0.001), summary('flood', 0)]),
  item(3, 300, null), // no probability block: not plotted
  item(4, null, [summary('long term', 0.5)]), // no station: not plotted
  item(5, 400, [summary('long term', 0.0001)]),
];

describe('ProbabilityChart', () => {
  let fixture: ComponentFixture<ProbabilityChart>;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  });
  afterEach(() => {
    fixture?.destroy();
    TestBed.resetTestingModule();
  });

  async function render(sections: SectionListItem[]) {
    fixture = TestBed.createComponent(ProbabilityChart);
    fixture.componentRef.setInput('sections', sections);
    fixture.componentRef.setInput('width', 640);
    fixture.componentRef.setInput('height', 300);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('takes one point per station with a station and a probability, per case, by chainage', () => {
    const { points, cases } = pfPoints(STATIONS);
    expect(cases).toEqual(['long term', 'flood']);
    expect(points.map((p) => [p.station, p.case, p.pf])).toEqual([
      [100, 'long term', 0.01],
      [100, 'flood', 0.1],
      [200, 'long term', 0.001],
      [200, 'flood', 0],
      [400, 'long term', 0.0001],
    ]);
  });

  it('draws one point per station and case, on a logarithmic axis of P(FS < 1)', async () => {
    const el = await render(STATIONS);
    const pts = Array.from(el.querySelectorAll('[data-testid="pf-point"]'));
    expect(pts.map((p) => [p.getAttribute('data-station'), p.getAttribute('data-case')])).toEqual([
      ['100', 'long term'],
      ['100', 'flood'],
      ['200', 'long term'],
      ['200', 'flood'],
      ['400', 'long term'],
    ]);
    // the decades from 10⁻⁴ (the least P_f, and 1/N = 10⁻⁴ of the count of none) up to 1
    const ticks = Array.from(el.querySelectorAll('text.tick'))
      .filter((t) => t.getAttribute('text-anchor') === 'end')
      .map((t) => [t.textContent?.trim(), Number(t.getAttribute('y')) - 4]);
    expect(ticks.map((t) => t[0])).toEqual(['10⁻⁴', '10⁻³', '10⁻²', '10⁻¹', '1']);
    const yOfTick = new Map(ticks.map(([text, y]) => [text, y as number]));
    // each mark centred on the height of its decade: read the centre from its hit circle
    const cy = (i: number) => Number(pts[i].querySelector('circle')!.getAttribute('cy'));
    expect(cy(0)).toBeCloseTo(yOfTick.get('10⁻²')!, 1);
    expect(cy(1)).toBeCloseTo(yOfTick.get('10⁻¹')!, 1);
    expect(cy(2)).toBeCloseTo(yOfTick.get('10⁻³')!, 1);
    expect(cy(4)).toBeCloseTo(yOfTick.get('10⁻⁴')!, 1);
    // a count of none: open, at 1/N
    expect(cy(3)).toBeCloseTo(yOfTick.get('10⁻⁴')!, 1);
    expect(pts[3].querySelector('path.mark')!.getAttribute('fill')).toBe('#ffffff');
    expect(pts[0].querySelector('path.mark')!.getAttribute('fill')).not.toBe('#ffffff');
    // the cases by shape as well as colour: a dot for the first case, a square for the second
    const cx = (i: number) => Number(pts[i].querySelector('circle')!.getAttribute('cx'));
    const d = (i: number) => pts[i].querySelector('path.mark')!.getAttribute('d');
    expect(d(0)).toBe(caseMarker(0, cx(0), cy(0)));
    expect(d(1)).toBe(caseMarker(1, cx(1), cy(1)));
    expect(d(1)).toMatch(/^M\S+ \S+h[\d.]+v[\d.]+h-[\d.]+Z$/);
  });

  it('says each point in words, and opens its section on Enter', async () => {
    const el = await render(STATIONS);
    const opened: number[] = [];
    fixture.componentInstance.open.subscribe((id) => opened.push(id));
    const pts = Array.from(el.querySelectorAll<SVGGElement>('[data-testid="pf-point"]'));
    expect(pts[0].getAttribute('aria-label')).toBe(
      'Station 0+100, case long term: P(FS < 1) 0.0100 ± 0.000995, β 2.50 normal, 2.80 lognormal. Open the section.',
    );
    expect(pts[3].getAttribute('aria-label')).toContain(
      'no realisation of 10000 failed (P(FS < 1) below 0.000100)',
    );
    expect(pts.map((p) => p.getAttribute('tabindex'))).toEqual(['0', '-1', '-1', '-1', '-1']);
    pts[2].dispatchEvent(new KeyboardEvent('keydown', { key: 'Enter' }));
    expect(opened).toEqual([2]);
    expect(el.querySelector('.summary')?.textContent).toContain(
      '3 stations carry their probability of failure, 2 cases. The greatest: 0.100 at station 0+100 (case flood).',
    );
  });

  it('says so when no realisation failed at any station', async () => {
    const el = await render([item(1, 100, [summary('long term', 0)])]);
    expect(el.querySelector('.summary')?.textContent).toContain(
      '1 station carries its probability of failure, 1 case. No realisation failed at any station. 1 with no failed realisation, drawn open at 1/N.',
    );
  });

  it('puts each station at the x the FS chart above it gives it (one chainage axis)', async () => {
    const el = await render(STATIONS);
    const placed = fixture.componentInstance['layout']().placed;
    const pfX = Array.from(el.querySelectorAll('[data-testid="pf-point"] circle.hit')).map(
      (c, i) => [placed[i].point.station, Number(c.getAttribute('cx'))],
    );
    const fs = TestBed.createComponent(ChainageChart);
    fs.componentRef.setInput('sections', STATIONS);
    fs.componentRef.setInput('width', 640);
    fs.componentRef.setInput('height', 300);
    await fs.whenStable();
    const fsX = new Map(
      fs.componentInstance['layout']().stations.map((s) => [s.point.station, s.x]),
    );
    fs.destroy();
    expect(new Set(pfX.map(([station]) => station))).toEqual(new Set([100, 200, 400]));
    for (const [station, x] of pfX) expect([station, x]).toEqual([station, fsX.get(station)]);
  });

  it('draws nothing when no station carries a probability', async () => {
    const el = await render([item(3, 300, null)]);
    expect(el.querySelector('[data-testid="pf-chart"]')).toBeNull();
  });

  it('passes axe’s rules on names and roles (colour contrast is the browser tests’)', async () => {
    const el = await render(STATIONS);
    document.body.appendChild(el);
    try {
      const results = await axe.run(el, {
        runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa'] },
        rules: { 'color-contrast': { enabled: false } },
      });
      expect(results.violations.map((v) => `${v.id}: ${v.nodes.length}`)).toEqual([]);
      expect(results.passes.map((r) => r.id)).toContain('aria-allowed-attr');
    } finally {
      el.remove();
    }
  }, 60_000);
});
