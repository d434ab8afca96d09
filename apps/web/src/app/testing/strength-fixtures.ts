/**
 * For specs only: a stored section of the invented Wendlecombe corridor (normalised, SI) whose
 * materials take the strengths that vary with stress, as the re-run form gets it: a mudstone in
 * Hoek–Brown, two soft clays with Su from σ′v (one with a constant OCR, one with a POP), a
 * rockfill as shear–normal points and a fill with a bilinear envelope; its second design case
 * sets its own points for the rockfill.
 */
import type { DesignCase, Material, SectionInput } from '../sections/section-types';

const mudstone: Material = {
  name: 'mudstone',
  unitWeight: 24,
  saturatedUnitWeight: 24,
  strength: { model: 'hoek-brown', intactStrength: 15000, gsi: 35, mi: 8, disturbance: 0.7 },
};
const softClay: Material = {
  name: 'soft-clay',
  unitWeight: 16,
  saturatedUnitWeight: 16.5,
  strength: {
    model: 'undrained-ratio',
    ratio: 0.22,
    minimum: 8,
    exponent: 0.8,
    ocr: 1.5,
    pop: null,
  },
};
const crustClay: Material = {
  name: 'crust-clay',
  unitWeight: 17,
  saturatedUnitWeight: 17.5,
  strength: { model: 'undrained-ratio', ratio: 0.25, minimum: 0, exponent: 0.8, ocr: 1, pop: 30 },
};
const rockfill: Material = {
  name: 'rockfill',
  unitWeight: 20,
  saturatedUnitWeight: 21,
  strength: {
    model: 'shear-normal',
    points: [
      [0, 0],
      [100, 95],
      [400, 300.123456789],
    ],
    beyond: 'extend',
  },
};
const fill: Material = {
  name: 'fill',
  unitWeight: 19,
  saturatedUnitWeight: 20,
  strength: {
    model: 'bilinear',
    cohesion: 3,
    frictionAngle: 38,
    breakStress: 150,
    frictionAngleBeyond: 32,
  },
};

export function sectionWithStrengths(): SectionInput {
  const materials = {
    mudstone,
    'soft-clay': softClay,
    'crust-clay': crustClay,
    rockfill,
    fill,
  };
  const water: SectionInput['water'] = { kind: 'none', unitWeight: 9.81 };
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
      name: 'loose rockfill',
      kind: 'long-term',
      requiredFs: 1.3,
      materials: {
        ...materials,
        rockfill: {
          ...rockfill,
          strength: {
            model: 'shear-normal',
            points: [
              [0, 0],
              [100, 80],
            ],
            beyond: 'hold',
          },
        },
      },
    },
  ];
  return {
    format: 'scarpline/1',
    id: 'wcb-3050-R',
    title: 'Wendlecombe bypass, Ch 3+050 right',
    station: 3050,
    offset: 0,
    units: 'si',
    ground: [
      [0, 100],
      [20, 100],
      [30, 120],
      [70, 123],
    ],
    materials,
    strata: [
      { material: 'fill', top: [] },
      { material: 'rockfill', top: [] },
      { material: 'crust-clay', top: [] },
      { material: 'soft-clay', top: [] },
      { material: 'mudstone', top: [] },
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
