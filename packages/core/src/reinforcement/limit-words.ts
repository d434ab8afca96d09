import type { ReinforcementMode, ReinforcementReport } from './types';

/**
 * What limits a reinforcement force at a crossing, in words (a pile's strength is its shear
 * resistance): the one wording the drawing, the CLI and the web app share.
 *
 * @example limitWords('pullout', 'nail') // → 'pullout behind the surface'
 */
export function limitWords(mode: ReinforcementMode, type: ReinforcementReport['type']): string {
  switch (mode) {
    case 'strength':
      return type === 'pile'
        ? 'shear resistance'
        : type === 'geosynthetic'
          ? 'tensile strength'
          : 'bar strength';
    case 'pullout':
      return 'pullout behind the surface';
    case 'front':
      return 'pullout in front';
    case 'facing':
      return 'facing and bond in front';
  }
}
