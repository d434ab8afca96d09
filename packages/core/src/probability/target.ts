/**
 * The one home of "a numeric input of a section": a target names it (a short path, e.g.
 * `materials.clay.cohesion`), reads its value and applies a new value to a section, giving a
 * new section (the one given is never changed). The random variables, the sensitivity plots
 * and solving for a value all name their inputs so.
 *
 * Targets (names of materials and reinforcement are everything between the first and the
 * last dot, so a name may hold dots):
 * - `materials.<name>.<parameter>`: unitWeight, saturatedUnitWeight, any number of its strength
 *   (cohesion, frictionAngle, su, suRate, suDatum, intactStrength, gsi, mi, disturbance, ratio,
 *   minimum, exponent, ocr, pop, breakStress, frictionAngleBeyond), or tanFrictionAngle (tan φ′:
 *   the friction angle set to its arctangent);
 * - `water.level`: a shift of the whole piezometric line up (+) or down (−), m; `water.ru`;
 * - `loads.<index>.<parameter>` (from 0 in the file's order): pressure, from, to of a strip;
 *   force, angle, x of a line load;
 * - `seismic.kh`, `seismic.kv`;
 * - `ground.<index>.x` or `.y`: a point of the ground (the strata below it clipped again);
 * - `infiniteSlope.angle`, `.depth`, `.waterRatio`: the infinite slope's settings;
 * - `reinforcement.<name>.<parameter>`: any number of the element (strength, tensileCapacity,
 *   capacity, bond, shear, length, spacing, inclination…).
 */
import { lowerEnvelope } from '../geometry/lower-envelope';
import type { Material, Polyline, Section, Strength } from '../model/types';
import { type QuantityKind } from '../model/units';

export type Target =
  | { kind: 'material'; material: string; parameter: string }
  | { kind: 'water'; parameter: 'level' | 'ru' }
  | { kind: 'load'; index: number; parameter: string }
  | { kind: 'seismic'; parameter: 'kh' | 'kv' }
  | { kind: 'ground'; index: number; axis: 'x' | 'y' }
  | { kind: 'infinite-slope'; parameter: 'angle' | 'depth' | 'waterRatio' }
  | { kind: 'reinforcement'; name: string; parameter: string };

/** The kind of quantity of each number a target may name (none: an angle, a ratio, a count). */
const PARAMETER_KINDS: Readonly<Record<string, QuantityKind | null>> = {
  unitWeight: 'unitWeight',
  saturatedUnitWeight: 'unitWeight',
  cohesion: 'pressure',
  frictionAngle: null,
  tanFrictionAngle: null,
  su: 'pressure',
  suRate: 'pressurePerLength',
  suDatum: 'length',
  intactStrength: 'pressure',
  gsi: null,
  mi: null,
  disturbance: null,
  ratio: null,
  minimum: 'pressure',
  exponent: null,
  ocr: null,
  pop: 'pressure',
  breakStress: 'pressure',
  frictionAngleBeyond: null,
};

const LOAD_KINDS: Readonly<Record<string, QuantityKind | null>> = {
  pressure: 'pressure',
  from: 'length',
  to: 'length',
  force: 'forcePerLength',
  angle: null,
  x: 'length',
};

const REINFORCEMENT_KINDS: Readonly<Record<string, QuantityKind | null>> = {
  strength: 'forcePerLength',
  interaction: null,
  coverage: null,
  inclination: null,
  length: 'length',
  spacing: 'length',
  tensileCapacity: 'force',
  bond: 'forcePerLength',
  facingCapacity: 'force',
  freeLength: 'length',
  bondLength: 'length',
  capacity: 'force',
  x: 'length',
  top: 'length',
  bottom: 'length',
  shear: 'forcePerLength',
};

/** A target read from its text, or why it cannot be. */
export type ParsedTarget = { ok: true; target: Target } | { ok: false; reason: string };

const FORMS =
  'materials.<name>.<parameter>, water.level, water.ru, loads.<index>.<parameter>, seismic.kh, seismic.kv, ground.<index>.x|y, infiniteSlope.angle|depth|waterRatio or reinforcement.<name>.<parameter>';

/** The named part between the first and the last dot, and the last part. */
function middleAndLast(text: string, head: string): [string, string] | null {
  const last = text.lastIndexOf('.');
  if (last <= head.length + 1) return null;
  return [text.slice(head.length + 1, last), text.slice(last + 1)];
}

/**
 * A target from its text, checked for its form only (parseTarget); whether the section has it
 * is checkTarget's.
 *
 * @example parseTarget('materials.clay.cohesion') // → { ok: true, target: { kind: 'material', … } }
 */
export function parseTarget(text: string): ParsedTarget {
  const bad = (why: string): ParsedTarget => ({
    ok: false,
    reason: `"${text}" is not a target: ${why}; write ${FORMS}`,
  });
  const head = text.split('.')[0];
  switch (head) {
    case 'materials': {
      const parts = middleAndLast(text, head);
      if (!parts) return bad('a material and a parameter are needed');
      if (!(parts[1] in PARAMETER_KINDS))
        return bad(
          `a material has no number "${parts[1]}" (${Object.keys(PARAMETER_KINDS).join(', ')})`,
        );
      return { ok: true, target: { kind: 'material', material: parts[0], parameter: parts[1] } };
    }
    case 'reinforcement': {
      const parts = middleAndLast(text, head);
      if (!parts) return bad('an element name and a parameter are needed');
      if (!(parts[1] in REINFORCEMENT_KINDS))
        return bad(`reinforcement has no number "${parts[1]}"`);
      return { ok: true, target: { kind: 'reinforcement', name: parts[0], parameter: parts[1] } };
    }
    case 'water':
      if (text === 'water.level' || text === 'water.ru')
        return {
          ok: true,
          target: { kind: 'water', parameter: text === 'water.level' ? 'level' : 'ru' },
        };
      return bad('water has level (a shift of the piezometric line) and ru');
    case 'seismic':
      if (text === 'seismic.kh' || text === 'seismic.kv')
        return {
          ok: true,
          target: { kind: 'seismic', parameter: text === 'seismic.kh' ? 'kh' : 'kv' },
        };
      return bad('seismic has kh and kv');
    case 'infiniteSlope': {
      const p = text.slice(head.length + 1);
      if (p === 'angle' || p === 'depth' || p === 'waterRatio')
        return { ok: true, target: { kind: 'infinite-slope', parameter: p } };
      return bad('the infinite slope has angle, depth and waterRatio');
    }
    case 'loads':
    case 'ground': {
      const m = /^(loads|ground)\.(\d+)\.([A-Za-z]+)$/.exec(text);
      if (!m) return bad(`write ${head}.<index>.<parameter>`);
      const index = Number(m[2]);
      if (head === 'ground') {
        if (m[3] !== 'x' && m[3] !== 'y') return bad('a ground point has x and y');
        return { ok: true, target: { kind: 'ground', index, axis: m[3] } };
      }
      if (!(m[3] in LOAD_KINDS)) return bad(`a load has no number "${m[3]}"`);
      return { ok: true, target: { kind: 'load', index, parameter: m[3] } };
    }
    default:
      return bad(`"${head}" is not a part of a section a target may name`);
  }
}

/** The kind of quantity a target's values have (null: an angle, a ratio or a coefficient). */
export function targetQuantity(target: Target): QuantityKind | null {
  switch (target.kind) {
    case 'material':
      return PARAMETER_KINDS[target.parameter] ?? null;
    case 'water':
      return target.parameter === 'level' ? 'length' : null;
    case 'load':
      return LOAD_KINDS[target.parameter] ?? null;
    case 'seismic':
      return null;
    case 'ground':
      return 'length';
    case 'infinite-slope':
      return target.parameter === 'depth' ? 'length' : null;
    case 'reinforcement':
      return REINFORCEMENT_KINDS[target.parameter] ?? null;
  }
}

/** A target's value in a section, or why the section has no such value. */
export type TargetValue = { ok: true; value: number } | { ok: false; reason: string };

function numberIn(record: object, key: string): number | undefined {
  const v = (record as Record<string, unknown>)[key];
  return typeof v === 'number' ? v : undefined;
}

function strengthValue(m: Material, parameter: string): number | undefined {
  if (parameter === 'unitWeight') return m.unitWeight;
  if (parameter === 'saturatedUnitWeight') return m.saturatedUnitWeight;
  if (parameter === 'tanFrictionAngle') {
    const phi = numberIn(m.strength, 'frictionAngle');
    return phi === undefined ? undefined : Math.tan((phi * Math.PI) / 180);
  }
  return numberIn(m.strength, parameter);
}

/**
 * A target's value in a section (SI): what the section has now (water.level is a shift: 0).
 *
 * @example targetValue(section, parsed.target) // → { ok: true, value: 5 }
 */
export function targetValue(section: Section, target: Target): TargetValue {
  const none = (reason: string): TargetValue => ({ ok: false, reason });
  switch (target.kind) {
    case 'material': {
      const m = section.materials[target.material];
      if (!m)
        return none(
          `the section has no material "${target.material}" (it has ${Object.keys(section.materials).join(', ')})`,
        );
      const v = strengthValue(m, target.parameter);
      if (v === undefined)
        return none(
          `material "${target.material}" (${m.strength.model}) has no ${target.parameter}`,
        );
      return { ok: true, value: v };
    }
    case 'water':
      if (target.parameter === 'level') {
        if (section.water.kind !== 'piezometric')
          return none('water.level shifts the piezometric line, and the section has none');
        return { ok: true, value: 0 };
      }
      if (section.water.kind !== 'ru') return none('the section gives no ru');
      return { ok: true, value: section.water.ru };
    case 'load': {
      const l = section.loads[target.index];
      if (!l)
        return none(
          `the section has ${section.loads.length} loads: there is no load ${target.index} (counted from 0)`,
        );
      const v = numberIn(l, target.parameter);
      if (v === undefined)
        return none(`load ${target.index} (a ${l.type} load) has no ${target.parameter}`);
      return { ok: true, value: v };
    }
    case 'seismic':
      return { ok: true, value: section.seismic[target.parameter] };
    case 'ground': {
      const p = section.ground[target.index];
      if (!p)
        return none(
          `the ground has ${section.ground.length} points: there is no point ${target.index} (counted from 0)`,
        );
      return { ok: true, value: p[target.axis === 'x' ? 0 : 1] };
    }
    case 'infinite-slope': {
      const s = section.analysis.infiniteSlope;
      if (!s) return none('the section gives no infinite slope (analysis.infiniteSlope)');
      return { ok: true, value: s[target.parameter] };
    }
    case 'reinforcement': {
      const r = section.reinforcement.find((e) => e.name === target.name);
      if (!r) return none(`the section has no reinforcement named "${target.name}"`);
      const v = numberIn(r, target.parameter);
      if (v === undefined)
        return none(`reinforcement "${target.name}" (${r.type}) has no ${target.parameter}`);
      return { ok: true, value: v };
    }
  }
}

/** A section with a new value of a target, or why it cannot take it. */
export type Applied = { ok: true; section: Section } | { ok: false; reason: string };

function withStrength(m: Material, parameter: string, value: number): Material {
  if (parameter === 'unitWeight') {
    // a saturated weight not given separately follows the bulk weight
    const same = m.saturatedUnitWeight === m.unitWeight;
    return { ...m, unitWeight: value, saturatedUnitWeight: same ? value : m.saturatedUnitWeight };
  }
  if (parameter === 'saturatedUnitWeight') return { ...m, saturatedUnitWeight: value };
  if (parameter === 'tanFrictionAngle')
    return {
      ...m,
      strength: { ...m.strength, frictionAngle: (Math.atan(value) * 180) / Math.PI } as Strength,
    };
  return { ...m, strength: { ...m.strength, [parameter]: value } };
}

function shifted(line: Polyline, dy: number): Polyline {
  return line.map(([x, y]): [number, number] => [x, y + dy]);
}

/**
 * The section with the target set to `value` (SI; water.level: the shift); the section given
 * is left as it was. Refused, with the reason, where the section has no such input or the
 * value does not fit it (a ground x out of order, a negative strength).
 *
 * @example applyValue(section, target, 8) // → { ok: true, section: … cohesion 8 kPa }
 */
export function applyValue(section: Section, target: Target, value: number): Applied {
  const has = targetValue(section, target);
  if (!has.ok) return has;
  if (!Number.isFinite(value)) return { ok: false, reason: `${value} is not a number` };
  switch (target.kind) {
    case 'material': {
      const m = section.materials[target.material];
      if (value < 0 && target.parameter !== 'suDatum')
        return {
          ok: false,
          reason: `${target.parameter} of "${target.material}" cannot be ${value}`,
        };
      return {
        ok: true,
        section: {
          ...section,
          materials: {
            ...section.materials,
            [target.material]: withStrength(m, target.parameter, value),
          },
        },
      };
    }
    case 'water': {
      const w = section.water;
      if (target.parameter === 'ru' && w.kind === 'ru')
        return { ok: true, section: { ...section, water: { ...w, ru: value } } };
      if (w.kind === 'piezometric')
        return { ok: true, section: { ...section, water: { ...w, line: shifted(w.line, value) } } };
      return { ok: false, reason: 'the section has no such water' };
    }
    case 'load': {
      const loads = section.loads.map((l, i) =>
        i === target.index ? { ...l, [target.parameter]: value } : l,
      );
      return { ok: true, section: { ...section, loads } };
    }
    case 'seismic':
      return {
        ok: true,
        section: { ...section, seismic: { ...section.seismic, [target.parameter]: value } },
      };
    case 'ground': {
      const ground = section.ground.map((p, i): [number, number] =>
        i !== target.index ? [p[0], p[1]] : target.axis === 'x' ? [value, p[1]] : [p[0], value],
      );
      for (let i = 1; i < ground.length; i++)
        if (!(ground[i][0] > ground[i - 1][0]))
          return { ok: false, reason: `ground x ${value} puts point ${target.index} out of order` };
      const strata = [];
      let above: Polyline = ground;
      for (let i = 0; i < section.strata.length; i++) {
        const top = i === 0 ? ground : lowerEnvelope(section.strata[i].top, above);
        strata.push({ material: section.strata[i].material, top });
        above = top;
      }
      return { ok: true, section: { ...section, ground, strata } };
    }
    case 'infinite-slope': {
      const s = section.analysis.infiniteSlope!;
      return {
        ok: true,
        section: {
          ...section,
          analysis: { ...section.analysis, infiniteSlope: { ...s, [target.parameter]: value } },
        },
      };
    }
    case 'reinforcement': {
      const reinforcement = section.reinforcement.map((r) =>
        r.name === target.name ? { ...r, [target.parameter]: value } : r,
      );
      return { ok: true, section: { ...section, reinforcement } };
    }
  }
}

/** Several targets set at once (each in turn), or the first refusal. */
export function applyValues(
  section: Section,
  pairs: readonly { target: Target; value: number }[],
): Applied {
  let s = section;
  for (const p of pairs) {
    const a = applyValue(s, p.target, p.value);
    if (!a.ok) return a;
    s = a.section;
  }
  return { ok: true, section: s };
}
