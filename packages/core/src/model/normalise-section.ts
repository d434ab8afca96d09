import { normaliseStrength } from '../strength/registry';
import { boundaryOverGround } from './boundary-over-ground';
import { lowerEnvelope } from '../geometry/lower-envelope';
import type { RawSection } from './raw-section';
import type { Analysis, Load, Material, Polyline, Section, Stratum, Water } from './types';
import { toSi } from './units';
import { SECTION_FORMAT } from '../formats';

/** Default unit weight of water: 9.81 kN/m³ for si files, 62.4 pcf for us files (common practice). */
function defaultWaterUnitWeight(units: RawSection['units']): number {
  return units === 'us' ? toSi(62.4, 'unitWeight', 'us') : 9.81;
}

/**
 * A checked section, already in SI (see rawSectionToSi), with every default filled in: the
 * first stratum's top is the ground, every other top a polyline over the ground's x-range
 * clipped under the ground and under the stratum above; water none/piezometric/ru; loads [];
 * seismic 0; no crack; methods [bishop], 30 slices, surface auto (none when only the infinite
 * slope is asked for). Assumes the section passed the schema and checkSection without errors.
 *
 * @example normaliseSection(rawSectionToSi(raw)).strata[0].top // → the ground
 */
export function normaliseSection(raw: RawSection): Section {
  const ground: Polyline = raw.ground.map(([x, y]) => [x, y]);

  const materials: Record<string, Material> = {};
  for (const [name, m] of Object.entries(raw.materials)) {
    const unitWeight = m.unitWeight ?? 0;
    const strength = normaliseStrength(m.strength);
    materials[name] = {
      name,
      ...(m.description ? { description: m.description } : {}),
      unitWeight,
      saturatedUnitWeight: m.saturatedUnitWeight ?? unitWeight,
      strength,
    };
  }

  const strata: Stratum[] = [];
  let above = ground;
  raw.strata.forEach((s, i) => {
    const top =
      i === 0 || s.top === undefined
        ? ground.map(([x, y]): [number, number] => [x, y])
        : lowerEnvelope(boundaryOverGround(s.top, ground), above);
    strata.push({ material: s.material, top });
    above = top;
  });

  const unitWeight = raw.water?.unitWeight ?? defaultWaterUnitWeight(raw.units);
  let water: Water = { kind: 'none', unitWeight };
  if (raw.water?.piezometric !== undefined) {
    water = {
      kind: 'piezometric',
      line: boundaryOverGround(raw.water.piezometric, ground),
      unitWeight,
    };
  } else if (raw.water?.ru !== undefined) water = { kind: 'ru', ru: raw.water.ru, unitWeight };

  const loads: Load[] = (raw.loads ?? []).map((l) =>
    l.type === 'strip'
      ? { type: 'strip', from: l.from, to: l.to, pressure: l.pressure }
      : { type: 'line', x: l.x, force: l.force, angle: l.angle ?? 0 },
  );

  const a = raw.analysis ?? {};
  const methods = a.methods ? [...a.methods] : ['bishop' as const];
  const onlyInfinite = methods.every((m) => m === 'infinite-slope');
  const analysis: Analysis = {
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
    case: a.case ?? null,
    requiredFs: a.requiredFs ?? null,
  };

  return {
    format: SECTION_FORMAT,
    id: raw.id,
    title: raw.title ?? raw.id,
    station: raw.station ?? null,
    offset: raw.offset ?? null,
    units: raw.units,
    ground,
    materials,
    strata,
    water,
    loads,
    seismic: { kh: raw.seismic?.kh ?? 0, kv: raw.seismic?.kv ?? 0 },
    crack: raw.crack ? { depth: raw.crack.depth, waterDepth: raw.crack.waterDepth ?? 0 } : null,
    analysis,
  };
}
