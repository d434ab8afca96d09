/**
 * The study form's model, pure: the section's own random variables as a section document
 * writes them, the inputs a solve may aim at, the defaults of each field, the request the
 * contract takes (apps/api services/studies) and where each of the API's located errors goes.
 */
import type { ProbabilitySpec } from '@scarpline/core/result';
import type { Section } from '@scarpline/core/model';
import type { LocatedError } from '../core/models';
import type { ProbabilityDocument, StudyKind, StudyRequest } from './study-types';

/** Realisations when a section gives none (the core's defaults, common practice). */
export const DEFAULT_REALISATIONS = { critical: 10_000, search: 1_000 } as const;

/** The kinds of study in our words. */
export const KIND_WORDS: Readonly<Record<StudyKind, string>> = {
  probability: 'Probability of failure',
  sensitivity: 'Sensitivity, one variable at a time',
  solve: 'Solve for a value',
};

/** A section's random variables as its document writes them (SI, as the API stores it). */
export function variablesDocument(p: ProbabilitySpec): ProbabilityDocument {
  return {
    variables: p.variables.map(({ name, target, distribution: d }) => {
      const { kind, ...values } = d;
      return { name, target, distribution: kind, ...values };
    }),
    ...(p.correlations.length > 0 ? { correlations: p.correlations } : {}),
    seed: p.seed,
    method: p.method,
    realisations: p.realisations,
    surface: p.surface,
  };
}

/** A variable's distribution in one line (SI, as stored). */
export function distributionText(d: ProbabilitySpec['variables'][number]['distribution']): string {
  const n = (v: number) => String(Number(v.toPrecision(4)));
  switch (d.kind) {
    case 'normal':
    case 'lognormal':
      return `${d.kind}, mean ${n(d.mean)}, SD ${n(d.sd)}`;
    case 'truncated-normal':
      return `normal cut to [${n(d.min)}, ${n(d.max)}], mean ${n(d.mean)}, SD ${n(d.sd)}`;
    case 'uniform':
      return `uniform on [${n(d.min)}, ${n(d.max)}]`;
    case 'triangular':
      return `triangular on [${n(d.min)}, ${n(d.max)}], mode ${n(d.mode)}`;
  }
}

/** An input of the section a solve may aim at: its target, its words and its current value (SI). */
export interface TargetChoice {
  target: string;
  label: string;
  value: number;
}

const PARAMETER_WORDS: Readonly<Record<string, string>> = {
  unitWeight: 'unit weight (kN/m³)',
  saturatedUnitWeight: 'saturated unit weight (kN/m³)',
  cohesion: 'cohesion c′ (kPa)',
  frictionAngle: 'friction angle φ′ (°)',
  su: 'undrained strength Su (kPa)',
  suRate: 'Su increase with depth (kPa/m)',
  suDatum: 'Su datum (m)',
  intactStrength: 'intact strength σci (kPa)',
  gsi: 'GSI',
  mi: 'mi',
  disturbance: 'disturbance D',
  ratio: 'Su/σ′v ratio',
  minimum: 'least Su (kPa)',
};

/**
 * The inputs of the section a solve may aim at: each material's unit weights and the numbers
 * of its strength, the water (a shift of the piezometric line, or ru) and the seismic
 * coefficients. Targets are the core's (core/probability/target.ts).
 */
export function targetChoices(s: Section): TargetChoice[] {
  const out: TargetChoice[] = [];
  for (const [name, m] of Object.entries(s.materials)) {
    if (m.strength.model === 'rigid') continue;
    const numbers: [string, number][] = [
      ['unitWeight', m.unitWeight],
      ['saturatedUnitWeight', m.saturatedUnitWeight],
    ];
    for (const [k, v] of Object.entries(m.strength)) {
      if (typeof v === 'number' && Number.isFinite(v)) numbers.push([k, v]);
    }
    for (const [k, v] of numbers) {
      out.push({
        target: `materials.${name}.${k}`,
        label: `${name}: ${PARAMETER_WORDS[k] ?? k}`,
        value: v,
      });
    }
  }
  if (s.water.kind === 'piezometric') {
    out.push({
      target: 'water.level',
      label: 'Water: shift of the piezometric line, + up (m)',
      value: 0,
    });
  } else if (s.water.kind === 'ru') {
    out.push({ target: 'water.ru', label: 'Water: pore pressure ratio ru', value: s.water.ru });
  }
  out.push(
    { target: 'seismic.kh', label: 'Seismic: horizontal coefficient kh', value: s.seismic.kh },
    { target: 'seismic.kv', label: 'Seismic: vertical coefficient kv', value: s.seismic.kv },
  );
  return out;
}

/** A range about a value to search a solve in: half to one and a half times it, or ±1 about 0. */
export function defaultRange(value: number): [number, number] {
  if (value === 0) return [-1, 1];
  const a = value * 0.5;
  const b = value * 1.5;
  return a < b ? [a, b] : [b, a];
}

/** The design cases of a section, with the required FS of each (one case: the section's own). */
export function caseChoices(s: Section): { name: string | null; requiredFs: number | null }[] {
  if (s.cases && s.cases.length > 0) {
    return s.cases.map((c) => ({ name: c.name, requiredFs: c.requiredFs }));
  }
  return [{ name: null, requiredFs: s.analysis.requiredFs }];
}

/** What the form holds, as its controls give it (a number field left empty is null). */
export interface StudyFormValue {
  kind: StudyKind;
  method: 'monte-carlo' | 'latin-hypercube';
  realisations: number | null;
  seed: number | null;
  surface: 'critical' | 'search';
  /** '' for every case (probability, sensitivity) or the section's one case. */
  case: string;
  target: string;
  targetFs: number | null;
  from: number | null;
  to: number | null;
}

/** The form's starting values for a section. */
export function initialValue(s: Section): StudyFormValue {
  const p = s.probability;
  const surface = p?.surface ?? 'critical';
  const first = targetChoices(s)[0];
  const cases = caseChoices(s);
  // one case: its required FS; several: the governing one's, which the API fills in
  const requiredFs = cases.length === 1 ? cases[0].requiredFs : null;
  const [from, to] = defaultRange(first?.value ?? 0);
  return {
    kind: p ? 'probability' : 'solve',
    method: p?.method ?? 'monte-carlo',
    realisations: p?.realisations ?? DEFAULT_REALISATIONS[surface],
    seed: p?.seed ?? 1,
    surface,
    case: '',
    target: first?.target ?? '',
    targetFs: requiredFs,
    from,
    to,
  };
}

/**
 * The request of the form's value. A probabilistic analysis with the section's own settings
 * sends no block (the API takes the section's own); with other settings it sends the section's
 * variables with them. A sensitivity always runs the section's own variables.
 */
export function studyRequest(s: Section, v: StudyFormValue): StudyRequest {
  const caseName = v.case === '' ? undefined : v.case;
  switch (v.kind) {
    case 'probability': {
      const own = s.probability;
      const same =
        own !== undefined &&
        own.method === v.method &&
        own.realisations === v.realisations &&
        own.seed === v.seed &&
        own.surface === v.surface;
      if (same || !own) return { kind: 'probability' };
      return {
        kind: 'probability',
        probability: {
          ...variablesDocument(own),
          method: v.method,
          ...(v.realisations === null ? {} : { realisations: v.realisations }),
          ...(v.seed === null ? {} : { seed: v.seed }),
          surface: v.surface,
        },
      };
    }
    case 'sensitivity':
      return { kind: 'sensitivity', ...(caseName === undefined ? {} : { case: caseName }) };
    case 'solve':
      return {
        kind: 'solve',
        target: v.target,
        ...(caseName === undefined ? {} : { case: caseName }),
        ...(v.targetFs === null ? {} : { targetFs: v.targetFs }),
        range: [v.from ?? Number.NaN, v.to ?? Number.NaN],
      };
  }
}

/** The form's fields an error of the API may land on. */
export type StudyField =
  | 'kind'
  | 'method'
  | 'realisations'
  | 'seed'
  | 'surface'
  | 'variables'
  | 'case'
  | 'target'
  | 'targetFs'
  | 'from'
  | 'to';

/** An error of the API: the core's located message, or one with a JSON pointer into the body. */
export type StudyError = LocatedError & { pointer?: string };

/** Where an error is, as a dotted path into the request (`probability.realisations`, `range.1`). */
export function errorPath(e: StudyError): string {
  const pointer = e.pointer ?? (e.path?.startsWith('/') ? e.path : undefined);
  if (typeof pointer === 'string' && pointer !== '') {
    return pointer
      .replace(/^#?\//, '')
      .split('/')
      .map((k) => k.replace(/~1/g, '/').replace(/~0/g, '~'))
      .join('.');
  }
  return (e.path ?? '').replace(/\[(\d+)\]/g, '.$1');
}

/** The field of the form an error belongs to; null: the form as a whole. */
export function fieldOf(e: StudyError): StudyField | null {
  const path = errorPath(e);
  const [head, next] = path.split('.');
  switch (head) {
    case 'kind':
    case 'case':
    case 'target':
    case 'targetFs':
      return head;
    case 'range':
      return next === '1' ? 'to' : 'from';
    case 'probability':
      switch (next) {
        case 'method':
        case 'realisations':
        case 'seed':
        case 'surface':
          return next;
        case 'variables':
        case 'correlations':
        case undefined:
          return 'variables';
        default:
          return null;
      }
    default:
      return null;
  }
}

/** What a study asked for, in one line (as the API accepted it, its defaults filled). */
export function requestText(r: StudyRequest): string {
  switch (r.kind) {
    case 'probability': {
      const p = r.probability;
      if (!p) return 'the section’s own variables and settings';
      const parts = [
        p.method === 'latin-hypercube' ? 'Latin hypercube' : 'Monte Carlo',
        ...(p.realisations === undefined ? [] : [`N = ${p.realisations}`]),
        ...(p.seed === undefined ? [] : [`seed ${p.seed}`]),
        p.surface === 'search' ? 'surface searched in each realisation' : 'critical surface',
        `${p.variables.length} ${p.variables.length === 1 ? 'variable' : 'variables'}`,
      ];
      return parts.join(', ');
    }
    case 'sensitivity':
      return r.case === undefined ? 'every case' : `case ${r.case}`;
    case 'solve': {
      const fs = r.targetFs === undefined ? 'the required FS' : `FS ${r.targetFs}`;
      const where = r.case === undefined ? '' : `, case ${r.case}`;
      return `${r.target} for ${fs} between ${r.range[0]} and ${r.range[1]}${where}`;
    }
  }
}
