import type { UndrainedRatioStrength } from '../model/types';
import type { StrengthModel } from './types';

/** An undrained strength from σ′v as a file writes it: all but the ratio optional. */
export interface RawUndrainedRatioStrength {
  model: 'undrained-ratio';
  ratio: number;
  minimum?: number;
  exponent?: number;
  ocr?: number;
  pop?: number;
}

/**
 * Su at the vertical effective stress σ′v (kPa): σ′v · S · OCRᵐ, not below the minimum. OCR is
 * the constant given, or (σ′v + POP)/σ′v with a pre-overburden pressure; σ′v below 0 is taken
 * as 0 (then Su is the minimum, or S·POP^m·0^(1−m) = 0 with a POP).
 *
 * @example undrainedRatioSu({ model: 'undrained-ratio', ratio: 0.22, minimum: 10, exponent: 0.8, ocr: 2, pop: null }, 100) // → 38.3
 */
export function undrainedRatioSu(s: UndrainedRatioStrength, sigmaV: number): number {
  const sv = Math.max(0, sigmaV);
  const ocrFactor =
    s.pop !== null
      ? sv > 0
        ? Math.pow((sv + s.pop) / sv, s.exponent)
        : 0
      : Math.pow(s.ocr, s.exponent);
  const su = s.pop !== null && sv === 0 ? 0 : sv * s.ratio * ocrFactor;
  return Math.max(s.minimum, su);
}

/**
 * Undrained, total stress (φ = 0), with Su from the vertical effective stress at the slice base:
 * the SHANSEP form Su/σ′v = S·OCRᵐ (Ladd & Foott 1974; Ladd 1991), which with OCR = 1 is the
 * plain ratio Su/σ′v of a normally consolidated clay, and a least Su (a crust, or the strength
 * near the surface where σ′v tends to 0). OCR is constant, or from a pre-overburden pressure
 * POP = σ′p − σ′v (common practice for a lightly overconsolidated clay whose σ′p follows
 * the depth). The default exponent m = 0.8 is common practice (Ladd 1991 gives 0.75–0.85).
 * σ′v is the present one: the weight of the column above the base (a fill included) less the
 * pore pressure (slices/stress-dependent.ts). Not dependent on F: Su is set once a surface.
 * Its `linear` is the least Su; the Rankine crack depth is 2·minimum/γ.
 *
 * @example undrainedRatio.fromVerticalStress!(clay)(80) // → Su at σ′v = 80 kPa
 */
export const undrainedRatio: StrengthModel<UndrainedRatioStrength, RawUndrainedRatioStrength> = {
  quantities: { minimum: 'pressure', pop: 'pressure' },
  normalise: (raw) => ({
    model: 'undrained-ratio',
    ratio: raw.ratio,
    minimum: raw.minimum ?? 0,
    exponent: raw.exponent ?? 0.8,
    ocr: raw.ocr ?? 1,
    pop: raw.pop ?? null,
  }),
  document: (s) => ({
    model: 'undrained-ratio',
    ratio: s.ratio,
    ...(s.minimum ? { minimum: s.minimum } : {}),
    ...(s.exponent !== 0.8 ? { exponent: s.exponent } : {}),
    ...(s.ocr !== 1 ? { ocr: s.ocr } : {}),
    ...(s.pop !== null ? { pop: s.pop } : {}),
  }),
  check: (raw) => {
    const notes = [];
    if (raw.ocr !== undefined && raw.pop !== undefined)
      notes.push({
        code: 'ocr-and-pop',
        message: 'give either ocr (a constant OCR) or pop (a pre-overburden pressure), not both',
        severity: 'error' as const,
        path: ['pop'],
      });
    if (raw.ratio > 1)
      notes.push({
        code: 'ratio-unusual',
        message: `Su/σ′v = ${raw.ratio} is unusually high (0.2–0.35 is typical of a normally consolidated clay); check the value`,
        path: ['ratio'],
      });
    return notes;
  },
  describe: (s, show) => {
    const ocr =
      s.pop !== null
        ? ` · OCR^${s.exponent}, POP ${show(s.pop, 'pressure', 0)}`
        : s.ocr !== 1
          ? ` · ${s.ocr}^${s.exponent} (OCR^m)`
          : '';
    const min = s.minimum > 0 ? `, at least ${show(s.minimum, 'pressure', 1)}` : '';
    return `Su = ${s.ratio} σ′v${ocr}${min}`;
  },
  stress: 'total',
  linear: (s) => ({ c: s.minimum, tanPhi: 0, rate: 0, datum: NaN }),
  tint: (s) => ({ kind: 'undrained', strength: undrainedRatioSu(s, 100) }),
  crackDepth: (s, gamma) => (gamma > 0 ? (2 * s.minimum) / gamma : 0),
  fromVerticalStress: (s) => (sigmaV) => undrainedRatioSu(s, sigmaV),
};
