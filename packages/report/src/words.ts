import {
  fromSi,
  strengthQuantities,
  UNIT_LABELS,
  type Load,
  type Material,
  type Point,
  type QuantityKind,
  type Reinforcement,
  type Section,
  type UnitSystem,
  type Water,
} from '@scarpline/core';
import type { ReviewRecord } from './types';

/** A number to `digits` decimals, or a dash. */
export const num = (v: number | null | undefined, digits: number): string =>
  typeof v === 'number' && Number.isFinite(v) ? v.toFixed(digits) : '—';

/** A value of the section (SI) in its units, with the unit. */
export function quantity(v: number, kind: QuantityKind, units: UnitSystem, digits = 2): string {
  return `${fromSi(v, kind, units).toFixed(digits)} ${UNIT_LABELS[units][kind]}`;
}

/** A polyline in the section's units: "(x, y) (x, y) …". */
export function pointsText(points: readonly Point[], units: UnitSystem): string {
  const L = (v: number) => fromSi(v, 'length', units).toFixed(2);
  return points.map((p) => `(${L(p[0])}, ${L(p[1])})`).join(' ');
}

/** A date (ISO) as a day, e.g. 2026-12-03. */
export const day = (iso: string | undefined): string => (iso ? iso.slice(0, 10) : '—');

/** Whether the record says someone checked the calculation. */
export const reviewed = (r: ReviewRecord | null | undefined): r is ReviewRecord =>
  !!r && !!r.reviewer && !/^not reviewed$/i.test(r.state.trim());

/** How a strength parameter is named in the report. */
const PARAMETER_NAMES: Record<string, string> = {
  cohesion: 'c′',
  frictionAngle: 'φ′',
  su: 'Su',
  suRate: 'Su increase with depth',
  suDatum: 'Su datum level',
  intactStrength: 'σci',
  gsi: 'GSI',
  mi: 'mi',
  disturbance: 'D',
  ratio: 'Su/σ′v (normally consolidated)',
  minimum: 'Su at least',
  exponent: 'm',
  ocr: 'OCR',
  pop: 'POP',
  points: '(σ′n, τ) points',
  beyond: 'beyond the last point',
  breakStress: 'σ′n at the break',
  frictionAngleBeyond: 'φ′ beyond the break',
};

const ANGLES = new Set(['frictionAngle', 'frictionAngleBeyond']);

/** What a strength model is called in the materials table. */
const MODEL_NAMES: Record<string, string> = {
  'mohr-coulomb': 'Mohr–Coulomb (drained)',
  undrained: 'undrained (Su)',
  rigid: 'rigid (no slip through it)',
  'hoek-brown': 'generalised Hoek–Brown',
  'undrained-ratio': 'undrained, Su from σ′v (SHANSEP)',
  'shear-normal': 'shear–normal function',
  bilinear: 'bilinear Mohr–Coulomb',
};

/** A material's strength model in words. */
export const modelName = (m: Material): string => MODEL_NAMES[m.strength.model] ?? m.strength.model;

/** A material's strength parameters in the section's units, e.g. "c′ 5.00 kPa, φ′ 32.0°". */
export function strengthText(m: Material, units: UnitSystem): string {
  const s = m.strength as unknown as Record<string, unknown>;
  const kinds = strengthQuantities(
    m.strength as unknown as Parameters<typeof strengthQuantities>[0],
  );
  const parts: string[] = [];
  for (const [key, v] of Object.entries(s)) {
    if (key === 'model' || v === null || v === undefined) continue;
    const name = PARAMETER_NAMES[key] ?? key;
    const kind = kinds[key];
    if (Array.isArray(v)) {
      const pts = (v as number[][])
        .map((p) => `(${p.map((x) => (kind ? fromSi(x, kind, units) : x).toFixed(1)).join(', ')})`)
        .join(' ');
      parts.push(`${name} ${pts}${kind ? ` ${UNIT_LABELS[units][kind]}` : ''}`);
    } else if (typeof v === 'number')
      parts.push(
        kind
          ? `${name} ${fromSi(v, kind, units).toFixed(kind === 'length' ? 2 : 1)} ${UNIT_LABELS[units][kind]}`
          : `${name} ${ANGLES.has(key) ? `${v.toFixed(1)}°` : String(v)}`,
      );
    else if (typeof v === 'string') parts.push(`${name} ${v}`);
  }
  return parts.join(', ') || '—';
}

/** The water of a section (or a case) in words. */
export function waterText(w: Water, units: UnitSystem): string {
  const g = `γw ${quantity(w.unitWeight, 'unitWeight', units)}`;
  if (w.kind === 'none') return `none (dry); ${g}`;
  if (w.kind === 'ru') return `pore-pressure ratio ru = ${w.ru}; ${g}`;
  return `piezometric line ${pointsText(w.line, units)}; ${g}`;
}

/** A load in words. */
export function loadText(l: Load, units: UnitSystem): string {
  const L = (v: number) => quantity(v, 'length', units);
  if (l.type === 'strip')
    return `strip load ${quantity(l.pressure, 'pressure', units, 1)} from x = ${L(l.from)} to ${L(l.to)}`;
  return `line load ${quantity(l.force, 'forcePerLength', units, 1)} at x = ${L(l.x)}, at ${l.angle}° from the vertical`;
}

/** A reinforcing element in words. */
export function reinforcementText(r: Reinforcement, units: UnitSystem): string {
  const L = (v: number) => quantity(v, 'length', units);
  const F = (v: number) => quantity(v, 'force', units, 1);
  const FL = (v: number) => quantity(v, 'forcePerLength', units, 1);
  const byF = r.dividedByF ? 'divided by F' : 'at full value';
  switch (r.type) {
    case 'geosynthetic':
      return `geosynthetic "${r.name}" along ${pointsText(r.line, units)}: strength ${FL(r.strength)}, interaction ${r.interaction}, coverage ${r.coverage}, ${byF}`;
    case 'nail':
      return `soil nail "${r.name}" head ${pointsText([r.head], units)}, ${r.inclination}° toward the ${r.toward}, length ${L(r.length)}, spacing ${L(r.spacing)}: tensile capacity ${F(r.tensileCapacity)}, bond ${FL(r.bond)}, facing ${F(r.facingCapacity)}, ${byF}`;
    case 'anchor':
      return `ground anchor "${r.name}" head ${pointsText([r.head], units)}, ${r.inclination}° toward the ${r.toward}, free length ${L(r.freeLength)}, bond length ${L(r.bondLength)}, spacing ${L(r.spacing)}: capacity ${F(r.capacity)}, bond ${FL(r.bond)}, acting as ${r.acts === 'load' ? 'a load' : 'mobilised'}, ${byF}`;
    case 'pile':
      return `pile row "${r.name}" at x = ${L(r.x)} from ${r.top === null ? 'the ground' : L(r.top)} to ${L(r.bottom)}: shear ${FL(r.shear)}, ${byF}`;
  }
}

/** The section's ground and strata tops, each a line of points. */
export function geometryRows(s: Section): [string, string][] {
  return [
    ['ground', pointsText(s.ground, s.units)],
    ...s.strata.map((t, i): [string, string] => [
      `stratum ${i + 1}: ${t.material}`,
      pointsText(t.top, s.units),
    ]),
  ];
}
