import { type QuantityKind, fromSi, UNIT_LABELS } from '../model/units';
import { describeStrength, isRigid, strengthTint } from '../strength/registry';
import type { MaterialTint } from '../strength/types';
import type { Load, Material, Point, Polyline, Section, UnitSystem } from '../model/types';

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
 * loads and the centreline offset.
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
    offset: section.offset === null ? null : L(section.offset),
    labels: UNIT_LABELS[u],
  };
}
