import {
  distinctWarnings,
  fsText,
  howFoundWords,
  UNIT_LABELS,
  VERDICT_WORDS,
  type MethodReport,
  type SectionResult,
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
 * A readable report of one section: a row per method (FS, converged, surface or the reason
 * it gave none), the governing FS against the required FS with the verdict in words, and the
 * warnings in plain words, each once.
 *
 * @example sectionTable(result) // → ['wcb-1240-L  Wendlecombe bypass, …', '  method  FS …', …]
 */
export function sectionTable(r: SectionResult): string[] {
  const length = UNIT_LABELS[r.units].length;
  const lines = [`${r.id}  ${r.title}${r.case ? `  [${r.case}]` : ''}`];
  lines.push('  method             FS       converged  surface');
  for (const m of r.results) {
    lines.push(
      `  ${m.method.padEnd(18)} ${(m.fs === null ? '—' : fsText(m.fs)).padStart(6)}   ${(m.converged ? 'yes' : 'no').padEnd(9)}  ${m.converged ? surfaceText(m, length) : (m.reason ?? '')}`,
    );
  }
  const words = VERDICT_WORDS[r.verdict];
  if (r.governing) {
    const against = r.requiredFs !== null ? ` against required ${r.requiredFs}` : '';
    lines.push(
      `  governing: ${r.governing.method} FS ${fsText(r.governing.fs)}${against}: ${words}`,
    );
  } else lines.push(`  governing: no method converged: ${words}`);
  if (r.search?.howFound) for (const w of howFoundWords(r.search.howFound)) lines.push(`  ${w}`);
  for (const w of distinctWarnings(r)) {
    lines.push(`  warning${w.method ? ` (${w.method})` : ''}: ${w.message}`);
  }
  return lines;
}
