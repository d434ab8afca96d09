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

  describe('the strength each base took', () => {
    const headers = (el: HTMLElement) =>
      Array.from(el.querySelectorAll('[data-testid=slice-table] thead th')).map((th) => {
        const unit = th.querySelector('.u')?.textContent?.trim();
        const words = Array.from(th.childNodes)
          .filter((n) => n.nodeType === Node.TEXT_NODE)
          .map((n) => n.textContent)
          .join(' ')
          .replace(/\s+/g, ' ')
          .trim();
        return unit ? `${words} [${unit}]` : words;
      });
    /** The cells after the base material (the 13th column on). */
    const strengthCells = (el: HTMLElement) =>
      Array.from(el.querySelectorAll('[data-testid=slice-table] tbody tr')).map((tr) =>
        Array.from(tr.querySelectorAll('td'))
          .slice(13)
          .map((td) => td.textContent?.replace(/\s+/g, ' ').trim()),
      );
    const withStrength = (
      material: string,
      cohesion: number | null | undefined,
      frictionAngle: number | null | undefined,
      strengthAt: SliceReport['strengthAt'],
    ): SliceReport =>
      ({
        ...slice(null, null),
        material,
        cohesion,
        frictionAngle,
        strengthAt,
      }) as SliceReport;

    it('is not shown for a result without it (an earlier version)', async () => {
      const el = await render([report('bishop', [slice(null, null)])]);
      expect(headers(el).at(-1)).toBe('base material');
      expect(strengthCells(el)).toEqual([[]]);
    });

    it('c, φ′ and the σ′n of a Hoek–Brown base; — for a fixed strength beside it', async () => {
      const el = await render([
        report('spencer', [
          withStrength('residual', 5, 27, null),
          withStrength('mudstone', 41.237, 38.46, { kind: 'normal', stress: 212.5 }),
        ]),
      ]);
      expect(headers(el).slice(13)).toEqual([
        'strength c′ or Su [kPa]',
        'φ′ [°]',
        'taken at σ′n [kPa]',
      ]);
      expect(strengthCells(el)).toEqual([
        ['5.00', '27.0', '—'],
        ['41.24', '38.5', '212.50'],
      ]);
      const cell = el.querySelectorAll('[data-testid=slice-table] tbody tr')[1].lastElementChild;
      expect(cell?.getAttribute('title')).toBe(
        'at the effective normal stress σ′n = 212.50 kPa on the base',
      );
      expect(el.querySelector('.legend')?.textContent).toContain('vertical effective stress σ′v');
    });

    it('Su from σ′v: the stress named σ′v; both kinds in one surface each named in its cell, in US units', async () => {
      TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
      const fixture = TestBed.createComponent(SliceTable);
      fixture.componentRef.setInput('methods', [
        report('bishop', [
          withStrength('soft-clay', 620, 0, { kind: 'vertical', stress: 2400 }),
          withStrength('rockfill', 0, 41.2, { kind: 'normal', stress: 1800 }),
        ]),
      ]);
      fixture.componentRef.setInput('governing', 'bishop');
      fixture.componentRef.setInput('units', 'us');
      await fixture.whenStable();
      const el = fixture.nativeElement as HTMLElement;
      expect(headers(el).slice(13)).toEqual([
        'strength c′ or Su [psf]',
        'φ′ [°]',
        'taken at σ′n or σ′v [psf]',
      ]);
      expect(strengthCells(el)).toEqual([
        ['620.00', '0.0', 'σ′v 2400.00'],
        ['0.00', '41.2', 'σ′n 1800.00'],
      ]);
      TestBed.resetTestingModule();
      const clay = await render([
        report('bishop', [withStrength('soft-clay', 18.5, 0, { kind: 'vertical', stress: 84 })]),
      ]);
      expect(headers(clay).at(-1)).toBe('taken at σ′v [kPa]');
      expect(strengthCells(clay)).toEqual([['18.50', '0.0', '84.00']]);
    });

    it('a stress column only where a slice has a finite stress; NaN or null shown as —', async () => {
      const el = await render([
        report('bishop', [
          withStrength('clay', 10, 25, null),
          withStrength('clay', null, Number.NaN, null),
        ]),
      ]);
      expect(headers(el).slice(13)).toEqual(['strength c′ or Su [kPa]', 'φ′ [°]']);
      expect(strengthCells(el)).toEqual([
        ['10.00', '25.0'],
        ['—', '—'],
      ]);
      expect(el.querySelector('.legend')?.textContent).not.toContain('Taken at');
    });
  });
});
