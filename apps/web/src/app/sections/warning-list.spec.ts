import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { MethodReport } from './section-types';
import { WARNING_EXPLANATIONS } from './warning-codes';
import { WarningList, warningItems } from './warning-list';

function method(partial: Partial<MethodReport>): MethodReport {
  return {
    method: 'bishop',
    fs: 1.2,
    converged: true,
    iterations: 5,
    surface: null,
    slices: [],
    warnings: [],
    ...partial,
  };
}

describe('WarningList', () => {
  let fixture: ComponentFixture<WarningList>;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    fixture = TestBed.createComponent(WarningList);
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const items = () => Array.from(el().querySelectorAll('li.warning')) as HTMLElement[];

  it('says "No warnings" when there are none', async () => {
    fixture.componentRef.setInput('warnings', []);
    fixture.componentRef.setInput('methods', [method({})]);
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="warning-list"]')?.textContent).toContain(
      'No warnings',
    );
    expect(items().length).toBe(0);
  });

  it('explains a known code in plain words, with what to check and the solver message', async () => {
    const message =
      'the lowest factor of safety is still on the edge of the search grid after 6 moves';
    fixture.componentRef.setInput('warnings', [{ code: 'minimum-on-edge', message }]);
    await fixture.whenStable();
    const [li] = items();
    expect(li.dataset['code']).toBe('minimum-on-edge');
    const text = li.textContent ?? '';
    expect(text).toContain(WARNING_EXPLANATIONS['minimum-on-edge'].title);
    expect(text).toContain(WARNING_EXPLANATIONS['minimum-on-edge'].meaning);
    expect(text).toContain('What to check:');
    expect(text).toContain(WARNING_EXPLANATIONS['minimum-on-edge'].check);
    expect(text).toContain(message);
    expect(el().textContent).not.toContain('No warnings');
  });

  it('falls back to the message for a code it does not know', async () => {
    fixture.componentRef.setInput('warnings', [
      { code: 'something-new', message: 'a new check fired here' },
    ]);
    await fixture.whenStable();
    const [li] = items();
    expect(li.querySelector('.title strong')?.textContent?.trim()).toBe('a new check fired here');
    expect(li.querySelector('.meaning')).toBeNull();
    expect(li.textContent).toContain('something-new');
  });

  it('lists method warnings under the method and shows a repeated failure once', async () => {
    fixture.componentRef.setInput('warnings', [
      { code: 'no-convergence', message: 'spencer: no (F, λ) found within 100 iterations' },
    ]);
    fixture.componentRef.setInput('methods', [
      method({ method: 'bishop', warnings: [{ code: 'negative-normal', message: 'tension' }] }),
      method({
        method: 'spencer',
        converged: false,
        fs: null,
        warnings: [{ code: 'no-convergence', message: 'no (F, λ) found within 100 iterations' }],
      }),
    ]);
    await fixture.whenStable();
    const list = items();
    expect(list.length).toBe(2);
    expect(list[0].textContent).toContain("Spencer's method");
    expect(list[0].textContent).toContain(WARNING_EXPLANATIONS['no-convergence'].title);
    expect(list[1].textContent).toContain("Bishop's simplified");
    expect(list[1].textContent).toContain(WARNING_EXPLANATIONS['negative-normal'].title);
  });

  it('has an explanation for every code the solver can put in a result', () => {
    const codes = [
      'no-surface',
      'minimum-on-edge',
      'surface-rejected',
      'cohesionless-circle',
      'no-convergence',
      'not-applicable',
      'm-alpha-small',
      'negative-normal',
      'thrust-outside',
    ];
    const got = warningItems(
      codes.map((code) => ({ code, message: `msg ${code}` })),
      [],
      [],
    );
    expect(got.filter((w) => w.explanation === null).map((w) => w.code)).toEqual([]);
  });
});
