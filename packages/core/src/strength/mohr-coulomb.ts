import type { MohrCoulombStrength } from '../model/types';
import type { StrengthModel } from './types';

const tanDeg = (a: number) => Math.tan((a * Math.PI) / 180);

/**
 * Mohr–Coulomb in effective stress: τ = c′ + σ′ tan φ′ (Coulomb 1776; Terzaghi's effective
 * stress). The Rankine crack depth is 2c′ tan(45° + φ′/2)/γ (Rankine 1857; common practice).
 *
 * @example mohrCoulomb.linear({ model: 'mohr-coulomb', cohesion: 5, frictionAngle: 30 }).tanPhi // → 0.577
 */
export const mohrCoulomb: StrengthModel<MohrCoulombStrength, MohrCoulombStrength> = {
  quantities: { cohesion: 'pressure' },
  normalise: (raw) => ({ ...raw }),
  document: (s) => ({ ...s }),
  check: (raw) =>
    raw.cohesion === 0 && raw.frictionAngle === 0
      ? [{ code: 'no-strength', message: 'c′ = 0 and φ′ = 0: this material has no strength' }]
      : [],
  describe: (s, show) =>
    `c′ ${show(s.cohesion, 'pressure', 1)}, φ′ ${Number(s.frictionAngle.toFixed(1))}°`,
  stress: 'effective',
  linear: (s) => ({ c: s.cohesion, tanPhi: tanDeg(s.frictionAngle), rate: 0, datum: NaN }),
  // granular: no more than a trace of cohesion (c′ ≤ 2 kPa) and φ′ ≥ 28° (common practice)
  tint: (s) => ({
    kind: s.cohesion <= 2 && s.frictionAngle >= 28 ? 'granular' : 'cohesive',
    strength: s.cohesion + 100 * tanDeg(s.frictionAngle),
  }),
  crackDepth: (s, gamma) =>
    gamma > 0 ? (2 * s.cohesion * tanDeg(45 + s.frictionAngle / 2)) / gamma : 0,
};
