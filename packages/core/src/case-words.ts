/**
 * A case's results in a checker's words, one home for the command line's tables and the
 * reports: a method's slip surface, the seismic and rapid-drawdown accounts, the strengths
 * taken at each slice base's stress, the reinforcement forces and the required reinforcement.
 */
import type { UnitSystem } from './model/types';
import { UNIT_LABELS } from './model/units';
import { limitWords } from './reinforcement/limit-words';
import type { CaseResult, DrawdownReport, MethodReport, SeismicReport } from './result';
import { fsText } from './verdict';

const fmt = (v: number | null, digits = 3) => (v === null ? '—' : v.toFixed(digits));

/** A method's slip surface in words: "circle centre (18.00, 51.00) R 12.50 m". */
export function surfaceText(m: MethodReport, length: string): string {
  const s = m.surface;
  if (!s) return '';
  if (s.type === 'circle')
    return `circle centre (${fmt(s.center[0], 2)}, ${fmt(s.center[1], 2)}) R ${fmt(s.radius, 2)} ${length}`;
  if (s.type === 'polyline') return `polyline of ${s.points.length} points`;
  if (s.type === 'log-spiral')
    return `log spiral, pole (${fmt(s.pole[0], 2)}, ${fmt(s.pole[1], 2)})`;
  return `plane at ${s.angle}°, ${fmt(s.depth, 2)} ${length} deep`;
}

/**
 * A seismic case's yield coefficient and displacements in words: ky and how it was found, each
 * relation's median and +1 SD (and whether the inputs lie in its range), the allowable.
 */
export function seismicWords(s: SeismicReport, units: UnitSystem): string[] {
  const unit = units === 'us' ? 'in' : 'mm';
  const d = (v: number) => `${v.toFixed(v < 10 ? 1 : 0)} ${unit}`;
  const lines = [
    s.ky === null
      ? `yield coefficient: none found up to the cap (${s.analyses} searches)`
      : `yield coefficient ky = ${s.ky.toFixed(3)} (the kh at which the least FS is 1.000; ${s.analyses} searches)`,
  ];
  if (s.pga !== null)
    lines.push(
      `design pga ${s.pga} g${s.magnitude !== null ? `, magnitude ${s.magnitude}` : ''}: permanent displacement of the sliding block`,
    );
  for (const e of s.displacements)
    lines.push(
      `  ${e.relation}: median ${d(e.median)}, +1 SD ${d(e.plusOneSd)}${e.inRange ? '' : ' (outside the data the relation was fitted to)'}`,
    );
  if (s.allowable !== null)
    lines.push(
      `allowable displacement ${d(s.allowable)}: ${s.within === null ? 'not compared' : s.within ? 'within it' : 'exceeded'}`,
    );
  return lines;
}

/**
 * A rapid-drawdown case in words: the F of each stage by the governing method, the drained
 * drawdown beside them, and how many slices each stage's strength was taken on.
 */
export function drawdownWords(d: DrawdownReport): string[] {
  const f = (v: number | null) => (v === null ? '—' : fsText(v));
  const [s1, s2, s3] = d.stages.map((s) => f(s.fs));
  const count = (stage: DrawdownReport['slices'][number]['stage']) =>
    d.slices.filter((s) => s.stage === stage).length;
  return [
    `rapid drawdown in three stages (Duncan, Wright & Wong 1990): before drawdown F ${s1}, undrained after it F ${s2}, drained where weaker F ${s3}`,
    `fully drained drawdown on the same surface: F ${f(d.drainedFs)}`,
    `slice bases: ${count('undrained')} undrained, ${count('drained-lower')} drained where weaker than undrained, ${count('drained')} drained (free-draining)`,
  ];
}

/**
 * Where a base's strength varied with stress on a method's surface: for each such material,
 * the range of c and φ its bases took and of the stress they were taken at (σ′n on the base
 * or σ′v above it).
 */
export function strengthWords(m: MethodReport, units: UnitSystem): string | null {
  const p = UNIT_LABELS[units].pressure;
  const by = new Map<string, MethodReport['slices']>();
  for (const s of m.slices) {
    if (!s.strengthAt) continue;
    const list = by.get(s.material) ?? [];
    list.push(s);
    by.set(s.material, list);
  }
  if (by.size === 0) return null;
  const range = (v: number[], digits: number) => {
    const lo = Math.min(...v).toFixed(digits);
    const hi = Math.max(...v).toFixed(digits);
    return lo === hi ? lo : `${lo}–${hi}`;
  };
  const parts = [...by].map(([name, list]) => {
    const at = list[0].strengthAt!;
    const stress = range(
      list.map((s) => s.strengthAt!.stress),
      0,
    );
    const c = range(
      list.map((s) => s.cohesion ?? 0),
      1,
    );
    if (at.kind === 'vertical') return `${name}: Su ${c} ${p} at σ′v ${stress} ${p}`;
    const phi = range(
      list.map((s) => s.frictionAngle ?? 0),
      1,
    );
    return `${name}: c ${c} ${p}, φ ${phi}° at σ′n ${stress} ${p}`;
  });
  const k = m.strengthIterations;
  const settled = k ? ` (settled in ${k} solution${k > 1 ? 's' : ''})` : '';
  return `strengths taken at each slice base's stress, ${m.method}${settled}: ${parts.join('; ')}`;
}

/**
 * A method's reinforcement in words, one line an element: its force in the equilibrium where
 * the surface crosses it, what limits it, and whether it is divided by F; or that the surface
 * does not cross it (or only pushes it).
 *
 * @example reinforcementWords(bishop, 'si') // → ['reinforcement, bishop (kN/m):', '  geosynthetic "basal geotextile" 159.0 at x = 5.30 of 200.0 (tensile strength), divided by F']
 */
export function reinforcementWords(m: MethodReport, units: UnitSystem): string[] {
  if (!m.reinforcement || m.reinforcement.length === 0 || !m.converged) return [];
  const u = UNIT_LABELS[units];
  const lines = [`reinforcement, ${m.method} (forces in ${u.forcePerLength}, x in ${u.length}):`];
  for (const e of m.reinforcement) {
    const counted = e.crossings.filter((c) => c.counted);
    const name = `${e.type} "${e.name}"`;
    if (counted.length === 0) {
      lines.push(
        `  ${name}: ${e.crossings.length ? 'crossed only where it is pushed' : 'not crossed'}`,
      );
      continue;
    }
    const at = counted
      .map(
        (c) =>
          `${c.force.toFixed(1)} at x = ${c.at[0].toFixed(2)} of ${c.available.toFixed(1)} (${limitWords(c.mode, e.type)})`,
      )
      .join('; ');
    lines.push(`  ${name} ${at}, ${e.dividedByF ? 'divided by F' : 'at full value'}`);
  }
  return lines;
}

/** A case's required reinforcement in words (one line). */
export function requiredWords(
  r: NonNullable<CaseResult['requiredReinforcement']>,
  units: UnitSystem,
): string {
  const u = UNIT_LABELS[units];
  const where = `at ${r.level.toFixed(2)} ${u.length} from x = ${r.from.toFixed(2)} to ${r.to.toFixed(2)}`;
  if (!r.reached || r.value === null)
    return `required reinforcement: not reached: ${r.reason ?? ''} (${r.analyses} analyses)`;
  const what =
    r.kind === 'force'
      ? `a further uniform force of ${r.value.toFixed(1)} ${u.forcePerLength} ${where}`
      : `${r.value} layer${r.value > 1 ? 's' : ''} of the product ${where} and up at ${r.spacing?.toFixed(2)} ${u.length}`;
  return `required reinforcement: ${what} gives FS ${r.fs === null ? '—' : fsText(r.fs)} (${r.method ?? '—'}) against required ${r.requiredFs}, ${r.dividedByF ? 'divided by F' : 'at full value'} (${r.analyses} analyses, each with its search)`;
}
