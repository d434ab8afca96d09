import type { EarthquakeSpec } from '../model/types';
import type { DisplacementEstimate, SeismicReport, Warning } from '../result';
import { DISPLACEMENT_RELATIONS } from './relations';
import { type DisplacementRelation, slidingBlockEstimate } from './sliding-block';
import {
  type FsAtKh,
  type YieldCoefficient,
  type YieldOptions,
  yieldCoefficient,
} from './yield-coefficient';

export interface SeismicReportOptions extends YieldOptions {
  /** The displacement relations to report (DISPLACEMENT_RELATIONS). */
  relations?: readonly DisplacementRelation[];
}

/** The earthquake part of a seismic case, in SI, and what the case's warnings gain from it. */
export interface SeismicOutcome {
  seismic: SeismicReport;
  /** The yield coefficient's own account (outcome, FS at ky, bracket). */
  yield: YieldCoefficient;
  /** For the case's warnings: the yield coefficient's, and each displacement estimate's. */
  warnings: Warning[];
}

const f3 = (x: number) => x.toFixed(3);

/**
 * The earthquake part of a seismic case: the yield coefficient ky of the whole search
 * (yieldCoefficient; `fsAt(kh)` runs the case's full analysis at that kh with the case's own
 * kv), and, given the design peak ground acceleration (spec.pga, g), the permanent
 * displacement of the sliding block by each published relation (sliding-block.ts; Jibson 2007
 * eq. 6, eq. 7 when a magnitude is given, Ambraseys & Menu 1988): the median and the value one
 * standard deviation of the log above it, in metres. `within` compares the largest median with
 * the allowable displacement (m): null without an allowable or without an estimate, false when
 * the slope is not stable statically (ky = 0: the displacement is unbounded).
 *
 * ky ≥ pga gives zero displacement (the block does not slide); ky above the cap with pga at or
 * below it is the same. ky = 0 gives no estimate (every relation tends to infinity there).
 *
 * @example seismicReport((kh) => analyse(section, kh), { pga: 0.25, magnitude: 6.5, allowableDisplacement: 0.15 }).seismic.within
 */
export function seismicReport(
  fsAt: FsAtKh,
  spec: EarthquakeSpec | null,
  options: SeismicReportOptions = {},
): SeismicOutcome {
  const y = yieldCoefficient(fsAt, options);
  const pga = spec?.pga ?? null;
  const magnitude = spec?.magnitude ?? null;
  const allowable = spec?.allowableDisplacement ?? null;
  const warnings: Warning[] = [...y.warnings];
  const displacements: DisplacementEstimate[] = [];
  // the ky the relations see: found, or (above the cap) the cap as a lower bound when pga ≤ cap
  let kyForDisplacement: number | null = null;
  if (y.outcome === 'found' || y.outcome === 'not-converged') kyForDisplacement = y.ky;
  else if (y.outcome === 'above-cap' && pga !== null && pga <= y.cap) kyForDisplacement = y.cap;
  if (pga !== null) {
    if (!(pga > 0)) {
      warnings.push({
        code: 'displacement-not-estimated',
        message: `the design peak ground acceleration is ${pga} g: no displacement is estimated`,
      });
    } else if (kyForDisplacement !== null && kyForDisplacement > 0) {
      const above = y.outcome === 'above-cap';
      for (const relation of options.relations ?? DISPLACEMENT_RELATIONS) {
        const e = slidingBlockEstimate(relation, kyForDisplacement, pga, magnitude);
        if (!e) continue;
        // above the cap the relation saw the cap, a lower bound of ky: say so
        const noSliding: Warning = {
          code: 'no-sliding',
          message: `${relation.source}: ky > ${f3(y.cap)} ≥ pga = ${f3(pga)} g, so the sliding block does not slide and the displacement is zero`,
        };
        displacements.push(above ? { ...e, warnings: [noSliding] } : e);
      }
      if (kyForDisplacement >= pga) {
        const ky = above ? `ky > ${f3(y.cap)}` : `ky = ${f3(kyForDisplacement)}`;
        warnings.push({
          code: 'no-sliding',
          message: `${ky} ≥ pga = ${f3(pga)} g: the sliding block does not slide, and every relation gives zero displacement`,
        });
      }
    } else if (y.outcome === 'found' || y.outcome === 'not-converged') {
      warnings.push({
        code: 'displacement-not-estimated',
        message: `ky = 0 (the least FS is ${f3(y.fs ?? NaN)} at kh = 0): the sliding-block relations give no finite displacement`,
      });
    } else if (y.outcome === 'above-cap') {
      warnings.push({
        code: 'displacement-not-estimated',
        message: `ky is above ${f3(y.cap)} and the pga of ${f3(pga)} g exceeds that: no displacement is estimated`,
      });
    } else if (y.outcome !== 'statically-unstable') {
      warnings.push({
        code: 'displacement-not-estimated',
        message: 'without a yield coefficient no displacement is estimated',
      });
    }
  }
  // the estimates' own warnings (out of range) join the case's; no sliding is said once above
  for (const e of displacements) {
    warnings.push(...e.warnings.filter((w) => w.code !== 'no-sliding'));
  }
  let within: boolean | null = null;
  if (allowable !== null) {
    if (displacements.length > 0) {
      within = Math.max(...displacements.map((e) => e.median)) <= allowable;
    } else if (y.ky === 0) {
      within = false;
    }
  }
  return {
    seismic: {
      ky: y.outcome === 'above-cap' || y.outcome === 'no-factor-of-safety' ? null : y.ky,
      kySurface: y.outcome === 'above-cap' ? null : y.surface,
      analyses: y.analyses,
      pga,
      magnitude,
      displacements,
      allowable,
      within,
    },
    yield: y,
    warnings,
  };
}
