/**
 * Words and numbers of the section page: units, FS and other figures (method names: shared/).
 * Units and their conversion are the core's (`@scarpline/core/units`): the stored input is SI
 * and is shown in the file's units with its `fromSi`.
 */
import { UNIT_LABELS, type QuantityKind, type UnitSystem } from '@scarpline/core/units';
import { fsText as coreFsText } from '@scarpline/core/verdict';
import type { ReportedSurface } from './section-types';

/** The unit of a quantity in the section's units (si when not given). */
export function unitOf(units: UnitSystem | undefined, q: QuantityKind): string {
  return UNIT_LABELS[units ?? 'si'][q];
}

/** A factor of safety as the core writes it (three decimals), a dash when there is none. */
export function fsText(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : coreFsText(v);
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

/** A date and time in the user's locale (the app's one way of writing a moment). */
export { dateTimeText as when } from '../shared/date-time';
