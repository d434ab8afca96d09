import {
  caseView,
  designCases,
  distinctWarnings,
  drawdownWords,
  drawSection,
  fsText,
  howFoundWords,
  METHOD_WORDS,
  reinforcementWords,
  requiredWords,
  seismicWords,
  sectionOfCase,
  sliceSheet,
  stationInUnits,
  strengthWords,
  surfaceText,
  UNIT_LABELS,
  VERDICT_WORDS,
  BETA_WORDS,
  COUNTED_WORDS,
  countedText,
  probabilityBasisWords,
  variableDistributionWords,
  type CaseResult,
  type MethodReport,
  type Section,
  type StationProbability,
  type StationResult,
} from '@scarpline/core';
import { MUTED, type Layout } from './layout';
import type { ReportMeta, SectionReportInput } from './types';
import {
  day,
  geometryRows,
  loadText,
  modelName,
  num,
  quantity,
  reinforcementText,
  reviewed,
  strengthText,
  waterText,
} from './words';

/** A station's name: its station, id and title. */
export function stationName(section: Section): string {
  const st =
    section.station === null ? '' : `${section.station} ${UNIT_LABELS[section.units].length}  `;
  return `${st}${section.id} — ${section.title}`;
}

/**
 * The title block: what was analysed, when, by which version and who submitted it, then the
 * review record; when nobody has checked it, lines to sign by hand.
 */
export function titleBlock(
  l: Layout,
  heading: string,
  meta: ReportMeta,
  rows: readonly (readonly [string, string])[],
): void {
  l.heading(heading, 1);
  l.fields([
    ['project', meta.project ?? '—'],
    ['corridor', meta.corridor ?? '—'],
    ...rows,
    ['source', meta.source ?? '—'],
    ['run', meta.run === undefined ? '—' : String(meta.run)],
    ['date', day(meta.date)],
    ['solver version', meta.solverVersion],
    ['submitted by', meta.submittedBy ?? '—'],
  ]);
  l.heading('Review', 3, 50);
  const r = meta.review;
  l.fields([
    ['state', r?.state ?? 'not reviewed'],
    ['reviewer', r?.reviewer ?? '—'],
    ['date', day(r?.date)],
    ['decision', r?.decision ?? '—'],
    ['comment', r?.comment ?? '—'],
  ]);
  if (!reviewed(r)) l.handLines(['checked by', 'date', 'signature']);
}

/** Label–value rows of a list: the label on the first, 'none' for an empty list. */
const listed = (label: string, items: readonly string[]): [string, string][] =>
  items.length
    ? items.map((x, i): [string, string] => [i === 0 ? label : '', x])
    : [[label, 'none']];

/** The inputs: geometry, materials, water, loads, reinforcement, cases and requirements, random variables. */
function inputs(l: Layout, s: Section, probability: readonly StationProbability[] | null): void {
  const u = s.units;
  l.heading('Inputs');
  l.paragraph(
    `Units: ${u === 'si' ? 'SI' : 'US customary'} (lengths in ${UNIT_LABELS[u].length}, pressures in ${UNIT_LABELS[u].pressure}, unit weights in ${UNIT_LABELS[u].unitWeight}).`,
    { color: MUTED },
  );
  l.heading('Geometry (x, y)', 3);
  l.table(
    [
      { head: 'line', width: 110 },
      { head: `points (x, y) in ${UNIT_LABELS[u].length}`, width: 385 },
    ],
    geometryRows(s),
    { wrap: [1] },
  );
  l.heading('Materials', 3);
  l.table(
    [
      { head: 'name', width: 70 },
      { head: 'description and source', width: 135 },
      { head: `γ / γsat (${UNIT_LABELS[u].unitWeight})`, width: 60, align: 'right' },
      { head: 'strength model', width: 80 },
      { head: 'parameters', width: 150 },
    ],
    Object.values(s.materials).map((m) => [
      m.name,
      m.description ?? '—',
      `${quantity(m.unitWeight, 'unitWeight', u, 1).split(' ')[0]} / ${quantity(m.saturatedUnitWeight, 'unitWeight', u, 1).split(' ')[0]}`,
      modelName(m),
      strengthText(m, u),
    ]),
    { wrap: [1, 3, 4] },
  );
  l.heading('Water, loads and reinforcement', 3);
  l.fields([
    ['water', waterText(s.water, u)],
    ...listed(
      'loads',
      s.loads.map((x) => loadText(x, u)),
    ),
    ...listed(
      'reinforcement',
      s.reinforcement.map((x) => reinforcementText(x, u)),
    ),
    [
      'seismic coefficients',
      s.seismic.kh || s.seismic.kv ? `kh ${s.seismic.kh}, kv ${s.seismic.kv}` : 'none',
    ],
    [
      'tension crack',
      s.crack
        ? `depth ${s.crack.depth === 'auto' ? 'from the strength (auto)' : quantity(s.crack.depth, 'length', u)}, water in it ${quantity(s.crack.waterDepth, 'length', u)}`
        : 'none',
    ],
    [
      'slip surface',
      s.analysis.surface
        ? `${s.analysis.surface.type === 'circle' || s.analysis.surface.type === 'polyline' ? 'given' : 'searched'}: ${s.analysis.surface.type}`
        : s.analysis.infiniteSlope
          ? 'infinite slope'
          : '—',
    ],
    ['slices', String(s.analysis.slices)],
  ]);
  l.heading('Design cases and requirements', 3);
  l.table(
    [
      { head: 'case', width: 100 },
      { head: 'kind', width: 85 },
      { head: 'required FS', width: 55, align: 'right' },
      { head: 'methods', width: 150 },
      { head: 'governing methods', width: 105 },
    ],
    designCases(s).map((c) => [
      c.name,
      c.kind,
      c.requiredFs === null ? '—' : String(c.requiredFs),
      c.analysis.methods.join(', '),
      (c.governs ?? c.analysis.methods).join(', '),
    ]),
    { wrap: [0, 3, 4] },
  );
  const cases = designCases(s);
  for (const c of cases) {
    const differs: [string, string][] = [];
    if (c.water !== s.water) differs.push(['water', waterText(c.water, u)]);
    if (c.loads !== s.loads && c.loads.length)
      differs.push(['loads', c.loads.map((x) => loadText(x, u)).join('; ')]);
    if (c.seismic.kh || c.seismic.kv)
      differs.push(['seismic', `kh ${c.seismic.kh}, kv ${c.seismic.kv}`]);
    if (c.drawdown) differs.push(['drawdown to', waterText(c.drawdown.after, u)]);
    if (differs.length && cases.length > 1) {
      l.paragraph(`case ${c.name}:`, { style: 'bold', size: 8.5 });
      l.fields(differs, 120, 8.5);
    }
  }
  randomVariables(l, s, probability);
}

/**
 * The section's random variables (its `probability` block): how the realisations are drawn and
 * analysed, each variable's target and distribution in the section's units, the correlations,
 * and whether this report gives the probability of failure that rests on them.
 */
function randomVariables(
  l: Layout,
  s: Section,
  probability: readonly StationProbability[] | null,
): void {
  const spec = s.probability;
  if (!spec) return;
  l.heading('Random variables', 3);
  l.paragraph(`${probabilityBasisWords(spec)}.`);
  l.table(
    [
      { head: 'variable', width: 110 },
      { head: 'target', width: 170 },
      { head: 'distribution', width: 215 },
    ],
    spec.variables.map((v) => [v.name, v.target, variableDistributionWords(v, s.units)]),
    { wrap: [0, 1, 2] },
  );
  l.fields(
    [
      ...listed(
        'correlations',
        spec.correlations.map((k) => `${k.between[0]} – ${k.between[1]}: ${k.coefficient}`),
      ),
    ],
    120,
    8.5,
  );
  if (probability?.length) return;
  l.paragraph(
    spec.surface === 'search'
      ? 'A probability of failure with the critical surface searched again in each realisation is a study of its own: this report gives none.'
      : 'No probability of failure was computed with this run: this report gives none.',
    { color: MUTED },
  );
}

/** A case's probability of failure: the FS's statistics, P(FS < 1), P(FS < required), β. */
function probabilityBlock(l: Layout, p: StationProbability, requiredFs: number | null): void {
  const counted = (x: { p: number; standardError: number }) => `${countedText(x)} (1 SE)`;
  l.heading('Probability of failure', 3, 80);
  l.fields([
    ['mean FS', p.meanFs === null ? '—' : fsText(p.meanFs)],
    ['SD of FS', num(p.sdFs, 3)],
    ['P(FS < 1)', counted(p.pFailure)],
    ...(p.pBelowRequired && requiredFs !== null
      ? [[`P(FS < ${requiredFs})`, counted(p.pBelowRequired)] as [string, string]]
      : []),
    ['β, FS normal', num(p.betaNormal, 2)],
    ['β, FS lognormal', num(p.betaLognormal, 2)],
    ['realisations with an FS', `${p.valid} of ${p.realisations}`],
  ]);
  l.paragraph(
    `${COUNTED_WORDS}; ${BETA_WORDS.normal}; ${BETA_WORDS.lognormal}. The random variables are listed with the inputs.`,
    { size: 8, color: MUTED },
  );
}

/** The methods the result used, with what they rest on and where they were published. */
function methods(l: Layout, r: StationResult): void {
  const used = [...new Set(r.cases.flatMap((c) => c.results.map((m) => m.method)))];
  l.heading('Methods and references');
  for (const id of used) {
    const w = METHOD_WORDS[id];
    l.paragraph(`${w.name} (${id})`, { style: 'bold', after: 0 });
    l.paragraph(w.basis, { indent: 10, after: 0 });
    for (const ref of w.references)
      l.paragraph(ref, { indent: 10, size: 8, color: MUTED, after: 0 });
    l.gap(4);
  }
}

/** A method's extra values in words: λ, θ, the correction, the interslice function. */
function extras(m: MethodReport): string {
  const parts: string[] = [];
  if (m.lambda !== undefined) parts.push(`λ ${m.lambda.toFixed(3)}`);
  if (m.theta !== undefined) parts.push(`θ ${m.theta.toFixed(1)}°`);
  if (m.correction !== undefined) parts.push(`f0 ${m.correction.toFixed(3)}`);
  if (m.fsUncorrected !== undefined) parts.push(`FS before f0 ${fsText(m.fsUncorrected)}`);
  if (m.intersliceFunction) parts.push(`f(x) ${m.intersliceFunction}`);
  return parts.join(', ');
}

/** One case: the methods' results, the verdict, the drawing, the search, warnings, slices. */
function caseResults(
  l: Layout,
  section: Section,
  r: StationResult,
  c: CaseResult,
  probability: StationProbability | undefined,
): void {
  const u = r.units;
  const req = c.requiredFs;
  l.heading(
    `Case ${c.name} (${c.kind}${req !== null ? `, required FS ${req}` : ', no requirement'})`,
  );
  l.table(
    [
      { head: 'method', width: 85 },
      { head: 'FS', width: 38, align: 'right' },
      { head: 'FS / required', width: 48, align: 'right' },
      { head: 'converged (iterations)', width: 58 },
      { head: 'λ, θ and other values', width: 106 },
      { head: 'slip surface or reason', width: 160 },
    ],
    c.results.map((m) => [
      `${m.method}${c.governs.includes(m.method) ? '' : ' *'}`,
      m.fs === null ? '—' : fsText(m.fs),
      m.fs !== null && req ? (m.fs / req).toFixed(2) : '—',
      `${m.converged ? 'yes' : 'no'} (${m.iterations})`,
      extras(m),
      m.converged ? surfaceText(m, UNIT_LABELS[u].length) : (m.reason ?? ''),
    ]),
    { wrap: [4, 5] },
  );
  if (c.results.some((m) => !c.governs.includes(m.method)))
    l.paragraph('* for comparison only: not among the methods that govern this case', {
      size: 8,
      color: MUTED,
    });
  const g = c.governing;
  l.paragraph(
    g
      ? `Governing: ${g.method} FS ${fsText(g.fs)}${req !== null ? ` against required ${req}${c.ratio !== null ? ` (${c.ratio.toFixed(2)} × required)` : ''}` : ''}: ${VERDICT_WORDS[c.verdict]}.`
      : `Governing: no method converged: ${VERDICT_WORDS[c.verdict]}.`,
    { style: 'bold' },
  );
  const words: string[] = [];
  if (c.seismic) words.push(...seismicWords(c.seismic, u));
  if (c.drawdown) words.push(...drawdownWords(c.drawdown));
  const governing = c.results.find((m) => m.method === g?.method);
  const strengths = governing ? strengthWords(governing, u) : null;
  if (strengths) words.push(strengths);
  if (governing) words.push(...reinforcementWords(governing, u));
  if (c.requiredReinforcement) words.push(requiredWords(c.requiredReinforcement, u));
  for (const w of words) l.paragraph(w.trim(), { indent: w.startsWith('  ') ? 10 : 0, after: 0 });
  if (words.length) l.gap(4);
  if (probability) probabilityBlock(l, probability, c.requiredFs);

  const drawing = drawSection(sectionOfCase(section, c.name), caseView(r, c.name), {
    idPrefix: `c${r.cases.indexOf(c)}`,
  });
  l.heading('Drawing', 3, l.svgSize(drawing, 400).h + 6);
  l.svg(drawing, 400);

  l.heading('Search', 3);
  const s = c.search;
  if (!s) l.paragraph('No search: the slip surface was given (or the method needs none).');
  else {
    const L = UNIT_LABELS[u].length;
    const grid = s.grid
      ? `centre grid x ${num(s.grid.x[0], 2)} to ${num(s.grid.x[1], 2)}, y ${num(s.grid.y[0], 2)} to ${num(s.grid.y[1], 2)} ${L}, ${s.grid.nx} × ${s.grid.ny} points`
      : 'no centre grid';
    l.paragraph(
      `${s.type} search by ${s.method}${s.noncircularMethod ? ` (non-circular by ${s.noncircularMethod})` : ''}: ${s.trials.toLocaleString('en-GB')} trial surfaces; ${grid}.`,
    );
    for (const mv of s.moves) l.paragraph(`grid moved: ${mv.reason}`, { indent: 10, after: 0 });
    if (s.howFound) for (const w of howFoundWords(s.howFound)) l.paragraph(w, { after: 0 });
    l.paragraph(
      s.map
        ? `FS map: the least FS of the circles about each grid centre, drawn as filled contours on the drawing above (${s.map.xs.length} × ${s.map.ys.length} centres); ${s.trialBand.count} trial surfaces within ${s.trialBand.within} of the least FS drawn.`
        : `No FS map (the search has no centre grid); ${s.trialBand.count} trial surfaces within ${s.trialBand.within} of the least FS drawn.`,
      { after: 4 },
    );
  }

  const warnings = distinctWarnings({ results: c.results, warnings: c.warnings });
  l.heading('Warnings', 3);
  if (warnings.length === 0) l.paragraph('None.');
  for (const w of warnings)
    l.paragraph(`${w.method ? `${w.method}: ` : ''}${w.message}`, { indent: 0, after: 1 });

  if (governing && governing.slices.length > 0) {
    const sheet = sliceSheet({ id: r.id, units: u, cases: [c] }, new Set());
    // drop the sheet's case and method columns: the heading names them
    const cols = sheet.columns.slice(2);
    l.heading(`Slices of the governing method (${governing.method})`, 3, 80);
    l.table(
      cols.map((col) => ({
        head: col.unit ? `${col.name} (${col.unit})` : col.name,
        width: col.name === 'material' ? 62 : col.name === '#' ? 18 : 33,
        align: col.name === 'material' ? 'left' : 'right',
      })),
      sheet.rows.slice(3).map((row) =>
        row.slice(2).map((v, i) => {
          if (v === null || v === undefined) return '';
          const f = cols[i].format;
          return typeof v === 'number' && f ? v.toFixed(f.split('.')[1]?.length ?? 0) : String(v);
        }),
      ),
      { size: 6.5 },
    );
  }
}

/** The pages of one section: title block, inputs, methods, the results of each case. */
export function sectionPages(l: Layout, input: SectionReportInput): void {
  const { section, meta } = input;
  const r = stationInUnits(input.result, section.units);
  const g = r.governing;
  titleBlock(l, `Section report: ${section.id}`, meta, [
    ['station', stationName(section)],
    [
      r.cases.length > 1 ? 'cases' : 'case',
      r.cases
        .map((c) => `${c.name}${c.requiredFs !== null ? ` (required FS ${c.requiredFs})` : ''}`)
        .join('; '),
    ],
    [
      'outcome',
      `${VERDICT_WORDS[r.verdict]}${g ? `; governing case ${g.case}: ${g.method} FS ${fsText(g.fs)}${g.ratio !== null ? `, ${g.ratio.toFixed(2)} × required` : ''}` : ''}`,
    ],
  ]);
  const probability = input.probability ?? null;
  inputs(l, section, probability);
  methods(l, r);
  for (const c of r.cases)
    caseResults(
      l,
      section,
      r,
      c,
      probability?.find((p) => p.case === c.name),
    );
}
