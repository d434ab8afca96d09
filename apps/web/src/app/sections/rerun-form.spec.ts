import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed, type ComponentFixture } from '@angular/core/testing';
import { RerunForm } from './rerun-form';
import type { SectionInput, SectionView } from './section-types';
import { apiTestProviders, verifyAndReset } from '../testing/api-testing';

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
});
