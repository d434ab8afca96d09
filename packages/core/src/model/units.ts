/**
 * Units: Scarpline computes in SI (m, kN, kPa, kN/m³). A file in `us` units (ft, lbf, psf,
 * pcf) is converted on input, and results go back in the file's units. This module is the only
 * place with conversion factors: each is derived below from the exact definitions of NIST
 * SP 811 (2008), Appendix B, and checked against mathjs in packages/core/test/units.test.ts.
 */
import { strengthQuantities } from '../strength/registry';
import type {
  RawBoundary,
  RawCase,
  RawCrack,
  RawLoad,
  RawMaterialOverride,
  RawReinforcement,
  RawSection,
  RawWater,
} from './raw-section';
import type { Point, SurfaceSpec, UnitSystem } from './types';

/**
 * The kinds of quantity that differ between the unit systems (angles and ratios do not). A
 * displacement is a length written in a smaller unit (mm, in): the permanent displacement of a
 * slope in an earthquake, a few centimetres.
 */
export type QuantityKind =
  | 'length'
  | 'force'
  | 'forcePerLength'
  | 'pressure'
  | 'unitWeight'
  | 'pressurePerLength'
  | 'displacement';

/** Every quantity kind, in a fixed order. */
export const QUANTITY_KINDS: readonly QuantityKind[] = [
  'length',
  'force',
  'forcePerLength',
  'pressure',
  'unitWeight',
  'pressurePerLength',
  'displacement',
];

/** 1 ft in m, exactly (NIST SP 811, B.8: the international foot). */
export const FOOT_IN_M = 0.3048;
/** 1 in in m, exactly (NIST SP 811, B.8). */
export const INCH_IN_M = 0.0254;
/** 1 lb (avoirdupois pound) in kg, exactly (NIST SP 811, B.8). */
export const POUND_IN_KG = 0.45359237;
/** Standard acceleration of gravity g_n in m/s², exactly (NIST SP 811, B.8; CGPM 1901). */
export const STANDARD_GRAVITY = 9.80665;
/**
 * 1 lbf in N: the weight of one pound under standard gravity, 0.45359237 kg × 9.80665 m/s² =
 * 4.4482216152605 N exactly (NIST SP 811, B.8); the product of the two doubles is the double
 * nearest to that decimal (checked in the units test).
 */
export const POUND_FORCE_IN_N = POUND_IN_KG * STANDARD_GRAVITY;

const N = POUND_FORCE_IN_N;
const FT = FOOT_IN_M;

/**
 * SI value of one `us` unit of each kind: multiply a us value by it to get SI. psf = lbf/ft²,
 * pcf = lbf/ft³ and lbf/ft are derived from the foot and the pound-force (in N, then to kN);
 * a rate of Su with depth (psf/ft) has the dimension of a unit weight.
 *
 * @example US_TO_SI.length // → 0.3048 (m per ft)
 */
export const US_TO_SI: Readonly<Record<QuantityKind, number>> = Object.freeze({
  length: FT,
  force: N / 1000,
  forcePerLength: N / FT / 1000,
  pressure: N / FT ** 2 / 1000,
  unitWeight: N / FT ** 3 / 1000,
  pressurePerLength: N / FT ** 2 / FT / 1000,
  displacement: INCH_IN_M,
});

/**
 * SI value of one `si` file unit of each kind: 1 (the file's unit is the SI unit), except a
 * displacement, written in mm in an si file (in in a us file) and held in m inside.
 *
 * @example SI_FILE_TO_SI.displacement // → 0.001 (m per mm)
 */
export const SI_FILE_TO_SI: Readonly<Record<QuantityKind, number>> = Object.freeze({
  length: 1,
  force: 1,
  forcePerLength: 1,
  pressure: 1,
  unitWeight: 1,
  pressurePerLength: 1,
  displacement: 0.001,
});

/** Unit symbols for messages and output. */
export const UNIT_LABELS: Readonly<Record<UnitSystem, Readonly<Record<QuantityKind, string>>>> = {
  si: {
    length: 'm',
    force: 'kN',
    forcePerLength: 'kN/m',
    pressure: 'kPa',
    unitWeight: 'kN/m³',
    pressurePerLength: 'kPa/m',
    displacement: 'mm',
  },
  us: {
    length: 'ft',
    force: 'lbf',
    forcePerLength: 'lbf/ft',
    pressure: 'psf',
    unitWeight: 'pcf',
    pressurePerLength: 'psf/ft',
    displacement: 'in',
  },
};

/**
 * A value in the given unit system converted to SI.
 *
 * @example toSi(10, 'length', 'us') // → 3.048
 * @example toSi(150, 'displacement', 'si') // → 0.15 (mm to m)
 */
export function toSi(value: number, kind: QuantityKind, units: UnitSystem): number {
  return units === 'us' ? value * US_TO_SI[kind] : value * SI_FILE_TO_SI[kind];
}

/**
 * An SI value converted to the given unit system (for reporting results).
 *
 * @example fromSi(3.048, 'length', 'us') // → 10
 */
export function fromSi(value: number, kind: QuantityKind, units: UnitSystem): number {
  return units === 'us' ? value / US_TO_SI[kind] : value / SI_FILE_TO_SI[kind];
}

const pointToSi = (p: Point, f: number): Point => [p[0] * f, p[1] * f];
const boundaryToSi = (b: RawBoundary, f: number): RawBoundary =>
  typeof b === 'number' ? b * f : b.map((p) => pointToSi(p, f));

function surfaceToSi(s: SurfaceSpec, f: number): SurfaceSpec {
  if (s.type === 'circle' && 'center' in s) {
    return { ...s, center: pointToSi(s.center, f), radius: s.radius * f };
  }
  if (s.type === 'polyline' && 'points' in s) {
    return { ...s, points: s.points.map((p) => pointToSi(p, f)) };
  }
  // Search settings (grid, ground ranges, noncircular) get their shape in a later version of
  // the format; they are passed through as written.
  return { ...s };
}

/** The SI value of one file unit of each kind, in a unit system. */
type Factor = (kind: QuantityKind) => number;

function materialsToSi(materials: Record<string, RawMaterialOverride>, f: Factor): void {
  for (const m of Object.values(materials)) {
    if (m.unitWeight !== undefined) m.unitWeight *= f('unitWeight');
    if (m.saturatedUnitWeight !== undefined) m.saturatedUnitWeight *= f('unitWeight');
    if (!m.strength) continue;
    const s = m.strength as unknown as Record<string, number | number[][]>;
    for (const [key, kind] of Object.entries(strengthQuantities(m.strength))) {
      const v = s[key];
      if (!kind || v === undefined) continue;
      // a list of points (σn, τ): every number in it is of the kind
      s[key] = Array.isArray(v) ? v.map((p) => p.map((x) => x * f(kind))) : v * f(kind);
    }
  }
}

function waterToSi(w: RawWater | undefined, f: Factor): void {
  if (!w) return;
  if (w.piezometric !== undefined) w.piezometric = boundaryToSi(w.piezometric, f('length'));
  if (w.unitWeight !== undefined) w.unitWeight *= f('unitWeight');
}

function loadsToSi(loads: RawLoad[] | undefined, f: Factor): void {
  const L = f('length');
  for (const load of loads ?? []) {
    if (load.type === 'strip') {
      load.from *= L;
      load.to *= L;
      load.pressure *= f('pressure');
    } else {
      load.x *= L;
      load.force *= f('forcePerLength');
    }
  }
}

function reinforcementToSi(list: RawReinforcement[] | undefined, f: Factor): void {
  const L = f('length');
  for (const r of list ?? []) {
    switch (r.type) {
      case 'geosynthetic':
        if (r.elevation !== undefined) r.elevation *= L;
        if (r.from !== undefined) r.from *= L;
        if (r.to !== undefined) r.to *= L;
        if (r.points) r.points = r.points.map((p) => pointToSi(p, L));
        r.strength *= f('forcePerLength');
        break;
      case 'nail':
        r.head = pointToSi(r.head, L);
        r.length *= L;
        r.spacing *= L;
        r.tensileCapacity *= f('force');
        r.bond *= f('forcePerLength');
        if (r.facingCapacity !== undefined) r.facingCapacity *= f('force');
        break;
      case 'anchor':
        r.head = pointToSi(r.head, L);
        r.freeLength *= L;
        r.bondLength *= L;
        r.spacing *= L;
        r.capacity *= f('force');
        if (r.bond !== undefined) r.bond *= f('forcePerLength');
        break;
      case 'pile':
        r.x *= L;
        if (r.top !== undefined) r.top *= L;
        r.bottom *= L;
        r.shear *= f('forcePerLength');
        break;
    }
  }
}

function crackToSi(crack: RawCrack | undefined, L: number): void {
  if (!crack) return;
  if (typeof crack.depth === 'number') crack.depth *= L;
  if (crack.waterDepth !== undefined) crack.waterDepth *= L;
}

function analysisToSi(a: RawCase['analysis'], f: Factor): void {
  if (!a) return;
  const L = f('length');
  const req = a.requiredReinforcement;
  if (req) {
    req.level *= L;
    if (req.from !== undefined) req.from *= L;
    if (req.to !== undefined) req.to *= L;
    if (req.spacing !== undefined) req.spacing *= L;
    if (req.product) req.product.strength *= f('forcePerLength');
  }
  if (a.surface) a.surface = surfaceToSi(a.surface, L);
  if (a.infiniteSlope) a.infiniteSlope.depth *= L;
}

/** A case's own settings in SI: its overrides as the section's, its drawdown and earthquake. */
function caseToSi(c: RawCase, f: Factor): void {
  const L = f('length');
  if (c.materials) materialsToSi(c.materials, f);
  waterToSi(c.water, f);
  loadsToSi(c.loads, f);
  reinforcementToSi(c.reinforcement, f);
  crackToSi(c.crack, L);
  analysisToSi(c.analysis, f);
  if (c.drawdown) {
    c.drawdown.after.piezometric = boundaryToSi(c.drawdown.after.piezometric, L);
    for (const d of Object.values(c.drawdown.materials ?? {}))
      if (d.drains === 'slow') d.dR *= f('pressure');
  }
  const e = c.earthquake;
  if (e?.allowableDisplacement !== undefined) e.allowableDisplacement *= f('displacement');
}

/**
 * A schema-valid section converted to SI, its cases included. `units` keeps the file's
 * system so that results can be reported back in it. Values whose file unit is the SI unit
 * (every one in an si file but a displacement, written in mm) keep their numbers exactly.
 *
 * @example rawSectionToSi(usSection).ground // → the ground in metres
 */
export function rawSectionToSi(raw: RawSection): RawSection {
  const copy = JSON.parse(JSON.stringify(raw)) as RawSection;
  const units = raw.units;
  const f: Factor = (kind) => (units === 'us' ? US_TO_SI[kind] : SI_FILE_TO_SI[kind]);
  const L = f('length');

  // station (chainage) and offset place the section on the corridor: labels, kept as given
  copy.ground = copy.ground.map((p) => pointToSi(p, L));
  materialsToSi(copy.materials, f);
  for (const st of copy.strata) if (st.top !== undefined) st.top = boundaryToSi(st.top, L);
  waterToSi(copy.water, f);
  loadsToSi(copy.loads, f);
  reinforcementToSi(copy.reinforcement, f);
  crackToSi(copy.crack, L);
  analysisToSi(copy.analysis, f);
  for (const c of copy.cases ?? []) caseToSi(c, f);
  return copy;
}
