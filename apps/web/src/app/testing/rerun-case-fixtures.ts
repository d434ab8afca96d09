/**
 * For specs only: a stored flood bank of the invented Wendlecombe corridor (normalised, SI)
 * with three design cases, as the re-run form gets it: a long term case that is the section
 * as it is (the section's required FS), a steady seepage case that sets its own strength for
 * the core, and an earthquake case with kh, kv and an earthquake block (displacement held in m).
 */
import type { DesignCase, Material, SectionInput } from '../sections/section-types';

const shell: Material = {
  name: 'shell',
  unitWeight: 19,
  saturatedUnitWeight: 21,
  strength: { model: 'mohr-coulomb', cohesion: 0, frictionAngle: 36 },
};
const core: Material = {
  name: 'core',
  unitWeight: 19,
  saturatedUnitWeight: 20,
  strength: { model: 'mohr-coulomb', cohesion: 5, frictionAngle: 27 },
};
const base: Material = {
  name: 'base',
  unitWeight: 0,
  saturatedUnitWeight: 0,
  strength: { model: 'rigid' },
};

export function sectionWithCases(): SectionInput {
  const materials = { shell, core, base };
  const water: SectionInput['water'] = {
    kind: 'piezometric',
    line: [
      [0, 25],
      [47, 20],
      [70, 19.8],
    ],
    unitWeight: 9.81,
  };
  const analysis: SectionInput['analysis'] = {
    methods: ['bishop', 'spencer'],
    slices: 30,
    surface: { type: 'auto' },
    infiniteSlope: null,
    case: null,
    requiredFs: 1.5,
  };
  const asSection = {
    governs: null,
    water,
    materials,
    loads: [],
    reinforcement: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis,
    drawdown: null,
    earthquake: null,
  };
  const cases: DesignCase[] = [
    { ...asSection, name: 'long term', kind: 'long-term', requiredFs: 1.5 },
    {
      ...asSection,
      name: 'design flood, steady seepage',
      kind: 'steady-seepage',
      requiredFs: 1.3,
      materials: {
        ...materials,
        core: { ...core, strength: { model: 'mohr-coulomb', cohesion: 2, frictionAngle: 24 } },
      },
    },
    {
      ...asSection,
      name: 'earthquake',
      kind: 'seismic',
      requiredFs: 1.1,
      seismic: { kh: 0.1, kv: 0.02 },
      earthquake: { pga: 0.2, magnitude: 6, allowableDisplacement: 0.15 },
    },
  ];
  return {
    format: 'scarpline/1',
    id: 'wfb-1150',
    title: 'Wendle flood bank, Ch 1+150',
    station: 1150,
    offset: 30,
    units: 'si',
    ground: [
      [0, 20],
      [28, 26],
      [32, 26],
      [47, 20],
      [70, 20],
    ],
    materials,
    strata: [
      { material: 'shell', top: [] },
      { material: 'core', top: [] },
      { material: 'base', top: [] },
    ],
    water,
    loads: [],
    reinforcement: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis,
    cases,
  };
}
