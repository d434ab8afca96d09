import type { Material, Section } from '../../src/model/types';

/** Mohr–Coulomb material for tests. */
export function mc(
  name: string,
  unitWeight: number,
  cohesion: number,
  frictionAngle: number,
  sat?: number,
): Material {
  return {
    name,
    unitWeight,
    saturatedUnitWeight: sat ?? unitWeight,
    strength: { model: 'mohr-coulomb', cohesion, frictionAngle },
  };
}

/** A normalised section for tests: a homogeneous 2:1 cut unless told otherwise. */
export function makeSection(over: Partial<Section> = {}): Section {
  const ground = over.ground ?? [
    [0, 10],
    [10, 10],
    [30, 20],
    [50, 20],
  ];
  return {
    format: 'scarpline/1',
    id: 'test',
    title: 'test',
    station: null,
    offset: null,
    units: 'si',
    ground,
    materials: over.materials ?? { soil: mc('soil', 18, 10, 25) },
    strata: over.strata ?? [{ material: 'soil', top: ground }],
    water: over.water ?? { kind: 'none', unitWeight: 9.81 },
    loads: over.loads ?? [],
    reinforcement: over.reinforcement ?? [],
    seismic: over.seismic ?? { kh: 0, kv: 0 },
    crack: over.crack ?? null,
    analysis: over.analysis ?? {
      methods: ['bishop'],
      slices: 30,
      surface: null,
      infiniteSlope: null,
      case: null,
      requiredFs: null,
    },
    ...over,
  };
}

/** The 2:1 cut of makeSection with a water line inside it (no ponded water). */
export function wetSection(over: Partial<Section> = {}): Section {
  return makeSection({
    water: {
      kind: 'piezometric',
      line: [
        [0, 8],
        [10, 8],
        [30, 15],
        [50, 15],
      ],
      unitWeight: 9.81,
    },
    ...over,
  });
}
