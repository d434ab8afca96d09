/**
 * The re-run form's model: controls for the editable parameters of a stored section (SI, as
 * the API takes edits: materials, water, the required FS, the design cases and the capacities of
 * the reinforcing elements), validators with the ranges of schemas/section.schema.json, the JSON
 * merge patch of what changed, and where the API's located errors belong.
 */
import { signal, type WritableSignal } from '@angular/core';
import {
  FormArray,
  FormControl,
  FormGroup,
  type AbstractControl,
  type ValidationErrors,
  type ValidatorFn,
} from '@angular/forms';
import type { LocatedError } from '../core/models';
import { reinforcementDocument } from '@scarpline/core/model';
import { fromSi, type QuantityKind } from '@scarpline/core/units';
import type {
  DesignCase,
  Material,
  Point,
  Reinforcement,
  SectionInput,
  SectionPatch,
  Strength,
} from './section-types';

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
      // "The required FS" begins a sentence of its own, not this one
      const named = label.startsWith('The ') ? `the ${label.slice(4)}` : label;
      return required ? { required: `Give ${named}.` } : null;
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
  /**
   * The value is in the unit an SI file writes (mm for a displacement), not in the SI the
   * section holds (m): `quantity` converts from the latter.
   */
  inFileUnit?: boolean;
}

export type PointGroup = FormGroup<{ x: NumCtl; y: NumCtl }>;

/**
 * A shear–normal strength's points (σ′n, τ in kPa) as an editable list: the whole list is
 * sent when it changed (a merge patch replaces a list), a point kept in place keeping its
 * exact stored value.
 */
export interface PointsEdit {
  /** The path of the list in the section document, as the API's errors name it. */
  path: string;
  original: Point[];
  array: FormArray<PointGroup>;
}

export interface MaterialEdit {
  name: string;
  model: Strength['model'];
  fields: Field[];
  /** The points of a shear–normal strength; null for any other model. */
  points: PointsEdit | null;
}

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
  /** The design cases the section lists, in order; empty for a section that lists none. */
  cases: CaseEdit[];
  /** The section's reinforcing elements, in order: their capacities. */
  reinforcement: ReinforcementEdit[];
}

/**
 * One reinforcing element's capacities: a geosynthetic's strength, interaction and coverage, a
 * nail's bar, bond and facing, an anchor's capacity and bond, a pile's shear. A list is replaced
 * whole by a merge patch, so an edit sends every element as the section document writes it.
 */
export interface ReinforcementEdit {
  name: string;
  type: Reinforcement['type'];
  /** Its place in the stored list (`reinforcement[1]`). */
  index: number;
  /** The element as stored (SI), written back with the edited values. */
  original: Reinforcement;
  fields: Field[];
  group: FormGroup;
}

/**
 * One design case's own values: its required FS, kh and kv (a seismic case), its earthquake
 * (when it has one), and the materials it sets its own properties for. Its fields' paths are
 * those of the stored list (`cases[2].requiredFs`); a case can be removed from the next run.
 */
export interface CaseEdit {
  name: string;
  kind: DesignCase['kind'];
  /** Its place in the stored list. */
  index: number;
  requiredFs: Field;
  /** Its required FS is the section's as stored (it may give none of its own). */
  sectionsRequirement: boolean;
  seismic: { kh: Field; kv: Field } | null;
  /** pga, magnitude and the allowable displacement (mm), when the case has an earthquake. */
  earthquake: Field[] | null;
  materials: MaterialEdit[];
  /** Every field of the case. */
  fields: Field[];
  group: FormGroup;
  /** Marked to be removed from the next run. */
  removed: WritableSignal<boolean>;
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

/** A point of a shear–normal strength: σ′n any number, τ at least 0 (kPa), six digits shown. */
function stressPointGroup(p: Point | null): PointGroup {
  return new FormGroup({
    x: new FormControl<number | null>(p ? shownValue(p[0]) : null, numberIn('σ′n', 'kPa', {})),
    y: new FormControl<number | null>(
      p ? shownValue(p[1]) : null,
      numberIn('τ', 'kPa', { min: 0 }),
    ),
  });
}

/**
 * At least two points, σ′n increasing from one point to the next (the schema's minItems and
 * the core's check of a shear–normal strength).
 */
function stressPointsValidator(c: AbstractControl): ValidationErrors | null {
  const rows = (c as FormArray<PointGroup>).controls;
  if (rows.length < 2)
    return { points: 'A shear–normal strength needs at least two points (σ′n, τ).' };
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1].controls.x.value;
    const b = rows[i].controls.x.value;
    if (typeof a === 'number' && typeof b === 'number' && !(b > a)) {
      return {
        order: `Point ${i + 1}: σ′n ${b} kPa is not above that of the point before (${a} kPa); give the points with σ′n increasing.`,
      };
    }
  }
  return null;
}

/** A new point of a shear–normal strength, after the given one (a copy of it) or empty. */
export function newStressPoint(after: Point | null): PointGroup {
  return stressPointGroup(after);
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

/** The fields of a material; `at` is its path (`materials.clay`, `cases[1].materials.clay`). */
function materialEdit(name: string, m: Material, at: string): MaterialEdit {
  const s = m.strength;
  const fields: Field[] = [];
  /** A field of the material's strength: its path and its place in the patch from its key. */
  const strength = (
    key: string,
    label: string,
    unit: string,
    quantity: QuantityKind | null,
    original: number | null,
    validator: ValidatorFn,
  ): Field =>
    field(key, label, unit, quantity, `${at}.strength.${key}`, original, validator, [
      'strength',
      key,
    ]);
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
      strength('cohesion', 'c′', 'kPa', 'pressure', s.cohesion, numberIn('c′', 'kPa', { min: 0 })),
      strength(
        'frictionAngle',
        'φ′',
        '°',
        null,
        s.frictionAngle,
        numberIn('φ′', '°', { min: 0, max: 90, maxExclusive: true }),
      ),
    );
  } else if (s.model === 'undrained') {
    fields.push(
      strength('su', 'Su', 'kPa', 'pressure', s.su, numberIn('Su', 'kPa', { min: 0 })),
      strength(
        'suRate',
        'Su increase with depth',
        'kPa/m',
        'pressurePerLength',
        s.suRate,
        numberIn('The increase of Su', 'kPa/m', { min: 0 }),
      ),
      strength('suDatum', 'Su datum elevation y', 'm', 'length', s.suDatum, datumValidator),
    );
  } else if (s.model === 'hoek-brown') {
    fields.push(
      strength(
        'intactStrength',
        'σci',
        'kPa',
        'pressure',
        s.intactStrength,
        numberIn('σci', 'kPa', { min: 0, minExclusive: true }),
      ),
      strength(
        'gsi',
        'GSI',
        '',
        null,
        s.gsi,
        numberIn('GSI', '', { min: 0, minExclusive: true, max: 100 }),
      ),
      strength(
        'mi',
        'mi',
        '',
        null,
        s.mi,
        numberIn('mi', '', { min: 0, minExclusive: true, max: 50 }),
      ),
      strength('disturbance', 'D', '', null, s.disturbance, numberIn('D', '', { min: 0, max: 1 })),
    );
  } else if (s.model === 'undrained-ratio') {
    fields.push(
      strength(
        'ratio',
        'S = Su/σ′v',
        '',
        null,
        s.ratio,
        numberIn('S', '', { min: 0, minExclusive: true }),
      ),
      strength(
        'exponent',
        'm (exponent of OCR)',
        '',
        null,
        s.exponent,
        numberIn('m', '', { min: 0, max: 1.5 }),
      ),
      // OCR or POP, as the section gives it (the two are never given together)
      s.pop === null
        ? strength('ocr', 'OCR', '', null, s.ocr, numberIn('OCR', '', { min: 1 }))
        : strength('pop', 'POP', 'kPa', 'pressure', s.pop, numberIn('POP', 'kPa', { min: 0 })),
      strength(
        'minimum',
        'Least Su',
        'kPa',
        'pressure',
        s.minimum,
        numberIn('The least Su', 'kPa', { min: 0 }),
      ),
    );
  } else if (s.model === 'bilinear') {
    fields.push(
      strength('cohesion', 'c′', 'kPa', 'pressure', s.cohesion, numberIn('c′', 'kPa', { min: 0 })),
      strength(
        'frictionAngle',
        'φ′1',
        '°',
        null,
        s.frictionAngle,
        numberIn('φ′1', '°', { min: 0, max: 90, maxExclusive: true }),
      ),
      strength(
        'breakStress',
        'Break stress σ′n',
        'kPa',
        'pressure',
        s.breakStress,
        numberIn('The break stress', 'kPa', { min: 0, minExclusive: true }),
      ),
      strength(
        'frictionAngleBeyond',
        'φ′2',
        '°',
        null,
        s.frictionAngleBeyond,
        numberIn('φ′2', '°', { min: 0, max: 90, maxExclusive: true }),
      ),
    );
  }
  const points: PointsEdit | null =
    s.model === 'shear-normal'
      ? {
          path: `${at}.strength.points`,
          original: s.points.map((p) => [p[0], p[1]] as Point),
          array: new FormArray<PointGroup>(
            s.points.map((p) => stressPointGroup(p)),
            stressPointsValidator,
          ),
        }
      : null;
  return { name, model: s.model, fields, points };
}

/** The capacities of a reinforcing element that a re-run may change (ranges of the schema). */
function reinforcementEdit(r: Reinforcement, index: number): ReinforcementEdit {
  const at = `reinforcement[${index}]`;
  const f = (
    key: string,
    label: string,
    unit: string,
    quantity: QuantityKind | null,
    value: number,
    range: Range,
  ) => field(key, label, unit, quantity, `${at}.${key}`, value, numberIn(label, unit, range));
  const positive: Range = { min: 0, minExclusive: true };
  const fields: Field[] =
    r.type === 'geosynthetic'
      ? [
          f('strength', 'Design strength', 'kN/m', 'forcePerLength', r.strength, { min: 0 }),
          f('interaction', 'Interaction Ci', '', null, r.interaction, {
            ...positive,
            max: 1.5,
          }),
          f('coverage', 'Coverage Rc', '', null, r.coverage, { ...positive, max: 1 }),
        ]
      : r.type === 'nail'
        ? [
            f('tensileCapacity', 'Bar capacity', 'kN', 'force', r.tensileCapacity, { min: 0 }),
            f('bond', 'Bond', 'kN/m', 'forcePerLength', r.bond, { min: 0 }),
            f('facingCapacity', 'Facing capacity', 'kN', 'force', r.facingCapacity, { min: 0 }),
          ]
        : r.type === 'anchor'
          ? [
              f('capacity', 'Capacity', 'kN', 'force', r.capacity, { min: 0 }),
              f('bond', 'Bond', 'kN/m', 'forcePerLength', r.bond, { min: 0 }),
            ]
          : [f('shear', 'Shear resistance', 'kN/m', 'forcePerLength', r.shear, { min: 0 })];
  return {
    name: r.name,
    type: r.type,
    index,
    original: r,
    fields,
    group: new FormGroup(Object.fromEntries(fields.map((x) => [x.key, x.control]))),
  };
}

/** The controls for a stored section (its values are SI). */
export function buildModel(input: SectionInput): RerunModel {
  const materials: MaterialEdit[] = Object.entries(input.materials).map(([name, m]) =>
    materialEdit(name, m, `materials${step(name)}`),
  );

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
  materials.forEach((m, i) => (controls[`material${i}`] = materialGroup(m)));
  controls['waterUnitWeight'] = water.unitWeight.control;
  if (water.ru) controls['ru'] = water.ru.control;
  if (water.line) controls['line'] = water.line;
  const cases = (input.cases ?? []).map((c, i) => caseEdit(input, c, i));
  cases.forEach((c, i) => (controls[`case${i}`] = c.group));
  const reinforcement = (input.reinforcement ?? []).map((r, i) => reinforcementEdit(r, i));
  reinforcement.forEach((r, i) => (controls[`reinforcement${i}`] = r.group));
  return { form: new FormGroup(controls), materials, water, requiredFs, cases, reinforcement };
}

/** A material's controls as a group (the datum checked again when the rate changes). */
function materialGroup(m: MaterialEdit): FormGroup {
  const group = new FormGroup<Record<string, AbstractControl>>(
    Object.fromEntries(m.fields.map((f) => [f.key, f.control])),
  );
  if (m.points) group.addControl('points', m.points.array);
  const rate = group.controls['suRate'];
  const datum = group.controls['suDatum'];
  if (rate && datum) rate.valueChanges.subscribe(() => datum.updateValueAndValidity());
  return group;
}

/** A value with its object members in one order, to compare two materials. */
function canonical(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(canonical);
  if (typeof v !== 'object' || v === null) return v;
  const o = v as Record<string, unknown>;
  return Object.fromEntries(
    Object.keys(o)
      .filter((k) => k !== 'name' && k !== 'description' && o[k] !== undefined)
      .sort()
      .map((k) => [k, canonical(o[k])]),
  );
}

const sameMaterial = (a: Material, b: Material | undefined): boolean =>
  b !== undefined && JSON.stringify(canonical(a)) === JSON.stringify(canonical(b));

/**
 * A case's own values. Its materials are those it sets its own properties for (differing from
 * the section's): the section document writes such a material whole in the case, so an edit
 * of one of its properties merges into it. A material the case leaves as the section's is not
 * offered (an edit would give the case a partial strength, which the API refuses).
 */
function caseEdit(input: SectionInput, c: DesignCase, index: number): CaseEdit {
  const at = `cases[${index}]`;
  const sectionRequired = input.analysis.requiredFs;
  const requiredFs = field(
    'requiredFs',
    'Required FS',
    '',
    null,
    `${at}.requiredFs`,
    c.requiredFs,
    numberIn('The required FS', '', { min: 0, minExclusive: true }, c.requiredFs !== null),
  );
  const seismic =
    c.kind === 'seismic'
      ? {
          kh: field(
            'kh',
            'kh',
            '',
            null,
            `${at}.seismic.kh`,
            c.seismic.kh,
            numberIn('kh', '', { min: 0, max: 1, maxExclusive: true }),
            ['seismic', 'kh'],
          ),
          kv: field(
            'kv',
            'kv',
            '',
            null,
            `${at}.seismic.kv`,
            c.seismic.kv,
            numberIn('kv', '', { min: -1, max: 1, minExclusive: true, maxExclusive: true }),
            ['seismic', 'kv'],
          ),
        }
      : null;
  const e = c.kind === 'seismic' ? c.earthquake : null;
  const allowable = e?.allowableDisplacement ?? null;
  const earthquake = e
    ? [
        field(
          'pga',
          'Design PGA',
          'g',
          null,
          `${at}.earthquake.pga`,
          e.pga,
          numberIn('The design PGA', 'g', { min: 0, max: 3, minExclusive: true }, false),
          ['earthquake', 'pga'],
        ),
        field(
          'magnitude',
          'Magnitude Mw',
          '',
          null,
          `${at}.earthquake.magnitude`,
          e.magnitude,
          numberIn('The magnitude', '', { min: 0, max: 10, minExclusive: true }, false),
          ['earthquake', 'magnitude'],
        ),
        {
          ...field(
            'allowableDisplacement',
            'Allowable displacement',
            'mm',
            'displacement',
            `${at}.earthquake.allowableDisplacement`,
            // held in m, written in mm as an SI file writes it
            allowable === null ? null : fromSi(allowable, 'displacement', 'si'),
            numberIn('The allowable displacement', 'mm', { min: 0, minExclusive: true }, false),
            ['earthquake', 'allowableDisplacement'],
          ),
          inFileUnit: true,
        },
      ]
    : null;
  const materials = Object.entries(c.materials)
    .filter(([name, m]) => m.strength.model !== 'rigid' && !sameMaterial(m, input.materials[name]))
    .map(([name, m]) => materialEdit(name, m, `${at}.materials${step(name)}`));
  const fields = [
    requiredFs,
    ...(seismic ? [seismic.kh, seismic.kv] : []),
    ...(earthquake ?? []),
    ...materials.flatMap((m) => m.fields),
  ];
  const controls: Record<string, AbstractControl> = { requiredFs: requiredFs.control };
  if (seismic) {
    controls['kh'] = seismic.kh.control;
    controls['kv'] = seismic.kv.control;
  }
  for (const f of earthquake ?? []) controls[f.key] = f.control;
  materials.forEach((m, i) => (controls[`material${i}`] = materialGroup(m)));
  return {
    name: c.name,
    kind: c.kind,
    index,
    requiredFs,
    sectionsRequirement: c.requiredFs === sectionRequired,
    seismic,
    earthquake,
    materials,
    fields,
    group: new FormGroup(controls),
    removed: signal(false),
  };
}

/** The cases not marked to be removed. */
export function keptCases(model: RerunModel): CaseEdit[] {
  return model.cases.filter((c) => !c.removed());
}

/** A case may be removed while another stays: a section keeps at least one. */
export function mayRemove(model: RerunModel, c: CaseEdit): boolean {
  return !c.removed() && keptCases(model).length > 1;
}

/** Marks the case to be removed from the next run (its fields no longer checked or sent). */
export function removeCase(model: RerunModel, c: CaseEdit): void {
  if (!mayRemove(model, c)) return;
  c.removed.set(true);
  c.group.disable();
}

/** Keeps a case marked to be removed, with its values as they were edited. */
export function keepCase(c: CaseEdit): void {
  c.removed.set(false);
  c.group.enable();
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
 * The points of a list as edited, or null when they are as shown (`show` rounds a stored value
 * as its field shows it). A point left as it was shown keeps its exact stored value.
 */
function editedPoints(
  array: FormArray<PointGroup>,
  before: Point[],
  show: (v: number) => number,
): Point[] | null {
  const now = array.controls.map((g) => [g.controls.x.value, g.controls.y.value] as Point);
  const shown = before.map((p) => [show(p[0]), show(p[1])] as Point);
  const same =
    now.length === shown.length &&
    now.every((p, i) => p[0] === shown[i][0] && p[1] === shown[i][1]);
  if (same) return null;
  // Points kept in place (same index, same shown values) keep their exact stored values.
  return now.map((p, i) =>
    shown[i] && p[0] === shown[i][0] && p[1] === shown[i][1] ? before[i] : p,
  );
}

/** The points of the piezometric line as edited, or null when they are as shown. */
function editedLine(model: RerunModel): Point[] | null {
  const line = model.water.line;
  const before = model.water.originalLine;
  if (!line || !before) return null;
  return editedPoints(line, before, shownCoordinate);
}

/**
 * The merge patch of one material: its changed fields, and a shear–normal strength's points
 * whole when any changed (a merge patch replaces a list).
 */
function materialPatch(m: MaterialEdit): Record<string, unknown> {
  const mp: Record<string, unknown> = {};
  for (const f of m.fields) if (changed(f)) put(mp, f.at, f.control.value);
  if (m.points) {
    const pts = editedPoints(m.points.array, m.points.original, (v) => shownValue(v) ?? v);
    if (pts) put(mp, ['strength', 'points'], pts);
  }
  return mp;
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
    const mp = materialPatch(m);
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
  const cases: Record<string, unknown> = {};
  for (const c of model.cases) {
    const cp = c.removed() ? null : casePatch(c);
    if (cp === null || Object.keys(cp).length) cases[c.name] = cp;
  }
  if (Object.keys(cases).length) patch['cases'] = cases;
  const list = reinforcementPatch(model.reinforcement);
  if (list) patch['reinforcement'] = list;
  return patch;
}

/**
 * The reinforcement as edited, every element as the section document writes it (SI) with its
 * changed capacities; null when none changed. The whole list: a merge patch replaces a list.
 */
function reinforcementPatch(edits: readonly ReinforcementEdit[]): unknown[] | null {
  if (!edits.some((e) => e.fields.some(changed))) return null;
  return edits.map((e) => {
    const doc = reinforcementDocument(e.original) as unknown as Record<string, unknown>;
    for (const f of e.fields) if (changed(f)) doc[f.key] = f.control.value;
    return doc;
  });
}

/** The value to send: as edited, or the exact stored value when the field is as shown. */
const valueOf = (f: Field) => (changed(f) ? f.control.value : f.original);

/**
 * The merge patch of one case (what the API merges into the case as the section document
 * writes it). kh and kv go together: a case's seismic replaces the section's whole, and one
 * that was the section's is not written in the case, so kh alone would leave kv at 0.
 */
function casePatch(c: CaseEdit): Record<string, unknown> {
  const cp: Record<string, unknown> = {};
  if (changed(c.requiredFs)) cp['requiredFs'] = c.requiredFs.control.value;
  if (c.seismic && (changed(c.seismic.kh) || changed(c.seismic.kv))) {
    cp['seismic'] = { kh: valueOf(c.seismic.kh), kv: valueOf(c.seismic.kv) };
  }
  for (const f of c.earthquake ?? []) if (changed(f)) put(cp, f.at, f.control.value);
  const materials: Record<string, unknown> = {};
  for (const m of c.materials) {
    const mp = materialPatch(m);
    if (Object.keys(mp).length) materials[m.name] = mp;
  }
  if (Object.keys(materials).length) cp['materials'] = materials;
  return cp;
}

/** A list of points and each point's two values, with their paths: `x[1]`, `x[1][0]` … */
function pointTargets(
  path: string,
  array: FormArray<PointGroup>,
): { path: string; control: AbstractControl }[] {
  const out: { path: string; control: AbstractControl }[] = [{ path, control: array }];
  array.controls.forEach((g, i) => {
    out.push({ path: `${path}[${i}]`, control: g.controls.x });
    out.push({ path: `${path}[${i}][0]`, control: g.controls.x });
    out.push({ path: `${path}[${i}][1]`, control: g.controls.y });
  });
  return out;
}

/** Every control of the model with the path the API's errors use for it. */
function targets(model: RerunModel): { path: string; control: AbstractControl }[] {
  const out: { path: string; control: AbstractControl }[] = [];
  for (const m of model.materials) {
    for (const f of m.fields) out.push(f);
    if (m.points) out.push(...pointTargets(m.points.path, m.points.array));
  }
  out.push(model.water.unitWeight, model.requiredFs);
  if (model.water.ru) out.push(model.water.ru);
  const line = model.water.line;
  if (line) out.push(...pointTargets('water.piezometric', line));
  for (const r of model.reinforcement) out.push(...r.fields);
  // requiredFs is sent at the top but checked as part of the analysis
  out.push({ path: 'requiredFs', control: model.requiredFs.control });
  // the API locates a case's errors in the list as edited: without the cases removed
  keptCases(model).forEach((c, k) => {
    const from = `cases[${c.index}]`;
    for (const f of c.fields) {
      out.push({ path: `cases[${k}]${f.path.slice(from.length)}`, control: f.control });
    }
    for (const m of c.materials) {
      if (m.points)
        out.push(...pointTargets(`cases[${k}]${m.points.path.slice(from.length)}`, m.points.array));
    }
  });
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
