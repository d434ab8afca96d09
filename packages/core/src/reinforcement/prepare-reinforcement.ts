import { lookupY } from '../geometry/lookup';
import type { Material, Reinforcement, Section } from '../model/types';
import { linearStrength, strengthEnvelope, verticalStressStrength } from '../strength/registry';
import type { Geometry, StratumProperties } from '../slices/prepare-section';

/**
 * One reinforcing element ready for the slicer, in one orientation (x → −x when mirrored),
 * forces per m run. Its line runs from its start (a nail's or an anchor's head, a layer's first
 * point, a pile's bottom); `s` is the length along it. `R` is the pullout (bond) resistance
 * gathered from the start up to `sR` (kN per m run): the resistance of a stretch is a
 * difference of two of its values.
 */
export interface PreparedElement {
  /** Index in Section.reinforcement. */
  index: number;
  type: Reinforcement['type'];
  xs: Float64Array;
  ys: Float64Array;
  s: Float64Array;
  sR: Float64Array;
  R: Float64Array;
  /** Tensile strength (a pile: its shear resistance), kN per m run. */
  strength: number;
  /** What the front part holds besides its own pullout: a nail's facing (kN per m run); Infinity for an anchor (its head holds). */
  facing: number;
  dividedByF: boolean;
  /** An anchor applied as a load. */
  asLoad: boolean;
}

/** The step along an element at which the pullout resistance is summed (m). */
const STEP = 0.25;
const MAX_SAMPLES = 4000;

/**
 * The vertical total and effective stress (kPa) at (x, y) and the material there, from the
 * strata, unit weights and water of a section in one orientation: the soil column above the
 * point (saturated below the piezometric line), water ponded on the ground, and the pore
 * pressure of the piezometric line or ru. Null above the ground or in a rigid base.
 */
export function stressAt(
  g: Geometry,
  strata: StratumProperties,
  section: Section,
  x: number,
  y: number,
): { sigmaV: number; effective: number; stratum: number } | null {
  const yg = lookupY(g.at.ground, x);
  if (!(y < yg)) return null;
  const water = section.water;
  const gw = water.unitWeight;
  const pz = g.at.piezometric ? lookupY(g.at.piezometric, x) : -Infinity;
  let sigma = pz > yg ? gw * (pz - yg) : 0;
  let stratum = -1;
  for (let k = 0; k < g.tops.length; k++) {
    const top = lookupY(g.at.tops[k], x);
    const bottom = k + 1 < g.tops.length ? lookupY(g.at.tops[k + 1], x) : -Infinity;
    if (!(top > y)) continue;
    const lo = Math.max(y, bottom);
    if (top > lo) {
      const dry = Math.max(0, top - Math.max(lo, pz));
      const wet = top - lo - dry;
      sigma += strata.gamma[k] * dry + strata.gammaSat[k] * wet;
    }
    if (bottom <= y) {
      stratum = k;
      break;
    }
  }
  if (stratum < 0 || stratum >= g.soilStrata) return null;
  const u = water.kind === 'ru' ? water.ru * sigma : pz > y ? gw * (pz - y) : 0;
  return { sigmaV: sigma, effective: sigma - u, stratum };
}

/** The shear strength (kPa) of a material on a plane at the effective normal stress σ′ (kPa), at elevation y. */
export function strengthOnPlane(m: Material, sigma: number, y: number): number {
  const env = strengthEnvelope(m.strength);
  if (env) {
    const out = new Float64Array(2);
    const at = Math.max(env.floor, sigma);
    env.tangent(at, out);
    return Math.max(0, out[0] + at * out[1]);
  }
  const vertical = verticalStressStrength(m.strength);
  if (vertical) return vertical(Math.max(0, sigma));
  const l = linearStrength(m.strength);
  if (!l) return 0;
  const c = l.c + (l.datum > y ? l.rate * (l.datum - y) : 0);
  return c + Math.max(0, sigma) * l.tanPhi;
}

/** The element's line, from its start, in section coordinates. */
function lineOf(r: Reinforcement): [number, number][] {
  const deg = Math.PI / 180;
  switch (r.type) {
    case 'geosynthetic':
      return r.line.map(([x, y]) => [x, y]);
    case 'nail':
    case 'anchor': {
      const L = r.type === 'nail' ? r.length : r.freeLength + r.bondLength;
      const dx = (r.toward === 'right' ? 1 : -1) * Math.cos(r.inclination * deg);
      const dy = -Math.sin(r.inclination * deg);
      const [hx, hy] = r.head;
      return r.type === 'nail'
        ? [
            [hx, hy],
            [hx + L * dx, hy + L * dy],
          ]
        : [
            [hx, hy],
            [hx + r.freeLength * dx, hy + r.freeLength * dy],
            [hx + L * dx, hy + L * dy],
          ];
    }
    case 'pile':
      return [
        [r.x, r.bottom],
        [r.x, r.top ?? Infinity],
      ];
  }
}

/**
 * The section's reinforcement prepared for slicing in one orientation: lines, capacities per
 * m run and the pullout resistance along each (a geosynthetic's 2·Ci·Rc·τ(σ′v) summed by the
 * trapezoid rule every 0.25 m, τ the strength of the soil at the overburden's vertical
 * effective stress; a nail's bond per m over the spacing; an anchor's bond over its bond
 * length only).
 */
export function prepareReinforcement(
  section: Section,
  g: Geometry,
  strata: StratumProperties,
  materials: Material[],
  mirror: boolean,
): PreparedElement[] {
  const sign = mirror ? -1 : 1;
  return section.reinforcement.map((r, index) => {
    const line = lineOf(r);
    if (r.type === 'pile' && r.top === null) {
      // a pile up to the ground: its line ends a little above it
      const x = sign * r.x;
      line[1][1] = lookupY(g.at.ground, x) + 1;
    }
    const xs = Float64Array.from(line, (p) => sign * p[0]);
    const ys = Float64Array.from(line, (p) => p[1]);
    const s = new Float64Array(xs.length);
    for (let i = 1; i < xs.length; i++)
      s[i] = s[i - 1] + Math.hypot(xs[i] - xs[i - 1], ys[i] - ys[i - 1]);
    const total = s[s.length - 1];
    let sR: Float64Array;
    let R: Float64Array;
    let strength: number;
    let facing = 0;
    if (r.type === 'geosynthetic' && !Number.isFinite(r.interaction)) {
      // a force whose pullout never limits it (the required force's)
      sR = Float64Array.of(0, total);
      R = Float64Array.of(0, 1e15 * Math.max(total, 1));
      strength = r.strength;
    } else if (r.type === 'geosynthetic') {
      const count = Math.min(MAX_SAMPLES, Math.max(2, Math.ceil(total / STEP) + 1));
      sR = new Float64Array(count);
      R = new Float64Array(count);
      let prev = 0;
      for (let k = 0; k < count; k++) {
        const at = (total * k) / (count - 1);
        sR[k] = at;
        const [x, y] = pointAlong(xs, ys, s, at);
        const st = stressAt(g, strata, section, x, y);
        const tau = st
          ? 2 *
            r.interaction *
            r.coverage *
            strengthOnPlane(materials[g.stratumMaterial[st.stratum]], st.effective, y)
          : 0;
        R[k] = k === 0 ? 0 : R[k - 1] + 0.5 * (prev + tau) * (sR[k] - sR[k - 1]);
        prev = tau;
      }
      strength = r.strength;
    } else if (r.type === 'nail') {
      sR = Float64Array.of(0, total);
      R = Float64Array.of(0, (r.bond * total) / r.spacing);
      strength = r.tensileCapacity / r.spacing;
      facing = r.facingCapacity / r.spacing;
    } else if (r.type === 'anchor') {
      sR = Float64Array.of(0, r.freeLength, total);
      R = Float64Array.of(0, 0, (r.bond * r.bondLength) / r.spacing);
      strength = r.capacity / r.spacing;
      facing = Infinity;
    } else {
      sR = Float64Array.of(0, total);
      R = Float64Array.of(0, 0);
      strength = r.shear;
    }
    return {
      index,
      type: r.type,
      xs,
      ys,
      s,
      sR,
      R,
      strength,
      facing,
      dividedByF: r.dividedByF,
      asLoad: r.type === 'anchor' && r.acts === 'load',
    };
  });
}

/** The point at length `at` along a line given by its vertices and their lengths. */
function pointAlong(
  xs: Float64Array,
  ys: Float64Array,
  s: Float64Array,
  at: number,
): [number, number] {
  let i = 1;
  while (i < s.length - 1 && s[i] < at) i++;
  const d = s[i] - s[i - 1];
  const t = d > 0 ? (at - s[i - 1]) / d : 0;
  return [xs[i - 1] + t * (xs[i] - xs[i - 1]), ys[i - 1] + t * (ys[i] - ys[i - 1])];
}

/** The resistance gathered between lengths a and b (a ≤ b) along an element. */
export function resistanceBetween(e: PreparedElement, a: number, b: number): number {
  return valueAt(e.sR, e.R, b) - valueAt(e.sR, e.R, a);
}

function valueAt(xs: Float64Array, ys: Float64Array, x: number): number {
  const n = xs.length;
  if (x <= xs[0]) return ys[0];
  if (x >= xs[n - 1]) return ys[n - 1];
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (xs[mid] <= x) lo = mid;
    else hi = mid;
  }
  const d = xs[hi] - xs[lo];
  return d > 0 ? ys[lo] + ((ys[hi] - ys[lo]) * (x - xs[lo])) / d : ys[hi];
}
