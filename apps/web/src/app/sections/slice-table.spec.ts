import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { SliceTable } from './slice-table';
import type { MethodReport, SliceReport } from './section-types';

const circle = { type: 'circle' as const, center: [8.6, 42.7] as [number, number], radius: 12 };

function slice(E: number | null, X: number | null): SliceReport {
  return {
    x: 4,
    width: 1,
    alpha: 12,
    baseLength: 1.02,
    weight: 30,
    porePressure: 0,
    normal: 28,
    shear: 9,
    interslice: { E, X, thrust: null },
    material: 'clay',
  };
}

const report = (method: MethodReport['method'], slices: SliceReport[]): MethodReport => ({
  method,
  fs: 1.4,
  converged: true,
  iterations: 8,
  surface: circle,
  slices,
  warnings: [],
});

async function render(methods: MethodReport[]) {
  TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
  const fixture = TestBed.createComponent(SliceTable);
  fixture.componentRef.setInput('methods', methods);
  fixture.componentRef.setInput('governing', methods[0].method);
  await fixture.whenStable();
  return fixture.nativeElement as HTMLElement;
}

/** The cells of the E and X columns (the 10th and 11th) of every row. */
const interslice = (el: HTMLElement) =>
  Array.from(el.querySelectorAll('[data-testid=slice-table] tbody tr')).map((tr) =>
    Array.from(tr.querySelectorAll('td'))
      .slice(9, 11)
      .map((td) => td.textContent?.trim()),
  );

describe('SliceTable', () => {
  it("Bishop's slices: E and X not computed, shown as — and said so, never 0.00", async () => {
    const el = await render([report('bishop', [slice(null, null), slice(null, null)])]);
    expect(interslice(el)).toEqual([
      ['—', '—'],
      ['—', '—'],
    ]);
    expect(el.querySelector('[data-testid=interslice-note]')?.textContent).toContain(
      "Bishop's simplified does not compute E and X (it assumes X = 0",
    );
  });

  it("Janbu's slices: E computed, X not; Spencer's: both, with no note", async () => {
    const janbu = await render([report('janbu', [slice(12.5, null)])]);
    expect(interslice(janbu)).toEqual([['12.50', '—']]);
    expect(janbu.querySelector('[data-testid=interslice-note]')?.textContent).toContain(
      'does not compute X',
    );
    TestBed.resetTestingModule();
    const spencer = await render([report('spencer', [slice(12.5, 3.25)])]);
    expect(interslice(spencer)).toEqual([['12.50', '3.25']]);
    expect(spencer.querySelector('[data-testid=interslice-note]')).toBeNull();
  });
});
