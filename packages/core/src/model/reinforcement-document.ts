import type { RawReinforcement, RawRequiredReinforcement } from './raw-section';
import type { Reinforcement, RequiredReinforcementSpec } from './types';

/**
 * A normalised reinforcing element written back as the section file writes it (in the units it
 * holds): the inverse of normaliseReinforcement, every default written out (a geosynthetic as
 * its points, a nail's or an anchor's side, an anchor's bond and how it acts), so that reading
 * it gives the same element again. Pure; the section document and the web app's re-run share it.
 *
 * @example reinforcementDocument({ type: 'pile', name: 'toe', x: 16, top: null, bottom: 55, shear: 50, dividedByF: true })
 * // → { type: 'pile', name: 'toe', x: 16, bottom: 55, shear: 50, dividedByF: true }
 */
export function reinforcementDocument(r: Reinforcement): RawReinforcement {
  switch (r.type) {
    case 'geosynthetic': {
      const { line, ...rest } = r;
      return { ...rest, points: line.map(([x, y]) => [x, y]) };
    }
    case 'nail':
    case 'anchor':
      return { ...r, head: [r.head[0], r.head[1]] };
    case 'pile': {
      const { top, ...rest } = r;
      return top === null ? rest : { ...rest, top };
    }
  }
}

/**
 * The required reinforcement to find written back as the file writes it: the inverse of
 * normaliseRequiredReinforcement.
 *
 * @example requiredReinforcementDocument({ kind: 'force', line: [[0, 70], [40, 70]], dividedByF: true })
 * // → { level: 70, from: 0, to: 40, dividedByF: true }
 */
export function requiredReinforcementDocument(
  r: RequiredReinforcementSpec,
): RawRequiredReinforcement {
  const at = { level: r.line[0][1], from: r.line[0][0], to: r.line[r.line.length - 1][0] };
  if (r.kind === 'force') return { ...at, dividedByF: r.dividedByF };
  return {
    ...at,
    dividedByF: r.dividedByF,
    product: { strength: r.strength, interaction: r.interaction, coverage: r.coverage },
    spacing: r.spacing,
    maxLayers: r.maxLayers,
  };
}
