import { WORK_LIMIT } from '../work-limit';
import { caseWorkWords, estimateCaseWork, estimateWork, requiredSearches } from './estimate-work';
import { caseOrigin, mergeCaseData } from '../model/merge-case';
import { checkCases } from './check-cases';
import { checkProbability } from './check-probability';
import { checkReinforcement } from './check-reinforcement';
import { betweenWords, checkBoundary } from './check-boundary';
import type { RawStrength } from '../model/raw-section';
import { STRENGTH_MODELS, checkStrength } from '../strength/registry';
import { lowerEnvelope } from '../geometry/lower-envelope';
import type { Polyline, UnitSystem } from '../model/types';
import { UNIT_LABELS } from '../model/units';
import { aboveIntervals, type AboveInterval } from './above-intervals';
import { isNumber, isPointList, isRecord } from './guards';
import type { Issue, PathKey } from './types';
import { closest, lengthUnit, listWords, num, quoteText } from './words';

/** Plausible unit weights of soil and rock, and of water, per unit system (common practice). */
const SOIL_WEIGHT = { si: [5, 30], us: [32, 190] } as const;
const SOIL_TYPICAL = { si: 'about 12 to 25 kN/m³', us: 'about 75 to 160 pcf' } as const;
const WATER_WEIGHT = { si: [9, 10.5], us: [57, 67] } as const;

/**
 * The checks that the schema cannot express, on a section as read from a file (in the file's
 * units; it may also have failed the schema, so every part is checked only where its shape
 * allows). Errors: ground x not strictly increasing; a stratum naming an undefined material; a
 * boundary or piezometric line that goes back in x or does not span the ground; both a
 * piezometric line and ru; a strip with from ≥ to; a load off the ground; crack water deeper
 * than the crack; a polyline surface whose x does not increase; infinite-slope without its
 * settings; phi-zero-circle on a polyline surface; more work than an analysis may use (all
 * cases together). Warnings: a boundary that rises above the ground or the stratum above (it
 * is clipped), a stratum left with no thickness, unused materials, implausible unit weights,
 * strata below a rigid base, a required FS below 1, and the like. Each design case is checked
 * as the section it sees (checkCases), its messages at the case's settings.
 *
 * @example checkSection(yamlData) // → [{ severity: 'warning', path: ['strata', 2, 'top'], … }]
 */
export function checkSection(data: unknown): Issue[] {
  if (!isRecord(data)) return [];
  const own = checkSettings(data);
  return [
    ...own,
    ...checkCases(data, own, checkSettings),
    ...checkWork(data),
    ...checkProbability(data),
  ];
}

/** The checks of checkSection on one set of settings: the section's own, or as a case sees them. */
function checkSettings(data: Record<string, unknown>): Issue[] {
  const issues: Issue[] = [];
  const units: UnitSystem = data.units === 'us' ? 'us' : 'si';
  const L = lengthUnit(units);
  const err = (path: PathKey[], code: string, message: string, key = false): void => {
    issues.push({ severity: 'error', path, code, message, ...(key ? { key } : {}) });
  };
  const warn = (path: PathKey[], code: string, message: string, key = false): void => {
    issues.push({ severity: 'warning', path, code, message, ...(key ? { key } : {}) });
  };

  // --- ground
  let ground: Polyline | null = null;
  if (isPointList(data.ground)) {
    const g = data.ground;
    const bad: number[] = [];
    for (let i = 1; i < g.length; i++) if (!(g[i][0] > g[i - 1][0])) bad.push(i);
    if (
      g.length > 2 &&
      bad.length === g.length - 1 &&
      g.every((p, i) => i === 0 || p[0] < g[i - 1][0])
    ) {
      err(
        ['ground'],
        'ground-x-order',
        'runs from right to left: list the ground points from left to right, x increasing',
      );
    } else {
      for (const i of bad) {
        err(
          ['ground', i],
          'ground-x-order',
          `x = ${num(g[i][0])} does not increase from the point before (x = ${num(g[i - 1][0])}); the ground's x must increase strictly from left to right`,
        );
      }
    }
    if (bad.length === 0) ground = g;
  }
  const gx0 = ground ? ground[0][0] : 0;
  const gx1 = ground ? ground[ground.length - 1][0] : 0;
  const tol = 1e-9 * Math.max(1, Math.abs(gx0), Math.abs(gx1));
  const groundRange = `the ground (x = ${num(gx0)} to ${num(gx1)} ${L})`;
  const offGround = (x: number): boolean => x < gx0 - tol || x > gx1 + tol;

  // --- materials
  const materials = isRecord(data.materials) ? data.materials : {};
  const names = Object.keys(materials);
  const modelOf = (name: string): unknown => {
    const m = materials[name];
    return isRecord(m) && isRecord(m.strength) ? m.strength.model : undefined;
  };
  for (const [name, m] of Object.entries(materials)) {
    if (!isRecord(m)) continue;
    const at: PathKey[] = ['materials', name];
    const uw = m.unitWeight;
    const [lo, hi] = SOIL_WEIGHT[units];
    if (isNumber(uw) && uw > 0 && (uw < lo || uw > hi)) {
      warn(
        [...at, 'unitWeight'],
        'unit-weight-unusual',
        `${num(uw)} ${UNIT_LABELS[units].unitWeight} is unusual for soil or rock (${SOIL_TYPICAL[units]} is typical); check the units`,
      );
    }
    const sat = m.saturatedUnitWeight;
    if (isNumber(sat) && sat > 0 && (sat < lo || sat > hi)) {
      warn(
        [...at, 'saturatedUnitWeight'],
        'unit-weight-unusual',
        `${num(sat)} ${UNIT_LABELS[units].unitWeight} is unusual for soil or rock (${SOIL_TYPICAL[units]} is typical); check the units`,
      );
    }
    if (isNumber(sat) && isNumber(uw) && sat < uw) {
      warn(
        [...at, 'saturatedUnitWeight'],
        'saturated-below-bulk',
        `${num(sat)} is less than unitWeight (${num(uw)}); the saturated unit weight is normally the larger`,
      );
    }
    const s = m.strength;
    if (isRecord(s) && typeof s.model === 'string' && s.model in STRENGTH_MODELS) {
      for (const note of checkStrength(s as unknown as RawStrength))
        (note.severity === 'error' ? err : warn)(
          [...at, 'strength', ...(note.path ?? [])],
          note.code,
          note.message,
        );
    }
  }

  // --- strata: materials
  const strata: unknown[] = Array.isArray(data.strata) ? data.strata : [];
  const used = new Set<string>();
  const label = (i: number): string => {
    const s = strata[i];
    return isRecord(s) && typeof s.material === 'string'
      ? `${s.material} (strata[${i}])`
      : `strata[${i}]`;
  };
  let firstRigid = -1;
  strata.forEach((s, i) => {
    if (!isRecord(s)) return;
    if (typeof s.material === 'string') {
      const mat = s.material;
      used.add(mat);
      if (!Object.prototype.hasOwnProperty.call(materials, mat)) {
        const near = closest(mat, names);
        const tail = near
          ? `; did you mean ${near}?`
          : names.length
            ? `; the materials are ${listWords(names, 10)}`
            : '';
        err(
          ['strata', i, 'material'],
          'material-undefined',
          `no material is named ${quoteText(mat)}${tail}`,
        );
      } else if (modelOf(mat) === 'rigid') {
        if (i === 0) {
          warn(
            ['strata', 0, 'material'],
            'rigid-on-top',
            'the top stratum is rigid: no slip surface can enter the ground',
          );
        }
        if (firstRigid < 0) firstRigid = i;
      } else if (firstRigid >= 0) {
        warn(
          ['strata', i],
          'below-rigid',
          `lies below the rigid ${label(firstRigid)}: no slip surface can reach it`,
        );
      }
    }
    if (i === 0 && s.top !== undefined) {
      warn(
        ['strata', 0, 'top'],
        'first-top-ignored',
        "the first stratum's top is the ground; this top is ignored",
      );
    }
  });
  for (const name of names) {
    if (!used.has(name))
      warn(['materials', name], 'material-unused', 'is not used by any stratum', true);
  }

  // --- boundaries: shape and span
  const spanning = (b: unknown, path: PathKey[], what: string): Polyline | null =>
    checkBoundary(b, path, what, ground, units, issues);

  const tops: (Polyline | null)[] = strata.map((s, i) =>
    i > 0 && isRecord(s)
      ? spanning(
          s.top,
          ['strata', i, 'top'],
          typeof s.material === 'string' ? `the top of ${s.material}` : 'the top',
        )
      : null,
  );

  // --- boundaries: clipping under the ground and the stratum above
  const between = (spans: AboveInterval[]): string => betweenWords(spans, units);
  if (ground) {
    let above: Polyline = ground;
    let chain = true;
    for (let i = 1; i < strata.length; i++) {
      const top = tops[i];
      if (!top) {
        chain = false;
        continue;
      }
      const path: PathKey[] = ['strata', i, 'top'];
      const overGround = aboveIntervals(top, ground);
      if (overGround.length) {
        warn(
          path,
          'boundary-above-ground',
          `rises above the ground ${between(overGround)}; clipped to the ground`,
        );
      }
      const underGround = lowerEnvelope(top, ground);
      if (!chain) {
        above = underGround;
        continue;
      }
      if (i >= 2) {
        const crossing = aboveIntervals(underGround, above);
        if (crossing.length) {
          warn(
            path,
            'boundary-crosses',
            `rises above the top of ${label(i - 1)} ${between(crossing)}; clipped to it`,
          );
        }
      }
      const clipped = lowerEnvelope(underGround, above);
      if (aboveIntervals(above, clipped).length === 0) {
        warn(
          ['strata', i - 1],
          'stratum-vanishes',
          `${label(i - 1)} has no thickness anywhere: the top of ${label(i)} is at or above its top everywhere`,
        );
      }
      above = clipped;
    }
  }

  // --- water
  const water = data.water;
  if (isRecord(water)) {
    if (water.piezometric !== undefined && water.ru !== undefined) {
      err(['water'], 'water-both', 'gives both a piezometric line and ru; give one of them');
    }
    if (water.piezometric !== undefined) {
      spanning(water.piezometric, ['water', 'piezometric'], 'the piezometric line');
    }
    const gw = water.unitWeight;
    const [lo, hi] = WATER_WEIGHT[units];
    if (isNumber(gw) && gw > 0 && (gw < lo || gw > hi)) {
      warn(
        ['water', 'unitWeight'],
        'unit-weight-unusual',
        `${num(gw)} ${UNIT_LABELS[units].unitWeight} is unusual for water (9.81 kN/m³, 62.4 pcf); check the units`,
      );
    }
  }

  // --- loads
  if (Array.isArray(data.loads)) {
    data.loads.forEach((load, i) => {
      if (!isRecord(load)) return;
      if (load.type === 'strip' && isNumber(load.from) && isNumber(load.to)) {
        if (load.from >= load.to) {
          err(
            ['loads', i, 'to'],
            'strip-order',
            `to (x = ${num(load.to)}) must be greater than from (x = ${num(load.from)})`,
          );
        }
        const left = Math.min(load.from, load.to);
        const right = Math.max(load.from, load.to);
        if (ground && (offGround(left) || offGround(right))) {
          err(
            ['loads', i],
            'load-outside',
            `the strip from x = ${num(load.from)} to ${num(load.to)} ${L} reaches beyond ${groundRange}`,
          );
        }
      }
      if (load.type === 'line' && isNumber(load.x) && ground && offGround(load.x)) {
        err(['loads', i, 'x'], 'load-outside', `x = ${num(load.x)} ${L} is off ${groundRange}`);
      }
    });
  }

  // --- reinforcement
  checkReinforcement(data, ground, L, err, warn);

  // --- crack
  const crack = data.crack;
  if (isRecord(crack) && isNumber(crack.depth) && isNumber(crack.waterDepth)) {
    if (crack.waterDepth > crack.depth) {
      err(
        ['crack', 'waterDepth'],
        'crack-water',
        `${num(crack.waterDepth)} ${L} of water is deeper than the crack (${num(crack.depth)} ${L})`,
      );
    }
  }

  // --- offset
  if (isNumber(data.offset) && ground && offGround(data.offset)) {
    warn(['offset'], 'offset-outside', `x = ${num(data.offset)} ${L} is off ${groundRange}`);
  }

  // --- analysis
  const a = data.analysis;
  if (isRecord(a)) {
    const methods: unknown[] = Array.isArray(a.methods) ? a.methods : ['bishop'];
    const methodPath = (m: string): PathKey[] =>
      Array.isArray(a.methods) ? ['analysis', 'methods', methods.indexOf(m)] : ['analysis'];
    if (methods.includes('infinite-slope')) {
      if (a.infiniteSlope === undefined) {
        err(
          methodPath('infinite-slope'),
          'infinite-slope-missing',
          'infinite-slope needs analysis.infiniteSlope (the slope angle and the depth of the slip plane)',
        );
      }
      const first = strata[0];
      if (
        isRecord(first) &&
        typeof first.material === 'string' &&
        modelOf(first.material) === 'rigid'
      ) {
        err(
          methodPath('infinite-slope'),
          'infinite-slope-rigid',
          'infinite-slope analyzes the first stratum, which is rigid',
        );
      }
    } else if (a.infiniteSlope !== undefined) {
      warn(
        ['analysis', 'infiniteSlope'],
        'infinite-slope-unused',
        'is given, but infinite-slope is not among the methods: it is not used',
      );
    }
    const fn = a.interslice;
    if (isRecord(fn) && fn.shape === 'piecewise-linear' && isPointList(fn.points)) {
      const p = fn.points;
      for (let j = 1; j < p.length; j++)
        if (p[j][0] < p[j - 1][0])
          err(
            ['analysis', 'interslice', 'points', j],
            'interslice-order',
            `ξ = ${num(p[j][0])} is below the point before (ξ = ${num(p[j - 1][0])}); give the points in increasing ξ`,
          );
      if (p.every((q) => q[1] === 0))
        err(
          ['analysis', 'interslice', 'points'],
          'interslice-zero',
          'f is 0 at every point: the interslice shear would vanish everywhere; give f > 0 somewhere',
        );
    }
    const surface = a.surface;
    if (isRecord(surface) && surface.type === 'polyline') {
      if (isPointList(surface.points)) {
        const p = surface.points;
        for (let j = 1; j < p.length; j++) {
          if (!(p[j][0] > p[j - 1][0])) {
            err(
              ['analysis', 'surface', 'points', j],
              'surface-x-order',
              `x = ${num(p[j][0])} does not increase from the point before (x = ${num(p[j - 1][0])}); a slip surface's x must increase strictly`,
            );
          }
        }
      }
      if (methods.includes('phi-zero-circle')) {
        err(
          methodPath('phi-zero-circle'),
          'needs-circle',
          'phi-zero-circle needs a circular slip surface; this surface is a polyline',
        );
      }
      for (const m of ['ordinary', 'bishop']) {
        if (methods.includes(m)) {
          warn(
            methodPath(m),
            'circular-method',
            `${m} takes moments about the centre of a circle; for a polyline surface spencer, morgenstern-price or janbu are the usual choice (common practice)`,
          );
        }
      }
    }
    if (isNumber(a.requiredFs) && a.requiredFs > 0 && a.requiredFs < 1) {
      warn(
        ['analysis', 'requiredFs'],
        'required-fs-below-one',
        `${num(a.requiredFs)} is below 1: it would accept a slope that is not stable`,
      );
    }
  }
  return issues;
}

/**
 * The work the analysis asks for, all cases together: an error past WORK_LIMIT, at the
 * settings that make the largest part of it.
 */
function checkWork(data: Record<string, unknown>): Issue[] {
  const strata = Array.isArray(data.strata) ? data.strata.length : 1;
  const cases = Array.isArray(data.cases) ? data.cases.filter(isRecord) : [];
  if (cases.length === 0) {
    const work = estimateWork(data.analysis, strata) * (1 + requiredSearches(data.analysis));
    if (work <= WORK_LIMIT) return [];
    const a = data.analysis;
    return [
      {
        severity: 'error',
        path: isRecord(a) && a.surface !== undefined ? ['analysis', 'surface'] : ['analysis'],
        code: 'too-much-work',
        message: `asks for about ${work.toExponential(1)} slice evaluations, more than the ${WORK_LIMIT.toExponential(0)} an analysis may use: use fewer grid centres, radii, moves, ground-range points, restarts or slices`,
      },
    ];
  }
  const parts = cases.map((c) => {
    const view = mergeCaseData(data, c);
    return { c, view, work: estimateCaseWork(view.analysis, strata, c.kind) };
  });
  const work = parts.reduce((sum, p) => sum + p.work, 0);
  if (work <= WORK_LIMIT) return [];
  const largest = parts.reduce((a, b) => (b.work > a.work ? b : a));
  const index = (data.cases as unknown[]).indexOf(largest.c);
  const a = largest.view.analysis;
  const surface: PathKey[] =
    isRecord(a) && a.surface !== undefined ? ['analysis', 'surface'] : ['analysis'];
  const from = caseOrigin(largest.c, surface);
  const name = typeof largest.c.name === 'string' ? quoteText(largest.c.name) : `cases[${index}]`;
  const n = parts.length;
  const counted = caseWorkWords(cases.map((c) => c.kind));
  return [
    {
      severity: 'error',
      path: from ? ['cases', index, ...from] : isRecord(data.analysis) ? surface : ['cases'],
      code: 'too-much-work',
      message: `the ${n === 1 ? 'case asks' : `${n} cases ask`} for about ${work.toExponential(1)} slice evaluations${n === 1 ? '' : ` together (${name} about ${largest.work.toExponential(1)})`}, more than the ${WORK_LIMIT.toExponential(0)} an analysis may use${counted ? ` (${counted})` : ''}: use fewer grid centres, radii, moves, ground-range points, restarts or slices${n === 1 ? '' : ', or fewer cases'}`,
    },
  ];
}
