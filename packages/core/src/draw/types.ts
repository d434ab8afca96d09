import type { ReportedSurface } from '../analyze';
import type { MethodId, Point } from '../model/types';
import type { LinearScale } from './scale-linear';

/** A grid of circle centres: x and y ranges and the number of centres along each. */
export interface SearchGrid {
  x: [number, number];
  y: [number, number];
  nx: number;
  ny: number;
}

/**
 * What a critical-surface search reports with a section result (values in the section's
 * units): the grid where it ended, how it moved, the FS map over the centres (fs[j][i] at
 * (xs[i], ys[j]), the least FS over the radii tried there) and the lowest trial surfaces.
 */
export interface SearchReport {
  type: 'grid' | 'ground-ranges' | 'noncircular' | 'auto';
  method: MethodId;
  trials: number;
  moves: { reason: string; grid: SearchGrid }[];
  grid: SearchGrid | null;
  map: { xs: number[]; ys: number[]; fs: (number | null)[][] } | null;
  lowest: { surface: ReportedSurface; fs: number }[];
}

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
