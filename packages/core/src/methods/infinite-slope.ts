import { linearStrength, strengthEnvelope, verticalStressStrength } from '../strength/registry';
import type { Material } from '../model/types';

export interface InfiniteSlopeInput {
  /** Slope angle β (degrees), vertical depth z of the slip plane (m), m = height of the water table above the plane / z. */
  angle: number;
  depth: number;
  waterRatio: number;
  material: Material;
  waterUnitWeight: number;
  kh: number;
}

export interface InfiniteSlopeResult {
  fs: number;
  converged: boolean;
  reason?: string;
  /** Per unit area of the slip plane: normal stress σ, pore pressure u, driving shear stress τ (kPa). */
  normalStress: number;
  porePressure: number;
  drivingStress: number;
}

/**
 * The infinite slope (Skempton & DeLory 1957; any soil-mechanics textbook): a slip plane
 * parallel to the ground at vertical depth z, seepage parallel to the slope with the water
 * table m·z above the plane, a horizontal seismic coefficient kh. Per unit area of the plane,
 * with W = γ̄·z·cos β the weight of the column (γ̄ = (1 − m)γ + m·γsat):
 *   F = [c′ + (W cos β − kh·W sin β − u) tan φ′] / (W sin β + kh·W cos β),  u = γw·m·z·cos²β.
 * Without water and kh: F = [c′ + γ z cos²β tan φ′] / (γ z sin β cos β); with c′ = 0 and no
 * water F = tan φ′ / tan β. Undrained soil: F = Su / (W sin β + kh·W cos β), with Su the
 * material's reference value su (no datum on an infinite plane). A strength that depends on
 * the normal stress (Hoek–Brown, shear–normal points, bilinear) is taken from its envelope at
 * the plane's σ′n = W cos β − kh·W sin β − u, which on an infinite slope does not depend on F:
 * F = τ(σ′n)/τ_driving; Su from σ′v at σ′v = γ̄z − u.
 *
 * @example infiniteSlope({ angle: 30, depth: 3, waterRatio: 0, material, waterUnitWeight: 9.81, kh: 0 }).fs
 */
export function infiniteSlope(input: InfiniteSlopeInput): InfiniteSlopeResult {
  const { angle, depth: z, waterRatio: m, material, waterUnitWeight: gw, kh } = input;
  const b = (angle * Math.PI) / 180;
  const gamma = (1 - m) * material.unitWeight + m * material.saturatedUnitWeight;
  const W = gamma * z * Math.cos(b);
  const u = gw * m * z * Math.cos(b) ** 2;
  const sigma = W * Math.cos(b) - kh * W * Math.sin(b);
  const tau = W * Math.sin(b) + kh * W * Math.cos(b);
  const st = linearStrength(material.strength);
  const out = { normalStress: sigma, porePressure: u, drivingStress: tau };
  if (!st)
    return { fs: NaN, converged: false, reason: 'infinite slope: the material is rigid', ...out };
  if (!(tau > 0))
    return {
      fs: NaN,
      converged: false,
      reason: 'infinite slope: no driving shear on the plane',
      ...out,
    };
  // (an undrained strength has tan φ′ = 0 and its Su at the datum on the plane)
  let resist = st.c + (sigma - u) * st.tanPhi;
  const envelope = strengthEnvelope(material.strength);
  const fromSv = verticalStressStrength(material.strength);
  if (envelope) {
    // the envelope at the plane's own σ′n, which does not depend on F here
    const ct = new Float64Array(2);
    const sn = Math.max(envelope.floor, sigma - u);
    envelope.tangent(sn, ct);
    resist = ct[0] + sn * ct[1];
  } else if (fromSv) {
    resist = fromSv(gamma * z - u);
  }
  const fs = Math.max(0, resist) / tau;
  return { fs, converged: true, ...out };
}
