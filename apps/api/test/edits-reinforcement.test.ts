/**
 * A re-run's edit of a reinforcing element: the list is sent whole (a merge patch replaces a
 * list), in SI, as the section document writes it; a bad capacity is refused at its place.
 * Pure (checkEdits needs no database).
 */
import { parseSections } from '@scarpline/core/input';
import { reinforcementDocument } from '@scarpline/core/model';
import { checkEdits } from '../src/services/edits';
import { Problem } from '../src/errors';

// Invented demo data (Wendlecombe corridor).
const stored = parseSections(
  `
format: scarpline/1
id: wcb-1240-N
title: nailed cut
units: si
ground: [[0, 62], [18, 62], [28, 72], [70, 74]]
materials:
  till: { unitWeight: 20.5, strength: { model: mohr-coulomb, cohesion: 6, frictionAngle: 29 } }
strata: [{ material: till }]
reinforcement:
  - { type: nail, name: nail 1, head: [20, 64], inclination: 15, length: 10, spacing: 1.5, tensileCapacity: 150, bond: 30 }
  - { type: pile, name: toe piles, x: 16, bottom: 55, shear: 50 }
analysis:
  methods: [bishop]
  surface: { type: circle, center: [18, 84], radius: 23 }
`,
  'nailed.yaml',
).sections[0];

test('an element edited in the whole list: the section has the new capacity, the rest kept', () => {
  const list = stored.reinforcement.map(reinforcementDocument);
  list[0] = { ...list[0], bond: 42 } as (typeof list)[0];
  const { section } = checkEdits(stored, { reinforcement: list });
  expect(section.reinforcement[0]).toMatchObject({ type: 'nail', bond: 42, tensileCapacity: 150 });
  expect(section.reinforcement[1]).toEqual(stored.reinforcement[1]);
});

test('a capacity out of range is refused with the place of the value', () => {
  const list = stored.reinforcement.map(reinforcementDocument);
  list[1] = { ...list[1], shear: -5 } as (typeof list)[1];
  let problem: unknown = null;
  try {
    checkEdits(stored, { reinforcement: list });
  } catch (e) {
    problem = e;
  }
  expect(problem).toBeInstanceOf(Problem);
  const errors = (problem as Problem).extra.errors as { path: string }[];
  expect(errors.map((e) => e.path)).toContain('reinforcement[1].shear');
});
