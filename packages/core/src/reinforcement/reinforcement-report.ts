import type { Reinforcement } from '../model/types';
import type { Warning } from '../result';
import { limitWords } from './limit-words';
import type { Crossing, CrossingReport, ReinforcementReport } from './types';

const deg = (r: number) => (r * 180) / Math.PI;
const finiteOrNull = (v: number) => (Number.isFinite(v) ? v : null);

/**
 * The reinforcement of a section as one method on one surface takes it (`crossings` from the
 * slicer in sliding orientation, `mirrored` its orientation, `n` the slices, `F` the factor of
 * safety the forces divided by F were divided by; null when the method found none): each
 * element's crossings and forces in section coordinates, the force on each slice (by slice
 * index in sliding orientation), and the warnings: an element the surface does not cross, or
 * crosses only where it is pushed; an element whose force reaches its capacity (not an anchor
 * applied as a load, whose force is a load).
 */
export function reinforcementReport(
  elements: readonly Reinforcement[],
  crossings: readonly Crossing[],
  mirrored: boolean,
  n: number,
  F: number | null,
): { elements: ReinforcementReport[]; perSlice: Float64Array; warnings: Warning[] } {
  const sx = mirrored ? -1 : 1;
  const perSlice = new Float64Array(n);
  const warnings: Warning[] = [];
  const reports = elements.map((e, index): ReinforcementReport => {
    const own = crossings.filter((c) => c.element === index);
    const list = own.map((c): CrossingReport => {
      const used = c.counted ? (c.dividedByF && F ? c.force / F : c.force) : 0;
      perSlice[c.slice] += used;
      return {
        at: [sx * c.x, c.y],
        slice: mirrored ? n - c.slice : c.slice + 1,
        available: c.force,
        force: used,
        mode: c.mode,
        counted: c.counted,
        direction: deg(Math.atan2(c.uy, sx * c.ux)),
        capacities: {
          strength: c.capacities.strength,
          behind: finiteOrNull(c.capacities.behind),
          front: finiteOrNull(c.capacities.front),
        },
      };
    });
    list.sort((a, b) => a.at[0] - b.at[0]);
    const counted = list.filter((c) => c.counted && c.available > 0);
    if (own.length === 0) {
      warnings.push({
        code: 'reinforcement-not-crossed',
        message: `the slip surface does not cross the ${e.type} "${e.name}": it adds nothing to this factor of safety`,
      });
    } else if (counted.length === 0) {
      warnings.push({
        code: 'reinforcement-not-crossed',
        message: `the slip surface crosses the ${e.type} "${e.name}" only where the movement would push it, or where it has no capacity: it carries nothing here`,
      });
    }
    const asLoad = e.type === 'anchor' && e.acts === 'load';
    for (const c of counted) {
      if (asLoad || c.force < c.available * (1 - 1e-9)) continue;
      warnings.push({
        code: 'reinforcement-fully-mobilised',
        message: `the ${e.type} "${e.name}" is fully mobilised where the slip surface crosses it at x = ${c.at[0].toFixed(2)}: the equilibrium takes all of its capacity there (${limitWords(c.mode, e.type)} governs)${e.dividedByF ? ' with F ≤ 1' : ', not divided by F'}; there is no margin on it`,
      });
      break;
    }
    return {
      name: e.name,
      type: e.type,
      dividedByF: e.dividedByF,
      force: list.reduce((sum, c) => sum + c.force, 0),
      crossings: list,
    };
  });
  return { elements: reports, perSlice, warnings };
}
