/**
 * `scarpline probability`, `scarpline sensitivity` and `scarpline solve`: the probabilistic
 * analysis of a section's random variables (its `probability` block), one-at-a-time
 * sensitivity with the tornado, and solving for the value of one input at which the critical
 * FS equals a target. Tables (or JSON), SVG drawings, the caution on every output. With the
 * surface searched again in each realisation, the realisations are shared among worker
 * threads in chunks (probability-worker.ts), which give the numbers of one run.
 */
import { writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import {
  CAUTION,
  analyzeProbability,
  caseProbability,
  countedText,
  distributionWords,
  drawProbability,
  drawSensitivity,
  drawTornado,
  fromSi,
  fsText,
  parseTarget,
  percentText,
  probabilityBasisWords,
  probabilityResult,
  probabilityRun,
  sensitivity,
  solveForValue,
  targetQuantity,
  targetValue,
  sectionOfCase,
  taylorSeries,
  toSi,
  UNIT_LABELS,
  type CaseProbability,
  type Critical,
  type ProbabilityResult,
  type ProbabilitySpec,
  type Section,
  type SensitivityResult,
  type SolveResult,
  type TaylorResult,
  type UnitSystem,
} from '@scarpline/core';
import { readSections, svgNameFor } from './plot-file';
import { UserError } from './read-input';
import type { ChunkReply, ChunkTask } from './probability-worker';

type Print = (line: string) => void;

/** Writes a drawing and says so (on standard error when standard output is JSON). */
function writer(json: boolean | undefined, print: Print, printErr: Print) {
  return (name: string, svg: string) => {
    writeFileSync(name, `${svg}\n`);
    (json ? printErr : print)(`wrote ${name}`);
  };
}

/** What the three commands share: which section and case of the file. */
interface Which {
  section?: string;
  case?: string;
}

export interface ProbabilityOptions extends Which {
  json?: boolean;
  svg?: string;
  realisations?: number;
  seed?: number;
  method?: ProbabilitySpec['method'];
  search?: boolean;
  taylor?: boolean;
  jobs?: number;
}

export interface SensitivityOptions extends Which {
  json?: boolean;
  svg?: string;
  tornado?: string;
  points?: number;
  search?: boolean;
}

export interface SolveOptions extends Which {
  for: string;
  target: number;
  range: [number, number];
  scan?: number;
  json?: boolean;
}

/** The sections of the file (or the one --section names); messages printed; errors throw. */
function sectionsOf(file: string, which: Which, printErr: Print): Section[] {
  const r = readSections(file);
  for (const w of r.warnings) printErr(w);
  if (r.errors.length > 0) {
    for (const e of r.errors) printErr(e);
    throw new UserError(`${r.name}: the file has errors (above); nothing was analyzed`);
  }
  const sections = which.section ? r.sections.filter((s) => s.id === which.section) : r.sections;
  if (sections.length === 0)
    throw new UserError(
      `${r.name}: no section ${which.section ?? ''} (it has ${r.sections.map((s) => s.id).join(', ')})`,
    );
  if (which.case) {
    const missing = sections.find(
      (s) =>
        !(s.cases?.length
          ? s.cases.some((c) => c.name === which.case)
          : (s.analysis.case ?? 'as given') === which.case),
    );
    if (missing) throw new UserError(`section ${missing.id} has no case ${which.case}`);
  }
  return sections;
}

/** The random variables of a section, with the options that replace the file's settings. */
function specOf(s: Section, o: ProbabilityOptions | SensitivityOptions): ProbabilitySpec {
  if (!s.probability)
    throw new UserError(
      `section ${s.id} gives no random variables: add a probability block (variables with a target and a distribution; see examples/levee-probability.yaml)`,
    );
  const p = { ...s.probability };
  if (o.search !== undefined && o.search) {
    p.surface = 'search';
    if (!('realisations' in o) || o.realisations === undefined)
      p.realisations = Math.min(p.realisations, 1000);
  }
  if ('realisations' in o && o.realisations !== undefined) {
    const cap = p.surface === 'search' ? 5000 : 100_000;
    if (o.realisations > cap)
      throw new UserError(
        `--realisations: at most ${cap} ${p.surface === 'search' ? 'when each searches again' : ''}`.trim(),
      );
    p.realisations = o.realisations;
  }
  if ('seed' in o && o.seed !== undefined) p.seed = o.seed;
  if ('method' in o && o.method !== undefined) p.method = o.method;
  return p;
}

const fs3 = (v: number | null) => (v === null ? '—' : fsText(v));
const row = (label: string, value: string) => `    ${label.padEnd(34)}${value}`;

/** The table of one section's probabilistic result (and its Taylor series check). */
function probabilityTable(
  r: ProbabilityResult,
  spec: ProbabilitySpec,
  taylor: TaylorResult | null,
): string[] {
  const lines = [`${r.id}  ${r.title}`];
  lines.push(`  ${probabilityBasisWords(spec)}`);
  for (const v of spec.variables)
    lines.push(`    ${v.name}: ${v.target}, ${distributionWords(v.distribution)} (SI)`);
  for (const k of spec.correlations)
    lines.push(`    correlation ${k.between[0]} – ${k.between[1]}: ${k.coefficient}`);
  for (const c of r.cases) {
    lines.push(
      `  case ${c.case} (${c.method}${c.requiredFs !== null ? `, required FS ${fsText(c.requiredFs)}` : ''})`,
    );
    lines.push(row('FS at the means (deterministic)', fs3(c.deterministicFs)));
    lines.push(row('mean FS', fs3(c.meanFs)));
    lines.push(row('SD of FS', c.sdFs === null ? '—' : c.sdFs.toFixed(3)));
    lines.push(row('least … greatest FS', `${fs3(c.minFs)} … ${fs3(c.maxFs)}`));
    lines.push(row('P(FS < 1), counted', `${countedText(c.pFailure)} (1 SE)`));
    if (c.pBelowRequired && c.requiredFs !== null)
      lines.push(row(`P(FS < ${fsText(c.requiredFs)}), counted`, countedText(c.pBelowRequired)));
    const beta = (b: typeof c.betaNormal) =>
      b.beta === null ? '—' : `${b.beta.toFixed(2)}  (Φ(−β) = ${percentText(b.pf!)})`;
    lines.push(row('β, FS normal', beta(c.betaNormal)));
    lines.push(row('β, FS lognormal', beta(c.betaLognormal)));
    if (c.sdFs === 0)
      lines.push(
        "    the variables do not move this case's FS (SD 0: its critical surface misses what they vary), so β has no value",
      );
    lines.push(row('realisations with an FS', `${c.valid} of ${c.realisations}`));
    const t = taylor?.cases.find((x) => x.case === c.case);
    if (t) {
      lines.push(
        `    Taylor series method (${t.analyses} analyses): FS ${fs3(t.fsMean)}, SD ${t.sdFs?.toFixed(3) ?? '—'}, β normal ${t.betaNormal.beta?.toFixed(2) ?? '—'}, β lognormal ${t.betaLognormal.beta?.toFixed(2) ?? '—'}`,
      );
      for (const term of t.terms)
        lines.push(
          `      ${term.variable.padEnd(30)} FS ${fs3(term.fsMinus)} … ${fs3(term.fsPlus)} at ∓1 SD, ${term.share === null ? '—' : `${(100 * term.share).toFixed(1)} %`} of the variance`,
        );
      if (t.correlationShare !== null)
        lines.push(
          `      ${'the correlations (2ρ ΔFᵢ ΔFⱼ)'.padEnd(30)} ${(100 * t.correlationShare).toFixed(1)} % of the variance`,
        );
    }
  }
  return lines;
}

/**
 * The realisations of a run with the surface searched again in each, shared among `jobs`
 * worker threads in chunks; the cases' statistics from all of them, in order.
 */
async function searchedOnThreads(
  section: Section,
  spec: ProbabilitySpec,
  o: ProbabilityOptions,
): Promise<ProbabilityResult> {
  const run = probabilityRun(section, spec, o.case ? { caseName: o.case } : {});
  const criticals: Record<string, Critical> = {};
  for (const rc of run.cases) criticals[rc.model.name] = rc.critical;
  const chunk = Math.max(1, Math.min(50, Math.ceil(spec.realisations / 40)));
  const tasks: ChunkTask[] = [];
  run.cases.forEach((rc) => {
    for (let from = 0; from < spec.realisations; from += chunk)
      tasks.push({
        section,
        spec,
        caseName: rc.model.name,
        criticals,
        from,
        to: Math.min(spec.realisations, from + chunk),
      });
  });
  const fs = new Map<string, (number | null)[]>(
    run.cases.map((rc) => [rc.model.name, new Array<number | null>(spec.realisations).fill(null)]),
  );
  const jobs = Math.max(1, Math.min(o.jobs ?? availableParallelism(), tasks.length));
  const workers = Array.from(
    { length: jobs },
    () => new Worker(join(__dirname, 'probability-worker.js')),
  );
  let next = 0;
  let done = 0;
  const total = tasks.reduce((k, t) => k + t.to - t.from, 0);
  try {
    await Promise.all(
      workers.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            const feed = () => {
              if (next >= tasks.length) return resolve();
              const task = tasks[next++];
              w.once('message', (reply: ChunkReply) => {
                if (!reply.ok)
                  return reject(
                    new UserError(`section ${section.id}, case ${task.caseName}: ${reply.error}`),
                  );
                const out = fs.get(task.caseName)!;
                reply.fs.forEach((v, k) => (out[task.from + k] = v));
                done += reply.fs.length;
                // a terminal sees the realisations counted as they come
                if (process.stderr.isTTY)
                  process.stderr.write(`\r${section.id}: ${done} of ${total} realisations`);
                feed();
              });
              w.postMessage(task);
            };
            w.once('error', reject);
            feed();
          }),
      ),
    );
  } finally {
    if (process.stderr.isTTY) process.stderr.write('\n');
    await Promise.all(workers.map((w) => w.terminate()));
  }
  const cases: CaseProbability[] = run.cases.map((rc) =>
    caseProbability(rc, spec, fs.get(rc.model.name)!),
  );
  return probabilityResult(section, spec, cases);
}

/** `scarpline probability FILE`: exit 0 when analyzed, 1 on bad input. */
export async function probabilityFile(
  file: string,
  o: ProbabilityOptions,
  print: Print,
  printErr: Print,
): Promise<number> {
  const sections = sectionsOf(file, o, printErr);
  const write = writer(o.json, print, printErr);
  const out: { result: ProbabilityResult; taylor: TaylorResult | null }[] = [];
  for (const s of sections) {
    const spec = specOf(s, o);
    const options = o.case ? { caseName: o.case } : {};
    const result =
      spec.surface === 'search'
        ? await searchedOnThreads(s, spec, o)
        : analyzeProbability(s, spec, options);
    const taylor = o.taylor ? taylorSeries(s, spec, options) : null;
    out.push({ result, taylor });
    if (o.svg)
      for (const c of result.cases) {
        const name =
          sections.length === 1 && result.cases.length === 1
            ? o.svg
            : svgNameFor(o.svg, `${s.id}-${c.case}`);
        write(name, drawProbability(c, { title: `${s.title}: distribution of FS` }));
      }
    if (!o.json) {
      for (const line of probabilityTable(result, spec, taylor)) print(line);
      print('');
    }
  }
  if (o.json)
    print(
      JSON.stringify(
        {
          caution: CAUTION,
          units: 'si',
          sections: out.map((x) => ({
            ...x.result,
            ...(x.taylor ? { taylor: x.taylor.cases } : {}),
          })),
        },
        null,
        2,
      ),
    );
  else print(`Caution: ${CAUTION}`);
  return 0;
}

/** A sensitivity result with the variables' values in the file's units. */
function sensitivityInUnits(r: SensitivityResult, units: UnitSystem): SensitivityResult {
  const back = (target: string, v: number) => {
    const t = parseTarget(target);
    const kind = t.ok ? targetQuantity(t.target) : null;
    return kind ? fromSi(v, kind, units) : v;
  };
  return {
    ...r,
    cases: r.cases.map((c) => ({
      ...c,
      series: c.series.map((s) => ({
        ...s,
        from: back(s.target, s.from),
        to: back(s.target, s.to),
        points: s.points.map(([x, f]): [number, number | null] => [back(s.target, x), f]),
      })),
    })),
  };
}

/** `scarpline sensitivity FILE`: exit 0 when analyzed, 1 on bad input. */
export function sensitivityFile(
  file: string,
  o: SensitivityOptions,
  print: Print,
  printErr: Print,
): number {
  const sections = sectionsOf(file, o, printErr);
  const write = writer(o.json, print, printErr);
  const all: SensitivityResult[] = [];
  for (const s of sections) {
    const spec = specOf(s, o);
    const r = sensitivityInUnits(
      sensitivity(s, spec, { ...(o.case ? { caseName: o.case } : {}), points: o.points }),
      s.units,
    );
    all.push(r);
    const required = (name: string) =>
      (s.cases?.length
        ? s.cases.find((c) => c.name === name)?.requiredFs
        : s.analysis.requiredFs) ?? null;
    for (const c of r.cases) {
      const one = sections.length === 1 && r.cases.length === 1;
      const id = `${s.id}-${c.case}`;
      const opts = { requiredFs: required(c.case) };
      if (o.svg)
        write(
          one ? o.svg : svgNameFor(o.svg, id),
          drawSensitivity(c, { ...opts, title: `${s.title}: FS one variable at a time` }),
        );
      if (o.tornado)
        write(
          one ? o.tornado : svgNameFor(o.tornado, id),
          drawTornado(c, { ...opts, title: `${s.title}: tornado of FS` }),
        );
    }
    if (o.json) continue;
    print(`${s.id}  ${s.title}`);
    print(
      `  each variable over its 1st to 99th percentile (or its bounds), the others at their means; ${spec.surface === 'critical' ? "on each case's critical surface at the means" : 'the critical surface searched again at each value'}; values in ${s.units === 'us' ? 'US' : 'SI'} units`,
    );
    for (const c of r.cases) {
      print(`  case ${c.case}: FS at the means ${fs3(c.fsAtMeans)}`);
      print(
        `    ${'variable'.padEnd(30)}${'from'.padStart(10)}${'to'.padStart(10)}${'FS low'.padStart(9)}${'FS high'.padStart(9)}${'range'.padStart(8)}`,
      );
      for (const x of c.series) {
        const n = (v: number) => String(Number(v.toPrecision(4))).padStart(10);
        const width = x.fsLow !== null && x.fsHigh !== null ? (x.fsHigh - x.fsLow).toFixed(3) : '—';
        print(
          `    ${x.variable.padEnd(30)}${n(x.from)}${n(x.to)}${fs3(x.fsLow).padStart(9)}${fs3(x.fsHigh).padStart(9)}${width.padStart(8)}`,
        );
      }
    }
    print('');
  }
  if (o.json) print(JSON.stringify({ caution: CAUTION, sections: all }, null, 2));
  else print(`Caution: ${CAUTION}`);
  return 0;
}

/**
 * `scarpline solve FILE --for TARGET --target FS --range A,B`: the range and the value in the
 * file's units. Exit 0 when a value was found in every section, 2 when the range holds none
 * in some section, 1 on bad input.
 */
export function solveFile(file: string, o: SolveOptions, print: Print, printErr: Print): number {
  const parsed = parseTarget(o.for);
  if (!parsed.ok) throw new UserError(`--for: ${parsed.reason}`);
  const kind = targetQuantity(parsed.target);
  const sections = sectionsOf(file, o, printErr);
  const results: SolveResult[] = [];
  let code = 0;
  for (const s of sections) {
    const has = targetValue(sectionOfCase(s, o.case), parsed.target);
    if (!has.ok) throw new UserError(`--for: section ${s.id}: ${has.reason}`);
    const si = (v: number) => (kind ? toSi(v, kind, s.units) : v);
    const back = (v: number) => (kind ? fromSi(v, kind, s.units) : v);
    const r = solveForValue(s, {
      target: o.for,
      targetFs: o.target,
      range: [si(o.range[0]), si(o.range[1])],
      ...(o.case ? { caseName: o.case } : {}),
      ...(o.scan ? { scan: o.scan } : {}),
    });
    const unitWords = kind ? ` ${UNIT_LABELS[s.units][kind]}` : '';
    const seen = r.steps.flatMap((x) => (x.fs === null ? [] : [x.fs]));
    const lo = back(r.range[0]);
    const hi = back(r.range[1]);
    const words = (v: number) => String(Number(v.toPrecision(6)));
    const shown: SolveResult = {
      ...r,
      range: [lo, hi],
      value: r.value === null ? null : back(r.value),
      steps: r.steps.map((x) => ({ ...x, value: back(x.value) })),
      // the reason in the file's units (the core's is in SI)
      reason:
        r.found || seen.length === 0
          ? r.reason
          : `no value in ${words(lo)} … ${words(hi)}${unitWords} gives FS = ${o.target}: over the range the critical FS lies between ${Math.min(...seen).toFixed(3)} and ${Math.max(...seen).toFixed(3)}; widen the range or change the target`,
    };
    results.push(shown);
    if (!r.found) code = 2;
    if (o.json) continue;
    const unit = kind ? ` ${UNIT_LABELS[s.units][kind]}` : '';
    const n = (v: number) => String(Number(v.toPrecision(6)));
    print(`${s.id}  ${s.title}`);
    print(
      `  case ${r.case}: ${o.for} for a critical FS of ${fsText(o.target)}, looked for in ${n(shown.range[0])} … ${n(shown.range[1])}${unit} (the full analysis at each step)`,
    );
    if (r.found) {
      print(
        `  value ${n(shown.value!)}${unit}: FS ${fs3(r.fs)} (${r.method ?? '—'}), after ${r.analyses} analyses`,
      );
      if (r.surface?.type === 'circle')
        print(
          `  critical surface: circle, centre (${r.surface.center.map((v) => n(fromSi(v, 'length', s.units))).join(', ')}), radius ${n(fromSi(r.surface.radius, 'length', s.units))} ${UNIT_LABELS[s.units].length}`,
        );
      else if (r.surface?.type === 'polyline')
        print(`  critical surface: polyline of ${r.surface.points.length} points`);
      else if (r.surface?.type === 'plane')
        print(`  critical surface: plane at ${n(r.surface.angle)}°`);
    } else print(`  no value found: ${shown.reason ?? ''} (${r.analyses} analyses)`);
    print('');
  }
  if (o.json) print(JSON.stringify({ caution: CAUTION, sections: results }, null, 2));
  else print(`Caution: ${CAUTION}`);
  return code;
}
