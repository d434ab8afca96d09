import { provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ReinforcementTable } from './reinforcement-table';
import { RequiredReinforcementView } from './required-reinforcement';
import { SliceTable } from './slice-table';
import { explain } from './warning-codes';
import type {
  MethodReport,
  ReinforcementReport,
  RequiredReinforcementReport,
  SliceReport,
} from './section-types';

const circle = { type: 'circle' as const, center: [18, 84] as [number, number], radius: 23 };

/** A method's reinforcement as the solver reports it (invented demo values, kN/m). */
const ELEMENTS: ReinforcementReport[] = [
  {
    name: 'nail row 1',
    type: 'nail',
    dividedByF: true,
    force: 44.71,
    crossings: [
      {
        at: [25.93, 62.41],
        slice: 18,
        available: 77.19,
        force: 44.71,
        mode: 'pullout',
        counted: true,
        direction: -15,
        capacities: { strength: 100, behind: 77.19, front: 162.8 },
      },
    ],
  },
  { name: 'crest grid', type: 'geosynthetic', dividedByF: true, force: 0, crossings: [] },
  {
    name: 'anchor A',
    type: 'anchor',
    dividedByF: false,
    force: 150,
    crossings: [
      {
        at: [34.2, 67.7],
        slice: 28,
        available: 150,
        force: 150,
        mode: 'strength',
        counted: true,
        direction: -20,
        capacities: { strength: 150, behind: null, front: null },
      },
    ],
  },
];

const slice = (reinforcement?: number): SliceReport => ({
  x: 4,
  width: 1,
  alpha: 12,
  baseLength: 1.02,
  weight: 30,
  porePressure: 0,
  normal: 28,
  shear: 9,
  interslice: { E: null, X: null, thrust: null },
  material: 'till',
  ...(reinforcement !== undefined ? { reinforcement } : {}),
});

const report = (reinforcement?: ReinforcementReport[], slices = [slice()]): MethodReport => ({
  method: 'bishop',
  fs: 1.727,
  converged: true,
  iterations: 8,
  surface: circle,
  slices,
  warnings: [],
  ...(reinforcement ? { reinforcement } : {}),
});

const rowsOf = (el: HTMLElement, testid: string) =>
  Array.from(el.querySelectorAll(`[data-testid=${testid}] tbody tr`)).map((tr) =>
    Array.from(tr.querySelectorAll('th, td')).map((c) =>
      (c.textContent ?? '').replace(/\s+/g, ' ').trim(),
    ),
  );

describe('ReinforcementTable', () => {
  beforeEach(() =>
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] }),
  );

  async function render(units: 'si' | 'us') {
    const fixture = TestBed.createComponent(ReinforcementTable);
    fixture.componentRef.setInput('methods', [report(ELEMENTS)]);
    fixture.componentRef.setInput('governing', 'bishop');
    fixture.componentRef.setInput('units', units);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('lists each crossing with its force, what limits it in words, and an element not crossed', async () => {
    const el = await render('si');
    expect(rowsOf(el, 'reinforcement-table')).toEqual([
      [
        'nail row 1',
        'soil nail',
        '(25.93, 62.41)',
        '18',
        '44.7',
        '77.2',
        'pullout behind the surface',
        'yes',
      ],
      ['crest grid', 'geosynthetic layer', 'not crossed', '—', '0.0', '—', '—', 'yes'],
      [
        'anchor A',
        'ground anchor',
        '(34.20, 67.70)',
        '28',
        '150.0',
        '150.0',
        'bar strength',
        'no (full value)',
      ],
    ]);
    const head = el.querySelector('[data-testid=reinforcement-table] thead')?.textContent ?? '';
    expect(head).toContain('kN/m');
    expect(el.querySelector('[data-testid=reinforcement-note]')?.textContent).toContain(
      "Bishop's simplified",
    );
  });

  it("gives the forces in the result's units", async () => {
    const el = await render('us');
    const head = el.querySelector('[data-testid=reinforcement-table] thead')?.textContent ?? '';
    expect(head).toContain('lbf/ft');
    expect(head).not.toContain('kN/m');
  });
});

describe('the slice table with reinforcement', () => {
  async function render(slices: SliceReport[]) {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    const fixture = TestBed.createComponent(SliceTable);
    fixture.componentRef.setInput('methods', [report(undefined, slices)]);
    fixture.componentRef.setInput('governing', 'bishop');
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  it('shows the force on each slice where the result has it, blank where none crosses', async () => {
    const el = await render([slice(), slice(28.96)]);
    expect(el.querySelector('[data-testid=slice-reinforcement]')?.textContent).toContain('kN/m');
    expect(rowsOf(el, 'slice-table').map((r) => r.at(-1))).toEqual(['', '28.96']);
  });

  it('has no such column for a result without reinforcement', async () => {
    const el = await render([slice(), slice()]);
    expect(el.querySelector('[data-testid=slice-reinforcement]')).toBeNull();
  });
});

describe('RequiredReinforcementView', () => {
  const base: RequiredReinforcementReport = {
    kind: 'force',
    level: 63,
    from: 0,
    to: 70,
    dividedByF: true,
    requiredFs: 1.5,
    reached: true,
    value: 86.25,
    fs: 1.503,
    method: 'bishop',
    surface: circle,
    analyses: 9,
  };

  async function render(r: RequiredReinforcementReport, units: 'si' | 'us' = 'si') {
    TestBed.configureTestingModule({ providers: [provideZonelessChangeDetection()] });
    const fixture = TestBed.createComponent(RequiredReinforcementView);
    fixture.componentRef.setInput('report', r);
    fixture.componentRef.setInput('units', units);
    await fixture.whenStable();
    return ((fixture.nativeElement as HTMLElement).textContent ?? '').replace(/\s+/g, ' ');
  }

  it('a force per run with its unit, and the FS it gives', async () => {
    const text = await render(base);
    expect(text).toContain('86.3 kN/m of uniform horizontal force per run');
    expect(text).toContain('1.503');
    expect(text).toContain('against the required 1.5');
    expect(text).toContain('at elevation 63 m');
    expect(text).toContain('9 analyses');
    TestBed.resetTestingModule();
    expect(await render(base, 'us')).toContain('86.3 lbf/ft');
  });

  it('a number of layers', async () => {
    const text = await render({ ...base, kind: 'layers', value: 3, spacing: 0.5 });
    expect(text).toContain('3 layers of the geosynthetic product given');
    expect(text).toContain('every 0.5 m');
  });

  it('the reason when no value was found', async () => {
    const text = await render({
      ...base,
      reached: false,
      value: null,
      fs: null,
      method: null,
      surface: null,
      reason: 'even 20 layers leave the FS at 1.31',
    });
    expect(text).toContain('No value found: even 20 layers leave the FS at 1.31.');
  });
});

describe('the reinforcement warnings in words', () => {
  it('explains each code the solver raises', () => {
    for (const code of [
      'reinforcement-not-crossed',
      'reinforcement-fully-mobilised',
      'reinforcement-ignored',
    ])
      expect(explain(code)?.title).toBeTruthy();
  });
});
