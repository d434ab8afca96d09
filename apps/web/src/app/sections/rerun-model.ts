/**
 * The re-run form's model: controls for the editable parameters of a stored section (SI, as
 * the API takes edits), validators with the ranges of schemas/section.schema.json, the JSON
 * merge patch of what changed, and where the API's located errors belong.
 */
import {
  FormArray,
  FormControl,
  FormGroup,
  type AbstractControl,
  type ValidationErrors,
  type ValidatorFn,
} from '@angular/forms';
import type { LocatedError } from '../core/models';
import type { QuantityKind } from '@scarpline/core/units';
import type { Point, SectionInput, SectionPatch, Strength } from './section-types';

/** A stored value as a field shows it: six significant digits. */
export function shownValue(v: number | null): number | null {
  return v === null ? null : Number(v.toPrecision(6));
}

/** A coordinate as a field shows it: to 0.1 mm. */
export function shownCoordinate(v: number): number {
  return Number(v.toFixed(4));
}

export type NumCtl = FormControl<number | null>;

interface Range {
  min?: number;
  max?: number;
  minExclusive?: boolean;
  maxExclusive?: boolean;
}

function rangeText(label: string, unit: string, r: Range): string {
  const u = unit ? (unit === '°' ? '°' : ` ${unit}`) : '';
  const parts: string[] = [];
  if (r.min !== undefined)
    parts.push(`${r.minExclusive ? 'greater than' : 'at least'} ${r.min}${u}`);
  if (r.max !== undefined) parts.push(`${r.maxExclusive ? 'less than' : 'at most'} ${r.max}${u}`);
  return `${label} must be ${parts.join(' and ')}.`;
}

/** A number, optionally required, within a range; the error carries its message. */
export function numberIn(label: string, unit: string, r: Range, required = true): ValidatorFn {
  return (c: AbstractControl): ValidationErrors | null => {
    const v: unknown = c.value;
    if (v === null || v === undefined || v === '') {
      return required ? { required: `Give ${label}.` } : null;
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) return { number: `${label} is a number.` };
    const low = r.min === undefined || (r.minExclusive ? v > r.min : v >= r.min);
    const high = r.max === undefined || (r.maxExclusive ? v < r.max : v <= r.max);
    return low && high ? null : { range: rangeText(label, unit, r) };
  };
}

/** The message of a control's first error (server errors first). */
export function errorText(errors: ValidationErrors | null | undefined): string {
  if (!errors) return '';
  for (const key of ['server', 'required', 'number', 'range', 'datum', 'points', 'order']) {
    const v: unknown = errors[key];
    if (typeof v === 'string') return v;
  }
  return 'Check this value.';
}

/** One editable number: its control, its label and SI unit, and its path in the section. */
export interface Field {
  key: string;
  label: string;
  unit: string;
  /** The path of this value in the section document, as the API's errors name it. */
  path: string;
  /** The stored value, exact. */
  original: number | null;
  /** The stored value as the field shows it (rounded: a us file's values are long in SI). */
  shown: number | null;
  /** Its kind of quantity, for its value in the file's own units. */
  quantity: QuantityKind | null;
  control: NumCtl;
  /** Where in the patch it goes, relative to its material: ['strength', 'su'] … */
  at: string[];
}

export interface MaterialEdit {
  name: string;
  model: Strength['model'];
  fields: Field[];
}

export type PointGroup = FormGroup<{ x: NumCtl; y: NumCtl }>;

export interface RerunModel {
  form: FormGroup;
  materials: MaterialEdit[];
  water: {
    kind: SectionInput['water']['kind'];
    unitWeight: Field;
    ru: Field | null;
    line: FormArray<PointGroup> | null;
    originalLine: Point[] | null;
  };
  requiredFs: Field;
}

/** A key of a path as the core writes it: `a.b`, or `a["odd key"]`. */
function step(key: string): string {
  return /^[A-Za-z0-9_][A-Za-z0-9_+@-]*$/.test(key) ? `.${key}` : `[${JSON.stringify(key)}]`;
}

function field(
  key: string,
  label: string,
  unit: string,
  quantity: QuantityKind | null,
  path: string,
  original: number | null,
  validator: ValidatorFn,
  at: string[] = [key],
): Field {
  const shown = shownValue(original);
  return {
    key,
    label,
    unit,
    quantity,
    path,
    original,
    shown,
    control: new FormControl<number | null>(shown, validator),
    at,
  };
}

/** γ and γsat: positive (exclusiveMinimum 0). */
const weight = (label: string) => numberIn(label, 'kN/m³', { min: 0, minExclusive: true });

/** Su's datum is needed once Su grows with depth (dependentRequired suRate → suDatum). */
function datumValidator(c: AbstractControl): ValidationErrors | null {
  const rate: unknown = c.parent?.get('suRate')?.value;
  const v: unknown = c.value;
  if (typeof rate === 'number' && rate > 0 && (v === null || v === undefined || v === '')) {
    return { datum: 'Give the elevation where Su applies: Su increases with depth below it.' };
  }
  if (v !== null && v !== undefined && v !== '' && !(typeof v === 'number' && Number.isFinite(v)))
    return { number: 'The datum is a number.' };
  return null;
}

function pointGroup(p: Point | null): PointGroup {
  return new FormGroup({
    x: new FormControl<number | null>(p ? shownCoordinate(p[0]) : null, numberIn('x', 'm', {})),
    y: new FormControl<number | null>(p ? shownCoordinate(p[1]) : null, numberIn('y', 'm', {})),
  });
}

/** At least two points, x never decreasing from one point to the next. */
function lineValidator(c: AbstractControl): ValidationErrors | null {
  const rows = (c as FormArray<PointGroup>).controls;
  if (rows.length < 2) return { points: 'The piezometric line needs at least two points.' };
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1].controls.x.value;
    const b = rows[i].controls.x.value;
    if (typeof a === 'number' && typeof b === 'number' && b < a) {
      return {
        order: `Point ${i + 1} goes back (x = ${b} after ${a}): x may not decrease along the line.`,
      };
    }
  }
  return null;
}

export function newPoint(after: Point | null): PointGroup {
  return pointGroup(after);
}

/** The controls for a stored section (its values are SI). */
export function buildModel(input: SectionInput): RerunModel {
  const materials: MaterialEdit[] = Object.entries(input.materials).map(([name, m]) => {
    const at = `materials${step(name)}`;
    const s = m.strength;
    const fields: Field[] = [];
    if (s.model !== 'rigid') {
      fields.push(
        field(
          'unitWeight',
          'γ',
          'kN/m³',
          'unitWeight',
          `${at}.unitWeight`,
          m.unitWeight,
          weight('γ'),
        ),
        field(
          'saturatedUnitWeight',
          'γsat',
          'kN/m³',
          'unitWeight',
          `${at}.saturatedUnitWeight`,
          m.saturatedUnitWeight,
          weight('γsat'),
        ),
      );
    }
    if (s.model === 'mohr-coulomb') {
      fields.push(
        field(
          'cohesion',
          'c′',
          'kPa',
          'pressure',
          `${at}.strength.cohesion`,
          s.cohesion,
          numberIn('c′', 'kPa', { min: 0 }),
          ['strength', 'cohesion'],
        ),
        field(
          'frictionAngle',
          'φ′',
          '°',
          null,
          `${at}.strength.frictionAngle`,
          s.frictionAngle,
          numberIn('φ′', '°', { min: 0, max: 90, maxExclusive: true }),
          ['strength', 'frictionAngle'],
        ),
      );
    } else if (s.model === 'undrained') {
      fields.push(
        field(
          'su',
          'Su',
          'kPa',
          'pressure',
          `${at}.strength.su`,
          s.su,
          numberIn('Su', 'kPa', { min: 0 }),
          ['strength', 'su'],
        ),
        field(
          'suRate',
          'Su increase with depth',
          'kPa/m',
          'pressurePerLength',
          `${at}.strength.suRate`,
          s.suRate,
          numberIn('The increase of Su', 'kPa/m', { min: 0 }),
          ['strength', 'suRate'],
        ),
        field(
          'suDatum',
          'Su datum elevation y',
          'm',
          'length',
          `${at}.strength.suDatum`,
          s.suDatum,
          datumValidator,
          ['strength', 'suDatum'],
        ),
      );
    }
    return { name, model: s.model, fields };
  });

  const w = input.water;
  const water: RerunModel['water'] = {
    kind: w.kind,
    unitWeight: field(
      'unitWeight',
      'γw',
      'kN/m³',
      'unitWeight',
      'water.unitWeight',
      w.unitWeight,
      weight('γw'),
    ),
    ru:
      w.kind === 'ru'
        ? field(
            'ru',
            'ru',
            '',
            null,
            'water.ru',
            w.ru,
            numberIn('ru', '', { min: 0, max: 1, maxExclusive: true }),
          )
        : null,
    line:
      w.kind === 'piezometric'
        ? new FormArray<PointGroup>(
            w.line.map((p) => pointGroup(p)),
            lineValidator,
          )
        : null,
    originalLine: w.kind === 'piezometric' ? w.line.map((p) => [p[0], p[1]] as Point) : null,
  };

  const required = input.analysis.requiredFs;
  const requiredFs = field(
    'requiredFs',
    'Required FS',
    '',
    null,
    'analysis.requiredFs',
    required,
    numberIn('The required FS', '', { min: 0, minExclusive: true }, required !== null),
  );

  const controls: Record<string, AbstractControl> = { requiredFs: requiredFs.control };
  materials.forEach((m, i) => {
    const group = new FormGroup<Record<string, NumCtl>>(
      Object.fromEntries(m.fields.map((f) => [f.key, f.control])),
    );
    const rate = group.controls['suRate'];
    const datum = group.controls['suDatum'];
    if (rate && datum) rate.valueChanges.subscribe(() => datum.updateValueAndValidity());
    controls[`material${i}`] = group;
  });
  controls['waterUnitWeight'] = water.unitWeight.control;
  if (water.ru) controls['ru'] = water.ru.control;
  if (water.line) controls['line'] = water.line;
  return { form: new FormGroup(controls), materials, water, requiredFs };
}

const changed = (f: Field) => f.control.value !== f.shown;

function put(target: Record<string, unknown>, at: string[], value: unknown): void {
  let o = target;
  for (const k of at.slice(0, -1)) {
    o[k] = o[k] ?? {};
    o = o[k] as Record<string, unknown>;
  }
  o[at[at.length - 1]] = value;
}

/**
 * The points of the line as edited, or null when they are as shown. A point left as it was
 * shown keeps its exact stored value.
 */
function editedLine(model: RerunModel): Point[] | null {
  const line = model.water.line;
  const before = model.water.originalLine;
  if (!line || !before) return null;
  const now = line.controls.map((g) => [g.controls.x.value, g.controls.y.value] as Point);
  const shown = before.map((p) => [shownCoordinate(p[0]), shownCoordinate(p[1])] as Point);
  const same =
    now.length === shown.length &&
    now.every((p, i) => p[0] === shown[i][0] && p[1] === shown[i][1]);
  if (same) return null;
  // Points kept in place (same index, same shown values) keep their exact stored values.
  return now.map((p, i) =>
    shown[i] && p[0] === shown[i][0] && p[1] === shown[i][1] ? before[i] : p,
  );
}

/**
 * The JSON merge patch (RFC 7396) of what changed, in SI, in the shape of the section
 * document: `{ materials: { clay: { strength: { frictionAngle: 24 } } }, water: { … },
 * requiredFs }`. Empty when nothing changed. A cleared Su datum is sent as null (removed).
 */
export function buildPatch(model: RerunModel): SectionPatch {
  const patch: SectionPatch = {};
  const materials: Record<string, unknown> = {};
  for (const m of model.materials) {
    const mp: Record<string, unknown> = {};
    for (const f of m.fields) if (changed(f)) put(mp, f.at, f.control.value);
    if (Object.keys(mp).length) materials[m.name] = mp;
  }
  if (Object.keys(materials).length) patch['materials'] = materials;
  const water: Record<string, unknown> = {};
  if (changed(model.water.unitWeight)) water['unitWeight'] = model.water.unitWeight.control.value;
  if (model.water.ru && changed(model.water.ru)) water['ru'] = model.water.ru.control.value;
  const line = editedLine(model);
  if (line) water['piezometric'] = line;
  if (Object.keys(water).length) patch['water'] = water;
  if (changed(model.requiredFs)) patch['requiredFs'] = model.requiredFs.control.value;
  return patch;
}

/** Every control of the model with the path the API's errors use for it. */
function targets(model: RerunModel): { path: string; control: AbstractControl }[] {
  const out: { path: string; control: AbstractControl }[] = [];
  for (const m of model.materials) for (const f of m.fields) out.push(f);
  out.push(model.water.unitWeight, model.requiredFs);
  if (model.water.ru) out.push(model.water.ru);
  const line = model.water.line;
  if (line) {
    out.push({ path: 'water.piezometric', control: line });
    line.controls.forEach((g, i) => {
      out.push({ path: `water.piezometric[${i}]`, control: g.controls.x });
      out.push({ path: `water.piezometric[${i}][0]`, control: g.controls.x });
      out.push({ path: `water.piezometric[${i}][1]`, control: g.controls.y });
    });
  }
  // requiredFs is sent at the top but checked as part of the analysis
  out.push({ path: 'requiredFs', control: model.requiredFs.control });
  return out;
}

/**
 * Puts each located error of a 422 on the control it is about (the longest path that is the
 * error's path or a prefix of it); answers the errors that belong to no field.
 */
export function placeErrors(model: RerunModel, errors: readonly LocatedError[]): LocatedError[] {
  const all = targets(model);
  const rest: LocatedError[] = [];
  for (const e of errors) {
    const path = e.path ?? '';
    let best: { path: string; control: AbstractControl } | null = null;
    for (const t of all) {
      const hit = path === t.path || path.startsWith(`${t.path}.`) || path.startsWith(`${t.path}[`);
      if (hit && (!best || t.path.length > best.path.length)) best = t;
    }
    if (best) {
      best.control.setErrors({ ...(best.control.errors ?? {}), server: e.message });
      best.control.markAsTouched();
    } else {
      rest.push(e);
    }
  }
  return rest;
}
