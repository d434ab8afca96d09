import {
  BETA_WORDS,
  COUNTED_WORDS,
  drawChainage,
  fsText,
  countedText,
  probabilityBasisWords,
  REALISATION_SURFACE_WORDS,
  variableDistributionWords,
  UNIT_LABELS,
  VERDICT_WORDS,
  VERDICTS,
  type ProbabilitySpec,
  type StationResult,
  type UnitSystem,
  type Verdict,
} from '@scarpline/core';
import { MUTED, renderPdf, type Layout } from './layout';
import { sectionPages, stationName, titleBlock } from './section-pages';
import type { CorridorReportInput, CorridorStation } from './types';
import { num } from './words';

/** The most section pages an appendix holds: beyond it the appendix is cut, with a line saying so. */
export const REPORT_LIMITS = { maxAppendixSections: 400 };

/** A station analysed, below its requirement in its governing case (its verdict over every case). */
const below = (s: CorridorStation): boolean => s.result?.verdict === 'below';

/** The stations whose section pages go in the appendix, in the order given. */
export function appendixStations(
  stations: readonly CorridorStation[],
  appendix: CorridorReportInput['appendix'],
): CorridorStation[] {
  if (appendix === 'none') return [];
  return appendix === 'all' ? [...stations] : stations.filter(below);
}

/**
 * The report of a corridor as a PDF: its title block and review record; a summary (stations,
 * cases, how many meet, fall below, have no FS or failed); the governing FS against the
 * required FS along the chainage, for each case (the core's chainage drawing, as vector
 * graphics); the stations below requirement with their governing case and method; the ones
 * not analysed and why; and an appendix of section pages (every station, those below
 * requirement, or none; at most REPORT_LIMITS.maxAppendixSections, then a line saying how
 * many were left out). `onProgress` is told as each section page is laid out.
 */
export function corridorReportPdf(input: CorridorReportInput): Promise<Buffer> {
  const { meta } = input;
  const name = meta.corridor ?? meta.source ?? 'corridor';
  return renderPdf(
    `Corridor report: ${name}`,
    { subject: 'Slope-stability corridor report', author: meta.submittedBy },
    (l, final) => corridorPages(l, input, final),
  );
}

/** A station's name in a sentence: its station, else its id. */
const stationWord = (s: CorridorStation): string =>
  s.section.station === null ? s.section.id : String(s.section.station);

/**
 * The probability of failure of the stations that carry one (none: nothing): what it rests on
 * (each set of random variables with the stations that share it, the sampling, N, the seed,
 * where each realisation is analysed, how P(FS < 1) is counted, β's two forms), then a row per
 * station and case beside the governing FS.
 */
function probabilityOfFailure(
  l: Layout,
  stations: readonly CorridorStation[],
  total: number,
  L: string,
): void {
  const carrying = stations.filter((s) => s.result && s.probability && s.probability.length > 0);
  if (carrying.length === 0) return;
  l.heading('Probability of failure');
  const groups = new Map<string, { spec: ProbabilitySpec; stations: CorridorStation[] }>();
  for (const s of carrying) {
    if (!s.section.probability) continue;
    const key = JSON.stringify(s.section.probability);
    const g = groups.get(key) ?? { spec: s.section.probability, stations: [] };
    g.stations.push(s);
    groups.set(key, g);
  }
  l.paragraph(
    `${carrying.length} of the ${total} stations carry a probability of failure, computed with the run ${REALISATION_SURFACE_WORDS.critical}: the critical surface of each case, found with every variable at its mean, is kept and the FS of each realisation is computed on it (no search per realisation). ${COUNTED_WORDS}. ${BETA_WORDS.normal}; ${BETA_WORDS.lognormal}.`,
  );
  for (const g of groups.values()) {
    const ids = g.stations.map(stationWord);
    const which =
      groups.size === 1 && g.stations.length === carrying.length
        ? 'Every station in the table below'
        : `Station${ids.length === 1 ? '' : 's'} ${ids.join(', ')}`;
    const units = g.stations[0].section.units;
    l.paragraph(`${which}: ${probabilityBasisWords(g.spec)}.`, { style: 'bold', after: 0 });
    for (const v of g.spec.variables)
      l.paragraph(`${v.name}: ${v.target}, ${variableDistributionWords(v, units)}`, {
        indent: 10,
        after: 0,
      });
    for (const k of g.spec.correlations)
      l.paragraph(`correlation ${k.between[0]} – ${k.between[1]}: ${k.coefficient}`, {
        indent: 10,
        after: 0,
      });
    l.gap(4);
  }
  l.table(
    [
      { head: `station (${L})`, width: 45, align: 'right' },
      { head: 'section', width: 100 },
      { head: 'case', width: 63 },
      { head: 'FS', width: 32, align: 'right' },
      { head: 'mean FS', width: 36, align: 'right' },
      { head: 'P(FS < 1) ± SE', width: 72, align: 'right' },
      { head: 'β normal', width: 40, align: 'right' },
      { head: 'β lognormal', width: 52, align: 'right' },
      { head: 'valid / N', width: 55, align: 'right' },
    ],
    carrying.flatMap((s) =>
      (s.probability ?? []).map((p) => {
        const c = s.result?.cases.find((x) => x.name === p.case);
        return [
          String(s.result?.station ?? s.section.station ?? '—'),
          s.section.id,
          p.case,
          c?.governing ? fsText(c.governing.fs) : '—',
          p.meanFs === null ? '—' : fsText(p.meanFs),
          countedText(p.pFailure),
          num(p.betaNormal, 2),
          num(p.betaLognormal, 2),
          `${p.valid} / ${p.realisations}`,
        ];
      }),
    ),
  );
  l.paragraph(
    "FS: the governing FS of the case with the section's own values; mean FS, P(FS < 1) with one standard error and β: of the realisations; valid: the realisations that gave an FS. Each section page gives P(FS < required) as well.",
    { size: 8, color: MUTED },
  );
}

/** The corridor's pages (`final`: the run that tells `onProgress`). */
function corridorPages(l: Layout, input: CorridorReportInput, final: boolean): void {
  const { meta, stations } = input;
  const name = meta.corridor ?? meta.source ?? 'corridor';
  const analysed = stations.filter((s) => s.result !== null);
  const results = analysed.map((s) => s.result as StationResult);
  const units: UnitSystem = stations[0]?.section.units ?? 'si';
  const L = UNIT_LABELS[units].length;
  const caseNames = [...new Set(results.flatMap((r) => r.cases.map((c) => c.name)))];
  const failed = [
    ...stations
      .filter((s) => s.result === null)
      .map((s) => ({
        station: s.section.station,
        label: s.section.id,
        reason: s.reason ?? 'not analyzed',
      })),
    ...(input.unread ?? []).map((u) => ({ ...u, reason: `did not read: ${u.reason}` })),
  ].sort((a, b) => (a.station ?? Infinity) - (b.station ?? Infinity));
  const total = stations.length + (input.unread?.length ?? 0);
  const count = (v: Verdict) => results.filter((r) => r.verdict === v).length;

  titleBlock(l, `Corridor report: ${name}`, meta, [
    ['stations', String(total)],
    ['cases', caseNames.join('; ') || '—'],
  ]);

  l.heading('Summary');
  l.fields([
    ['stations', String(total)],
    ['analyzed', String(analysed.length)],
    ['not analyzed (failed)', String(failed.length)],
    ['design cases', String(caseNames.length)],
    ['below requirement', String(count('below'))],
    ...VERDICTS.filter((v) => v !== 'below' && count(v) > 0).map((v): [string, string] => [
      VERDICT_WORDS[v],
      String(count(v)),
    ]),
  ]);
  l.table(
    [
      { head: 'case', width: 130 },
      { head: 'stations', width: 55, align: 'right' },
      { head: 'below requirement', width: 70, align: 'right' },
      { head: 'least FS', width: 60, align: 'right' },
      { head: 'least FS / required', width: 80, align: 'right' },
      { head: 'at station', width: 100 },
    ],
    caseNames.map((n) => {
      const rows = results.flatMap((r) => {
        const c = r.cases.find((x) => x.name === n);
        return c ? [{ r, c }] : [];
      });
      const key = (x: (typeof rows)[number]) => x.c.ratio ?? x.c.governing?.fs ?? Infinity;
      const least = rows.reduce<(typeof rows)[number] | null>(
        (a, x) => (a === null || key(x) < key(a) ? x : a),
        null,
      );
      return [
        n,
        String(rows.length),
        String(rows.filter((x) => x.c.verdict === 'below').length),
        least?.c.governing ? fsText(least.c.governing.fs) : '—',
        least?.c.ratio !== null && least?.c.ratio !== undefined ? least.c.ratio.toFixed(2) : '—',
        least ? `${least.r.station ?? '—'} ${least.r.id}` : '—',
      ];
    }),
  );

  for (const n of caseNames) {
    const points = stations.flatMap((s) => {
      const c = s.result?.cases.find((x) => x.name === n);
      const station = s.result?.station ?? s.section.station;
      if (station === null || (s.result && !c)) return [];
      return [{ station, fs: c?.governing?.fs ?? null, requiredFs: c?.requiredFs ?? null }];
    });
    if (points.length === 0) continue;
    const svg = drawChainage(points, {
      title: `Governing FS and the required FS along the chainage, case ${n}`,
      units,
      width: 1040,
      height: 300,
    });
    l.heading(`FS along the chainage: case ${n}`, 2, l.svgSize(svg, 330).h + 6);
    l.svg(svg, 330);
  }

  probabilityOfFailure(l, stations, total, L);

  l.heading('Stations below requirement');
  const low = stations.filter(below);
  if (low.length === 0)
    l.paragraph('None: every station analyzed meets its requirement or has none.');
  else
    l.table(
      [
        { head: `station (${L})`, width: 55, align: 'right' },
        { head: 'section', width: 120 },
        { head: 'governing case', width: 100 },
        { head: 'method', width: 80 },
        { head: 'FS', width: 40, align: 'right' },
        { head: 'required', width: 45, align: 'right' },
        { head: 'FS / required', width: 55, align: 'right' },
      ],
      low.map((s) => {
        const g = (s.result as StationResult).governing;
        return [
          String(s.result?.station ?? '—'),
          s.section.id,
          g?.case ?? '—',
          g?.method ?? '—',
          g ? fsText(g.fs) : '—',
          g?.requiredFs === null || g === null ? '—' : String(g.requiredFs),
          num(g?.ratio, 2),
        ];
      }),
    );

  l.heading('Stations not analyzed');
  if (failed.length === 0) l.paragraph('None.');
  else
    l.table(
      [
        { head: `station (${L})`, width: 55, align: 'right' },
        { head: 'section', width: 120 },
        { head: 'why', width: 320 },
      ],
      failed.map((s) => [String(s.station ?? '—'), s.label, s.reason]),
      { wrap: [2] },
    );

  const chosen = appendixStations(analysed, input.appendix);
  const shown = chosen.slice(0, REPORT_LIMITS.maxAppendixSections);
  const pages = shown.length;
  if (final) input.onProgress?.(0, pages);
  l.heading('Appendix: section pages');
  l.paragraph(
    input.appendix === 'none'
      ? 'No section pages were asked for.'
      : `${input.appendix === 'all' ? 'Every station analysed' : 'The stations below requirement'}: ${chosen.length} section${chosen.length === 1 ? '' : 's'}.`,
    { color: MUTED },
  );
  if (chosen.length > shown.length)
    l.paragraph(
      `The appendix is cut at ${REPORT_LIMITS.maxAppendixSections} sections (REPORT_LIMITS.maxAppendixSections): the last ${chosen.length - shown.length} of the ${chosen.length} are left out; report those sections on their own.`,
      { style: 'bold' },
    );
  shown.forEach((s, i) => {
    l.newPage();
    l.paragraph(`Appendix ${i + 1} of ${pages}: ${stationName(s.section)}`, {
      color: MUTED,
      size: 8,
    });
    sectionPages(l, {
      section: s.section,
      result: s.result as StationResult,
      probability: s.probability ?? null,
      meta: s.meta,
    });
    if (final) input.onProgress?.(i + 1, pages);
  });
}
