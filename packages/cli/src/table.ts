import {
  distinctWarnings,
  fsText,
  howFoundWords,
  limitWords,
  UNIT_LABELS,
  VERDICT_WORDS,
  type MethodReport,
  type CaseResult,
  type DrawdownReport,
  type SeismicReport,
  type UnitSystem,
  type StationResult,
} from '@scarpline/core';

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

/**
 * The slice table of a method: a row per slice, left to right, with its geometry, weight, pore
 * pressure and base forces, its base material and the strength the base took (c′ or Su, φ′)
 * and, for a strength that varies with stress, the stress it was taken at (σ′n on the base, or
 * σ′v above it for Su from σ′v). The strength columns are left out where no slice has them
 * (results of earlier versions), the stress column where every strength is fixed.
 *
 * @example sliceTable(result.cases[0].results[0], 'si') // → ['slices of bishop (…)', '   #      x …', …]
 */
export function sliceTable(m: MethodReport, units: UnitSystem): string[] {
  const u = UNIT_LABELS[units];
  const has = (v: number | null | undefined): v is number =>
    typeof v === 'number' && Number.isFinite(v);
  const n = (v: number | null | undefined, digits: number) => (has(v) ? v.toFixed(digits) : '—');
  const withC = m.slices.some((s) => has(s.cohesion));
  const withPhi = m.slices.some((s) => has(s.frictionAngle));
  const withAt = m.slices.some((s) => s.strengthAt && has(s.strengthAt.stress));
  const material = Math.max(8, ...m.slices.map((s) => s.material.length));
  const cols: {
    head: string;
    width: number;
    cell: (s: MethodReport['slices'][number]) => string;
  }[] = [
    { head: 'x', width: 9, cell: (s) => n(s.x, 2) },
    { head: 'b', width: 7, cell: (s) => n(s.width, 3) },
    { head: 'α°', width: 6, cell: (s) => n(s.alpha, 1) },
    { head: 'W', width: 10, cell: (s) => n(s.weight, 1) },
    { head: 'u', width: 8, cell: (s) => n(s.porePressure, 1) },
    { head: 'N′', width: 10, cell: (s) => n(s.normal, 1) },
    { head: 'S', width: 9, cell: (s) => n(s.shear, 1) },
  ];
  if (withC) cols.push({ head: 'c′/Su', width: 8, cell: (s) => n(s.cohesion, 1) });
  if (withPhi) cols.push({ head: 'φ′°', width: 6, cell: (s) => n(s.frictionAngle, 1) });
  if (m.slices.some((s) => has(s.reinforcement)))
    cols.push({ head: 'T', width: 8, cell: (s) => (s.reinforcement ? n(s.reinforcement, 1) : '') });
  if (withAt)
    cols.push({
      head: 'taken at',
      width: 12,
      cell: (s) =>
        s.strengthAt && has(s.strengthAt.stress)
          ? `${s.strengthAt.kind === 'normal' ? 'σ′n' : 'σ′v'} ${s.strengthAt.stress.toFixed(1)}`
          : '—',
    });
  const lines = [
    `slices of ${m.method} (x, b in ${u.length}; W, N′, S${m.reinforcement ? ', T (reinforcement)' : ''} in ${u.forcePerLength}; u, c′/Su and the stress a strength was taken at in ${u.pressure})`,
    `${'#'.padStart(3)} ${cols
      .slice(0, 7)
      .map((c) => c.head.padStart(c.width))
      .join(' ')}  ${'material'.padEnd(material)} ${cols
      .slice(7)
      .map((c) => c.head.padStart(c.width))
      .join(' ')}`.trimEnd(),
  ];
  m.slices.forEach((s, i) => {
    lines.push(
      `${String(i + 1).padStart(3)} ${cols
        .slice(0, 7)
        .map((c) => c.cell(s).padStart(c.width))
        .join(' ')}  ${s.material.padEnd(material)} ${cols
        .slice(7)
        .map((c) => c.cell(s).padStart(c.width))
        .join(' ')}`.trimEnd(),
    );
  });
  return lines;
}

/** The lines of one case: a row per method, the governing FS against the requirement, how the search found it, the warnings. */
function caseLines(c: CaseResult, units: UnitSystem, indent: string, slices = false): string[] {
  const length = UNIT_LABELS[units].length;
  const lines: string[] = [];
  lines.push(`${indent}method             FS       converged  surface`);
  for (const m of c.results) {
    lines.push(
      `${indent}${m.method.padEnd(18)} ${(m.fs === null ? '—' : fsText(m.fs)).padStart(6)}   ${(m.converged ? 'yes' : 'no').padEnd(9)}  ${m.converged ? surfaceText(m, length) : (m.reason ?? '')}`,
    );
  }
  const words = VERDICT_WORDS[c.verdict];
  const comparing = c.results.filter((m) => !c.governs.includes(m.method)).map((m) => m.method);
  if (c.governing) {
    const against = c.requiredFs !== null ? ` against required ${c.requiredFs}` : '';
    lines.push(
      `${indent}governing: ${c.governing.method} FS ${fsText(c.governing.fs)}${against}: ${words}`,
    );
  } else lines.push(`${indent}governing: no method converged: ${words}`);
  if (comparing.length > 0) lines.push(`${indent}for comparison only: ${comparing.join(', ')}`);
  if (c.seismic) for (const w of seismicWords(c.seismic, units)) lines.push(`${indent}${w}`);
  if (c.drawdown) for (const w of drawdownWords(c.drawdown)) lines.push(`${indent}${w}`);
  const governing = c.results.find((m) => m.method === c.governing?.method);
  const strengths = governing ? strengthWords(governing, units) : null;
  if (strengths) lines.push(`${indent}${strengths}`);
  if (governing) for (const w of reinforcementWords(governing, units)) lines.push(`${indent}${w}`);
  if (c.requiredReinforcement)
    lines.push(`${indent}${requiredWords(c.requiredReinforcement, units)}`);
  if (c.search?.howFound)
    for (const w of howFoundWords(c.search.howFound)) lines.push(`${indent}${w}`);
  for (const w of distinctWarnings({ results: c.results, warnings: c.warnings })) {
    lines.push(`${indent}warning${w.method ? ` (${w.method})` : ''}: ${w.message}`);
  }
  if (slices && governing && governing.slices.length > 0)
    for (const l of sliceTable(governing, units)) lines.push(`${indent}${l}`);
  return lines;
}

/**
 * A readable report of one section: for each design case, a row per method (FS, converged,
 * surface or the reason it gave none), the governing FS against the required FS with the
 * verdict in words, and the warnings in plain words, each once; with more than one case, the
 * station's verdict and its governing case last. A section of one case reads as it always did.
 * With `slices`, each case ends with the slice table of its governing method (sliceTable).
 *
 * @example sectionTable(result) // → ['wcb-1240-L  Wendlecombe bypass, …', '  method  FS …', …]
 */
export function sectionTable(r: StationResult, options: { slices?: boolean } = {}): string[] {
  const slices = options.slices === true;
  if (r.cases.length === 1) {
    const c = r.cases[0];
    const named = c.name !== 'as given' ? `  [${c.name}]` : '';
    return [`${r.id}  ${r.title}${named}`, ...caseLines(c, r.units, '  ', slices)];
  }
  const lines = [`${r.id}  ${r.title}  (${r.cases.length} design cases)`];
  for (const c of r.cases) {
    const req = c.requiredFs !== null ? `, required FS ${c.requiredFs}` : '';
    lines.push(`  case ${c.name} (${c.kind}${req})`);
    lines.push(...caseLines(c, r.units, '    ', slices));
  }
  const g = r.governing;
  const below = r.cases.filter((c) => c.verdict === 'below').map((c) => c.name);
  lines.push(
    `  station: ${VERDICT_WORDS[r.verdict]}${below.length > 0 ? ` in ${below.join(', ')}` : r.verdict === 'meets' ? ' in every case' : ''}${g ? `; governing case ${g.case}: ${g.method} FS ${fsText(g.fs)}${g.ratio !== null ? `, ${g.ratio.toFixed(2)} × required` : ''}` : ''}`,
  );
  return lines;
}
