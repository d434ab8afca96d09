import { yAt } from '../geometry/y-at';
import type { RawReinforcement, RawRequiredReinforcement } from './raw-section';
import type { Point, Polyline, Reinforcement, RequiredReinforcementSpec } from './types';

/**
 * The side a nail or an anchor runs toward from its head when the file does not say: the side
 * where the ground is higher at the element's horizontal reach (into the slope).
 */
function intoSlope(ground: Polyline, head: Point, reach: number): 'left' | 'right' {
  const x0 = ground[0][0];
  const x1 = ground[ground.length - 1][0];
  const at = (x: number) => yAt(ground, Math.min(x1, Math.max(x0, x)));
  return at(head[0] - reach) > at(head[0] + reach) ? 'left' : 'right';
}

/**
 * The reinforcement with its defaults: a geosynthetic at an elevation runs across the ground's
 * x-range unless from/to are given, its coverage 1; a nail's or anchor's side is into the
 * slope, a nail's facing capacity 0, an anchor's bond strength its capacity over its bond
 * length and its force applied as a load; divided by F for every element but an anchor applied
 * as a load (see ReinforcementCommon).
 */
export function normaliseReinforcement(
  raw: RawReinforcement[] | undefined,
  ground: Polyline,
): Reinforcement[] {
  return (raw ?? []).map((r): Reinforcement => {
    switch (r.type) {
      case 'geosynthetic': {
        const line: Polyline = r.points
          ? r.points.map(([x, y]) => [x, y])
          : [
              [r.from ?? ground[0][0], r.elevation!],
              [r.to ?? ground[ground.length - 1][0], r.elevation!],
            ];
        return {
          type: 'geosynthetic',
          name: r.name,
          line,
          strength: r.strength,
          interaction: r.interaction,
          coverage: r.coverage ?? 1,
          dividedByF: r.dividedByF ?? true,
        };
      }
      case 'nail': {
        const reach = r.length * Math.cos((r.inclination * Math.PI) / 180);
        return {
          type: 'nail',
          name: r.name,
          head: [r.head[0], r.head[1]],
          inclination: r.inclination,
          toward: r.toward ?? intoSlope(ground, r.head, reach),
          length: r.length,
          spacing: r.spacing,
          tensileCapacity: r.tensileCapacity,
          bond: r.bond,
          facingCapacity: r.facingCapacity ?? 0,
          dividedByF: r.dividedByF ?? true,
        };
      }
      case 'anchor': {
        const reach = (r.freeLength + r.bondLength) * Math.cos((r.inclination * Math.PI) / 180);
        const acts = r.acts ?? 'load';
        return {
          type: 'anchor',
          name: r.name,
          head: [r.head[0], r.head[1]],
          inclination: r.inclination,
          toward: r.toward ?? intoSlope(ground, r.head, reach),
          freeLength: r.freeLength,
          bondLength: r.bondLength,
          spacing: r.spacing,
          capacity: r.capacity,
          bond: r.bond ?? r.capacity / r.bondLength,
          acts,
          dividedByF: r.dividedByF ?? acts === 'mobilised',
        };
      }
      case 'pile':
        return {
          type: 'pile',
          name: r.name,
          x: r.x,
          top: r.top ?? null,
          bottom: r.bottom,
          shear: r.shear,
          dividedByF: r.dividedByF ?? true,
        };
    }
  });
}

/** The required reinforcement to find, with its extent over the ground's x-range by default; null when not asked. */
export function normaliseRequiredReinforcement(
  raw: RawRequiredReinforcement | undefined,
  ground: Polyline,
): RequiredReinforcementSpec | null {
  if (!raw) return null;
  const line: Polyline = [
    [raw.from ?? ground[0][0], raw.level],
    [raw.to ?? ground[ground.length - 1][0], raw.level],
  ];
  const dividedByF = raw.dividedByF ?? true;
  if (!raw.product) return { kind: 'force', line, dividedByF };
  return {
    kind: 'layers',
    line,
    spacing: raw.spacing ?? 0.5,
    strength: raw.product.strength,
    interaction: raw.product.interaction,
    coverage: raw.product.coverage ?? 1,
    dividedByF,
    maxLayers: raw.maxLayers ?? 20,
  };
}
