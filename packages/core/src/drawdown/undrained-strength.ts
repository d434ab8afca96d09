/**
 * The undrained strength of a slowly draining soil at a rapid drawdown, from the stresses it
 * was consolidated under (Duncan, Wright & Wong 1990, the second stage of their procedure; the
 * same equations in Duncan, Wright & Brandon 2014, Soil Strength and Slope Stability, 2nd ed.,
 * ch. 9). On a slice base, with σ′fc and τfc the effective normal and the shear stress on it
 * before drawdown:
 *
 * - the principal stress ratio of consolidation, taking the base as the plane that fails,
 *   inclined to the major principal plane as the effective envelope c′, φ′ has it:
 *   Kc = [σ′fc + τfc (1 + sin φ′)/cos φ′] / [σ′fc − τfc (1 − sin φ′)/cos φ′];
 * - the same ratio at failure under that envelope (Kc for a point on it):
 *   Kf = (σ′fc + c′ cos φ′)(1 + sin φ′) / [(σ′fc − c′ cos φ′)(1 − sin φ′)],
 *   which is (1 + sin φ′)/(1 − sin φ′) when c′ = 0;
 * - the strength after isotropic consolidation (Kc = 1), the "R" envelope of consolidated–
 *   undrained tests in terms of the consolidation pressure: τff = dR + σ′fc tan ψR;
 * - the strength after consolidation to failure (Kc = Kf): the soil is already at failure, so
 *   its strength is the effective envelope at the consolidation stress, τff = c′ + σ′fc tan φ′;
 * - between them, linearly in Kc:
 *   τff = [(Kf − Kc) τff(Kc = 1) + (Kc − 1) τff(Kc = Kf)] / (Kf − 1), Kc held within [1, Kf].
 *
 * Where the published ratios have no value — σ′fc below c′ cos φ′ (Kf unbounded) or the minor
 * principal stress of consolidation not positive (Kc unbounded) — the ratio is taken as
 * unbounded: an unbounded Kc is held at Kf (the effective envelope); an unbounded Kf with a
 * bounded Kc gives the isotropic envelope. A tensile σ′fc is taken as 0 (no effective stress).
 * These are our choices where the sources are silent.
 */

/** The envelopes a slowly draining soil's undrained strength is drawn from: c′, φ′ (as sin, cos, tan) and dR, tan ψR. */
export interface DrawdownEnvelopes {
  c: number;
  sinPhi: number;
  cosPhi: number;
  tanPhi: number;
  dR: number;
  tanPsiR: number;
}

/** The envelopes of a soil: c′ (kPa), φ′ (degrees), dR (kPa), ψR (degrees). */
export function drawdownEnvelopes(
  c: number,
  phiDegrees: number,
  dR: number,
  psiRDegrees: number,
): DrawdownEnvelopes {
  const phi = (phiDegrees * Math.PI) / 180;
  return {
    c,
    sinPhi: Math.sin(phi),
    cosPhi: Math.cos(phi),
    tanPhi: Math.tan(phi),
    dR,
    tanPsiR: Math.tan((psiRDegrees * Math.PI) / 180),
  };
}

/** Kc from the consolidation stresses on the base (Infinity where the minor principal stress is not positive). */
export function consolidationRatio(sigma: number, tau: number, e: DrawdownEnvelopes): number {
  const s1 = sigma + (tau * (1 + e.sinPhi)) / e.cosPhi;
  const s3 = sigma - (tau * (1 - e.sinPhi)) / e.cosPhi;
  return s3 > 0 ? s1 / s3 : Infinity;
}

/** Kf at the normal stress σ′fc (Infinity where σ′fc ≤ c′ cos φ′). */
export function failureRatio(sigma: number, e: DrawdownEnvelopes): number {
  const a = sigma - e.c * e.cosPhi;
  return a > 0 ? ((sigma + e.c * e.cosPhi) * (1 + e.sinPhi)) / (a * (1 - e.sinPhi)) : Infinity;
}

/**
 * τff, the undrained strength (kPa) on a base consolidated under σ′fc and τfc (see the file's
 * note).
 *
 * @example undrainedStrength(100, 20, drawdownEnvelopes(0, 30, 10, 15)) // → between 36.8 and 57.7
 */
export function undrainedStrength(sigmaFc: number, tauFc: number, e: DrawdownEnvelopes): number {
  const sigma = sigmaFc > 0 ? sigmaFc : 0;
  const isotropic = e.dR + sigma * e.tanPsiR;
  const atFailure = e.c + sigma * e.tanPhi;
  const kf = failureRatio(sigma, e);
  const kc = consolidationRatio(sigma, tauFc, e);
  let w: number;
  if (kf === Infinity) w = kc === Infinity ? 1 : 0;
  else if (!(kf > 1)) w = 1;
  else w = (Math.min(Math.max(kc, 1), kf) - 1) / (kf - 1);
  return (1 - w) * isotropic + w * atFailure;
}
