import { type QuantityKind, fromSi, UNIT_LABELS } from '../model/units';
import { describeStrength, isRigid, strengthTint } from '../strength/registry';
import type { MaterialTint } from '../strength/types';
import type {
  Load,
  Material,
  Point,
  Polyline,
  Reinforcement,
  Section,
  UnitSystem,
} from '../model/types';

/** A reinforcing element's geometry in the section's own units (its capacities are not drawn). */
export type DrawingReinforcement =
  | (Pick<Reinforcement, 'name'> & { type: 'geosynthetic'; line: Polyline })
  | (Pick<Reinforcement, 'name'> & {
      type: 'nail';
      head: Point;
      inclination: number;
      toward: 'left' | 'right';
      length: number;
    })
  | (Pick<Reinforcement, 'name'> & {
      type: 'anchor';
      head: Point;
      inclination: number;
      toward: 'left' | 'right';
      freeLength: number;
      bondLength: number;
    })
  | (Pick<Reinforcement, 'name'> & {
      type: 'pile';
      x: number;
      top: number | null;
      bottom: number;
    });

/** A section's geometry for drawing, in its own units (the units of its result). */
export interface DrawingModel {
  units: UnitSystem;
  length: string;
  ground: Polyline;
  /**
   * Each stratum: its material's name, the file's description of it ('' when none), its strength
   * in words, whether it is a rigid base, and its kind and strength for its colour.
   */
  strata: {
    material: string;
    top: Polyline;
    description: string;
    describe: string;
    rigid: boolean;
    tint: MaterialTint;
  }[];
  water: { line: Polyline | null; ru: number | null };
  loads: Load[];
  /** The reinforcing elements, their geometry in the section's units. */
  reinforcement: DrawingReinforcement[];
  offset: number | null;
  labels: (typeof UNIT_LABELS)[UnitSystem];
}

function describe(m: Material, units: UnitSystem): string {
  const show = (v: number, kind: QuantityKind, digits: number) => {
    const x = fromSi(v, kind, units);
    return `${Number(digits >= 0 ? x.toFixed(digits) : x.toPrecision(-digits))} ${UNIT_LABELS[units][kind]}`;
  };
  return describeStrength(m.strength, show);
}

/**
 * The section (SI inside) converted back to its own units for drawing: ground, strata tops
 * with a short description of each material's strength, the piezometric line or ru, the
 * loads, the reinforcing elements' geometry and the centreline offset.
 *
 * @example sectionInUnits(section).ground // → [[0, 200], [40, 200], …] for a file in feet
 */
export function sectionInUnits(section: Section): DrawingModel {
  const u = section.units;
  const L = (v: number) => fromSi(v, 'length', u);
  const line = (pts: Polyline): Polyline => pts.map(([x, y]): Point => [L(x), L(y)]);
  const loads: Load[] = section.loads.map((l) =>
    l.type === 'strip'
      ? { ...l, from: L(l.from), to: L(l.to), pressure: fromSi(l.pressure, 'pressure', u) }
      : { ...l, x: L(l.x), force: fromSi(l.force, 'forcePerLength', u) },
  );
  const reinforcement = section.reinforcement.map((r): DrawingReinforcement => {
    switch (r.type) {
      case 'geosynthetic':
        return { type: r.type, name: r.name, line: line(r.line) };
      case 'nail':
        return {
          type: r.type,
          name: r.name,
          head: [L(r.head[0]), L(r.head[1])],
          inclination: r.inclination,
          toward: r.toward,
          length: L(r.length),
        };
      case 'anchor':
        return {
          type: r.type,
          name: r.name,
          head: [L(r.head[0]), L(r.head[1])],
          inclination: r.inclination,
          toward: r.toward,
          freeLength: L(r.freeLength),
          bondLength: L(r.bondLength),
        };
      case 'pile':
        return {
          type: r.type,
          name: r.name,
          x: L(r.x),
          top: r.top === null ? null : L(r.top),
          bottom: L(r.bottom),
        };
    }
  });
  return {
    units: u,
    length: UNIT_LABELS[u].length,
    ground: line(section.ground),
    strata: section.strata.map((s) => {
      const m = section.materials[s.material];
      return {
        material: s.material,
        top: line(s.top),
        description: m?.description ?? '',
        describe: m ? describe(m, u) : '',
        rigid: m ? isRigid(m.strength) : false,
        tint: m ? strengthTint(m.strength) : { kind: 'cohesive' as const, strength: 50 },
      };
    }),
    water: {
      line: section.water.kind === 'piezometric' ? line(section.water.line) : null,
      ru: section.water.kind === 'ru' ? section.water.ru : null,
    },
    loads,
    reinforcement,
    offset: section.offset === null ? null : L(section.offset),
    labels: UNIT_LABELS[u],
  };
}
