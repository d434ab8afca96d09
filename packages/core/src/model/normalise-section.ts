import { normaliseStrength } from '../strength/registry';
import { boundaryOverGround } from './boundary-over-ground';
import { lowerEnvelope } from '../geometry/lower-envelope';
import { mergeCase } from './merge-case';
import { normaliseProbability } from '../probability/normalise-probability';
import { normaliseReinforcement, normaliseRequiredReinforcement } from './normalise-reinforcement';
import type {
  RawAnalysis,
  RawCase,
  RawCrack,
  RawLoad,
  RawMaterial,
  RawSection,
  RawSeismic,
  RawStratum,
  RawWater,
} from './raw-section';
import type {
  Analysis,
  Crack,
  DesignCase,
  DrawdownDrainage,
  DrawdownSpec,
  Load,
  Material,
  Polyline,
  Section,
  Seismic,
  Stratum,
  UnitSystem,
  Water,
} from './types';
import { toSi } from './units';
import { SECTION_FORMAT } from '../formats';

/** Default unit weight of water: 9.81 kN/m³ for si files, 62.4 pcf for us files (common practice). */
function defaultWaterUnitWeight(units: UnitSystem): number {
  return units === 'us' ? toSi(62.4, 'unitWeight', 'us') : 9.81;
}

/**
 * A checked section, already in SI (see rawSectionToSi), with every default filled in: the
 * first stratum's top is the ground, every other top a polyline over the ground's x-range
 * clipped under the ground and under the stratum above; water none/piezometric/ru; loads [];
 * reinforcement []; seismic 0; no crack; methods [bishop], 30 slices, surface auto (none when only the infinite
 * slope is asked for). A section that lists cases gets each as a DesignCase: the section's
 * settings with the case's overrides merged (mergeCase), normalised by the same functions.
 * Assumes the section passed the schema and checkSection without errors.
 *
 * @example normaliseSection(rawSectionToSi(raw)).strata[0].top // → the ground
 */
export function normaliseSection(raw: RawSection): Section {
  const ground: Polyline = raw.ground.map(([x, y]) => [x, y]);
  const section: Section = {
    format: SECTION_FORMAT,
    id: raw.id,
    title: raw.title ?? raw.id,
    station: raw.station ?? null,
    offset: raw.offset ?? null,
    units: raw.units,
    ground,
    materials: normaliseMaterials(raw.materials),
    strata: normaliseStrata(raw.strata, ground),
    water: normaliseWater(raw.water, ground, raw.units),
    loads: normaliseLoads(raw.loads),
    reinforcement: normaliseReinforcement(raw.reinforcement, ground),
    seismic: normaliseSeismic(raw.seismic),
    crack: normaliseCrack(raw.crack),
    analysis: normaliseAnalysis(raw.analysis, ground),
  };
  if (raw.cases && raw.cases.length > 0)
    section.cases = raw.cases.map((c) => normaliseCase(raw, c, ground));
  if (raw.probability) section.probability = normaliseProbability(raw.probability, raw.units);
  return section;
}

/** The materials by name: unit weights filled in (saturated defaults to bulk; 0 for a rigid base without one). */
function normaliseMaterials(raw: Record<string, RawMaterial>): Record<string, Material> {
  const materials: Record<string, Material> = {};
  for (const [name, m] of Object.entries(raw)) {
    const unitWeight = m.unitWeight ?? 0;
    materials[name] = {
      name,
      ...(m.description ? { description: m.description } : {}),
      unitWeight,
      saturatedUnitWeight: m.saturatedUnitWeight ?? unitWeight,
      strength: normaliseStrength(m.strength),
    };
  }
  return materials;
}

/** The strata: the first one's top is the ground, each other top over the ground's x-range, clipped under the one above. */
function normaliseStrata(raw: RawStratum[], ground: Polyline): Stratum[] {
  const strata: Stratum[] = [];
  let above = ground;
  raw.forEach((s, i) => {
    const top =
      i === 0 || s.top === undefined
        ? ground.map(([x, y]): [number, number] => [x, y])
        : lowerEnvelope(boundaryOverGround(s.top, ground), above);
    strata.push({ material: s.material, top });
    above = top;
  });
  return strata;
}

/** The water: a piezometric line over the ground's x-range, ru, or none; γw by default. */
function normaliseWater(raw: RawWater | undefined, ground: Polyline, units: UnitSystem): Water {
  const unitWeight = raw?.unitWeight ?? defaultWaterUnitWeight(units);
  if (raw?.piezometric !== undefined)
    return { kind: 'piezometric', line: boundaryOverGround(raw.piezometric, ground), unitWeight };
  if (raw?.ru !== undefined) return { kind: 'ru', ru: raw.ru, unitWeight };
  return { kind: 'none', unitWeight };
}

/** The loads; a line load's angle 0 by default. */
function normaliseLoads(raw: RawLoad[] | undefined): Load[] {
  return (raw ?? []).map((l) =>
    l.type === 'strip'
      ? { type: 'strip', from: l.from, to: l.to, pressure: l.pressure }
      : { type: 'line', x: l.x, force: l.force, angle: l.angle ?? 0 },
  );
}

/** The seismic coefficients, 0 by default. */
function normaliseSeismic(raw: RawSeismic | undefined): Seismic {
  return { kh: raw?.kh ?? 0, kv: raw?.kv ?? 0 };
}

/** The tension crack, its water 0 deep by default; null for none. */
function normaliseCrack(raw: RawCrack | undefined): Crack | null {
  return raw ? { depth: raw.depth, waterDepth: raw.waterDepth ?? 0 } : null;
}

/** The analysis settings: methods [bishop], 30 slices, surface auto (none when only the infinite slope is asked for). */
function normaliseAnalysis(raw: RawAnalysis | undefined, ground: Polyline): Analysis {
  const a = raw ?? {};
  const methods = a.methods ? [...a.methods] : ['bishop' as const];
  const onlyInfinite = methods.every((m) => m === 'infinite-slope');
  return {
    methods,
    slices: a.slices ?? 30,
    surface: a.surface ? { ...a.surface } : onlyInfinite ? null : { type: 'auto' },
    infiniteSlope: a.infiniteSlope
      ? {
          angle: a.infiniteSlope.angle,
          depth: a.infiniteSlope.depth,
          waterRatio: a.infiniteSlope.waterRatio ?? 0,
        }
      : null,
    ...(a.interslice
      ? {
          interslice:
            a.interslice.shape === 'piecewise-linear'
              ? { shape: 'piecewise-linear', points: a.interslice.points.map(([x, f]) => [x, f]) }
              : { shape: a.interslice.shape },
        }
      : {}),
    ...(a.trialBand !== undefined ? { trialBand: a.trialBand } : {}),
    ...(a.searchEachMethod ? { searchEachMethod: true } : {}),
    ...(a.requiredReinforcement
      ? { requiredReinforcement: normaliseRequiredReinforcement(a.requiredReinforcement, ground) }
      : {}),
    case: a.case ?? null,
    requiredFs: a.requiredFs ?? null,
  };
}

/**
 * One case of a section: the section's settings with the case's merged in (mergeCase), then
 * normalised as the section's are. Its requirement is its own requiredFs, else the section's
 * analysis.requiredFs. A rapid-drawdown case's water after drawdown takes the unit weight of
 * the water before, and every material of the section that its drawdown does not list drains
 * freely. A seismic case always has its earthquake (null settings where not given); the other
 * kinds have none.
 */
function normaliseCase(raw: RawSection, c: RawCase, ground: Polyline): DesignCase {
  const merged = mergeCase(raw, c);
  const water = normaliseWater(merged.water, ground, raw.units);
  const analysis = normaliseAnalysis(merged.analysis, ground);
  return {
    name: c.name,
    kind: c.kind,
    requiredFs: analysis.requiredFs,
    governs: c.governs ? [...c.governs] : null,
    water,
    materials: normaliseMaterials(merged.materials),
    loads: normaliseLoads(merged.loads),
    reinforcement: normaliseReinforcement(merged.reinforcement, ground),
    seismic: normaliseSeismic(merged.seismic),
    crack: normaliseCrack(merged.crack),
    analysis,
    drawdown: c.drawdown ? normaliseDrawdown(c.drawdown, raw, water, ground) : null,
    earthquake:
      c.kind === 'seismic'
        ? {
            pga: c.earthquake?.pga ?? null,
            magnitude: c.earthquake?.magnitude ?? null,
            allowableDisplacement: c.earthquake?.allowableDisplacement ?? null,
          }
        : null,
  };
}

function normaliseDrawdown(
  raw: NonNullable<RawCase['drawdown']>,
  section: RawSection,
  before: Water,
  ground: Polyline,
): DrawdownSpec {
  const after = normaliseWater(
    { piezometric: raw.after.piezometric, unitWeight: before.unitWeight },
    ground,
    section.units,
  );
  const materials: Record<string, DrawdownDrainage> = {};
  for (const name of Object.keys(section.materials)) {
    const d = raw.materials?.[name];
    materials[name] =
      d?.drains === 'slow' ? { drains: 'slow', dR: d.dR, psiR: d.psiR } : { drains: 'free' };
  }
  return { after, materials };
}
