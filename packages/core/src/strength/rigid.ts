import type { RigidStrength } from '../model/types';
import type { StrengthModel } from './types';

/**
 * A rigid base: no slip surface enters it; a surface that reaches it follows its top
 * (common practice for a much stronger stratum below).
 *
 * @example rigid.linear({ model: 'rigid' }) // → null
 */
export const rigid: StrengthModel<RigidStrength, RigidStrength> = {
  quantities: {},
  normalise: () => ({ model: 'rigid' }),
  document: () => ({ model: 'rigid' }),
  check: () => [],
  describe: () => 'rigid base: no slip surface enters it',
  stress: 'none',
  linear: () => null,
  tint: () => ({ kind: 'rigid', strength: Infinity }),
  crackDepth: () => 0,
};
