import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import type { InputWarning, MethodReport } from './section-types';
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

function inputWarning(partial: Partial<InputWarning>): InputWarning {
  const w = {
    severity: 'warning' as const,
    file: 'corridor.yaml',
    line: 31,
    column: 22,
    path: 'template.materials.fill.saturatedUnitWeight',
    code: 'saturated-below-bulk',
    message: '18 kN/m³ is below the unit weight above the water (19)',
    ...partial,
  };
  return { ...w, text: `${w.file}:${w.line}:${w.column} warning: ${w.path}: ${w.message}` };
}

describe('WarningList', () => {
  let fixture: ComponentFixture<WarningList>;

  beforeEach(() => {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    fixture = TestBed.createComponent(WarningList);
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const items = () => Array.from(el().querySelectorAll<HTMLElement>('li.warning'));

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

  it('shows a warning of the input explained, with its file:line:column and path', async () => {
    fixture.componentRef.setInput('inputWarnings', [inputWarning({})]);
    await fixture.whenStable();
    const [li] = items();
    expect(li.dataset['code']).toBe('saturated-below-bulk');
    const e = WARNING_EXPLANATIONS['saturated-below-bulk'];
    expect(li.querySelector('.title strong')?.textContent?.trim()).toBe(e.title);
    expect(li.querySelector('.from')?.textContent).toContain('the input checks');
    expect(li.textContent).toContain(e.meaning);
    expect(li.textContent).toContain(e.check);
    expect(li.querySelector('.message')?.textContent).toContain('Input check:');
    expect(li.querySelector('.message')?.textContent).toContain('18 kN/m³ is below');
    const where = li.querySelector('[data-testid=warning-location]')?.textContent ?? '';
    expect(where.replace(/\s+/g, ' ').trim()).toBe(
      'Where: corridor.yaml:31:22 at template.materials.fill.saturatedUnitWeight',
    );
  });

  it('gives a warning about the file itself its place without a path', async () => {
    fixture.componentRef.setInput('inputWarnings', [
      inputWarning({ code: 'yaml-warning', path: '', line: 3, column: 1, message: 'odd key' }),
    ]);
    await fixture.whenStable();
    const where = items()[0].querySelector('[data-testid=warning-location]')?.textContent ?? '';
    expect(where.replace(/\s+/g, ' ').trim()).toBe('Where: corridor.yaml:3:1');
  });

  it('lists one input warning at several places once, with every place', async () => {
    const a = inputWarning({ path: 'sections[0].materials.fill.saturatedUnitWeight', line: 12 });
    const b = inputWarning({ path: 'sections[4].materials.fill.saturatedUnitWeight', line: 40 });
    const got = warningItems([], [], [a, b, a]);
    expect(got).toHaveLength(1);
    expect(got[0].origin).toBe('input');
    expect(got[0].locations).toEqual([
      { at: 'corridor.yaml:12:22', path: 'sections[0].materials.fill.saturatedUnitWeight' },
      { at: 'corridor.yaml:40:22', path: 'sections[4].materials.fill.saturatedUnitWeight' },
    ]);
    fixture.componentRef.setInput('inputWarnings', [a, b]);
    await fixture.whenStable();
    expect(items()).toHaveLength(1);
    const where = items()[0].querySelector('[data-testid=warning-location]')?.textContent ?? '';
    expect(where.replace(/\s+/g, ' ').trim()).toBe(
      'Where: corridor.yaml:12:22 at sections[0].materials.fill.saturatedUnitWeight; ' +
        'corridor.yaml:40:22 at sections[4].materials.fill.saturatedUnitWeight',
    );
  });

  it('keeps a warning of the input apart from the same words in the result', () => {
    const w = inputWarning({ code: 'not-applicable', message: 'no infinite-slope settings' });
    const got = warningItems([{ code: 'not-applicable', message: w.message }], [], [w]);
    expect(got.map((g) => [g.origin, g.sources])).toEqual([
      ['input', ['the input checks']],
      ['result', ['the analysis']],
    ]);
    expect(got[1].locations).toEqual([]);
  });

  it('has an explanation for every code the input checks can warn with', () => {
    const codes = [
      'unit-weight-unusual',
      'saturated-below-bulk',
      'no-strength',
      'rigid-on-top',
      'below-rigid',
      'first-top-ignored',
      'material-unused',
      'boundary-above-ground',
      'boundary-crosses',
      'stratum-vanishes',
      'offset-outside',
      'infinite-slope-unused',
      'circular-method',
      'required-fs-below-one',
      'yaml-warning',
      'no-template',
      'looks-like-degrees',
    ];
    const got = warningItems(
      [],
      [],
      codes.map((code) => inputWarning({ code, message: code })),
    );
    expect(got.filter((w) => w.explanation === null).map((w) => w.code)).toEqual([]);
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
      'probability-not-computed',
    ];
    const got = warningItems(
      codes.map((code) => ({ code, message: `msg ${code}` })),
      [],
      [],
    );
    expect(got.filter((w) => w.explanation === null).map((w) => w.code)).toEqual([]);
  });
});
