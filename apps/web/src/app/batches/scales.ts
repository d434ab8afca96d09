import { chainageLabel } from '@scarpline/core/chainage-label';
/** Small pieces shared by the chart and the plan: scales, ticks, chainage and units. */
import type { UnitSystem } from '@scarpline/core';

/** The unit system of a section's file (the core's). */
export type Units = UnitSystem;

/** A linear map from [d0, d1] onto [r0, r1]. */
export function linear(d0: number, d1: number, r0: number, r1: number): (v: number) => number {
  const k = d1 === d0 ? 0 : (r1 - r0) / (d1 - d0);
  return (v) => r0 + (v - d0) * k;
}

/** The nearest of 1, 2, 2.5, 5 × 10ⁿ at or above `v` (v > 0). */
export function niceStep(v: number): number {
  if (!(v > 0) || !Number.isFinite(v)) return 1;
  const p = 10 ** Math.floor(Math.log10(v));
  const f = v / p;
  const m = f <= 1 ? 1 : f <= 2 ? 2 : f <= 2.5 ? 2.5 : f <= 5 ? 5 : 10;
  return m * p;
}

/** Round tick values covering [min, max] with about `count` intervals. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  if (max < min) [min, max] = [max, min];
  if (max === min) return [min];
  const step = niceStep((max - min) / Math.max(1, count));
  const first = Math.ceil(min / step - 1e-9) * step;
  const out: number[] = [];
  for (let v = first; v <= max + step * 1e-9; v += step) out.push(Number(v.toFixed(10)));
  return out;
}

/**
 * The one unit system of a batch's sections (each says the units of its file): null when
 * there are none, or when they mix files in m and in ft, which share no length axis.
 */
export function batchUnits(sections: readonly { units: Units }[]): Units | null {
  const first = sections[0]?.units ?? null;
  return sections.every((s) => s.units === first) ? first : null;
}

export function lengthUnit(units: Units | null): string {
  return units === 'us' ? 'ft' : units === 'si' ? 'm' : '';
}

/** A station written as chainage: 1240 → 1+240 (si), 15000 → 150+00 (us), plain without units. */
export function formatChainage(station: number, units: Units | null): string {
  return units === null ? formatNumber(station) : chainageLabel(station, units);
}

/** A number with no more decimals than it needs (at most 3). */
export function formatNumber(v: number): string {
  return String(Number(v.toFixed(3)));
}

/** A factor of safety to two decimals. */
export function formatFs(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(2);
}
