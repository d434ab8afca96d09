import type { UndrainedStrength } from '../model/types';
import type { StrengthModel } from './types';

/** An undrained strength as a file writes it: the rate and the datum are optional. */
export interface RawUndrainedStrength {
  model: 'undrained';
  su: number;
  suRate?: number;
  suDatum?: number;
}

/**
 * Undrained, total stress (φ = 0): Su at the datum elevation, growing by suRate per unit of
 * depth below it, constant above it (and constant everywhere without a datum), as for a
 * normally consolidated clay (common practice; e.g. Skempton 1957). The Rankine crack depth
 * is 2Su/γ (common practice).
 *
 * @example undrained.linear({ model: 'undrained', su: 20, suRate: 1.5, suDatum: 10 }).rate // → 1.5
 */
export const undrained: StrengthModel<UndrainedStrength, RawUndrainedStrength> = {
  quantities: { su: 'pressure', suRate: 'pressurePerLength', suDatum: 'length' },
  normalise: (raw) => ({
    model: 'undrained',
    su: raw.su,
    suRate: raw.suRate ?? 0,
    suDatum: raw.suDatum ?? null,
  }),
  // without growth with depth suRate is 0 and there is no datum: write neither
  document: (s) => ({
    model: 'undrained',
    su: s.su,
    ...(s.suRate ? { suRate: s.suRate } : {}),
    ...(s.suDatum !== null ? { suDatum: s.suDatum } : {}),
  }),
  check: (raw) =>
    raw.su === 0 && (raw.suRate ?? 0) === 0
      ? [
          {
            code: 'no-strength',
            message: 'Su = 0 and no increase with depth: this material has no strength',
          },
        ]
      : [],
  describe: (s, show) => {
    const su = `Su ${show(s.su, 'pressure', 1)}`;
    if (!(s.suRate > 0)) return su;
    const datum = s.suDatum === null ? '' : ` below ${show(s.suDatum, 'length', 2)}`;
    return `${su} + ${show(s.suRate, 'pressurePerLength', -3)}${datum}`;
  },
  stress: 'total',
  linear: (s) => ({
    c: s.su,
    tanPhi: 0,
    rate: s.suDatum !== null ? s.suRate : 0,
    datum: s.suDatum ?? NaN,
  }),
  tint: (s) => ({ kind: 'undrained', strength: s.su }),
  crackDepth: (s, gamma) => (gamma > 0 ? (2 * s.su) / gamma : 0),
};
