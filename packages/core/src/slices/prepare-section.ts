import { type Lookup, lookup } from '../geometry/lookup';
import { polylineCrossings } from '../geometry/polyline-crossings';
import type { Material, Polyline, Section } from '../model/types';
import { isRigid, linearStrength } from '../strength/registry';
import { type PreparedElement, prepareReinforcement } from '../reinforcement/prepare-reinforcement';
import { type StrengthRules, strengthRules } from './stress-dependent';

/** A line load resolved into components (kN/m; x right, y up). */
export interface PointForce {
  x: number;
  fx: number;
  fy: number;
}

/** The section's boundaries in one orientation, ready for slicing. */
export interface Geometry {
  ground: Polyline;
  /** Strata tops, top to bottom; tops[0] is the ground. */
  tops: Polyline[];
  /** Index into PreparedSection.materials for each stratum. */
  stratumMaterial: number[];
  /** Number of strata above the first rigid stratum (all strata when none is rigid). */
  soilStrata: number;
  /** Top of the first rigid stratum: slip surfaces may not go below it. */
  rigidTop: Polyline | null;
  piezometric: Polyline | null;
  /**
   * Other lines that cut the slices as the piezometric line does (their vertices, their
   * crossings with the strata tops and with the slip surface are slice edges), so that two
   * sections that differ only in their water are sliced alike (a rapid drawdown's water before
   * and after). Empty but for that.
   */
  cutLines: Polyline[];
  strips: { from: number; to: number; pressure: number }[];
  lineLoads: PointForce[];
  /** The reinforcing elements in this orientation (reinforcement/prepare-reinforcement.ts). */
  reinforcement: PreparedElement[];
  xMin: number;
  xMax: number;
  /** The same polylines as constant-time lookups: ground, tops (tops[0] the ground), rigid top, piezometric line. */
  at: {
    ground: Lookup;
    tops: Lookup[];
    rigid: Lookup | null;
    piezometric: Lookup | null;
  };
  /** Highest elevation of each stratum top: a surface whose lowest point is below it may reach that stratum. */
  topMax: Float64Array;
  /**
   * Slice edges that do not depend on the slip surface, sorted: vertices of the ground, the
   * strata tops, the piezometric line and the cut lines, crossings of those lines with the
   * tops, and the edges of loads.
   */
  fixedEdges: Float64Array;
}

/**
 * Material properties by stratum index (strata above the rigid base), as flat arrays for the
 * slicer's inner loop: unit weights, and the strength parameters of the two soil models.
 */
export interface StratumProperties {
  gamma: Float64Array;
  gammaSat: Float64Array;
  /** c′ (Mohr–Coulomb) or Su at its datum (undrained), kPa. */
  c: Float64Array;
  /** tan φ′ (0 for undrained). */
  tanPhi: Float64Array;
  /** Rate of increase of Su with depth below its datum (kPa/m) and the datum (NaN when constant). */
  suRate: Float64Array;
  suDatum: Float64Array;
}

/**
 * A section prepared once for many slip surfaces: materials by index and the geometry in
 * its own orientation and mirrored (x → −x). Slicing always works in the orientation in
 * which the sliding mass moves toward −x, so that the methods need one sign convention.
 */
export interface PreparedSection {
  section: Section;
  materials: Material[];
  /** Length tolerance for coincident points (m). */
  tol: number;
  normal: Geometry;
  mirrored: Geometry;
  /** The strengths that vary with the stresses on each base (slices/stress-dependent.ts); null when none does. */
  rules: StrengthRules | null;
  /** By stratum (the same in both orientations). */
  strata: StratumProperties;
}

function mirrorLine(line: Polyline): Polyline {
  const out: Polyline = [];
  for (let i = line.length - 1; i >= 0; i--) out.push([-line[i][0], line[i][1]]);
  return out;
}

function fixedEdges(
  tops: Polyline[],
  soil: number,
  lines: Polyline[],
  strips: Geometry['strips'],
  lineLoads: PointForce[],
): Float64Array {
  const xs: number[] = [];
  const vertices = (line: Polyline | null) => {
    if (line) for (const p of line) xs.push(p[0]);
  };
  vertices(tops[0]);
  for (let i = 1; i <= Math.min(soil, tops.length - 1); i++) vertices(tops[i]);
  for (const line of lines) {
    vertices(line);
    const from = tops[0][0][0];
    const to = tops[0][tops[0].length - 1][0];
    for (let i = 0; i < Math.min(soil, tops.length); i++)
      xs.push(...polylineCrossings(line, tops[i], from, to));
  }
  for (const s of strips) xs.push(s.from, s.to);
  for (const l of lineLoads) xs.push(l.x);
  return Float64Array.from(xs).sort();
}

function geometryOf(
  section: Section,
  materialIndex: Map<string, number>,
  mirror: boolean,
  alsoCutAt: Polyline[],
): Geometry {
  const m = (line: Polyline) =>
    mirror ? mirrorLine(line) : line.map((p) => [p[0], p[1]] as [number, number]);
  const tops = section.strata.map((s, i) => (i === 0 ? m(section.ground) : m(s.top)));
  const stratumMaterial = section.strata.map((s) => materialIndex.get(s.material) ?? -1);
  let soilStrata = section.strata.length;
  for (let i = 0; i < section.strata.length; i++) {
    const m = section.materials[section.strata[i].material];
    if (m && isRigid(m.strength)) {
      soilStrata = i;
      break;
    }
  }
  const sign = mirror ? -1 : 1;
  const strips = [];
  const lineLoads: PointForce[] = [];
  for (const load of section.loads) {
    if (load.type === 'strip') {
      const a = sign * load.from;
      const b = sign * load.to;
      strips.push({ from: Math.min(a, b), to: Math.max(a, b), pressure: load.pressure });
    } else {
      const th = (load.angle * Math.PI) / 180;
      lineLoads.push({
        x: sign * load.x,
        fx: sign * load.force * Math.sin(th),
        fy: -load.force * Math.cos(th),
      });
    }
  }
  const ground = tops[0];
  const rigidTop = soilStrata < tops.length ? tops[soilStrata] : null;
  const piezometric = section.water.kind === 'piezometric' ? m(section.water.line) : null;
  const cutLines = alsoCutAt.map(m);
  return {
    ground,
    tops,
    stratumMaterial,
    soilStrata,
    rigidTop,
    piezometric,
    cutLines,
    strips,
    lineLoads,
    reinforcement: [],
    xMin: ground[0][0],
    xMax: ground[ground.length - 1][0],
    at: {
      ground: lookup(ground),
      tops: tops.map(lookup),
      rigid: rigidTop ? lookup(rigidTop) : null,
      piezometric: piezometric ? lookup(piezometric) : null,
    },
    topMax: Float64Array.from(tops, (t) => Math.max(...t.map((p) => p[1]))),
    fixedEdges: fixedEdges(
      tops,
      soilStrata,
      piezometric ? [piezometric, ...cutLines] : cutLines,
      strips,
      lineLoads,
    ),
  };
}

export function stratumProperties(section: Section, materials: Material[], index: number[]) {
  const n = section.strata.length;
  const p: StratumProperties = {
    gamma: new Float64Array(n),
    gammaSat: new Float64Array(n),
    c: new Float64Array(n),
    tanPhi: new Float64Array(n),
    suRate: new Float64Array(n),
    suDatum: new Float64Array(n).fill(NaN),
  };
  for (let k = 0; k < n; k++) {
    const m = materials[index[k]];
    if (!m) continue;
    p.gamma[k] = m.unitWeight;
    p.gammaSat[k] = m.saturatedUnitWeight;
    const l = linearStrength(m.strength);
    if (l) {
      p.c[k] = l.c;
      p.tanPhi[k] = l.tanPhi;
      p.suRate[k] = l.rate;
      p.suDatum[k] = l.datum;
    }
  }
  return p;
}

/**
 * Prepare a normalised section for slicing. `alsoCutAt`: lines (section coordinates) that cut
 * the slices as a piezometric line does, so that a section with other water (the same lines
 * given the other way round) is sliced into the same slices; none but for that.
 *
 * @example const prepared = prepareSection(section); sliceSurface(prepared, circle, 30)
 */
export function prepareSection(section: Section, alsoCutAt: Polyline[] = []): PreparedSection {
  const names = Object.keys(section.materials);
  const materials = names.map((n) => section.materials[n]);
  const materialIndex = new Map(names.map((n, i) => [n, i]));
  const ground = section.ground;
  const width = ground[ground.length - 1][0] - ground[0][0];
  const normal = geometryOf(section, materialIndex, false, alsoCutAt);
  const mirrored = geometryOf(section, materialIndex, true, alsoCutAt);
  const strata = stratumProperties(section, materials, normal.stratumMaterial);
  if (section.reinforcement.length > 0) {
    normal.reinforcement = prepareReinforcement(section, normal, strata, materials, false);
    mirrored.reinforcement = prepareReinforcement(section, mirrored, strata, materials, true);
  }
  return {
    section,
    materials,
    tol: 1e-9 * Math.max(width, 1),
    normal,
    mirrored,
    rules: strengthRules(materials),
    strata,
  };
}
