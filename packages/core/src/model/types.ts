/**
 * The normalised section model: what the solver works on.
 *
 * A section file (schemas/section.schema.json) is validated, then normalised into this shape:
 * every length in metres, force in kN, pressure in kPa, unit weight in kN/m³, angles in
 * degrees as given; every default filled in; every stratum top a full polyline over the
 * ground's x-range, clipped so that it never rises above the ground or the stratum above.
 * x runs to the right, y up.
 */
import type { SECTION_FORMAT } from '../formats';
import type { ProbabilitySpec } from '../probability/types';

/** A point [x, y]. */
export type Point = [number, number];

/** A polyline, x non-decreasing for boundaries and strictly increasing for the ground. */
export type Polyline = Point[];

export type UnitSystem = 'si' | 'us';

/** Mohr–Coulomb in effective stress: c′ (kPa) and φ′ (degrees). */
export interface MohrCoulombStrength {
  model: 'mohr-coulomb';
  cohesion: number;
  frictionAngle: number;
}

/**
 * Undrained (total stress, φ = 0): Su (kPa) at the datum elevation `suDatum` (m), growing by
 * `suRate` (kPa per m of depth) below it; constant Su above the datum. With no datum Su is
 * constant.
 */
export interface UndrainedStrength {
  model: 'undrained';
  su: number;
  suRate: number;
  suDatum: number | null;
}

/** A rigid base: no slip surface enters it; a surface that reaches it follows its top. */
export interface RigidStrength {
  model: 'rigid';
}

/**
 * The generalised Hoek–Brown criterion of a rock mass (Hoek, Carranza-Torres & Corkum 2002):
 * σci, the uniaxial compressive strength of the intact rock (kPa), the Geological Strength
 * Index GSI, the intact-rock constant mi and the disturbance factor D (0 undisturbed … 1).
 */
export interface HoekBrownStrength {
  model: 'hoek-brown';
  intactStrength: number;
  gsi: number;
  mi: number;
  disturbance: number;
}

/**
 * Undrained (total stress, φ = 0) with Su from the vertical effective stress σ′v on the base:
 * Su = max(minimum, σ′v · ratio · OCRᵐ) (Ladd & Foott 1974), OCR constant (`ocr`) or from a
 * pre-overburden pressure (`pop`, kPa: OCR = (σ′v + pop)/σ′v). With OCR = 1 it is the plain
 * ratio Su/σ′v.
 */
export interface UndrainedRatioStrength {
  model: 'undrained-ratio';
  ratio: number;
  minimum: number;
  exponent: number;
  ocr: number;
  pop: number | null;
}

/**
 * A shear strength given as points (σ′n, τ) in kPa, σ′n increasing, joined by straight lines;
 * beyond the last point the last segment is extended (`beyond: 'extend'`) or τ held.
 */
export interface ShearNormalStrength {
  model: 'shear-normal';
  points: Point[];
  beyond: 'extend' | 'hold';
}

/** A bilinear Mohr–Coulomb envelope: c′ and φ′ up to the break stress σ′b (kPa), φ′ beyond (degrees). */
export interface BilinearStrength {
  model: 'bilinear';
  cohesion: number;
  frictionAngle: number;
  breakStress: number;
  frictionAngleBeyond: number;
}

export type Strength =
  | MohrCoulombStrength
  | UndrainedStrength
  | RigidStrength
  | HoekBrownStrength
  | UndrainedRatioStrength
  | ShearNormalStrength
  | BilinearStrength;

export interface Material {
  name: string;
  /** The file's description of the material (e.g. "Firm silty CLAY"), shown in drawings; absent when none. */
  description?: string;
  /** Unit weight above the piezometric line (kN/m³); 0 for a rigid material without one. */
  unitWeight: number;
  /** Unit weight below the piezometric line (kN/m³); equals unitWeight when not given. */
  saturatedUnitWeight: number;
  strength: Strength;
}

/** A stratum: its material and its top boundary over the full ground x-range. */
export interface Stratum {
  material: string;
  top: Polyline;
}

export type Water =
  | { kind: 'none'; unitWeight: number }
  /** Pore pressure u = γw·(y_line − y) where positive; above the ground the water is ponded. */
  | { kind: 'piezometric'; line: Polyline; unitWeight: number }
  /** Pore pressure u = ru·σv (σv the vertical total stress of the soil column). */
  | { kind: 'ru'; ru: number; unitWeight: number };

/** A vertical strip surcharge (kPa) on the ground between x = from and x = to. */
export interface StripLoad {
  type: 'strip';
  from: number;
  to: number;
  pressure: number;
}

/**
 * A line load (kN per m run) applied on the ground at x. `angle` is measured from the
 * downward vertical in degrees, positive turning toward +x.
 */
export interface LineLoad {
  type: 'line';
  x: number;
  force: number;
  angle: number;
}

export type Load = StripLoad | LineLoad;

/**
 * How a reinforcement force enters the equilibrium of the slice whose base it crosses:
 * `dividedByF` true: it is a resistance like the soil's and is divided by the factor of
 * safety with it (T/F in every equation: "adds to the resisting side"); false: it is applied
 * at its full value, as a known force that reduces what drives the slide. Practice is divided
 * for passive elements; a prestressed anchor applied as a load is the usual undivided case.
 */
interface ReinforcementCommon {
  name: string;
  dividedByF: boolean;
}

/**
 * A geosynthetic layer (geogrid, geotextile): its line in the section (x increasing), its
 * long-term design tensile strength after reduction factors (kN per m run), and its pullout
 * resistance per m of length, 2·Ci·Rc·τ(σ′v) on both faces: Ci the interaction coefficient, Rc
 * the coverage ratio, τ(σ′v) the strength of the soil it lies in at the vertical effective
 * stress of the overburden there.
 */
export interface GeosyntheticLayer extends ReinforcementCommon {
  type: 'geosynthetic';
  line: Polyline;
  strength: number;
  interaction: number;
  coverage: number;
}

/**
 * A soil nail: its head (on the face), inclination below the horizontal (degrees), the side it
 * runs toward, length, horizontal spacing; bar tensile capacity and facing capacity (kN per
 * nail), bond strength per m of nail (kN/m). Forces per m run are these over the spacing.
 */
export interface SoilNail extends ReinforcementCommon {
  type: 'nail';
  head: Point;
  inclination: number;
  toward: 'left' | 'right';
  length: number;
  spacing: number;
  tensileCapacity: number;
  bond: number;
  facingCapacity: number;
}

/**
 * A ground anchor: head, inclination below the horizontal (degrees), the side it runs toward,
 * free and bond lengths, horizontal spacing, capacity (kN per anchor) and the bond strength
 * per m of the bond length (kN/m; capacity/bondLength when not given). `acts`: `load`, a
 * prestressed anchor whose force is applied (the part of it anchored behind the slip surface);
 * `mobilised`, a passive one whose force is the least of its capacity and its bond behind.
 */
export interface GroundAnchor extends ReinforcementCommon {
  type: 'anchor';
  head: Point;
  inclination: number;
  toward: 'left' | 'right';
  freeLength: number;
  bondLength: number;
  spacing: number;
  capacity: number;
  bond: number;
  acts: 'load' | 'mobilised';
}

/**
 * A pile or shear key at x, from its top (null: the ground) down to its bottom elevation: where
 * the slip surface crosses it, a force of `shear` (kN per m run) along the surface against the
 * movement.
 */
export interface PileRow extends ReinforcementCommon {
  type: 'pile';
  x: number;
  top: number | null;
  bottom: number;
  shear: number;
}

export type Reinforcement = GeosyntheticLayer | SoilNail | GroundAnchor | PileRow;

/**
 * Pseudo-static seismic coefficients. kh acts horizontally in the direction of sliding;
 * kv > 0 adds kv·W downward, kv < 0 acts upward.
 */
export interface Seismic {
  kh: number;
  kv: number;
}

/**
 * Tension crack at the upper end of the slip surface: its depth below the ground (m), or
 * 'auto' for the Rankine depth 2c′·tan(45° + φ′/2)/γ (2Su/γ for undrained soil) of the
 * material at the crest; waterDepth is the depth of water standing in the crack (m).
 */
export interface Crack {
  depth: number | 'auto';
  waterDepth: number;
}

export type MethodId =
  | 'ordinary'
  | 'bishop'
  | 'janbu'
  | 'spencer'
  | 'morgenstern-price'
  | 'phi-zero-circle'
  | 'log-spiral'
  | 'infinite-slope';

export const METHOD_IDS: readonly MethodId[] = [
  'ordinary',
  'bishop',
  'janbu',
  'spencer',
  'morgenstern-price',
  'phi-zero-circle',
  'log-spiral',
  'infinite-slope',
];

export interface CircleSurface {
  type: 'circle';
  center: Point;
  radius: number;
}

export interface PolylineSurface {
  type: 'polyline';
  points: Polyline;
}

/** A surface to search for (later issues give these their full shape). */
export interface SearchSurface {
  type: 'grid' | 'ground-ranges' | 'noncircular' | 'auto';
  [setting: string]: unknown;
}

export type SurfaceSpec = CircleSurface | PolylineSurface | SearchSurface;

/** Infinite slope: slope angle β (degrees), vertical depth z of the slip plane (m), m = hw/z. */
export interface InfiniteSlopeSpec {
  angle: number;
  depth: number;
  waterRatio: number;
}

/** A point [ξ, f] of a piecewise-linear interslice function. */
export type IntersliceOrdinate = [number, number];

/**
 * Interslice force function f(ξ) of Morgenstern–Price, ξ from 0 at the toe end to 1 at the
 * crest end of the slip surface: constant 1, the half-sine sin(πξ) (both from Morgenstern &
 * Price 1965), or a piecewise-linear function through the given points [ξ, f] (ξ increasing;
 * f held at the first and last point's value beyond them).
 */
export type IntersliceFunction =
  | { shape: 'constant' }
  | { shape: 'half-sine' }
  | { shape: 'piecewise-linear'; points: IntersliceOrdinate[] };

export interface Analysis {
  methods: MethodId[];
  slices: number;
  /** Morgenstern–Price interslice function; half-sine when not given. */
  interslice?: IntersliceFunction;
  /** Trial surfaces within this fraction of the least FS are reported and drawn (0.05 when not given). */
  trialBand?: number;
  surface: SurfaceSpec | null;
  infiniteSlope: InfiniteSlopeSpec | null;
  case: string | null;
  requiredFs: number | null;
  /** With a searched surface: polish the critical circle separately for each method. */
  searchEachMethod?: boolean;
  /** For a case below its required FS: the extra reinforcement at which it meets it (null: not asked). */
  requiredReinforcement?: RequiredReinforcementSpec | null;
}

/**
 * The extra reinforcement to find for a case below its requirement, each step a full search:
 * `force`, one uniform horizontal force per m run (no pullout limit) along the line at the
 * given level, wherever the slip surface crosses it; `layers`, the number of layers of a
 * geosynthetic product, the lowest at the given level and the rest above it at the spacing.
 * `line`: the extent, at the lowest level.
 */
export type RequiredReinforcementSpec =
  | { kind: 'force'; line: Polyline; dividedByF: boolean }
  | {
      kind: 'layers';
      line: Polyline;
      spacing: number;
      strength: number;
      interaction: number;
      coverage: number;
      dividedByF: boolean;
      maxLayers: number;
    };

/** A validated, normalised section in SI units. */
export interface Section {
  format: typeof SECTION_FORMAT;
  id: string;
  title: string;
  /** Chainage and offset as given in the file (labels placing the section on the corridor: not converted). */
  station: number | null;
  offset: number | null;
  /** The units of the file it came from; results are reported back in these. */
  units: UnitSystem;
  ground: Polyline;
  materials: Record<string, Material>;
  strata: Stratum[];
  water: Water;
  loads: Load[];
  /** Reinforcing elements, [] when none. */
  reinforcement: Reinforcement[];
  seismic: Seismic;
  crack: Crack | null;
  analysis: Analysis;
  /**
   * The design cases the file lists, each with the section's settings and its own overrides
   * merged. Absent or empty: the section's own settings are its one case (analysis.case and
   * requiredFs name it and set its requirement); designCases() gives the list either way.
   */
  cases?: DesignCase[];
  /** The random variables of the probabilistic analysis, in SI; absent when the file gives none. */
  probability?: ProbabilitySpec;
}

// --- design cases ---------------------------------------------------------------------

/** The kinds of design case (result.ts CASE_KINDS lists them). */
export type DesignCaseKind =
  | 'end-of-construction'
  | 'long-term'
  | 'steady-seepage'
  | 'rapid-drawdown'
  | 'seismic'
  | 'surcharge'
  | 'other';

/**
 * How a material behaves during a rapid drawdown (Duncan, Wright & Wong 1990): `free` drains
 * as the water falls (drained strength with the post-drawdown pore pressures throughout);
 * `slow` does not (stage 2 takes its undrained strength from the consolidation stresses, by
 * the isotropically consolidated "R" envelope: intercept dR (kPa) and slope ψR (degrees)).
 */
export type DrawdownDrainage = { drains: 'free' } | { drains: 'slow'; dR: number; psiR: number };

/** A rapid drawdown: the water after it (the case's own water is the water before). */
export interface DrawdownSpec {
  after: Water;
  /** By material name; a material not listed drains freely. */
  materials: Record<string, DrawdownDrainage>;
}

/** What the displacement estimate of a seismic case needs (SI: pga in g, displacement in m). */
export interface EarthquakeSpec {
  pga: number | null;
  magnitude: number | null;
  allowableDisplacement: number | null;
}

/**
 * One design case of a section, in SI, with the case's overrides already merged into the
 * section's own water, materials, loads, seismic, crack and analysis (caseSection puts them
 * back into a Section to analyse).
 */
export interface DesignCase {
  name: string;
  kind: DesignCaseKind;
  requiredFs: number | null;
  /** The methods whose FS govern; null: every method asked governs (the lowest FS). */
  governs: MethodId[] | null;
  water: Water;
  materials: Record<string, Material>;
  loads: Load[];
  reinforcement: Reinforcement[];
  seismic: Seismic;
  crack: Crack | null;
  analysis: Analysis;
  drawdown: DrawdownSpec | null;
  earthquake: EarthquakeSpec | null;
}
