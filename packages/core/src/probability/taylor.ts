/**
 * The Taylor series method of the US Army Corps of Engineers (ETL 1110-2-547, 1997; Duncan
 * 2000, "Factors of safety and reliability in geotechnical engineering"): FS at the means of
 * the variables, then each variable moved one SD either way with the others at their means,
 * σF² ≈ Σ ΔFᵢ² + 2 Σᵢ<ⱼ ρᵢⱼ ΔFᵢ ΔFⱼ with ΔFᵢ = (F(xᵢ + σᵢ) − F(xᵢ − σᵢ))/2: 2n + 1
 * analyses. The second sum is the first-order variance of correlated variables (the covariance
 * terms of the first-order second-moment method; it is 0 when they are uncorrelated, the case
 * the ETL writes out). A cheap cross-check of the sampling.
 */
import { CAUTION } from '../caution';
import type { Section } from '../model/types';
import { meanOf, sdOf } from './distributions';
import {
  type ProbabilityOptions,
  betaLognormal,
  betaNormal,
  probabilityRun,
  valuesApplied,
} from './probability';
import type { ProbabilitySpec, TaylorCase, TaylorResult } from './types';

/**
 * The Taylor series method on every case of a section (or options.caseName), each analysis on
 * the critical surface at the means or searched again, as the spec's surface says.
 *
 * @example taylorSeries(section, spec).cases[0].sdFs // → 0.21
 */
export function taylorSeries(
  section: Section,
  spec: ProbabilitySpec,
  options: ProbabilityOptions = {},
): TaylorResult {
  const run = probabilityRun(section, { ...spec, realisations: 1 }, options);
  const means = spec.variables.map((v) => meanOf(v.distribution));
  const cases = run.cases.map((rc): TaylorCase => {
    const at = (values: number[]) => {
      try {
        return rc.fs(valuesApplied(rc.model.section, run.targets, values, rc.model.name));
      } catch {
        return null;
      }
    };
    const fsMean = at(means);
    let variance = 0;
    let complete = fsMean !== null;
    /** ΔFᵢ, half the change of F over ± one SD of each variable (signed; null: no FS). */
    const half: (number | null)[] = [];
    const terms = spec.variables.map((v, k) => {
      const sd = sdOf(v.distribution);
      const moved = (sign: number) => at(means.map((m, j) => (j === k ? m + sign * sd : m)));
      const fsMinus = moved(-1);
      const fsPlus = moved(1);
      const d = fsMinus !== null && fsPlus !== null ? (fsPlus - fsMinus) / 2 : null;
      half.push(d);
      if (d === null) complete = false;
      else variance += d * d;
      return { variable: v.name, sd, fsMinus, fsPlus, share: d === null ? null : d * d };
    });
    const index = new Map(spec.variables.map((v, k) => [v.name, k]));
    let covariance = 0;
    for (const c of spec.correlations) {
      const di = half[index.get(c.between[0])!];
      const dj = half[index.get(c.between[1])!];
      if (di !== null && dj !== null) covariance += 2 * c.coefficient * di * dj;
    }
    variance += covariance;
    for (const t of terms) if (t.share !== null) t.share = variance > 0 ? t.share / variance : 0;
    const sdFs = complete ? Math.sqrt(Math.max(0, variance)) : null;
    const none = { beta: null, pf: null };
    return {
      case: rc.model.name,
      fsMean,
      terms,
      correlationShare:
        !complete || spec.correlations.length === 0
          ? null
          : variance > 0
            ? covariance / variance
            : 0,
      sdFs,
      betaNormal: fsMean !== null && sdFs !== null ? betaNormal(fsMean, sdFs) : none,
      betaLognormal: fsMean !== null && sdFs !== null ? betaLognormal(fsMean, sdFs) : none,
      analyses: 2 * spec.variables.length + 1,
    };
  });
  return { id: section.id, title: section.title, cases, caution: CAUTION };
}
