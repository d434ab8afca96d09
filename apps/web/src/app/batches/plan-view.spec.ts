import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { ResultCollection, ResultFeature } from './batch-types';
import { FS_RAMP, fsBin, fsBins, PlanView, stationFeatures } from './plan-view';
import type { Units } from './scales';

function feature(
  n: number,
  coords: number[][] | null,
  fs: number | null,
  required: number | null = 1.5,
): ResultFeature {
  return {
    type: 'Feature',
    id: `wcb-geo@${1000 + 20 * n}`,
    geometry: coords ? { type: 'LineString', coordinates: coords } : null,
    properties: {
      station: 1000 + 20 * n,
      chainage: `1+${String(20 * n).padStart(3, '0')}`,
      section_id: `wcb-geo@${1000 + 20 * n}`,
      case: null,
      governing_method: 'bishop',
      fs,
      required_fs: required,
      verdict:
        fs === null
          ? 'no-fs'
          : required === null
            ? 'no-requirement'
            : fs >= required
              ? 'meets'
              : 'below',
      warnings: 0,
      note: null,
      caution: 'Results need review.',
      review_state: 'pending',
      job_state: 'done',
    },
  };
}

function collection(features: ResultFeature[]): ResultCollection {
  return { type: 'FeatureCollection', name: 'wcb-geo', caution: 'Results need review.', features };
}

/** Parallel section lines from x = 0 to `length`, the i-th at y = i·gap, with these FS. */
function rungs(length: number, gap: number, fs: (number | null)[]): ResultCollection {
  return collection(
    fs.map((v, i) =>
      feature(
        i,
        [
          [0, i * gap],
          [length, i * gap],
        ],
        v,
      ),
    ),
  );
}

async function render(
  c: ResultCollection,
  width = 800,
  units: Units | null = 'si',
): Promise<ComponentFixture<PlanView>> {
  const fixture = TestBed.createComponent(PlanView);
  fixture.componentRef.setInput('results', c);
  fixture.componentRef.setInput('units', units);
  fixture.componentRef.setInput('width', width);
  await fixture.whenStable();
  return fixture;
}

/** Every vertex drawn, from the visible polylines' points. */
function drawn(el: HTMLElement): [number, number][] {
  return Array.from(el.querySelectorAll('polyline.stroke')).flatMap((p) =>
    (p.getAttribute('points') ?? '')
      .trim()
      .split(/\s+/)
      .map((xy) => xy.split(',').map(Number) as [number, number]),
  );
}

function box(points: [number, number][]) {
  const xs = points.map((p) => p[0]);
  const ys = points.map((p) => p[1]);
  return { w: Math.max(...xs) - Math.min(...xs), h: Math.max(...ys) - Math.min(...ys) };
}

describe('PlanView', () => {
  it('draws x and y at one scale: the drawn box has the coordinates’ aspect ratio', async () => {
    // A corridor 400 wide (x) and 100 high (y), in projected coordinates.
    const wide = collection([
      feature(
        0,
        [
          [451200, 102300, 40],
          [451230, 102300, 41],
        ],
        1.8,
      ),
      feature(
        1,
        [
          [451570, 102400, 40],
          [451600, 102380, 41],
        ],
        1.7,
      ),
    ]);
    const f = await render(wide, 800);
    const b = box(drawn(f.nativeElement));
    expect(b.w / b.h).toBeCloseTo(400 / 100, 2);

    // And a tall one (60 × 600), limited by the height instead of the width.
    const tall = collection([
      feature(
        0,
        [
          [0, 0],
          [60, 0],
        ],
        1.8,
      ),
      feature(
        1,
        [
          [0, 600],
          [20, 590],
          [40, 600],
        ],
        1.7,
      ),
    ]);
    const g = await render(tall, 800);
    const t = box(drawn(g.nativeElement));
    expect(t.w / t.h).toBeCloseTo(60 / 600, 2);
    const svg = g.nativeElement.querySelector('[data-testid=plan-view]') as SVGElement;
    expect(Number(svg.getAttribute('height'))).toBeLessThanOrEqual(560);
  });

  it('draws a WGS 84 line (RFC 7946) by its projected positions, at one scale', async () => {
    // The export gives lon/lat geometry and, where the corridor names its system, the
    // projected positions in the properties: a box 400 × 100 in the projected system.
    const at = (n: number, lonLat: number[][], projected: number[][]) => {
      const f = feature(n, lonLat, 1.8);
      f.properties.crs = 'EPSG:32630';
      f.properties.projected_coordinates = projected;
      return f;
    };
    const f = await render(
      collection([
        at(
          0,
          [
            [-2.27, 51.2],
            [-2.2696, 51.2],
          ],
          [
            [551200, 5672300, 40],
            [551230, 5672300, 41],
          ],
        ),
        at(
          1,
          [
            [-2.265, 51.201],
            [-2.2646, 51.201],
          ],
          [
            [551570, 5672400, 40],
            [551600, 5672380, 41],
          ],
        ),
      ]),
      800,
    );
    const b = box(drawn(f.nativeElement));
    expect(b.w / b.h).toBeCloseTo(400 / 100, 2);
  });

  it('puts north up: a larger y is drawn higher', async () => {
    const f = await render(rungs(10, 500, [1.8, 1.8]));
    const lines = Array.from<Element>(f.nativeElement.querySelectorAll('polyline.stroke'));
    const yOf = (p: Element) =>
      Number((p.getAttribute('points') ?? '').split(' ')[0].split(',')[1]);
    expect(yOf(lines[1])).toBeLessThan(yOf(lines[0]));
    expect(f.nativeElement.querySelector('.north')).not.toBeNull();
  });

  it('bins FS against the required FS; a failing result is always the lowest bin', () => {
    expect(fsBin(1.4, 1.5)).toBe(0);
    expect(fsBin(1.5, 1.5)).toBe(1);
    expect(fsBin(1.64, 1.5)).toBe(1);
    expect(fsBin(1.7, 1.5)).toBe(2);
    expect(fsBin(2.0, 1.5)).toBe(3);
    expect(fsBin(2.5, 1.5)).toBe(4);
    expect(fsBin(3.2, 1.5)).toBe(5);
    expect(fsBin(1.52, 1.5, 'below')).toBe(0);
    expect(fsBin(1.7, null)).toBeNull();
    expect(fsBin(null, 1.5)).toBeNull();
    const labels = fsBins([1.5, 1.5]).map((b) => b.label);
    expect(labels[0]).toBe('under 1.50: below the required FS');
    expect(labels[1]).toBe('1.50 – 1.65');
    expect(labels[5]).toBe('3.00 and above');
    // mixed requirements: the legend speaks in multiples of the required FS
    expect(fsBins([1.3, 1.5])[1].label).toBe('1 × – 1.1 × required FS');
  });

  it('colours each line by its bin, the failing ones thicker and marked', async () => {
    // The first fails (1.2 against 1.5); the last has no FS.
    const f = await render(rungs(10, 40, [1.2, 1.6, 3.5, null]));
    const el = f.nativeElement as HTMLElement;
    const lines = Array.from(el.querySelectorAll('g.line'));
    const stroke = (g: Element) => g.querySelector('polyline.stroke') as Element;
    expect(lines.map((g) => stroke(g).getAttribute('stroke'))).toEqual([
      FS_RAMP[0],
      FS_RAMP[1],
      FS_RAMP[5],
      '#7b858b',
    ]);
    expect(stroke(lines[0]).getAttribute('stroke-width')).toBe('5');
    expect(stroke(lines[1]).getAttribute('stroke-width')).toBe('2.5');
    expect(el.querySelectorAll('.fail-mark')).toHaveLength(1);
    expect(lines[0].querySelector('.fail-mark')).not.toBeNull();
    expect(el.querySelectorAll('.legend li')).toHaveLength(FS_RAMP.length + 1);
  });

  const twoLines = () => rungs(400, 100, [1.8, 1.8]);
  const barText = (f: ComponentFixture<PlanView>) =>
    (f.nativeElement as HTMLElement)
      .querySelector('.scale-bar text[text-anchor=middle]')
      ?.textContent?.trim() ?? '';

  it('writes the scale bar in the units the sections give (ft), or says it cannot', async () => {
    // The labels are in m form; the units the page passes are what counts.
    expect(barText(await render(twoLines(), 800, 'us'))).toMatch(/^\d+(\.\d+)? ft$/);
    expect(barText(await render(twoLines(), 800, null))).toMatch(/^\d+(\.\d+)? coordinate units$/);
  });

  it('has a scale bar of a round length whose drawn length matches the scale', async () => {
    const f = await render(twoLines());
    const el = f.nativeElement as HTMLElement;
    const b = box(drawn(el));
    const pxPerUnit = b.w / 400;
    const bar = el.querySelectorAll('.scale-bar rect');
    const barPx = Number(bar[0].getAttribute('width')) + Number(bar[1].getAttribute('width'));
    const label =
      el.querySelector('.scale-bar text[text-anchor=middle]')?.textContent?.trim() ?? '';
    const m = /^(\d+(?:\.\d+)?) m$/.exec(label);
    expect(m).not.toBeNull();
    expect(barPx / pxPerUnit).toBeCloseTo(Number(m?.[1]), 1);
  });

  it('opens the section of a line on click', async () => {
    const f = await render(rungs(10, 50, [1.8, 1.2]));
    const opened: string[] = [];
    f.componentInstance.open.subscribe((x) => opened.push(x.properties.section_id));
    (f.nativeElement.querySelectorAll('g.line')[1] as Element).dispatchEvent(
      new MouseEvent('click', { bubbles: true }),
    );
    expect(opened).toEqual(['wcb-geo@1020']);
  });

  it('says so plainly when the input had no coordinates', async () => {
    const f = await render(collection([feature(0, null, 1.8), feature(1, null, 1.2)]));
    const el = f.nativeElement as HTMLElement;
    expect(el.querySelector('svg')).toBeNull();
    expect(el.textContent).toContain("this batch's input had no coordinates");
  });

  it('draws each section line once, as its station’s row, when the results have a row per case', async () => {
    const line = [
      [0, 0],
      [50, 0],
    ];
    const station = feature(1, line, 1.21, 1.3);
    const rows = (n: number) => [
      {
        ...station,
        properties: { ...station.properties, row: 'case' as const, case: 'long term', fs: 1.6 + n },
      },
      {
        ...station,
        properties: { ...station.properties, row: 'case' as const, case: 'end of construction' },
      },
      {
        ...station,
        properties: { ...station.properties, row: 'station' as const, case: 'end of construction' },
      },
    ];
    const c = collection([...rows(0)]);
    expect(stationFeatures(c)?.features.map((f) => f.properties.row)).toEqual(['station']);
    // results of an API before design cases have no rows: kept as they are
    const old = collection([feature(1, line, 1.7)]);
    expect(stationFeatures(old)).toBe(old);
    const f = await render(c);
    expect((f.nativeElement as HTMLElement).querySelectorAll('polyline.stroke')).toHaveLength(1);
  });
});
