import {
  distinctWarnings,
  drawdownWords,
  fsText,
  howFoundWords,
  reinforcementWords,
  requiredWords,
  seismicWords,
  strengthWords,
  surfaceText,
  UNIT_LABELS,
  VERDICT_WORDS,
  type MethodReport,
  type CaseResult,
  type UnitSystem,
  type StationResult,
} from '@scarpline/core';

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
