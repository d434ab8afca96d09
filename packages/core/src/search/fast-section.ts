import type { Geometry, PreparedSection } from '../slices/prepare-section';
import type { SliceSet } from '../slices/slice-surface';
import { type Lookup, lookup } from './lookup';

/**
 * One orientation of a section prepared for the search's fast slicing: every boundary as a
 * constant-time lookup and every material property as a flat array, by stratum.
 */
export interface FastGeometry {
  g: Geometry;
  ground: Lookup;
  /** Strata tops, tops[0] the ground; only the strata above the rigid base. */
  tops: Lookup[];
  /** Highest point of each top: a circle whose lowest point is below it may reach that stratum. */
  topMax: Float64Array;
  soil: number;
  rigid: Lookup | null;
  piezo: Lookup | null;
  /** By stratum: γ, γsat, c′ or Su, tan φ′, Su rate and datum (NaN when none), material index. */
  gamma: Float64Array;
  gammaSat: Float64Array;
  c: Float64Array;
  tanPhi: Float64Array;
  suRate: Float64Array;
  suDatum: Float64Array;
  material: Int32Array;
  gw: number;
  ru: number;
  strips: Float64Array; // from, to, pressure …
  lines: Float64Array; // x, fx, fy …
  crackDepth: number;
  crackWater: number;
}

export interface FastSection {
  prepared: PreparedSection;
  normal: FastGeometry;
  mirrored: FastGeometry;
}

function fastGeometry(prepared: PreparedSection, g: Geometry): FastGeometry {
  const soil = g.soilStrata;
  const mats = prepared.materials;
  const gamma = new Float64Array(soil);
  const gammaSat = new Float64Array(soil);
  const c = new Float64Array(soil);
  const tanPhi = new Float64Array(soil);
  const suRate = new Float64Array(soil);
  const suDatum = new Float64Array(soil).fill(NaN);
  const material = new Int32Array(soil);
  for (let k = 0; k < soil; k++) {
    const m = mats[g.stratumMaterial[k]];
    material[k] = g.stratumMaterial[k];
    gamma[k] = m.unitWeight;
    gammaSat[k] = m.saturatedUnitWeight;
    const st = m.strength;
    if (st.model === 'mohr-coulomb') {
      c[k] = st.cohesion;
      tanPhi[k] = Math.tan((st.frictionAngle * Math.PI) / 180);
    } else if (st.model === 'undrained') {
      c[k] = st.su;
      if (st.suDatum !== null) {
        suRate[k] = st.suRate;
        suDatum[k] = st.suDatum;
      }
    }
  }
  const water = prepared.section.water;
  const crack = prepared.section.crack;
  // an automatic crack takes the Rankine depth of the top stratum (the exact slicer uses the crest's material)
  let crackDepth = 0;
  if (crack) {
    if (crack.depth !== 'auto') crackDepth = crack.depth;
    else if (soil > 0 && gamma[0] > 0) {
      crackDepth =
        tanPhi[0] > 0 || c[0] > 0
          ? (2 * c[0] * Math.tan(Math.PI / 4 + Math.atan(tanPhi[0]) / 2)) / gamma[0]
          : 0;
    }
  }
  return {
    g,
    ground: lookup(g.ground),
    tops: g.tops.slice(0, Math.min(soil + 1, g.tops.length)).map(lookup),
    topMax: Float64Array.from(g.tops.slice(0, Math.min(soil + 1, g.tops.length)), (t) =>
      Math.max(...t.map((p) => p[1])),
    ),
    soil,
    rigid: g.rigidTop ? lookup(g.rigidTop) : null,
    piezo: g.piezometric ? lookup(g.piezometric) : null,
    gamma,
    gammaSat,
    c,
    tanPhi,
    suRate,
    suDatum,
    material,
    gw: water.unitWeight,
    ru: water.kind === 'ru' ? water.ru : 0,
    strips: Float64Array.from(g.strips.flatMap((s) => [s.from, s.to, s.pressure])),
    lines: Float64Array.from(g.lineLoads.flatMap((l) => [l.x, l.fx, l.fy])),
    crackDepth,
    crackWater: crack ? crack.waterDepth : 0,
  };
}

/** Prepare both orientations of a section for the search. */
export function fastSection(prepared: PreparedSection): FastSection {
  return {
    prepared,
    normal: fastGeometry(prepared, prepared.normal),
    mirrored: fastGeometry(prepared, prepared.mirrored),
  };
}

/** A slice set with room for `capacity` slices, to be filled again and again. */
export function sliceBuffer(capacity: number): SliceSet {
  const f = () => new Float64Array(capacity);
  return {
    n: 0,
    mirrored: false,
    xl: f(),
    xr: f(),
    yTopL: f(),
    yTopR: f(),
    yBaseL: f(),
    yBaseR: f(),
    area: f(),
    weight: f(),
    cx: f(),
    cy: f(),
    porePressure: f(),
    cohesion: f(),
    tanPhi: f(),
    material: new Int32Array(capacity),
    qx: f(),
    qy: f(),
    qm: f(),
  };
}
