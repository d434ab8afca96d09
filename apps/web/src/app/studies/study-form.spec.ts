import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import type { SectionInput } from '../sections/section-types';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { sectionWithCases } from '../testing/rerun-case-fixtures';
import { aStudy, sectionWithVariables } from '../testing/study-fixtures';
import { StudyForm } from './study-form';
import type { Study } from './study-types';

const ASK = '/api/v1/sections/9/studies';

describe('StudyForm', () => {
  let fixture: ComponentFixture<StudyForm>;
  let backend: HttpTestingController;
  let asked: Study[];

  async function open(section: SectionInput = sectionWithVariables()) {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StudyForm);
    fixture.componentRef.setInput('sectionId', 9);
    fixture.componentRef.setInput('section', section);
    asked = [];
    fixture.componentInstance.asked.subscribe((s) => asked.push(s));
    await fixture.whenStable();
  }

  afterEach(() => {
    fixture?.destroy();
    verifyAndReset(backend);
  });

  const el = () => fixture.nativeElement as HTMLElement;
  const q = <T extends Element = HTMLElement>(sel: string) => el().querySelector<T>(sel);
  const byId = <T extends Element = HTMLElement>(id: string) => q<T>(`[data-testid="${id}"]`);

  async function type(id: string, value: string) {
    const input = byId<HTMLInputElement>(id)!;
    input.value = value;
    input.dispatchEvent(new Event('input'));
    await fixture.whenStable();
  }

  async function pickKind(kind: string) {
    q<HTMLInputElement>(`[data-testid="study-kind"] input[value="${kind}"]`)!.click();
    await fixture.whenStable();
  }

  async function submit() {
    byId<HTMLButtonElement>('ask-study')!.click();
    await fixture.whenStable();
  }

  it('shows the section’s own variables and settings, and asks with them as they are', async () => {
    await open();
    const rows = Array.from(el().querySelectorAll('[data-testid="study-variable"]'));
    const cells = (r: Element) =>
      Array.from(r.children).map((c) => c.textContent?.replace(/\s+/g, ' ').trim());
    expect(rows.map(cells)).toEqual([
      ['core c′', 'materials.core.cohesion', 'lognormal, mean 5, SD 1.5'],
      ['core φ′', 'materials.core.frictionAngle', 'normal, mean 27, SD 2'],
    ]);
    expect(byId<HTMLInputElement>('study-realisations')!.value).toBe('2000');
    expect(byId<HTMLInputElement>('study-seed')!.value).toBe('7');

    await submit();
    const req = backend.expectOne(ASK);
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ kind: 'probability' });
    const study = aStudy();
    req.flush(study, { status: 202, statusText: 'Accepted' });
    await fixture.whenStable();
    expect(asked).toEqual([study]);
  });

  it('sends the section’s variables (SI) with other settings as a probability block', async () => {
    await open();
    await type('study-realisations', '5000');
    await type('study-seed', '11');
    await submit();
    const req = backend.expectOne(ASK);
    expect(req.request.body).toEqual({
      kind: 'probability',
      probability: {
        variables: [
          {
            name: 'core c′',
            target: 'materials.core.cohesion',
            distribution: 'lognormal',
            mean: 5,
            sd: 1.5,
          },
          {
            name: 'core φ′',
            target: 'materials.core.frictionAngle',
            distribution: 'normal',
            mean: 27,
            sd: 2,
          },
        ],
        method: 'monte-carlo',
        realisations: 5000,
        seed: 11,
        surface: 'critical',
      },
    });
    req.flush(aStudy(), { status: 202, statusText: 'Accepted' });
  });

  it('checks the realisations before asking', async () => {
    await open();
    await type('study-realisations', '3');
    await submit();
    backend.expectNone(ASK);
    expect(byId('study-notice')?.textContent).toContain('see the marked fields');
    expect(q('mat-error')?.textContent).toContain('At least 10');
  });

  it('solves for the first input within a range about it: the governing case’s required FS, or the case’s picked', async () => {
    await open();
    await pickKind('solve');
    // the first input of the first material that is not rigid: the shell's unit weight (19)
    await submit();
    const first = backend.expectOne(ASK);
    // the governing case: the API takes its required FS
    expect(first.request.body).toEqual({
      kind: 'solve',
      target: 'materials.shell.unitWeight',
      range: [9.5, 28.5],
    });
    first.flush(aStudy({ kind: 'solve' }), { status: 202, statusText: 'Accepted' });

    const loader = TestbedHarnessEnvironment.loader(fixture);
    const caseSelect = await loader.getHarness(
      MatSelectHarness.with({ selector: '[data-testid="study-case"]' }),
    );
    await caseSelect.open();
    await caseSelect.clickOptions({ text: 'design flood, steady seepage' });
    await fixture.whenStable();
    expect(byId<HTMLInputElement>('study-target-fs')!.value).toBe('1.3');
    await submit();
    const second = backend.expectOne(ASK);
    expect(second.request.body).toEqual({
      kind: 'solve',
      target: 'materials.shell.unitWeight',
      case: 'design flood, steady seepage',
      targetFs: 1.3,
      range: [9.5, 28.5],
    });
    second.flush(aStudy({ kind: 'solve' }), { status: 202, statusText: 'Accepted' });
  });

  it('solves a section of one case at its required FS', async () => {
    const one = sectionWithVariables();
    delete one.cases;
    await open(one);
    await pickKind('solve');
    expect(el().querySelector('[data-testid="study-case"]')).toBeNull();
    await submit();
    const req = backend.expectOne(ASK);
    expect(req.request.body).toEqual({
      kind: 'solve',
      target: 'materials.shell.unitWeight',
      targetFs: 1.5,
      range: [9.5, 28.5],
    });
    req.flush(aStudy({ kind: 'solve' }), { status: 202, statusText: 'Accepted' });
  });

  it('puts a 422’s located errors on their fields: by JSON pointer and by path', async () => {
    await open();
    await type('study-realisations', '200000');
    // the form's own maximum is 100 000: ask for less and let the API refuse
    await type('study-realisations', '90000');
    await submit();
    backend.expectOne(ASK).flush(
      {
        title: 'Unprocessable Content',
        status: 422,
        detail: '2 errors in the request.',
        errors: [
          {
            severity: 'error',
            pointer: '/probability/realisations',
            code: 'above-maximum',
            message: 'at most 50000 realisations on the critical surface',
          },
          {
            severity: 'error',
            path: 'probability.variables[1].target',
            code: 'target-unknown',
            message: 'the section has no material "core"',
          },
          { severity: 'error', path: 'budget', code: 'limit', message: 'over the day’s budget' },
        ],
      },
      { status: 422, statusText: 'Unprocessable Content' },
    );
    await fixture.whenStable();
    const field = byId('study-realisations')!.closest('mat-form-field')!;
    expect(field.querySelector('mat-error')?.textContent).toContain(
      'at most 50000 realisations on the critical surface',
    );
    expect(byId('variables-error')?.textContent).toContain('the section has no material "core"');
    const problem = byId('study-problem')!;
    expect(problem.textContent).toContain('Unprocessable Content');
    expect(problem.querySelectorAll('li')).toHaveLength(1);
    expect(problem.textContent).toContain('over the day’s budget');
  });

  it('puts a solve’s range error on the range’s end', async () => {
    await open();
    await pickKind('solve');
    await submit();
    backend.expectOne(ASK).flush(
      {
        title: 'Unprocessable Content',
        status: 422,
        errors: [
          {
            severity: 'error',
            pointer: '/range/1',
            code: 'range',
            message: 'the unit weight is at most 30 kN/m³',
          },
        ],
      },
      { status: 422, statusText: 'Unprocessable Content' },
    );
    await fixture.whenStable();
    const field = byId('study-to')!.closest('mat-form-field')!;
    expect(field.querySelector('mat-error')?.textContent).toContain(
      'the unit weight is at most 30 kN/m³',
    );
  });

  it('says a section without variables has none to study, and asks nothing', async () => {
    await open(sectionWithCases());
    // with no variables the form opens on solving; a probability needs variables
    await pickKind('probability');
    expect(byId('no-variables')?.textContent).toContain('no random variables');
    expect(byId<HTMLButtonElement>('ask-study')!.disabled).toBe(true);
  });

  it('searching in every realisation: N follows the surface until typed, and at most 5 000', async () => {
    await open();
    const loader = TestbedHarnessEnvironment.loader(fixture);
    const surface = await loader.getHarness(
      MatSelectHarness.with({ selector: '[data-testid="study-surface"]' }),
    );
    await surface.open();
    await surface.clickOptions({ text: 'Searched again in every realisation' });
    await fixture.whenStable();
    // the core's default when searching (the section's own N is for its critical surface)
    expect(byId<HTMLInputElement>('study-realisations')!.value).toBe('1000');
    await type('study-realisations', '6000');
    await submit();
    backend.expectNone(ASK);
    const field = byId('study-realisations')!.closest('mat-form-field')!;
    expect(field.querySelector('mat-error')?.textContent).toContain(
      'At most 5000 when the surface is searched in every realisation.',
    );
    await type('study-realisations', '4000');
    await submit();
    const req = backend.expectOne(ASK);
    expect(req.request.body).toMatchObject({
      kind: 'probability',
      probability: { surface: 'search', realisations: 4000, seed: 7, method: 'monte-carlo' },
    });
    req.flush(aStudy(), { status: 202, statusText: 'Accepted' });
  });
});
