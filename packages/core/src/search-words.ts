import type { HowFound } from './result';

const count = (n: number) => n.toLocaleString('en-GB');
const origin = (o: HowFound['critical']) =>
  `${o.stage === 'polish' ? 'a polish' : o.stage === 'grid' ? 'the grid' : 'the ground ranges'}${o.touching ? ` of a circle touching the top of ${o.touching}` : ''}`;

/**
 * The search's account of the critical circle in a checker's words, one line each: the
 * trial circles by stage, where the critical one came from, and its confirmation. The CLI
 * prints them; the web app and the reports show the same lines.
 *
 * @example howFoundWords(result.search.howFound)[2] // → 'confirmed: bishop FS 1.595 as searched, 1.595 cut afresh and solved in full'
 */
export function howFoundWords(h: HowFound): string[] {
  const c = h.candidates;
  const total = c.grid + c.groundRanges + c.polish;
  const touching = h.boundaries.length
    ? ` (with the circles touching the top of ${h.boundaries.join(', ')})`
    : '';
  const exact = h.confirmation.exact === null ? 'no solution' : h.confirmation.exact.toFixed(3);
  return [
    `search: ${count(total)} trial circles: grid ${count(c.grid)}${touching}, ground ranges ${count(c.groundRanges)}, polishes ${count(c.polish)}`,
    `critical circle: from ${origin(h.critical)}`,
    `confirmed: ${h.confirmation.method} FS ${h.confirmation.searched.toFixed(3)} as searched, ${exact} cut afresh and solved in full`,
  ];
}
