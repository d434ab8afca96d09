import type { HoekBrownStrength } from '../model/types';
import type { NormalStressEnvelope, StrengthModel } from './types';

/** A Hoek–Brown strength as a file writes it: the disturbance factor is optional (default 0). */
export interface RawHoekBrownStrength {
  model: 'hoek-brown';
  intactStrength: number;
  gsi: number;
  mi: number;
  disturbance?: number;
}

/** The rock-mass constants of the generalised criterion. */
export interface HoekBrownConstants {
  mb: number;
  s: number;
  a: number;
  /** Uniaxial tensile strength of the mass, σt = −s σci / mb (kPa, negative). */
  tensile: number;
}

/**
 * mb, s and a of the generalised Hoek–Brown criterion (Hoek, Carranza-Torres & Corkum 2002,
 * eqs. 2–4): mb = mi exp((GSI − 100)/(28 − 14D)), s = exp((GSI − 100)/(9 − 3D)),
 * a = 1/2 + (e^(−GSI/15) − e^(−20/3))/6; σt = −s σci/mb (their eq. 9).
 *
 * @example hoekBrownConstants({ model: 'hoek-brown', intactStrength: 50000, gsi: 50, mi: 10, disturbance: 0 }).mb // → 1.677
 */
export function hoekBrownConstants(h: HoekBrownStrength): HoekBrownConstants {
  const mb = h.mi * Math.exp((h.gsi - 100) / (28 - 14 * h.disturbance));
  const s = Math.exp((h.gsi - 100) / (9 - 3 * h.disturbance));
  const a = 0.5 + (Math.exp(-h.gsi / 15) - Math.exp(-20 / 3)) / 6;
  return { mb, s, a, tensile: (-s * h.intactStrength) / mb };
}

/**
 * The point of the τ–σn envelope at the minor principal stress σ3, from the σ1–σ3 form
 * σ1 = σ3 + σci (mb σ3/σci + s)^a by Balmer's (1952) relations for a curved envelope, as Hoek
 * (1990) applies them to this criterion: with k = dσ1/dσ3 = 1 + a mb (mb σ3/σci + s)^(a−1),
 * σn = σ3 + (σ1 − σ3)/(k + 1), τ = (σ1 − σ3)√k/(k + 1), and the tangent of the envelope there
 * sin φ = (k − 1)/(k + 1), i.e. tan φ = (k − 1)/(2√k), c = τ − σn tan φ. Into out: [σn, τ, c, tan φ].
 */
export function hoekBrownPoint(
  sigmaCi: number,
  k: HoekBrownConstants,
  sigma3: number,
  out: Float64Array,
): void {
  const q = Math.max(0, (k.mb * sigma3) / sigmaCi + k.s);
  const d = sigmaCi * Math.pow(q, k.a);
  const slope = 1 + k.a * k.mb * Math.pow(q, k.a - 1);
  const sigmaN = sigma3 + d / (slope + 1);
  const root = Math.sqrt(slope);
  const tau = (d * root) / (slope + 1);
  const tanPhi = (slope - 1) / (2 * root);
  out[0] = sigmaN;
  out[1] = tau;
  out[2] = tau - sigmaN * tanPhi;
  out[3] = tanPhi;
}

/**
 * The envelope of a Hoek–Brown rock mass in τ–σ′n: at a given σ′n the σ3 whose point of the
 * envelope has it (Newton's method on σn(σ3), whose derivative is closed, kept inside the
 * bracket from σt, where σn = σt, to σn itself, since σn ≥ σ3),
 * and the exact tangent there (hoekBrownPoint). Below the tensile strength σt the base is taken
 * at σt, where τ = 0 and the tangent is vertical: it is taken a hair inside, at
 * σ3 = σt (1 − 10⁻⁴). Meant for 0 ≤ σ′n ≤ σci: a base in tension or above the strength of the
 * intact rock is named in a warning.
 */
export function hoekBrownEnvelope(h: HoekBrownStrength): NormalStressEnvelope {
  const k = hoekBrownConstants(h);
  const sci = h.intactStrength;
  const pt = new Float64Array(4);
  const low = k.tensile * (1 - 1e-4);
  hoekBrownPoint(sci, k, low, pt);
  const floor = pt[0];
  const lowC = pt[2];
  const lowT = pt[3];
  const tol = 1e-12 * sci;
  // the last root and the slope dσn/dσ3 there: the next base (a neighbour, of a like σn) starts from it
  let lastSigma = NaN;
  let lastS3 = NaN;
  let lastDg = NaN;
  /**
   * The tangent at σn = sigma (> floor) into out: the σ3 of that point by Newton's method kept
   * inside a shrinking bracket, and the tangent at the last iterate (within 10⁻¹² σci of it).
   */
  const tangentAt = (sigma: number, out: Float64Array): void => {
    let lo = low;
    let hi = sigma;
    let x =
      lastDg > 0 ? lastS3 + (sigma - lastSigma) / lastDg : sigma - 0.5 * sci * Math.pow(k.s, k.a);
    if (!(x > lo && x < hi)) x = 0.5 * (lo + hi);
    for (let it = 0; it < 100; it++) {
      const q = Math.max(1e-300, (k.mb * x) / sci + k.s);
      const qa = Math.pow(q, k.a);
      const d = sci * qa;
      const slope = 1 + (k.a * k.mb * qa) / q;
      const dSlope = (k.a * (k.a - 1) * k.mb * k.mb * qa) / (q * q * sci);
      const g = x + d / (slope + 1) - sigma;
      if (g > 0) hi = x;
      else lo = x;
      const dg = 1 + (slope - 1) / (slope + 1) - (d * dSlope) / ((slope + 1) * (slope + 1));
      const step = g / dg;
      let next = x - step;
      const settled = Math.abs(step) <= tol;
      if (!settled && !(next > lo && next < hi)) next = 0.5 * (lo + hi);
      if (settled || hi - lo <= tol) {
        lastSigma = sigma;
        lastS3 = next;
        lastDg = dg;
        // Balmer's tangent at x, as hoekBrownPoint gives it, from the numbers at hand
        const root = Math.sqrt(slope);
        const tanPhi = (slope - 1) / (2 * root);
        out[0] = (d * root) / (slope + 1) - (x + d / (slope + 1)) * tanPhi;
        out[1] = tanPhi;
        return;
      }
      x = next;
    }
    hoekBrownPoint(sci, k, x, pt);
    out[0] = pt[2];
    out[1] = pt[3];
  };
  return {
    floor,
    range: [0, sci],
    rangeWords: 'outside 0 ≤ σ′n ≤ σci, the range the Hoek–Brown criterion is meant for',
    tangent: (sigma, out) => {
      if (!(sigma > floor)) {
        out[0] = lowC;
        out[1] = lowT;
        return;
      }
      tangentAt(sigma, out);
    },
  };
}

const tangentAt = (h: HoekBrownStrength, sigma: number) => {
  const out = new Float64Array(2);
  hoekBrownEnvelope(h).tangent(sigma, out);
  return { c: out[0], tanPhi: out[1] };
};

/**
 * The generalised Hoek–Brown criterion of a jointed rock mass (Hoek, Carranza-Torres & Corkum
 * 2002), effective stress, σ1′ = σ3′ + σci (mb σ3′/σci + s)^a. Each slice base takes the
 * tangent of its τ–σ′n envelope at the base's effective normal stress (hoekBrownEnvelope),
 * iterated with the method. Its `linear` (where the iteration starts, and the crack depth) is
 * the tangent at σ′n = 0.
 *
 * @example hoekBrown.envelope!({ model: 'hoek-brown', intactStrength: 50000, gsi: 50, mi: 10, disturbance: 0 }).floor // → −108.1
 */
export const hoekBrown: StrengthModel<HoekBrownStrength, RawHoekBrownStrength> = {
  quantities: { intactStrength: 'pressure' },
  normalise: (raw) => ({
    model: 'hoek-brown',
    intactStrength: raw.intactStrength,
    gsi: raw.gsi,
    mi: raw.mi,
    disturbance: raw.disturbance ?? 0,
  }),
  document: (s) => ({
    model: 'hoek-brown',
    intactStrength: s.intactStrength,
    gsi: s.gsi,
    mi: s.mi,
    ...(s.disturbance ? { disturbance: s.disturbance } : {}),
  }),
  check: (raw) =>
    raw.gsi < 10
      ? [
          {
            code: 'gsi-low',
            message: `GSI ${raw.gsi} is below 10: such a mass behaves as a soil rather than as jointed rock; check whether a soil strength suits it better`,
            path: ['gsi'],
          },
        ]
      : [],
  describe: (s, show) =>
    `Hoek–Brown σci ${show(s.intactStrength, 'pressure', 0)}, GSI ${s.gsi}, mi ${s.mi}, D ${s.disturbance}`,
  stress: 'effective',
  linear: (s) => ({ ...tangentAt(s, 0), rate: 0, datum: NaN }),
  tint: (s) => {
    const t = tangentAt(s, 100);
    return { kind: 'cohesive', strength: t.c + 100 * t.tanPhi };
  },
  crackDepth: (s, gamma) => {
    const t = tangentAt(s, 0);
    const phi = Math.atan(t.tanPhi);
    return gamma > 0 ? (2 * t.c * Math.tan(Math.PI / 4 + phi / 2)) / gamma : 0;
  },
  envelope: hoekBrownEnvelope,
};
