/**
 * One-at-a-time sensitivity: the FS of each case as each variable moves through its range
 * (its distribution's 1st to 99th percentile, or its bounds) with the others at their means:
 * the series of a plot, and the least and greatest FS of each (the bars of a tornado chart,
 * widest first).
 */
import { CAUTION } from '../caution';
import type { Section } from '../model/types';
import { meanOf, plotRange } from './distributions';
import { type ProbabilityOptions, probabilityRun, valuesApplied } from './probability';
import type {
  ProbabilitySpec,
  SensitivityCase,
  SensitivityResult,
  SensitivitySeries,
} from './types';

/**
 * The sensitivity of every case of a section (or options.caseName) to each variable, at
 * `points` values over its range, on the critical surface at the means or searched again
 * (the spec's surface).
 *
 * @example sensitivity(section, spec).cases[0].series[0].variable // → the variable that matters most
 */
export function sensitivity(
  section: Section,
  spec: ProbabilitySpec,
  options: ProbabilityOptions & { points?: number } = {},
): SensitivityResult {
  const points = Math.max(3, Math.min(101, options.points ?? 11));
  const run = probabilityRun(section, { ...spec, realisations: 1 }, options);
  const means = spec.variables.map((v) => meanOf(v.distribution));
  const total = run.cases.length * spec.variables.length * points;
  let done = 0;
  const cases = run.cases.map((rc): SensitivityCase => {
    const at = (values: number[]) => {
      try {
        return rc.fs(valuesApplied(rc.model.section, run.targets, values, rc.model.name));
      } catch {
        return null;
      }
    };
    const series = spec.variables.map((v, k): SensitivitySeries => {
      const [from, to] = plotRange(v.distribution);
      const pts: [number, number | null][] = [];
      for (let j = 0; j < points; j++) {
        const x = from + ((to - from) * j) / (points - 1);
        pts.push([x, at(means.map((m, i) => (i === k ? x : m)))]);
        done++;
        options.onProgress?.(done, total);
      }
      const fs = pts.map((p) => p[1]).filter((f): f is number => f !== null);
      return {
        variable: v.name,
        target: v.target,
        points: pts,
        fsLow: fs.length ? Math.min(...fs) : null,
        fsHigh: fs.length ? Math.max(...fs) : null,
        from,
        to,
      };
    });
    const width = (s: SensitivitySeries) =>
      s.fsLow !== null && s.fsHigh !== null ? s.fsHigh - s.fsLow : -1;
    series.sort((a, b) => width(b) - width(a));
    return { case: rc.model.name, fsAtMeans: at(means), series };
  });
  return {
    id: section.id,
    title: section.title,
    station: section.station,
    cases,
    caution: CAUTION,
  };
}
