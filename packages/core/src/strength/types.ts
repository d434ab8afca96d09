import type { Strength } from '../model/types';
import type { QuantityKind } from '../model/units';

/**
 * A strength as the slicer and the methods take it along a slice base at elevation y:
 * c = c + rate · max(0, datum − y) (kPa; datum NaN when c is constant), and tan φ′.
 */
export interface LinearStrength {
  c: number;
  tanPhi: number;
  rate: number;
  datum: number;
}

/**
 * What a drawing colours a material by: its kind (a granular soil, a soil with cohesion and
 * friction, an undrained soil, a rigid base) and a representative shear strength (kPa): c′ +
 * 100 kPa·tan φ′ for effective-stress soils, Su for undrained ones.
 */
export interface MaterialTint {
  kind: 'granular' | 'cohesive' | 'undrained' | 'rigid';
  strength: number;
}

/**
 * A strength that depends on the effective normal stress σ′n on the slice base (a curved or
 * broken τ–σ′n envelope): each base takes the tangent of the envelope at its own σ′n, a linear
 * strength c + σ′n tan φ that equals the envelope there (slices/stress-dependent.ts iterates
 * σ′n with the method).
 */
export interface NormalStressEnvelope {
  /** The least σ′n the envelope is taken at (kPa): a base with less is taken at this. */
  floor: number;
  /** The σ′n (kPa) it is meant for, [lowest, highest]: bases outside it are named in a warning. */
  range: [number, number];
  /** Why a σ′n outside the range is doubtful, for the warning ("beyond the last point" …). */
  rangeWords: string;
  /** The tangent at σ′n (not below floor): out[0] = c (kPa), out[1] = tan φ. */
  tangent(sigma: number, out: Float64Array): void;
}

/** A warning about a material's strength that the schema cannot express. */
export interface StrengthNote {
  code: string;
  message: string;
  /** An error (the file is refused) rather than a warning. */
  severity?: 'error';
  /** Where in the strength, below it (e.g. ['points', 2]). */
  path?: (string | number)[];
}

/**
 * One strength model: everything the rest of the solver needs to know of it, in one file
 * (strength/<model>.ts), listed in strength/registry.ts. `R` is what a file writes (optional
 * settings absent), `S` the normalised strength (SI, defaults filled).
 */
export interface StrengthModel<S extends Strength, R extends { model: S['model'] }> {
  /** The settings of the file's strength that have a dimension, for the conversion to SI. */
  quantities: Partial<Record<Exclude<keyof R, 'model'>, QuantityKind>>;
  /** The normalised strength from the file's (defaults filled in). */
  normalise(raw: R): S;
  /** What a file writes for it: the inverse of normalise. */
  document(s: S): R;
  /** Warnings the schema cannot express (e.g. a material with no strength at all). */
  check(raw: R): StrengthNote[];
  /** A few words for a legend or a table; `show` writes an SI value in the section's units with its label. */
  describe(s: S, show: (value: number, kind: QuantityKind, digits: number) => string): string;
  /**
   * The stress it is written in: `effective` (a drained strength, c′ and φ′, with the pore
   * pressure on the base), `total` (an undrained strength, Su), `none` (a rigid base). A rapid
   * drawdown draws undrained strengths only from an effective-stress strength.
   */
  stress: 'effective' | 'total' | 'none';
  /** Its strength as the slicer takes it, or null for a rigid base (no slip surface enters it). */
  linear(s: S): LinearStrength | null;
  /** Its kind and representative strength, for the colour of a drawing. */
  tint(s: S): MaterialTint;
  /**
   * A strength that depends on the effective normal stress on the base: its envelope. Its
   * `linear` is then only where the iteration starts.
   */
  envelope?(s: S): NormalStressEnvelope;
  /**
   * An undrained strength drawn from the vertical effective stress σ′v (kPa) at the base: Su
   * there. Its `linear` is then only its least value.
   */
  fromVerticalStress?(s: S): (sigmaV: number) => number;
  /** The Rankine depth of a tension crack in it under its unit weight γ (0 where none forms). */
  crackDepth(s: S, gamma: number): number;
}
