import { linearStrength } from '../strength/registry';
import { circlePolygonMoments } from '../geometry/circle-polygon-moments';
import { lowerEnvelope } from '../geometry/lower-envelope';
import { polylineBetween } from '../geometry/polyline-between';
import { yAt } from '../geometry/y-at';
import type { Point, Polyline, Seismic } from '../model/types';
import type { PreparedSection } from '../slices/prepare-section';
import { curvePolylineMeets } from '../slices/base-curve';
import type { SlicedSurface } from '../slices/slice-surface';
import { failed } from './failed';
import { sliceForces } from './slice-forces';
import { statics } from './statics';
import type { SliceMethodResult } from './types';

/** What the φ = 0 circle reports beyond the common result. */
export interface PhiZeroCircleResult extends SliceMethodResult {
  /** Weight of the sliding mass (kN/m) and its lever arm about the centre (m). */
  massWeight: number;
  leverArm: number;
  resistingMoment: number;
  drivingMoment: number;
}

const upperEnvelope = (a: Polyline, b: Polyline): Polyline =>
  lowerEnvelope(
    a.map((p) => [p[0], -p[1]]),
    b.map((p) => [p[0], -p[1]]),
  ).map((p) => [p[0], -p[1]]);

/** The region between an upper and a lower polyline over [xa, xb], as a polygon. */
function band(
  upper: Polyline,
  lower: Polyline | null,
  xa: number,
  xb: number,
  deep: number,
): Point[] {
  const top = polylineBetween(upper, xa, xb);
  const bottom: Polyline = lower
    ? polylineBetween(lower, xa, xb)
    : [
        [xa, deep],
        [xb, deep],
      ];
  return [...top, ...bottom.reverse()];
}

/**
 * ∫ Su ds along the arc of the circle (centre, r) between x0 and x1 (lower half), for
 * Su = su + rate·(datum − y) below the datum and su above: closed form on the angle ψ from
 * the downward vertical, x = xc + r sin ψ, y = yc − r cos ψ.
 */
function arcSuIntegral(
  xc: number,
  yc: number,
  r: number,
  x0: number,
  x1: number,
  su: number,
  rate: number,
  datum: number,
): number {
  const psi = (x: number) => Math.asin(Math.max(-1, Math.min(1, (x - xc) / r)));
  const p0 = psi(x0);
  const p1 = psi(x1);
  const ym = yc - r * Math.cos(0.5 * (p0 + p1));
  if (!Number.isFinite(datum) || rate === 0 || ym >= datum) return su * r * (p1 - p0);
  return r * ((su + rate * (datum - yc)) * (p1 - p0) + rate * r * (Math.sin(p1) - Math.sin(p0)));
}

/**
 * The φ = 0 circle (Fellenius 1927; Petterson's Swedish circle):
 *   F = R·Σ Su,i·Li / (W·a + moments of loads, ponded water, crack water and kh·W),
 * with the weight W of the sliding mass and its lever arm a about the centre from the exact
 * geometry — the disk intersected with each stratum (and split at the piezometric line where
 * the saturated unit weight differs), no slices — and Su integrated in closed form along each
 * piece of the arc (Su growing with depth included). Surface loads and water pressures come
 * from their exact resultants. Needs φ = 0 along the whole arc and a circle that does not
 * meet a rigid base (there the normal force on the flat part would enter the moments).
 *
 * @example phiZeroCircle(prepared, sliced, circle, seismic).fs
 */
export function phiZeroCircle(
  prepared: PreparedSection,
  sliced: SlicedSurface,
  center: Point,
  radius: number,
  seismic: Seismic,
): PhiZeroCircleResult {
  const s = sliced.slices;
  const n = s.n;
  const g = s.mirrored ? prepared.mirrored : prepared.normal;
  const xc = s.mirrored ? -center[0] : center[0];
  const yc = center[1];
  const none = { massWeight: 0, leverArm: 0, resistingMoment: 0, drivingMoment: 0 };
  const notApplicable = (reason: string): PhiZeroCircleResult => ({
    ...failed(n, 0, reason, undefined, 'not-applicable'),
    ...none,
  });
  if (!sliced.pieces.every((p) => p.arc)) {
    return notApplicable(
      'φ = 0 circle: the circle meets the rigid base; use a method of slices for this composite surface',
    );
  }
  for (let i = 0; i < n; i++) {
    if (s.tanPhi[i] !== 0) {
      return notApplicable(
        'φ = 0 circle: the arc passes through soil with φ′ > 0; use a method of slices',
      );
    }
  }
  const xa = s.xl[0];
  const xb = s.xr[n - 1];
  const r2 = radius * radius;
  const outsideAbove = (x: number, y: number) => y > yc && (x - xc) ** 2 + (y - yc) ** 2 > r2;
  if (
    [
      [xa, yAt(g.ground, xa)],
      [xb, yAt(g.ground, xb)],
      ...g.ground.filter((p) => p[0] > xa && p[0] < xb),
    ].some((p) => outsideAbove(p[0], p[1]))
  ) {
    return notApplicable(
      'φ = 0 circle: the ground rises above the top of the circle; the sliding mass is not disk ∩ soil',
    );
  }
  let deep = Infinity;
  for (const top of g.tops) for (const p of top) deep = Math.min(deep, p[1]);
  deep = Math.min(deep, yc - radius) - 10 * radius;
  const kv1 = 1 + seismic.kv;
  const pz = g.piezometric;

  // weight and its moments, stratum by stratum, from disk ∩ polygon
  let W = 0;
  let MWx = 0; // Σ γ ∫∫ (x − xc)
  let MWy = 0; // Σ γ ∫∫ (y − yc)
  const addRegion = (poly: Point[], gamma: number) => {
    const m = circlePolygonMoments([xc, yc], radius, poly);
    const sign = m.area < 0 ? -1 : 1;
    W += gamma * sign * m.area;
    MWx += gamma * sign * (m.mx - xc * m.area);
    MWy += gamma * sign * (m.my - yc * m.area);
  };
  for (let k = 0; k < g.soilStrata; k++) {
    const mat = prepared.materials[g.stratumMaterial[k]];
    const upper = g.tops[k];
    const lower = k + 1 < g.tops.length ? g.tops[k + 1] : null;
    if (pz && mat.saturatedUnitWeight !== mat.unitWeight) {
      // saturated part: between min(top, line) and the bottom; dry part: between the top and max(bottom, min(top, line))
      const wetTop = lowerEnvelope(upper, pz);
      const bottom = lower ?? [
        [g.xMin, deep],
        [g.xMax, deep],
      ];
      const wetBottom = lowerEnvelope(bottom, wetTop);
      addRegion(band(wetTop, wetBottom, xa, xb, deep), mat.saturatedUnitWeight);
      addRegion(band(upper, upperEnvelope(bottom, wetTop), xa, xb, deep), mat.unitWeight);
    } else {
      addRegion(band(upper, lower, xa, xb, deep), mat.unitWeight);
    }
  }

  // resisting: R·∫ Su ds, the arc split at strata tops and at each material's Su datum
  const arc = sliced.pieces;
  const cuts = [xa, xb];
  for (let k = 1; k < g.soilStrata; k++) cuts.push(...curvePolylineMeets(arc, g.tops[k], xa, xb));
  for (const mat of prepared.materials) {
    const l = linearStrength(mat.strength);
    if (l && Number.isFinite(l.datum)) {
      const dy = yc - l.datum;
      if (Math.abs(dy) < radius) {
        const dx = Math.sqrt(radius * radius - dy * dy);
        if (dy > 0) cuts.push(xc - dx, xc + dx);
      }
    }
  }
  const xs = cuts.filter((x) => x >= xa && x <= xb).sort((u, v) => u - v);
  let suL = 0;
  for (let i = 0; i + 1 < xs.length; i++) {
    const x0 = xs[i];
    const x1 = xs[i + 1];
    if (x1 - x0 <= prepared.tol) continue;
    const xm = 0.5 * (x0 + x1);
    const ym = yc - Math.sqrt(Math.max(0, radius * radius - (xm - xc) ** 2));
    let k = 0;
    while (k + 1 < g.soilStrata && yAt(g.tops[k + 1], xm) >= ym) k++;
    const st = linearStrength(prepared.materials[g.stratumMaterial[k]].strength);
    if (st) suL += arcSuIntegral(xc, yc, radius, x0, x1, st.c, st.rate, st.datum);
  }
  const resisting = radius * suL;

  // driving: weight with seismic forces, plus the exact resultants of surface and crack water and loads
  let Mq = 0;
  let Mr = 0;
  for (let i = 0; i < n; i++) {
    Mq += s.qm[i] - xc * s.qy[i] + yc * s.qx[i];
    Mr += s.rm[i] - xc * s.ry[i] + yc * s.rx[i];
  }
  const driving = kv1 * MWx - seismic.kh * MWy - Mq;
  // reinforcement divided by F: F·(driving − Mr/F) = resisting
  const F = (resisting + Mr) / driving;
  if (!(F > 0) || !Number.isFinite(F)) {
    return {
      ...failed(n, 1, 'φ = 0 circle: the sliding mass has no driving moment about the centre'),
      ...none,
    };
  }
  const st = statics(s, seismic, [xc, yc]);
  // per-slice forces for the report only (with φ = 0 they do not enter F): no warnings from them
  const forces = sliceForces(s, st, F, 0, null, false);
  return {
    fs: F,
    converged: true,
    iterations: 1,
    ...forces,
    pivot: [xc, yc],
    warnings: [],
    massWeight: W,
    leverArm: W > 0 ? MWx / W : 0,
    resistingMoment: resisting,
    drivingMoment: driving,
  };
}
