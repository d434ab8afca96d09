/**
 * Small pieces shared by the chart, the plan and the table: chainage, units and FS. Scales and
 * ticks are the core's (`scaleLinear`, `niceTicks`, `niceStep` from `@scarpline/core/draw`).
 */
import { chainageLabel } from '@scarpline/core/draw';
import type { UnitSystem } from '@scarpline/core/units';

/** The unit system of a section's file (the core's). */
export type Units = UnitSystem;

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

/**
 * A factor of safety over its required value to three decimals, as the core writes an FS
 * (0.998 stays below 1 where two decimals would write 1.00).
 */
export function formatRatio(v: number | null | undefined): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(3);
}
