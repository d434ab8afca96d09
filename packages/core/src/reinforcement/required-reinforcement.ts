import type { MethodId, Reinforcement, RequiredReinforcementSpec, Section } from '../model/types';
import type { RequiredReinforcementReport } from './types';

/** The critical FS of a section as its case judges it (a full analysis: the search included) and the surface it was found on. */
export type CaseFs = (section: Section) => {
  fs: number | null;
  method: MethodId | null;
  surface: RequiredReinforcementReport['surface'];
};

/** The first uniform force tried (kN per m run) and the most doublings of it. */
const FIRST_FORCE = 25;
const DOUBLINGS = 14;
/** The force is found to this fraction of itself (bisection), on the side that meets the requirement. */
const FORCE_TOL = 0.005;

/** The layers of a spec: n levels from its line upward at its spacing. */
function layers(
  spec: Extract<RequiredReinforcementSpec, { kind: 'layers' }>,
  count: number,
): Reinforcement[] {
  const out: Reinforcement[] = [];
  for (let k = 0; k < count; k++) {
    out.push({
      type: 'geosynthetic',
      name: `required layer ${k + 1}`,
      line: spec.line.map(([x, y]) => [x, y + k * spec.spacing]),
      strength: spec.strength,
      interaction: spec.interaction,
      coverage: spec.coverage,
      dividedByF: spec.dividedByF,
    });
  }
  return out;
}

/** The uniform force T along a spec's line: a layer of strength T whose pullout never limits it. */
function uniform(spec: RequiredReinforcementSpec, T: number): Reinforcement {
  return {
    type: 'geosynthetic',
    name: 'required force',
    line: spec.line.map(([x, y]) => [x, y]),
    strength: T,
    interaction: Infinity,
    coverage: 1,
    dividedByF: spec.dividedByF,
  };
}

/**
 * The extra reinforcement at which a case below its requirement meets it, each trial value
 * judged by `caseFs` on the section with that reinforcement added to its own (a full
 * analysis, the search included, so the critical surface is found again every step):
 * - a uniform force per m run along the spec's line: doubled from 25 kN/m until the case
 *   meets the requirement (at most 14 times), then bisected to 0.5 % of itself; the value
 *   reported meets it;
 * - a number of layers of a product: the least count up to maxLayers that meets it (bisection
 *   on the count, the critical FS growing with it).
 * Says so when no value in range meets it. `required` is the case's required FS.
 */
export function requiredReinforcement(
  section: Section,
  spec: RequiredReinforcementSpec,
  required: number,
  caseFs: CaseFs,
): RequiredReinforcementReport {
  let analyses = 0;
  const judge = (extra: Reinforcement[]) => {
    analyses++;
    const r = caseFs({ ...section, reinforcement: [...section.reinforcement, ...extra] });
    return { ...r, meets: r.fs !== null && r.fs >= required };
  };
  const level = spec.line[0][1];
  const from = spec.line[0][0];
  const to = spec.line[spec.line.length - 1][0];
  const base = {
    kind: spec.kind,
    level,
    from,
    to,
    dividedByF: spec.dividedByF,
    requiredFs: required,
  };
  if (spec.kind === 'force') {
    let lo = 0;
    let hi = FIRST_FORCE;
    let at = judge([uniform(spec, hi)]);
    for (let k = 0; k < DOUBLINGS && !at.meets; k++) {
      lo = hi;
      hi *= 2;
      at = judge([uniform(spec, hi)]);
    }
    if (!at.meets) {
      return {
        ...base,
        reached: false,
        value: null,
        fs: at.fs,
        method: at.method,
        surface: at.surface,
        analyses,
        reason: `no force up to the largest tried (${DOUBLINGS} doublings) brings the critical FS (${at.fs?.toFixed(3) ?? 'none'}) to ${required}: the critical surface passes this level by; try another level`,
      };
    }
    while (hi - lo > FORCE_TOL * hi) {
      const mid = 0.5 * (lo + hi);
      const m = judge([uniform(spec, mid)]);
      if (m.meets) {
        hi = mid;
        at = m;
      } else lo = mid;
    }
    return {
      ...base,
      reached: true,
      value: hi,
      fs: at.fs,
      method: at.method,
      surface: at.surface,
      analyses,
    };
  }
  let top = judge(layers(spec, spec.maxLayers));
  if (!top.meets) {
    return {
      ...base,
      spacing: spec.spacing,
      reached: false,
      value: null,
      fs: top.fs,
      method: top.method,
      surface: top.surface,
      analyses,
      reason: `even ${spec.maxLayers} layers at the given spacing do not bring the critical FS (${top.fs?.toFixed(3) ?? 'none'}) to ${required}`,
    };
  }
  let lo = 0;
  let hi = spec.maxLayers;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    const m = judge(layers(spec, mid));
    if (m.meets) {
      hi = mid;
      top = m;
    } else lo = mid;
  }
  return {
    ...base,
    spacing: spec.spacing,
    reached: true,
    value: hi,
    fs: top.fs,
    method: top.method,
    surface: top.surface,
    analyses,
  };
}
