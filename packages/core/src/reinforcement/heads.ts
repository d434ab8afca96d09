import { yAt } from '../geometry/y-at';
import type { Section } from '../model/types';

/** How far below the ground a layer's end may be and still be at the face (m). */
const AT_FACE = 1;

/**
 * Where the reinforcement meets the ground (x, section coordinates): nail and anchor heads, a
 * pile's x, and the ends of a geosynthetic that lie at the face (within 1 m below the ground).
 * The search cuts the slope faces there (search-settings.ts faceParts): a slip surface that
 * passes between two rows, or above the highest, crosses none of them.
 */
export function reinforcementHeads(section: Section): number[] {
  const xs: number[] = [];
  for (const r of section.reinforcement) {
    if (r.type === 'nail' || r.type === 'anchor') xs.push(r.head[0]);
    else if (r.type === 'pile') xs.push(r.x);
    else {
      for (const [x, y] of [r.line[0], r.line[r.line.length - 1]])
        if (yAt(section.ground, x) - y <= AT_FACE) xs.push(x);
    }
  }
  return xs;
}
