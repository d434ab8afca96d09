import { buildModel, buildPatch, placeErrors } from './rerun-model';
import type { LocatedError } from '../core/models';
import type { Reinforcement, SectionInput } from './section-types';
import { sectionWithStrengths } from '../testing/strength-fixtures';

/** Invented demo elements (Wendlecombe corridor), SI as the API stores them. */
const ELEMENTS: Reinforcement[] = [
  {
    type: 'geosynthetic',
    name: 'basal grid',
    line: [
      [10, 60],
      [40, 60],
    ],
    strength: 40,
    interaction: 0.8,
    coverage: 1,
    dividedByF: true,
  },
  {
    type: 'nail',
    name: 'nail row 1',
    head: [20, 64],
    inclination: 15,
    toward: 'right',
    length: 10,
    spacing: 1.5,
    tensileCapacity: 150,
    bond: 30,
    facingCapacity: 0,
    dividedByF: true,
  },
  {
    type: 'anchor',
    name: 'anchor A',
    head: [26.5, 70.5],
    inclination: 20,
    toward: 'right',
    freeLength: 6,
    bondLength: 5,
    spacing: 2,
    capacity: 300,
    bond: 60,
    acts: 'load',
    dividedByF: false,
  },
  {
    type: 'pile',
    name: 'toe piles',
    x: 16,
    top: null,
    bottom: 55,
    shear: 50,
    dividedByF: true,
  },
];

const reinforced = (): SectionInput => ({ ...sectionWithStrengths(), reinforcement: ELEMENTS });

describe('the re-run model of a reinforced section', () => {
  it("offers each element's capacities, at their places in the list", () => {
    const m = buildModel(reinforced());
    expect(m.reinforcement.map((e) => [e.name, e.fields.map((f) => f.path)])).toEqual([
      [
        'basal grid',
        ['reinforcement[0].strength', 'reinforcement[0].interaction', 'reinforcement[0].coverage'],
      ],
      [
        'nail row 1',
        [
          'reinforcement[1].tensileCapacity',
          'reinforcement[1].bond',
          'reinforcement[1].facingCapacity',
        ],
      ],
      ['anchor A', ['reinforcement[2].capacity', 'reinforcement[2].bond']],
      ['toe piles', ['reinforcement[3].shear']],
    ]);
    expect(m.reinforcement[1].fields.map((f) => [f.shown, f.unit])).toEqual([
      [150, 'kN'],
      [30, 'kN/m'],
      [0, 'kN'],
    ]);
  });

  it('sends nothing for the reinforcement while no capacity changed', () => {
    expect(buildPatch(buildModel(reinforced()))).toEqual({});
  });

  it('sends the whole list when one capacity changed, every element as the file writes it', () => {
    const m = buildModel(reinforced());
    m.reinforcement[1].fields.find((f) => f.key === 'bond')!.control.setValue(42);
    m.reinforcement[3].fields[0].control.setValue(80);
    const patch = buildPatch(m);
    expect(Object.keys(patch)).toEqual(['reinforcement']);
    const list = patch['reinforcement'] as Record<string, unknown>[];
    expect(list).toHaveLength(4);
    // a layer as its points, a pile without a top where the ground is its top
    expect(list[0]).toEqual({
      type: 'geosynthetic',
      name: 'basal grid',
      points: [
        [10, 60],
        [40, 60],
      ],
      strength: 40,
      interaction: 0.8,
      coverage: 1,
      dividedByF: true,
    });
    expect(list[1]).toMatchObject({ name: 'nail row 1', bond: 42, tensileCapacity: 150 });
    expect(list[2]).toEqual({ ...ELEMENTS[2] });
    expect(list[3]).toEqual({
      type: 'pile',
      name: 'toe piles',
      x: 16,
      bottom: 55,
      shear: 80,
      dividedByF: true,
    });
  });

  it('refuses a capacity out of range before sending', () => {
    const m = buildModel(reinforced());
    const ci = m.reinforcement[0].fields.find((f) => f.key === 'interaction')!;
    ci.control.setValue(2);
    expect(ci.control.errors?.['range']).toBe(
      'Interaction Ci must be greater than 0 and at most 1.5.',
    );
    const shear = m.reinforcement[3].fields[0];
    shear.control.setValue(-1);
    expect(shear.control.errors?.['range']).toBe('Shear resistance must be at least 0 kN/m.');
  });

  it("puts the API's located error on the element's field", () => {
    const m = buildModel(reinforced());
    const error: LocatedError = {
      severity: 'error',
      file: 'edited-section.json',
      line: 1,
      column: 1,
      path: 'reinforcement[2].capacity',
      code: 'below-minimum',
      message: 'capacity must be at least 0',
      sections: [],
    };
    expect(placeErrors(m, [error])).toEqual([]);
    expect(m.reinforcement[2].fields[0].control.errors?.['server']).toBe(
      'capacity must be at least 0',
    );
  });
});
