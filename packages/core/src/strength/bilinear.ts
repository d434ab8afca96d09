import type { BilinearStrength } from '../model/types';
import type { NormalStressEnvelope, StrengthModel } from './types';

const tanDeg = (a: number) => Math.tan((a * Math.PI) / 180);

/**
 * The envelope of a bilinear strength: τ = c′ + σ′n tan φ′ up to the break stress σ′b, and
 * τ = c′ + σ′b tan φ′ + (σ′n − σ′b) tan φ′₂ beyond, so the tangent beyond is
 * c = c′ + σ′b (tan φ′ − tan φ′₂), tan φ′₂. A base in tension is taken at σ′n = 0 (no tensile
 * strength beyond the cohesion intercept; common practice).
 */
export function bilinearEnvelope(s: BilinearStrength): NormalStressEnvelope {
  const t1 = tanDeg(s.frictionAngle);
  const t2 = tanDeg(s.frictionAngleBeyond);
  const c2 = s.cohesion + s.breakStress * (t1 - t2);
  return {
    floor: 0,
    range: [0, Infinity],
    rangeWords: 'below 0',
    tangent: (sigma, out) => {
      const beyond = sigma > s.breakStress;
      out[0] = beyond ? c2 : s.cohesion;
      out[1] = beyond ? t2 : t1;
    },
  };
}

/**
 * A bilinear Mohr–Coulomb envelope in effective stress (common practice for a soil whose
 * friction angle falls at higher stress, e.g. a compacted fill or rockfill): c′ and φ′ up to
 * the break stress σ′b, φ′₂ beyond (bilinearEnvelope). Each base takes the line at its σ′n,
 * iterated with the method. Its `linear` (where the iteration starts, and the crack depth) is
 * the first line.
 *
 * @example bilinear.envelope!({ model: 'bilinear', cohesion: 5, frictionAngle: 40, breakStress: 200, frictionAngleBeyond: 32 }).floor // → 0
 */
export const bilinear: StrengthModel<BilinearStrength, BilinearStrength> = {
  quantities: { cohesion: 'pressure', breakStress: 'pressure' },
  normalise: (raw) => ({ ...raw }),
  document: (s) => ({ ...s }),
  check: (raw) =>
    raw.frictionAngleBeyond > raw.frictionAngle
      ? [
          {
            code: 'friction-rises',
            message: `φ′ beyond the break (${raw.frictionAngleBeyond}°) is above φ′ before it (${raw.frictionAngle}°): the envelope then bends upward; check the order`,
            path: ['frictionAngleBeyond'],
          },
        ]
      : [],
  describe: (s, show) =>
    `c′ ${show(s.cohesion, 'pressure', 1)}, φ′ ${s.frictionAngle}° to σ′n ${show(s.breakStress, 'pressure', 0)}, ${s.frictionAngleBeyond}° beyond`,
  stress: 'effective',
  linear: (s) => ({ c: s.cohesion, tanPhi: tanDeg(s.frictionAngle), rate: 0, datum: NaN }),
  tint: (s) => ({
    kind: s.cohesion <= 2 && s.frictionAngle >= 28 ? 'granular' : 'cohesive',
    strength: s.cohesion + 100 * tanDeg(s.frictionAngle),
  }),
  crackDepth: (s, gamma) =>
    gamma > 0 ? (2 * s.cohesion * tanDeg(45 + s.frictionAngle / 2)) / gamma : 0,
  envelope: bilinearEnvelope,
};
