import type { DrawdownSpec, Material } from '../model/types';
import type { Warning } from '../result';
import { linearStrength, strengthStress } from '../strength/registry';
import { type DrawdownEnvelopes, drawdownEnvelopes } from './undrained-strength';

/**
 * How one material takes a rapid drawdown:
 * - `free`: it drains as the water falls: its own strength (drained, c′ and φ′, with the
 *   pore pressures after drawdown) in every stage;
 * - `slow`: a Mohr–Coulomb soil that does not drain: stage 2 gives it the undrained strength
 *   of its consolidation stresses (undrained-strength.ts), stage 3 its drained strength where
 *   that is lower;
 * - `total`: a soil whose strength is already undrained (Su, total stress): it keeps Su in
 *   every stage.
 */
export type MaterialDrainage =
  { drains: 'free' } | { drains: 'slow'; envelopes: DrawdownEnvelopes } | { drains: 'total' };

/** The drainage of each material, by its index in PreparedSection.materials, and what to tell the engineer. */
export interface Drainage {
  byMaterial: MaterialDrainage[];
  warnings: Warning[];
}

/**
 * The drainage of each material of a section under a drawdown spec. A material the spec does
 * not list drains freely. Only a Mohr–Coulomb material can be `slow` (its undrained strength is
 * drawn from c′, φ′ and the R envelope): a material with an undrained strength (Su) keeps it
 * in every stage, and a rigid base takes no slip surface, whatever the spec says of them; both
 * are told in a warning, as is a name that is not a material of the section.
 *
 * @example resolveDrainage(prepared.materials, spec).byMaterial[0] // → { drains: 'free' }
 */
export function resolveDrainage(materials: readonly Material[], spec: DrawdownSpec): Drainage {
  const warnings: Warning[] = [];
  const names = new Set(materials.map((m) => m.name));
  for (const name of Object.keys(spec.materials)) {
    if (!names.has(name)) {
      warnings.push({
        code: 'drawdown-unknown-material',
        message: `the drawdown gives the drainage of "${name}", which is not a material of this section: ignored`,
      });
    }
  }
  const byMaterial = materials.map((m): MaterialDrainage => {
    const given = Object.prototype.hasOwnProperty.call(spec.materials, m.name)
      ? spec.materials[m.name]
      : undefined;
    const stress = strengthStress(m.strength);
    const linear = linearStrength(m.strength);
    if (stress === 'total') {
      if (given) {
        warnings.push({
          code: 'drawdown-strength-kept',
          message: `"${m.name}" has an undrained strength (Su): it keeps Su through every stage of the drawdown; its drainage (${given.drains}) applies only to a Mohr–Coulomb soil (c′, φ′)`,
        });
      }
      return { drains: 'total' };
    }
    if (stress === 'none' || !linear) {
      if (given?.drains === 'slow') {
        warnings.push({
          code: 'drawdown-strength-kept',
          message: `"${m.name}" is a rigid base: no slip surface enters it, so its drainage does not matter`,
        });
      }
      return { drains: 'free' };
    }
    if (!given || given.drains === 'free') return { drains: 'free' };
    const phi = (Math.atan(linear.tanPhi) * 180) / Math.PI;
    return { drains: 'slow', envelopes: drawdownEnvelopes(linear.c, phi, given.dR, given.psiR) };
  });
  return { byMaterial, warnings };
}
