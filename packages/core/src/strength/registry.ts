import type { RawStrength } from '../model/raw-section';
import type { Strength } from '../model/types';
import type { QuantityKind } from '../model/units';
import { bilinear } from './bilinear';
import { hoekBrown } from './hoek-brown';
import { mohrCoulomb } from './mohr-coulomb';
import { rigid } from './rigid';
import { shearNormal } from './shear-normal';
import type {
  LinearStrength,
  MaterialTint,
  NormalStressEnvelope,
  StrengthModel,
  StrengthNote,
} from './types';
import { undrained } from './undrained';
import { undrainedRatio } from './undrained-ratio';

/**
 * Every strength model, by the name a file gives it (`strength.model`). The rest of the
 * solver asks a strength through the functions below and never looks at its model: adding a
 * model is a file in strength/, its row here, its branch in the section schema and its id in
 * the Strength type.
 */
export const STRENGTH_MODELS = {
  'mohr-coulomb': mohrCoulomb,
  undrained,
  rigid,
  'hoek-brown': hoekBrown,
  'undrained-ratio': undrainedRatio,
  'shear-normal': shearNormal,
  bilinear,
} as const satisfies Record<Strength['model'], unknown>;

type AnyModel = StrengthModel<Strength, RawStrength>;
const modelOf = (s: { model: Strength['model'] }) =>
  STRENGTH_MODELS[s.model] as unknown as AnyModel;

/** The settings of a file's strength with a dimension (for the conversion to SI). */
export const strengthQuantities = (raw: RawStrength): Partial<Record<string, QuantityKind>> =>
  modelOf(raw).quantities;
/** The normalised strength of a file's. */
export const normaliseStrength = (raw: RawStrength): Strength => modelOf(raw).normalise(raw);
/** What a file writes for a strength. */
export const strengthDocument = (s: Strength): RawStrength => modelOf(s).document(s);
/** Warnings about a file's strength the schema cannot express. */
export const checkStrength = (raw: RawStrength): StrengthNote[] => modelOf(raw).check(raw);
/** A few words for a legend; `show` writes an SI value in the section's units with its label. */
export const describeStrength = (
  s: Strength,
  show: (value: number, kind: QuantityKind, digits: number) => string,
): string => modelOf(s).describe(s, show);
/** The strength as the slicer takes it; null for a rigid base. */
export const linearStrength = (s: Strength): LinearStrength | null => modelOf(s).linear(s);
/** The stress a strength is written in: effective (c′, φ′), total (Su) or none (a rigid base). */
export const strengthStress = (s: Strength): 'effective' | 'total' | 'none' => modelOf(s).stress;
/** The Rankine depth of a tension crack in a material of this strength and unit weight γ. */
export const crackDepthIn = (s: Strength, gamma: number): number => modelOf(s).crackDepth(s, gamma);
/** Its kind and representative strength, for the colour of a drawing. */
export const strengthTint = (s: Strength): MaterialTint => modelOf(s).tint(s);
/** A rigid base: no slip surface enters it. */
export const isRigid = (s: Strength): boolean => linearStrength(s) === null;
/**
 * A strength that depends on the effective normal stress on the base: its τ–σ′n envelope
 * (the tangent at σ′n); null for a strength that does not.
 */
export const strengthEnvelope = (s: Strength): NormalStressEnvelope | null =>
  modelOf(s).envelope?.(s) ?? null;
/** An undrained strength drawn from the vertical effective stress at the base: Su at σ′v; null for others. */
export const verticalStressStrength = (s: Strength): ((sigmaV: number) => number) | null =>
  modelOf(s).fromVerticalStress?.(s) ?? null;
/** Whether a strength varies from base to base with the stresses on it (set by slices/stress-dependent.ts). */
export const variesWithStress = (s: Strength): boolean =>
  !!(modelOf(s).envelope || modelOf(s).fromVerticalStress);
/** The model's name in a sentence ("Hoek–Brown", "Su from σ′v" …). */
export const STRENGTH_WORDS: Record<Strength['model'], string> = {
  'mohr-coulomb': 'Mohr–Coulomb',
  undrained: 'undrained (Su)',
  rigid: 'rigid',
  'hoek-brown': 'Hoek–Brown',
  'undrained-ratio': 'Su from σ′v',
  'shear-normal': 'shear–normal function',
  bilinear: 'bilinear Mohr–Coulomb',
};
