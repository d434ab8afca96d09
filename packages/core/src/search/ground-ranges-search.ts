import type { GroundRangeSettings } from './search-settings';
import type { CircleEvaluator, CircleTrial, Trials } from './trials';

/**
 * Circles through a point of the upper ground range (where the slide starts) and a point of
 * the lower range (where it comes out), each pair with `radii` radii from just over half the
 * chord to 2.5 chords (geometric), the centre on the side of the chord away from the soil.
 * `groundAt` gives the ground elevation at x. Returns the lowest of these circles (null when
 * none was admissible).
 *
 * @example groundRangesSearch(settings.groundRanges, (x) => yAt(ground, x), evaluate, trials)
 */
export function groundRangesSearch(
  settings: GroundRangeSettings,
  groundAt: (x: number) => number,
  evaluate: CircleEvaluator,
  trials: Trials,
): CircleTrial | null {
  let best: CircleTrial | null = null;
  const pts = (r: [number, number]) =>
    Array.from(
      { length: settings.points },
      (_, i) => r[0] + ((r[1] - r[0]) * i) / Math.max(1, settings.points - 1),
    );
  for (const xu of pts(settings.upper)) {
    for (const xl of pts(settings.lower)) {
      const ax = xu;
      const ay = groundAt(xu);
      const bx = xl;
      const by = groundAt(xl);
      const dx = bx - ax;
      const dy = by - ay;
      const chord = Math.hypot(dx, dy);
      if (chord < 1e-6) continue;
      const mx = 0.5 * (ax + bx);
      const my = 0.5 * (ay + by);
      // unit normal pointing up
      let nx = -dy / chord;
      let ny = dx / chord;
      if (ny < 0) {
        nx = -nx;
        ny = -ny;
      }
      for (let k = 0; k < settings.radii; k++) {
        const r = 0.5 * chord * 1.02 * Math.pow(5 / 1.02, k / Math.max(1, settings.radii - 1));
        const h = Math.sqrt(Math.max(0, r * r - 0.25 * chord * chord));
        const xc = mx + nx * h;
        const yc = my + ny * h;
        const fs = trials.try(evaluate, xc, yc, r);
        if (fs > 0 && (!best || fs < best.fs)) {
          best = { center: [xc, yc], radius: r, fs, stage: trials.stage, boundary: -1 };
        }
      }
    }
  }
  return best;
}
