/**
 * Builders for the verification cases: normalised sections in SI, sliced surfaces and the
 * method options every check needs.
 */
import {
  type Material,
  type Point,
  type Section,
  type SlicedSurface,
  prepareSection,
  sliceSurface,
} from '@scarpline/core';

export const GAMMA_W = 9.81;

export function mohrCoulomb(
  unitWeight: number,
  cohesion: number,
  frictionAngle: number,
  sat?: number,
): Material {
  return {
    name: 'soil',
    unitWeight,
    saturatedUnitWeight: sat ?? unitWeight,
    strength: { model: 'mohr-coulomb', cohesion, frictionAngle },
  };
}

export function undrained(
  unitWeight: number,
  su: number,
  suRate = 0,
  suDatum: number | null = null,
): Material {
  return {
    name: 'soil',
    unitWeight,
    saturatedUnitWeight: unitWeight,
    strength: { model: 'undrained', su, suRate, suDatum },
  };
}

/** A homogeneous section. */
export function homogeneous(
  ground: Point[],
  material: Material,
  over: Partial<Section> = {},
): Section {
  return {
    format: 'scarpline/1',
    id: 'check',
    title: 'verification case',
    station: null,
    offset: null,
    units: 'si',
    ground,
    materials: { soil: material },
    strata: [{ material: 'soil', top: ground }],
    water: { kind: 'none', unitWeight: GAMMA_W },
    loads: [],
    seismic: { kh: 0, kv: 0 },
    crack: null,
    analysis: {
      methods: ['bishop'],
      slices: 40,
      surface: null,
      infiniteSlope: null,
      case: null,
      requiredFs: null,
    },
    ...over,
  };
}

/** A simple slope: flat toe at y = 0 up to x = toe, rising at 1 : run to height h, flat crest beyond. */
export function simpleSlope(h: number, run: number, toe = 20, width = 100): Point[] {
  return [
    [0, 0],
    [toe, 0],
    [toe + h * run, h],
    [toe + h * run + width, h],
  ];
}

export function cut(
  section: Section,
  surface: Parameters<typeof sliceSurface>[1],
  n = 40,
): SlicedSurface {
  const out = sliceSurface(prepareSection(section), surface, n);
  if (!out.ok) throw new Error(out.reason);
  return out;
}

/** Method options for a circle: the centre in sliding orientation. */
export function circleOptions(sliced: SlicedSurface, center: Point, section: Section) {
  return {
    seismic: section.seismic,
    pivot: [(sliced.slices.mirrored ? -1 : 1) * center[0], center[1]] as Point,
  };
}

export const relErr = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
