import type { Point, ShearNormalStrength } from '../model/types';
import type { NormalStressEnvelope, StrengthModel, StrengthNote } from './types';

/** A shear–normal function as a file writes it. */
export interface RawShearNormalStrength {
  model: 'shear-normal';
  points: Point[];
  beyond?: 'extend' | 'hold';
}

/**
 * The envelope through points (σ′n, τ), σ′n increasing: straight between them; from σ′n = 0 to
 * a first point above 0, the straight line from the origin (no strength without normal stress
 * unless a point says so); below the first point (or 0) the base is taken at it; beyond the
 * last point the last segment extended, or τ held at the last point's (`hold`). A base beyond
 * the last point is named in a warning (the test data do not reach it).
 */
export function shearNormalEnvelope(s: ShearNormalStrength): NormalStressEnvelope {
  const pts: Point[] = s.points[0][0] > 0 ? [[0, 0], ...s.points] : s.points.map((p) => p);
  const m = pts.length;
  const last = pts[m - 1];
  return {
    floor: pts[0][0],
    range: [pts[0][0], last[0]],
    rangeWords:
      s.beyond === 'hold'
        ? 'beyond the last point of the shear–normal function (τ held at the last point)'
        : 'beyond the last point of the shear–normal function (its last segment extended)',
    tangent: (sigma, out) => {
      if (sigma > last[0] && s.beyond === 'hold') {
        out[0] = last[1];
        out[1] = 0;
        return;
      }
      let j = 0;
      while (j < m - 2 && sigma > pts[j + 1][0]) j++;
      const [x0, y0] = pts[j];
      const [x1, y1] = pts[j + 1];
      const t = (y1 - y0) / (x1 - x0);
      out[0] = y0 - x0 * t;
      out[1] = t;
    },
  };
}

/**
 * A shear strength measured over a range of normal stress (rockfill, residual soils: common
 * practice), given as points (σ′n, τ) joined by straight lines (shearNormalEnvelope), effective
 * stress. Each base takes the segment at its σ′n, iterated with the method. Its `linear` (where
 * the iteration starts, and the crack depth) is the first segment.
 *
 * @example shearNormal.envelope!({ model: 'shear-normal', points: [[0, 0], [100, 80], [400, 250]], beyond: 'extend' }).range // → [0, 400]
 */
export const shearNormal: StrengthModel<ShearNormalStrength, RawShearNormalStrength> = {
  quantities: { points: 'pressure' },
  normalise: (raw) => ({
    model: 'shear-normal',
    points: raw.points.map((p): Point => [p[0], p[1]]),
    beyond: raw.beyond ?? 'extend',
  }),
  document: (s) => ({
    model: 'shear-normal',
    points: s.points.map((p): Point => [p[0], p[1]]),
    ...(s.beyond !== 'extend' ? { beyond: s.beyond } : {}),
  }),
  check: (raw) => {
    const notes: StrengthNote[] = [];
    const p = raw.points;
    for (let i = 1; i < p.length; i++) {
      if (!(p[i][0] > p[i - 1][0]))
        notes.push({
          code: 'points-not-increasing',
          message: `σn ${p[i][0]} is not above that of the point before (${p[i - 1][0]}): give the points with σn increasing`,
          severity: 'error',
          path: ['points', i],
        });
      else if (p[i][1] < p[i - 1][1])
        notes.push({
          code: 'shear-decreasing',
          message: `τ falls from ${p[i - 1][1]} to ${p[i][1]} as σn grows: a strength that falls with normal stress is unusual; check the point`,
          path: ['points', i],
        });
    }
    if (p.length > 0 && p[0][0] < 0)
      notes.push({
        code: 'tension-point',
        message: 'the first point has σn below 0: a base in tension is taken at it',
        path: ['points', 0],
      });
    return notes;
  },
  describe: (s, show) =>
    `τ–σ′n points ${s.points.map((p) => `(${show(p[0], 'pressure', 0)}, ${show(p[1], 'pressure', 0)})`).join(' ')}`,
  stress: 'effective',
  linear: (s) => {
    const out = new Float64Array(2);
    shearNormalEnvelope(s).tangent(s.points[0][0], out);
    return { c: out[0], tanPhi: out[1], rate: 0, datum: NaN };
  },
  tint: (s) => {
    const out = new Float64Array(2);
    shearNormalEnvelope(s).tangent(100, out);
    const strength = out[0] + 100 * out[1];
    return { kind: out[0] <= 2 ? 'granular' : 'cohesive', strength };
  },
  crackDepth: (s, gamma) => {
    const out = new Float64Array(2);
    shearNormalEnvelope(s).tangent(0, out);
    const phi = Math.atan(out[1]);
    return gamma > 0 ? (2 * Math.max(0, out[0]) * Math.tan(Math.PI / 4 + phi / 2)) / gamma : 0;
  },
  envelope: shearNormalEnvelope,
};
