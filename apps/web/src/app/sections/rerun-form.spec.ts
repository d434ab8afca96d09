import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { RerunForm } from './rerun-form';
import type { SectionInput, SectionView } from './section-types';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';
import { sectionWithCases } from '../testing/rerun-case-fixtures';
import { sectionWithStrengths } from '../testing/strength-fixtures';

function input(): SectionInput {
  return {
    format: 'scarpline/1',
    id: 'wcb-main@1000',
    title: 'Station 1000',
    station: 1000,
    offset: 0,
    units: 'si',
    ground: [
      [0, 41],
      [50, 42],
    ],
    materials: {
      'weathered-mudstone': {
        name: 'weathered-mudstone',
        unitWeight: 20,
        saturatedUnitWeight: 20.5,
        strength: { model: 'mohr-coulomb', cohesion: 5, frictionAngle: 26 },
      },
      mudstone: {
        name: 'mudstone',
        unitWeight: 0,
        saturatedUnitWeight: 0,
        strength: { model: 'rigid' },
      },
    },
    strata: [
      { material: 'weathered-mudstone', top: [] },
      { material: 'mudstone', top: [] },
    ],
    water: {
      kind: 'piezometric',
      line: [
        [0, 38.5],
        [8, 38.5],
        [50, 39.8],
      ],
      unitWeight: 9.81,
    },
    loads: [],
    reinforcement: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis: {
      methods: ['bishop', 'spencer'],
      slices: 30,
      surface: { type: 'auto' },
      infiniteSlope: null,
      case: 'long-term',
      requiredFs: 1.5,
    },
  };
}

function view(run = 1, status: SectionView['status'] = 'done'): SectionView {
  return {
    id: 7,
    batchId: 1,
    key: 'wcb-main@1000',
    station: 1000,
    status,
    run,
    failReason: null,
    submittedBy: 2,
    submitter: { id: 2, name: 'Evan Engineer' },
    input: input(),
    inputWarnings: [],
    result: null,
    previous: [],
    review: { state: 'pending', latest: null, history: [] },
    caution: 'c',
  };
}

describe('RerunForm', () => {
  let fixture: ComponentFixture<RerunForm>;
  let backend: HttpTestingController;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: apiTestProviders() });
    backend = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(RerunForm);
    fixture.componentRef.setInput('section', view());
    await fixture.whenStable();
  });

  afterEach(() => verifyAndReset(backend));

  const el = () => fixture.nativeElement as HTMLElement;
  const field = (path: string) =>
    el().querySelector(`input[data-field="${path}"]`) as HTMLInputElement;

  async function type(inputEl: HTMLInputElement, value: string): Promise<void> {
    inputEl.value = value;
    inputEl.dispatchEvent(new Event('input'));
    inputEl.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
  }

  async function submit(): Promise<void> {
    (el().querySelector('[data-testid="rerun-submit"]') as HTMLButtonElement).click();
    await fixture.whenStable();
  }

  it('labels the fields with SI units and says edits are SI', () => {
    expect(el().querySelector('.si-note')?.textContent).toContain('SI units');
    const labels = Array.from(el().querySelectorAll('mat-label')).map((l) => l.textContent);
    expect(labels).toContain('γ (kN/m³)');
    expect(labels).toContain('c′ (kPa)');
    expect(labels).toContain('φ′ (°)');
    expect(el().textContent).toContain('A rigid base: it has no parameters to edit.');
  });

  it('has no case part for a section that lists no cases', () => {
    expect(el().querySelectorAll('[data-testid="rerun-case"]').length).toBe(0);
    expect(el().textContent).not.toContain('Design cases');
    expect(el().querySelector('[data-field^="cases"]')).toBeNull();
    expect(el().querySelector('[data-testid="remove-case"]')).toBeNull();
  });

  it('shows the range of an out-of-range φ′ and sends nothing', async () => {
    const phi = field('materials.weathered-mudstone.strength.frictionAngle');
    expect(phi.value).toBe('26');
    await type(phi, '95');
    await submit();
    const errors = Array.from(el().querySelectorAll('mat-error')).map((e) => e.textContent);
    expect(errors).toContain('φ′ must be at least 0° and less than 90°.');
    expect(el().querySelector('.notice')?.textContent).toContain('out of range');
    backend.expectNone('/api/v1/sections/7/runs');
  });

  it('sends a merge patch with only what changed, then says which run it is', async () => {
    const emitted: SectionView[] = [];
    fixture.componentInstance.queued.subscribe((v) => emitted.push(v));
    await type(field('materials.weathered-mudstone.strength.frictionAngle'), '24');
    await type(field('analysis.requiredFs'), '1.4');
    await submit();
    const req = backend.expectOne('/api/v1/sections/7/runs');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({
      materials: { 'weathered-mudstone': { strength: { frictionAngle: 24 } } },
      requiredFs: 1.4,
    });
    req.flush(view(2, 'queued'), { status: 202, statusText: 'Accepted' });
    await fixture.whenStable();
    expect(el().querySelector('[data-testid="rerun-queued"]')?.textContent).toContain(
      'Queued as run 2',
    );
    expect(emitted.map((v) => v.run)).toEqual([2]);
  });

  it('sends the whole piezometric line when a point moved, and nothing else', async () => {
    const ys = el().querySelectorAll<HTMLInputElement>(
      '[data-testid="piezometric-points"] input[aria-label$="y in m"]',
    );
    expect(ys.length).toBe(3);
    await type(ys[1], '39');
    await submit();
    const req = backend.expectOne('/api/v1/sections/7/runs');
    expect(req.request.body).toEqual({
      water: {
        piezometric: [
          [0, 38.5],
          [8, 39],
          [50, 39.8],
        ],
      },
    });
    req.flush(view(2, 'queued'));
  });

  it("shows a US file's SI values rounded, with the file's units, and sends only the edit", async () => {
    // another run of the section: the form is built again for it
    const us = view(3);
    const pcf = 4.4482216152605e-3 / 0.3048 ** 3; // kN/m³ in one pcf
    us.input = {
      ...input(),
      units: 'us',
      materials: {
        'lean-clay': {
          name: 'lean-clay',
          unitWeight: 122 * pcf,
          saturatedUnitWeight: 128 * pcf,
          strength: { model: 'mohr-coulomb', cohesion: 7.182038847050375, frictionAngle: 26 },
        },
      },
      water: {
        kind: 'piezometric',
        line: [
          [0, 60.3504],
          [54.864000000000004, 67.6656],
        ],
        unitWeight: 62.4 * pcf,
      },
    };
    fixture.componentRef.setInput('section', us);
    await fixture.whenStable();
    const gamma = field('materials.lean-clay.unitWeight');
    expect(gamma.value).toBe('19.1647');
    expect(gamma.closest('mat-form-field')?.textContent).toContain('= 122 pcf');
    await type(field('materials.lean-clay.strength.frictionAngle'), '24');
    const ys = el().querySelectorAll<HTMLInputElement>(
      '[data-testid="piezometric-points"] input[aria-label$="y in m"]',
    );
    await type(ys[0], '61');
    await submit();
    const req = backend.expectOne('/api/v1/sections/7/runs');
    expect(req.request.body).toEqual({
      materials: { 'lean-clay': { strength: { frictionAngle: 24 } } },
      // the point left alone keeps its exact stored value
      water: {
        piezometric: [
          [0, 61],
          [54.864000000000004, 67.6656],
        ],
      },
    });
    req.flush(view(2, 'queued'));
  });

  it('refuses to send when nothing changed', async () => {
    await submit();
    expect(el().querySelector('.notice')?.textContent).toContain('Nothing has changed');
    backend.expectNone('/api/v1/sections/7/runs');
  });

  it('shows the located errors of a 422 by their field and in a list, keeping the edits', async () => {
    await type(field('materials.weathered-mudstone.unitWeight'), '2');
    await submit();
    backend.expectOne('/api/v1/sections/7/runs').flush(
      {
        title: 'Invalid input',
        status: 422,
        detail: '2 errors in the input.',
        errors: [
          {
            severity: 'error',
            file: 'edited-section.json',
            line: 12,
            column: 9,
            path: 'materials.weathered-mudstone.unitWeight',
            code: 'unit-weight-low',
            message: 'γ is too low for this check',
          },
          {
            severity: 'error',
            file: 'edited-section.json',
            line: 40,
            column: 5,
            path: 'strata[1].top',
            code: 'boundary-short',
            message: 'the top of mudstone ends short of the ground',
          },
        ],
      },
      { status: 422, statusText: 'Unprocessable Entity' },
    );
    await fixture.whenStable();
    const list = el().querySelector('[data-testid="rerun-errors"]')?.textContent ?? '';
    expect(list).toContain('γ is too low for this check');
    expect(list).toContain('strata[1].top');
    expect(list).toContain('the top of mudstone ends short of the ground');
    expect(el().querySelector('[data-testid="rerun-problem"]')?.textContent).toContain(
      '2 errors in the input.',
    );
    const byField = Array.from(el().querySelectorAll('mat-error')).map((e) => e.textContent);
    expect(byField).toContain('γ is too low for this check');
    expect(field('materials.weathered-mudstone.unitWeight').value).toBe('2');
  });

  describe('a section with design cases', () => {
    beforeEach(async () => {
      const v = view(2);
      v.input = sectionWithCases();
      fixture.componentRef.setInput('section', v);
      await fixture.whenStable();
    });

    const caseBox = (name: string) =>
      el().querySelector(`[data-testid="rerun-case"][data-case="${name}"]`) as HTMLElement;

    it("groups each case's own values under its name and kind, with labels", () => {
      const legends = Array.from(el().querySelectorAll('[data-testid="rerun-case"] > legend')).map(
        (l) => l.textContent?.replace(/\s+/g, ' ').trim(),
      );
      expect(legends).toEqual([
        'Case “long term” long term',
        'Case “design flood, steady seepage” steady seepage',
        'Case “earthquake” seismic',
      ]);
      const labels = (name: string) =>
        Array.from(caseBox(name).querySelectorAll('mat-label')).map((l) => l.textContent);
      expect(labels('long term')).toEqual(['Required FS']);
      expect(labels('design flood, steady seepage')).toEqual([
        'Required FS',
        'γ (kN/m³)',
        'γsat (kN/m³)',
        'c′ (kPa)',
        'φ′ (°)',
      ]);
      expect(labels('earthquake')).toEqual([
        'Required FS',
        'kh',
        'kv',
        'Design PGA (g)',
        'Magnitude Mw',
        'Allowable displacement (mm)',
      ]);
      expect(field('cases[2].earthquake.allowableDisplacement').value).toBe('150');
      expect(caseBox('long term').textContent).toContain('The section’s');
    });

    it('sends the edit of a case by its name, and nothing else', async () => {
      await type(field('cases[2].requiredFs'), '1.2');
      await type(field('cases[2].seismic.kh'), '0.15');
      await type(field('cases[1].materials.core.strength.frictionAngle'), '22');
      await submit();
      const req = backend.expectOne('/api/v1/sections/7/runs');
      expect(req.request.body).toEqual({
        cases: {
          'design flood, steady seepage': {
            materials: { core: { strength: { frictionAngle: 22 } } },
          },
          earthquake: { requiredFs: 1.2, seismic: { kh: 0.15, kv: 0.02 } },
        },
      });
      req.flush(view(3, 'queued'));
    });

    it('marks a case in range before sending', async () => {
      await type(field('cases[2].seismic.kv'), '1');
      await submit();
      const error = field('cases[2].seismic.kv').closest('mat-form-field')?.textContent;
      expect(error).toContain('kv must be greater than -1 and less than 1.');
      backend.expectNone('/api/v1/sections/7/runs');
    });

    it('removes a case after saying in words that it will be gone; never the last one', async () => {
      const remove = (name: string) =>
        caseBox(name).querySelector('[data-testid="remove-case"]') as HTMLButtonElement;
      remove('earthquake').click();
      await fixture.whenStable();
      expect(
        caseBox('earthquake').querySelector('[data-testid="case-removed"]')?.textContent,
      ).toContain('The case “earthquake” will be gone from the next run');
      expect(caseBox('earthquake').querySelector('input')).toBeNull();
      remove('long term').click();
      await fixture.whenStable();
      const last = remove('design flood, steady seepage');
      expect(last.disabled).toBe(true);
      expect(caseBox('design flood, steady seepage').textContent).toContain(
        'The only case left: a section keeps at least one.',
      );
      // changed my mind about the long term
      (
        Array.from(caseBox('long term').querySelectorAll('button')).find((b) =>
          b.textContent?.includes('Keep this case'),
        ) as HTMLButtonElement
      ).click();
      await fixture.whenStable();
      expect(remove('design flood, steady seepage').disabled).toBe(false);
      await submit();
      const req = backend.expectOne('/api/v1/sections/7/runs');
      expect(req.request.body).toEqual({ cases: { earthquake: null } });
      req.flush(view(3, 'queued'));
    });

    it("puts the API's error about a case on that case's field and in the list", async () => {
      (
        caseBox('long term').querySelector('[data-testid="remove-case"]') as HTMLButtonElement
      ).click();
      await fixture.whenStable();
      await type(field('cases[2].requiredFs'), '0.5');
      await submit();
      backend.expectOne('/api/v1/sections/7/runs').flush(
        {
          title: 'Invalid input',
          status: 422,
          detail: '1 error in the input.',
          errors: [
            {
              severity: 'error',
              file: 'edited-section.json',
              line: 241,
              column: 21,
              // the earthquake is the second case once the long term is removed
              path: 'cases[1].requiredFs',
              code: 'requirement-low',
              message: 'a required FS below 1 is not a requirement',
            },
          ],
        },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
      await fixture.whenStable();
      expect(field('cases[2].requiredFs').closest('mat-form-field')?.textContent).toContain(
        'a required FS below 1 is not a requirement',
      );
      expect(
        field('cases[1].requiredFs').closest('mat-form-field')?.querySelector('mat-error'),
      ).toBeNull();
      expect(el().querySelector('[data-testid="rerun-errors"]')?.textContent).toContain(
        'cases[1].requiredFs',
      );
    });
  });

  describe('a section whose strengths vary with stress', () => {
    beforeEach(async () => {
      const v = view(4);
      v.input = sectionWithStrengths();
      fixture.componentRef.setInput('section', v);
      await fixture.whenStable();
    });

    const materialBox = (name: string) =>
      Array.from(el().querySelectorAll<HTMLElement>('form > fieldset.group')).find((f) =>
        f.querySelector('legend')?.textContent?.trim().startsWith(`${name} `),
      )!;
    const labels = (box: HTMLElement) =>
      Array.from(box.querySelectorAll('mat-label')).map((l) => l.textContent);
    const pointInputs = (box: HTMLElement, which: 'σ′n' | 'τ') =>
      Array.from(
        box.querySelectorAll<HTMLInputElement>(
          `[data-testid="strength-points"] input[aria-label$="${which} in kPa"]`,
        ),
      );

    it("labels each model's own fields with their units", () => {
      expect(labels(materialBox('mudstone'))).toEqual([
        'γ (kN/m³)',
        'γsat (kN/m³)',
        'σci (kPa)',
        'GSI',
        'mi',
        'D',
      ]);
      expect(labels(materialBox('soft-clay')).slice(2)).toEqual([
        'S = Su/σ′v',
        'm (exponent of OCR)',
        'OCR',
        'Least Su (kPa)',
      ]);
      expect(labels(materialBox('crust-clay'))).toContain('POP (kPa)');
      expect(labels(materialBox('fill')).slice(2)).toEqual([
        'c′ (kPa)',
        'φ′1 (°)',
        'Break stress σ′n (kPa)',
        'φ′2 (°)',
      ]);
      const rockfill = materialBox('rockfill');
      expect(pointInputs(rockfill, 'σ′n').map((i) => i.value)).toEqual(['0', '100', '400']);
      expect(pointInputs(rockfill, 'τ').map((i) => i.value)).toEqual(['0', '95', '300.123']);
      expect(field('materials.mudstone.strength.intactStrength').value).toBe('15000');
      // the case that sets its own rockfill offers its points too
      const loose = el().querySelector('[data-testid="rerun-case"][data-case="loose rockfill"]')!;
      expect(
        loose.querySelector('[data-field="cases[1].materials.rockfill.strength.points"]'),
      ).not.toBeNull();
    });

    it('marks points whose σ′n does not increase, and sends nothing', async () => {
      const rockfill = materialBox('rockfill');
      await type(pointInputs(rockfill, 'σ′n')[2], '50');
      await submit();
      expect(
        rockfill.querySelector('[data-testid="strength-points-error"]')?.textContent,
      ).toContain('Point 3: σ′n 50 kPa is not above that of the point before (100 kPa)');
      backend.expectNone('/api/v1/sections/7/runs');
    });

    it('adds a point at the end and sends the whole list with the other edits', async () => {
      const rockfill = materialBox('rockfill');
      (
        Array.from(rockfill.querySelectorAll('button')).find((b) =>
          b.textContent?.includes('Add a point at the end'),
        ) as HTMLButtonElement
      ).click();
      await fixture.whenStable();
      await type(pointInputs(rockfill, 'σ′n')[3], '700');
      await type(pointInputs(rockfill, 'τ')[3], '480');
      await type(field('materials.mudstone.strength.gsi'), '42');
      await type(field('materials.soft-clay.strength.minimum'), '10');
      await submit();
      const req = backend.expectOne('/api/v1/sections/7/runs');
      expect(req.request.body).toEqual({
        materials: {
          mudstone: { strength: { gsi: 42 } },
          'soft-clay': { strength: { minimum: 10 } },
          rockfill: {
            strength: {
              points: [
                [0, 0],
                [100, 95],
                [400, 300.123456789],
                [700, 480],
              ],
            },
          },
        },
      });
      req.flush(view(5, 'queued'));
    });

    it("shows the API's error about a point by that point's field", async () => {
      await type(field('materials.fill.strength.frictionAngleBeyond'), '40');
      await submit();
      backend.expectOne('/api/v1/sections/7/runs').flush(
        {
          title: 'Invalid input',
          status: 422,
          detail: '2 errors in the input.',
          errors: [
            {
              severity: 'error',
              file: 'edited-section.json',
              line: 30,
              column: 11,
              path: 'materials.rockfill.strength.points[1]',
              code: 'points-not-increasing',
              message: 'σn 100 is not above that of the point before',
            },
            {
              severity: 'error',
              file: 'edited-section.json',
              line: 44,
              column: 11,
              path: 'materials.fill.strength.frictionAngleBeyond',
              code: 'check-order',
              message: 'φ′ beyond the break is above φ′ before it',
            },
          ],
        },
        { status: 422, statusText: 'Unprocessable Entity' },
      );
      await fixture.whenStable();
      const point = field('materials.rockfill.strength.points[1][0]');
      expect(point.closest('mat-form-field')?.textContent).toContain(
        'σn 100 is not above that of the point before',
      );
      expect(
        field('materials.fill.strength.frictionAngleBeyond').closest('mat-form-field')?.textContent,
      ).toContain('φ′ beyond the break is above φ′ before it');
    });

    it('puts the stored points back', async () => {
      const rockfill = materialBox('rockfill');
      await type(pointInputs(rockfill, 'σ′n')[1], '120');
      (
        Array.from(el().querySelectorAll('button')).find((b) =>
          b.textContent?.includes('Put back the stored values'),
        ) as HTMLButtonElement
      ).click();
      await fixture.whenStable();
      expect(pointInputs(materialBox('rockfill'), 'σ′n').map((i) => i.value)).toEqual([
        '0',
        '100',
        '400',
      ]);
      await submit();
      expect(el().querySelector('.notice')?.textContent).toContain('Nothing has changed');
      backend.expectNone('/api/v1/sections/7/runs');
    });
  });
});
