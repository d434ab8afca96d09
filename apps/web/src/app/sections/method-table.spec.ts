import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MethodTable } from './method-table';
import type { MethodReport } from './section-types';

const circle = { type: 'circle' as const, center: [8.6, 42.7] as [number, number], radius: 1.78 };

const METHODS: MethodReport[] = [
  {
    method: 'bishop',
    fs: 3.592363,
    converged: true,
    iterations: 10,
    surface: circle,
    slices: [],
    warnings: [],
  },
  {
    method: 'spencer',
    fs: 3.587431,
    converged: true,
    iterations: 36,
    surface: circle,
    slices: [],
    warnings: [],
    lambda: 0.263615,
    theta: 14.768,
  },
  {
    method: 'morgenstern-price',
    fs: null,
    converged: false,
    iterations: 100,
    reason: 'no (F, λ) with moment and force equilibrium within 100 iterations',
    surface: {
      type: 'polyline',
      points: [
        [0, 40],
        [5, 38],
        [12, 42],
      ],
    },
    slices: [],
    warnings: [],
  },
];

describe('MethodTable', () => {
  let fixture: ComponentFixture<MethodTable>;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    fixture = TestBed.createComponent(MethodTable);
    fixture.componentRef.setInput('methods', METHODS);
    fixture.componentRef.setInput('governing', { method: 'spencer', fs: 3.587431 });
    fixture.componentRef.setInput('requiredFs', 1.5);
    await fixture.whenStable();
  });

  const row = (m: string) =>
    (fixture.nativeElement as HTMLElement).querySelector(`tr[data-method="${m}"]`) as HTMLElement;

  it('lists every method and marks the governing one, in words', () => {
    const rows = (fixture.nativeElement as HTMLElement).querySelectorAll(
      '[data-testid="method-table"] tbody tr',
    );
    expect(rows.length).toBe(3);
    expect(row('spencer').classList).toContain('governing');
    expect(row('spencer').querySelector('[data-testid="governing-mark"]')?.textContent).toContain(
      'governing',
    );
    expect(row('bishop').querySelector('[data-testid="governing-mark"]')).toBeNull();
    expect(row('bishop').classList).not.toContain('governing');
  });

  it('shows FS, iterations, λ with θ, and the circle', () => {
    const text = row('spencer').textContent ?? '';
    expect(text).toContain('3.587');
    expect(text).toContain('36');
    expect(text).toContain('0.264 (θ 14.8°)');
    expect(text).toContain('centre (8.60, 42.70) m, radius 1.78 m');
    expect(row('bishop').textContent).toContain('3.592');
  });

  it('says a method did not converge and why', () => {
    const r = row('morgenstern-price');
    expect(r.textContent).toContain('not solved');
    expect(r.querySelector('.reason')?.textContent).toContain(
      'no (F, λ) with moment and force equilibrium within 100 iterations',
    );
    expect(r.textContent).toContain('noncircular: 3 points');
    expect(row('spencer').textContent).toContain('converged');
  });

  it('gives lengths in feet for a section in US units', async () => {
    fixture.componentRef.setInput('units', 'us');
    await fixture.whenStable();
    expect(row('bishop').textContent).toContain('radius 1.78 ft');
  });
});
