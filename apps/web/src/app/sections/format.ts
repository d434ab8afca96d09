/** Words and numbers of the section page: units, FS and other figures (method names: shared/). */
import type { ReportedSurface, UnitSystem } from './section-types';

/** The kinds of quantity whose unit differs between the unit systems. */
export type Quantity =
  'length' | 'forcePerLength' | 'pressure' | 'unitWeight' | 'pressurePerLength';

export const UNIT_LABELS: Record<UnitSystem, Record<Quantity, string>> = {
  si: {
    length: 'm',
    forcePerLength: 'kN/m',
    pressure: 'kPa',
    unitWeight: 'kN/m³',
    pressurePerLength: 'kPa/m',
  },
  us: {
    length: 'ft',
    forcePerLength: 'lbf/ft',
    pressure: 'psf',
    unitWeight: 'pcf',
    pressurePerLength: 'psf/ft',
  },
};

export function unitOf(units: UnitSystem | undefined, q: Quantity): string {
  return UNIT_LABELS[units ?? 'si'][q];
}

/** A factor of safety: three decimals, as the drawing and the exports print it. */
export function fsText(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(3);
}

/** A figure with a fixed number of decimals, a dash when there is none; −0 printed as 0. */
export function fixed(v: number | null | undefined, digits = 2): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const s = v.toFixed(digits);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s.replace('-', '−');
}

/** A figure with up to `digits` decimals and no trailing zeros (inputs as the user gave them). */
export function plain(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—';
  const s = String(Number(v.toFixed(digits)));
  return s.startsWith('-') ? `−${s.slice(1)}` : s;
}

/** A point as (x, y). */
export function pointText(p: readonly [number, number], digits = 2): string {
  return `(${fixed(p[0], digits)}, ${fixed(p[1], digits)})`;
}

/** A slip surface in one line, in the section's units. */
export function surfaceText(s: ReportedSurface | null | undefined, units: UnitSystem): string {
  if (!s) return '—';
  const L = unitOf(units, 'length');
  switch (s.type) {
    case 'circle':
      return `circle: centre ${pointText(s.center)} ${L}, radius ${fixed(s.radius)} ${L}`;
    case 'polyline':
      return `noncircular: ${s.points.length} points from ${pointText(s.points[0])} to ${pointText(s.points[s.points.length - 1])} ${L}`;
    case 'plane':
      return `planar: slope angle ${fixed(s.angle, 1)}°, depth ${fixed(s.depth)} ${L}`;
    case 'log-spiral':
      return `log spiral: pole ${pointText(s.pole)} ${L}, r₀ ${fixed(s.r0)} ${L}, r₁ ${fixed(s.r1)} ${L}`;
  }
}

/** A date and time in the user's locale. */
export function when(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  return Number.isNaN(d.getTime())
    ? iso
    : d.toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

// The stored input is SI (the solver normalises every file to SI); it is shown in the file's
// units. From the exact definitions 1 ft = 0.3048 m and 1 lbf = 4.4482216152605 N (NIST SP
// 811), the same the solver's units module derives its factors from.
const FT = 0.3048;
const LBF_IN_KN = 4.4482216152605e-3;
const SI_PER_US: Record<Quantity, number> = {
  length: FT,
  forcePerLength: LBF_IN_KN / FT,
  pressure: LBF_IN_KN / FT ** 2,
  unitWeight: LBF_IN_KN / FT ** 3,
  pressurePerLength: LBF_IN_KN / FT ** 3,
};

/** An SI value of the stored input in the section's own units. */
export function fromSi(v: number, q: Quantity, units: UnitSystem): number {
  return units === 'us' ? v / SI_PER_US[q] : v;
}
