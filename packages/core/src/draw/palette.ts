/**
 * The colours of Scarpline's drawings. FS maps use a perceptual sequential ramp (dark = low
 * FS, light = high), never a rainbow; the critical slip surface has one accent colour of its
 * own; strata use an earth ramp of steadily falling lightness, so that deeper strata read
 * darker in colour and in grey print alike.
 */

/** The critical (governing) slip surface. */
export const ACCENT = '#d6246e';
/** Other methods' surfaces, axes and text. */
export const INK = '#26303a';
export const MUTED = '#6b7480';
export const GRID_LINE = '#e3e6ea';
export const WATER_LINE = '#1f6fb2';
export const WATER_FILL = '#a9d0ef';
export const RIGID_FILL = '#a3a6aa';
/** Points below the required FS on a chainage plot (shape differs too: never colour alone). */
export const BELOW_REQUIRED = '#9c2a2a';

/** The FS ramp: ten samples of the viridis colour map (van der Walt & Smith 2015, CC0). */
const FS_RAMP = [
  '#440154',
  '#482878',
  '#3e4989',
  '#31688e',
  '#26828e',
  '#1f9e89',
  '#35b779',
  '#6ece58',
  '#b5de2b',
  '#fde725',
];

/** The strata ramp (own): sand to umber, lightness falling steadily. */
const STRATA_RAMP = ['#f1e6cc', '#e0c99b', '#c9aa74', '#ab8a5c', '#8a6f52', '#6a5849'];

const rgb = (hex: string): [number, number, number] => [
  parseInt(hex.slice(1, 3), 16),
  parseInt(hex.slice(3, 5), 16),
  parseInt(hex.slice(5, 7), 16),
];
const hex = (c: readonly number[]): string =>
  `#${c
    .map((v) =>
      Math.round(Math.min(255, Math.max(0, v)))
        .toString(16)
        .padStart(2, '0'),
    )
    .join('')}`;

/**
 * The colour at t ∈ [0, 1] of a ramp of hex colours, interpolated in RGB between its samples.
 *
 * @example rampColor(['#000000', '#ffffff'], 0.5) // → '#808080'
 */
export function rampColor(ramp: readonly string[], t: number): string {
  const u = Math.min(1, Math.max(0, Number.isFinite(t) ? t : 0)) * (ramp.length - 1);
  const i = Math.min(ramp.length - 2, Math.floor(u));
  const f = u - i;
  const a = rgb(ramp[i]);
  const b = rgb(ramp[i + 1]);
  return hex(a.map((v, k) => v + (b[k] - v) * f));
}

/**
 * The FS-map colour at t ∈ [0, 1] (0 the lowest FS of the map).
 *
 * @example fsColor(0) // → '#440154'
 */
export function fsColor(t: number): string {
  return rampColor(FS_RAMP, t);
}

/**
 * The fill of stratum `index` of `count` (0 the top stratum), spread over the whole ramp.
 *
 * @example strataColor(0, 3) // → '#f1e6cc'
 */
export function strataColor(index: number, count: number): string {
  return rampColor(STRATA_RAMP, count <= 1 ? 0.25 : index / (count - 1));
}
