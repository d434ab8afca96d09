import type { Point, UnitSystem } from './model/types';
import { type QuantityKind, fromSi, toSi } from './model/units';
import { caseView } from './case-view';
import type {
  DrawdownReport,
  GridReport,
  MethodReport,
  ReportedSurface,
  RequiredReinforcementReport,
  SectionResult,
  SeismicReport,
  StationResult,
} from './result';

/**
 * A reported slip surface with its lengths converted from one unit system to another.
 *
 * @example surfaceInUnits({ type: 'plane', angle: 30, depth: 3.048 }, 'si', 'us').depth // → 10
 */
export function surfaceInUnits(
  s: ReportedSurface,
  from: UnitSystem,
  to: UnitSystem,
): ReportedSurface {
  const L = (v: number) => fromSi(toSi(v, 'length', from), 'length', to);
  const pt = (p: Point): Point => [L(p[0]), L(p[1])];
  if (s.type === 'circle') return { ...s, center: pt(s.center), radius: L(s.radius) };
  if (s.type === 'polyline') return { ...s, points: s.points.map(pt) };
  if (s.type === 'plane') return { ...s, depth: L(s.depth) };
  return { ...s, pole: pt(s.pole), r0: L(s.r0), r1: L(s.r1), points: s.points.map(pt) };
}

/**
 * A section result with every value converted to another unit system: lengths, forces per
 * run and pressures of the methods, slices, surfaces and the search, and the station.
 * Angles, FS, λ and ratios do not change; the words of warnings are left as the solver wrote
 * them. The one place results change units: analyzeSection builds its result in SI and
 * converts it here to the file's units; the CLI converts here again for `--units`.
 *
 * @example resultInUnits(result, 'us').results[0].surface // → the circle in feet
 */
export function resultInUnits<T extends SectionResult>(r: T, to: UnitSystem): T {
  const from = r.units;
  if (from === to) return r;
  const c = (v: number, kind: QuantityKind) => fromSi(toSi(v, kind, from), kind, to);
  const L = (v: number) => c(v, 'length');
  const F = (v: number) => c(v, 'forcePerLength');
  const pt = (p: Point): Point => [L(p[0]), L(p[1])];
  const surface = (s: ReportedSurface | null): ReportedSurface | null =>
    s && surfaceInUnits(s, from, to);
  const grid = (g: GridReport): GridReport => ({
    ...g,
    x: [L(g.x[0]), L(g.x[1])],
    y: [L(g.y[0]), L(g.y[1])],
  });
  const method = (m: MethodReport): MethodReport => ({
    ...m,
    surface: surface(m.surface),
    ...(m.base ? { base: m.base.map(pt) } : {}),
    ...(m.ends ? { ends: { upper: pt(m.ends.upper), lower: pt(m.ends.lower) } } : {}),
    ...(m.crack
      ? {
          crack: {
            x: L(m.crack.x),
            depth: L(m.crack.depth),
            waterDepth: L(m.crack.waterDepth),
            waterForce: F(m.crack.waterForce),
          },
        }
      : {}),
    slices: m.slices.map((s) => ({
      ...s,
      x: L(s.x),
      width: L(s.width),
      baseLength: L(s.baseLength),
      weight: F(s.weight),
      porePressure: c(s.porePressure, 'pressure'),
      ...(s.cohesion !== undefined ? { cohesion: c(s.cohesion, 'pressure') } : {}),
      ...(s.strengthAt
        ? { strengthAt: { ...s.strengthAt, stress: c(s.strengthAt.stress, 'pressure') } }
        : {}),
      ...(s.reinforcement !== undefined ? { reinforcement: F(s.reinforcement) } : {}),
      normal: F(s.normal),
      shear: F(s.shear),
      interslice: {
        E: s.interslice.E === null ? null : F(s.interslice.E),
        X: s.interslice.X === null ? null : F(s.interslice.X),
        thrust: s.interslice.thrust === null ? null : L(s.interslice.thrust),
      },
    })),
    ...(m.reinforcement
      ? {
          reinforcement: m.reinforcement.map((e) => ({
            ...e,
            force: F(e.force),
            crossings: e.crossings.map((x) => ({
              ...x,
              at: pt(x.at),
              available: F(x.available),
              force: F(x.force),
              capacities: {
                strength: F(x.capacities.strength),
                behind: x.capacities.behind === null ? null : F(x.capacities.behind),
                front: x.capacities.front === null ? null : F(x.capacities.front),
              },
            })),
          })),
        }
      : {}),
    ...(m.massWeight !== undefined ? { massWeight: F(m.massWeight) } : {}),
    ...(m.leverArm !== undefined ? { leverArm: L(m.leverArm) } : {}),
  });
  const search = r.search
    ? {
        ...r.search,
        moves: r.search.moves.map((mv) => ({ ...mv, grid: grid(mv.grid) })),
        grid: r.search.grid ? grid(r.search.grid) : null,
        map: r.search.map
          ? { ...r.search.map, xs: r.search.map.xs.map(L), ys: r.search.map.ys.map(L) }
          : null,
        trialBand: {
          ...r.search.trialBand,
          surfaces: r.search.trialBand.surfaces.map((l) => ({
            ...l,
            surface: surface(l.surface) as ReportedSurface,
          })),
        },
      }
    : r.search;
  return {
    ...r,
    units: to,
    station: r.station === null ? null : L(r.station),
    results: r.results.map(method),
    ...(r.search !== undefined ? { search } : {}),
  };
}

/**
 * A station's result with every case converted to another unit system (resultInUnits on each
 * case's methods and search; the station as resultInUnits converts it).
 *
 * @example stationInUnits(result, 'us').cases[0].results[0].surface // → the circle in feet
 */
export function stationInUnits(r: StationResult, to: UnitSystem): StationResult {
  if (r.units === to) return r;
  const cases = r.cases.map((c) => {
    const v = resultInUnits({ ...caseView(r, c.name) }, to);
    return {
      ...c,
      results: v.results,
      search: v.search,
      ...(c.drawdown ? { drawdown: drawdownInUnits(c.drawdown, r.units, to) } : {}),
      ...(c.seismic ? { seismic: seismicInUnits(c.seismic, r.units, to) } : {}),
      ...(c.requiredReinforcement
        ? { requiredReinforcement: requiredInUnits(c.requiredReinforcement, r.units, to) }
        : {}),
    };
  });
  const station = resultInUnits({ ...caseView(r), results: [], search: null }, to).station;
  return { ...r, units: to, station, cases };
}

/**
 * The required reinforcement of a case in another unit system: level, extent and spacing as
 * lengths, a force per run (not a number of layers), the surface.
 */
export function requiredInUnits(
  r: RequiredReinforcementReport,
  from: UnitSystem,
  to: UnitSystem,
): RequiredReinforcementReport {
  if (from === to) return r;
  const c = (v: number, kind: QuantityKind) => fromSi(toSi(v, kind, from), kind, to);
  const L = (v: number) => c(v, 'length');
  return {
    ...r,
    level: L(r.level),
    from: L(r.from),
    to: L(r.to),
    ...(r.spacing !== undefined ? { spacing: L(r.spacing) } : {}),
    value: r.value !== null && r.kind === 'force' ? c(r.value, 'forcePerLength') : r.value,
    surface: r.surface ? surfaceInUnits(r.surface, from, to) : null,
  };
}

/** 1 inch in m, exactly (NIST SP 811, B.8). */
const INCH_IN_M = 0.0254;

/**
 * A displacement in SI (m) as results write it: mm in si files, in (inches) in us files — the
 * units displacement relations and allowable displacements are stated in.
 *
 * @example displacementOut(0.15, 'si') // → 150
 */
export function displacementOut(m: number, units: UnitSystem): number {
  return units === 'us' ? m / INCH_IN_M : m * 1000;
}

/**
 * The earthquake report of a seismic case in another unit system (`from` 'si' for the one
 * the analysis builds, whose displacements are in m): the ky surface's coordinates as lengths,
 * displacements in mm or in (displacementOut).
 */
export function seismicInUnits(
  s: SeismicReport,
  from: UnitSystem | 'built',
  to: UnitSystem,
): SeismicReport {
  if (from === to) return s;
  // as built by the analysis: SI lengths, displacements in m
  const m = (v: number) => (from === 'built' ? v : from === 'us' ? v * INCH_IN_M : v / 1000);
  const d = (v: number) => displacementOut(m(v), to);
  const lengths = from === 'built' ? 'si' : from;
  return {
    ...s,
    kySurface: s.kySurface ? surfaceInUnits(s.kySurface, lengths, to) : null,
    displacements: s.displacements.map((e) => ({
      ...e,
      median: d(e.median),
      plusOneSd: d(e.plusOneSd),
    })),
    allowable: s.allowable === null ? null : d(s.allowable),
  };
}

/**
 * The drawdown report of a rapid-drawdown case in another unit system: each slice's x as a
 * length and its strength as a pressure.
 */
export function drawdownInUnits(
  d: DrawdownReport,
  from: UnitSystem,
  to: UnitSystem,
): DrawdownReport {
  if (from === to) return d;
  const c = (v: number, kind: QuantityKind) => fromSi(toSi(v, kind, from), kind, to);
  return {
    ...d,
    slices: d.slices.map((s) => ({
      ...s,
      x: c(s.x, 'length'),
      strength: c(s.strength, 'pressure'),
    })),
  };
}
