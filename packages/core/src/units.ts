/**
 * `@scarpline/core/units`: the unit systems, their symbols and the conversion factors between
 * them (model/units.ts, from the exact NIST SP 811 definitions). Pure and browser-safe: the
 * web app shows stored SI values in a file's units with these.
 */
export type { UnitSystem } from './model/types';
export * from './model/units';
export { resultInUnits, stationInUnits } from './result-units';
