import type { Point } from '../model/types';
import type { LinearScale } from './scale-linear';

/** The x and y scales of a drawing, from section coordinates to pixels. */
export interface Scales {
  x: LinearScale;
  y: LinearScale;
}

/** A drawing frame: the scales and the plot area in pixels. */
export interface Frame extends Scales {
  left: number;
  top: number;
  width: number;
  height: number;
}

/** Section coordinates to pixels. */
export const toPixels = (points: readonly Point[], s: Scales): [number, number][] =>
  points.map(([a, b]) => [s.x(a), s.y(b)]);
