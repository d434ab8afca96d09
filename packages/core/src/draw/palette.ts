/**
 * The colours of Scarpline's drawings. FS maps use a perceptual sequential ramp (dark = low
 * FS, light = high), never a rainbow; the critical slip surface has one accent colour of its
 * own; strata are coloured by their material, from earth ramps of our own: a hue for each
 * kind of soil (granular, cohesive, undrained) and a lightness for its strength (weaker is
 * paler), so that the same material has the same colour in every drawing.
 */

/** The critical (governing) slip surface. */
export const ACCENT = '#d6246e';
/** Words in the accent's hue, dark enough to read on white (WCAG AA). */
export const ACCENT_TEXT = '#b01657';
/** Other methods' surfaces, axes and text. */
export const INK = '#26303a';
export const MUTED = '#6b7480';
export const GRID_LINE = '#e3e6ea';
export const WATER_LINE = '#1f6fb2';
export const WATER_FILL = '#a9d0ef';
export const RIGID_FILL = '#a3a6aa';
/**
 * Reinforcing elements and their forces: a rust of our own (steel and grids), apart from the
 * earth ramps, the water's blue and the accent; each kind of element also has its own line
 * shape, so that colour is never the only cue.
 */
export const REINFORCEMENT = '#9c4a12';
/** Words about reinforcement forces, dark enough to read on white (WCAG AA). */
export const REINFORCEMENT_TEXT = '#7a360a';
/** Points below the required FS on a chainage plot (shape differs too: never colour alone). */
export const BELOW_REQUIRED = '#a3302a';
/** Points that meet the required FS on a chainage plot. */
export const MEETS = '#2f6b3a';

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

/**
 * The earth ramps (own), pale to deep, one a kind of soil: straw to ochre for granular soils,
 * buff to umber for soils with cohesion and friction, pale sage to olive for undrained ones.
 */
export const MATERIAL_RAMPS = {
  granular: ['#f6ebc6', '#e8cf8c', '#cfa95c', '#a57f3f'],
  cohesive: ['#efe2d4', '#d8bea4', '#b5947a', '#8a6b57'],
  undrained: ['#e4e8da', '#c3ccae', '#9aa685', '#6d7a5e'],
} as const;

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
 * The fill of a material of a kind and a representative shear strength (kPa): its kind's ramp,
 * paler for weaker, over 5 to 300 kPa on a log scale; `shift` (−1 to 1) moves it along the ramp
 * to tell apart two materials that would otherwise look alike. A rigid base is grey (hatched
 * in the drawing).
 *
 * @example materialFill({ kind: 'granular', strength: 65 }) // → a mid ochre
 */
export function materialFill(
  tint: { kind: keyof typeof MATERIAL_RAMPS | 'rigid'; strength: number },
  shift = 0,
): string {
  if (tint.kind === 'rigid') return RIGID_FILL;
  const t = Math.log(Math.max(5, tint.strength) / 5) / Math.log(300 / 5);
  return rampColor(MATERIAL_RAMPS[tint.kind], Math.min(1, Math.max(0, t)) * 0.85 + 0.05 + shift);
}

/**
 * The distance between two #rrggbb colours in RGB (0 to 441).
 *
 * @example rgbDistance('#000000', '#000010') // → 16
 */
export function rgbDistance(a: string, b: string): number {
  const [p, q] = [rgb(a), rgb(b)];
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}
