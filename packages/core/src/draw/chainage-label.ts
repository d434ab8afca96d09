import type { UnitSystem } from '../model/types';

/**
 * A station written as chainage: kilometres + metres for si (1240 → "1+240"), hundreds of
 * feet + feet for us (15000 → "150+00"), the usual notation of road and rail drawings.
 *
 * @example chainageLabel(1240.5, 'si') // → '1+240.5'
 */
export function chainageLabel(station: number, units: UnitSystem): string {
  const unit = units === 'us' ? 100 : 1000;
  const digits = units === 'us' ? 2 : 3;
  const sign = station < 0 ? '-' : '';
  const a = Math.abs(station);
  const major = Math.floor(a / unit + 1e-9);
  const minor = Number((a - major * unit).toFixed(3));
  const [whole, frac] = String(minor).split('.');
  return `${sign}${major}+${whole.padStart(digits, '0')}${frac ? `.${frac}` : ''}`;
}
