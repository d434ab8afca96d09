import type { Material, Polyline, Section } from '../model/types';

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
  strips: { from: number; to: number; pressure: number }[];
  lineLoads: PointForce[];
  xMin: number;
  xMax: number;
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
}

function mirrorLine(line: Polyline): Polyline {
  const out: Polyline = [];
  for (let i = line.length - 1; i >= 0; i--) out.push([-line[i][0], line[i][1]]);
  return out;
}

function geometryOf(
  section: Section,
  materialIndex: Map<string, number>,
  mirror: boolean,
): Geometry {
  const m = (line: Polyline) =>
    mirror ? mirrorLine(line) : line.map((p) => [p[0], p[1]] as [number, number]);
  const tops = section.strata.map((s, i) => (i === 0 ? m(section.ground) : m(s.top)));
  const stratumMaterial = section.strata.map((s) => materialIndex.get(s.material) ?? -1);
  let soilStrata = section.strata.length;
  for (let i = 0; i < section.strata.length; i++) {
    if (section.materials[section.strata[i].material]?.strength.model === 'rigid') {
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
  return {
    ground,
    tops,
    stratumMaterial,
    soilStrata,
    rigidTop: soilStrata < tops.length ? tops[soilStrata] : null,
    piezometric: section.water.kind === 'piezometric' ? m(section.water.line) : null,
    strips,
    lineLoads,
    xMin: ground[0][0],
    xMax: ground[ground.length - 1][0],
  };
}

/**
 * Prepare a normalised section for slicing.
 *
 * @example const prepared = prepareSection(section); sliceSurface(prepared, circle, 30)
 */
export function prepareSection(section: Section): PreparedSection {
  const names = Object.keys(section.materials);
  const materials = names.map((n) => section.materials[n]);
  const materialIndex = new Map(names.map((n, i) => [n, i]));
  const ground = section.ground;
  const width = ground[ground.length - 1][0] - ground[0][0];
  return {
    section,
    materials,
    tol: 1e-9 * Math.max(width, 1),
    normal: geometryOf(section, materialIndex, false),
    mirrored: geometryOf(section, materialIndex, true),
  };
}
