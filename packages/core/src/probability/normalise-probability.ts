/**
 * The section file's `probability` (schemas/section.schema.json, $defs/probability) as the
 * solver takes it: defaults filled in, each variable named, its SD from its COV where given,
 * and every value in SI by the kind of quantity its target is.
 */
import { toSi } from '../model/units';
import type { UnitSystem } from '../model/types';
import { parseTarget, targetQuantity } from './target';
import type { Distribution, DistributionKind, ProbabilitySpec } from './types';

/** A random variable as written in a file that passed the schema. */
export interface RawRandomVariable {
  name?: string;
  target: string;
  distribution: DistributionKind;
  mean?: number;
  sd?: number;
  cov?: number;
  min?: number;
  max?: number;
  mode?: number;
}

/** `probability` as written in a file that passed the schema. */
export interface RawProbability {
  variables: RawRandomVariable[];
  correlations?: { between: [string, string]; coefficient: number }[];
  seed?: number;
  method?: 'monte-carlo' | 'latin-hypercube';
  realisations?: number;
  surface?: 'critical' | 'search';
}

/** Realisations when the file gives none: on the critical surface, and searching in each. */
export const DEFAULT_REALISATIONS = { critical: 10_000, search: 1_000 } as const;

/** A variable's distribution in its own units (the SD from the COV where that is given). */
export function distributionOf(v: RawRandomVariable): Distribution {
  const mean = v.mean ?? 0;
  const sd = v.sd ?? (v.cov ?? 0) * Math.abs(mean);
  switch (v.distribution) {
    case 'normal':
    case 'lognormal':
      return { kind: v.distribution, mean, sd };
    case 'truncated-normal':
      return {
        kind: 'truncated-normal',
        mean,
        sd,
        min: v.min ?? -Infinity,
        max: v.max ?? Infinity,
      };
    case 'uniform':
      return { kind: 'uniform', min: v.min ?? 0, max: v.max ?? 0 };
    case 'triangular':
      return { kind: 'triangular', min: v.min ?? 0, mode: v.mode ?? 0, max: v.max ?? 0 };
  }
}

function scaled(d: Distribution, f: number): Distribution {
  switch (d.kind) {
    case 'normal':
    case 'lognormal':
      return { ...d, mean: d.mean * f, sd: d.sd * f };
    case 'truncated-normal':
      return { ...d, mean: d.mean * f, sd: d.sd * f, min: d.min * f, max: d.max * f };
    case 'uniform':
      return { ...d, min: d.min * f, max: d.max * f };
    case 'triangular':
      return { ...d, min: d.min * f, mode: d.mode * f, max: d.max * f };
  }
}

/**
 * The probabilistic analysis a file asks for, in SI (seed 1, Monte Carlo, N 10 000 on the
 * critical surface or 1 000 searching, when not given). Assumes the file passed the schema
 * and checkProbability.
 *
 * @example normaliseProbability({ variables: [{ target: 'seismic.kh', distribution: 'uniform', min: 0, max: 0.1 }] }, 'si').realisations // → 10000
 */
export function normaliseProbability(raw: RawProbability, units: UnitSystem): ProbabilitySpec {
  const surface = raw.surface ?? 'critical';
  return {
    variables: raw.variables.map((v) => {
      const t = parseTarget(v.target);
      const kind = t.ok ? targetQuantity(t.target) : null;
      const f = kind ? toSi(1, kind, units) : 1;
      return {
        name: v.name ?? v.target,
        target: v.target,
        distribution: scaled(distributionOf(v), f),
      };
    }),
    correlations: (raw.correlations ?? []).map((c) => ({
      between: [c.between[0], c.between[1]],
      coefficient: c.coefficient,
    })),
    seed: raw.seed ?? 1,
    method: raw.method ?? 'monte-carlo',
    realisations: raw.realisations ?? DEFAULT_REALISATIONS[surface],
    surface,
  };
}
