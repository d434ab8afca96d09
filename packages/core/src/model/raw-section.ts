/**
 * A section as written in a file that passed the schema (schemas/section.schema.json): the
 * file's own units, optional fields absent. normaliseSection turns it into a Section.
 */
import type { SECTION_FORMAT } from '../formats';
import type { RawProbability } from '../probability/normalise-probability';
import type {
  DesignCaseKind,
  InfiniteSlopeSpec,
  IntersliceFunction,
  MethodId,
  BilinearStrength,
  MohrCoulombStrength,
  Point,
  RigidStrength,
  StripLoad,
  SurfaceSpec,
  UnitSystem,
} from './types';

/** A boundary: a constant elevation or a polyline. */
export type RawBoundary = number | Point[];

export type RawStrength =
  | MohrCoulombStrength
  | { model: 'undrained'; su: number; suRate?: number; suDatum?: number }
  | RigidStrength
  | { model: 'hoek-brown'; intactStrength: number; gsi: number; mi: number; disturbance?: number }
  | {
      model: 'undrained-ratio';
      ratio: number;
      minimum?: number;
      exponent?: number;
      ocr?: number;
      pop?: number;
    }
  | { model: 'shear-normal'; points: Point[]; beyond?: 'extend' | 'hold' }
  | BilinearStrength;

export interface RawMaterial {
  description?: string;
  unitWeight?: number;
  saturatedUnitWeight?: number;
  strength: RawStrength;
}

export interface RawStratum {
  material: string;
  top?: RawBoundary;
}

export interface RawWater {
  piezometric?: RawBoundary;
  ru?: number;
  unitWeight?: number;
}

export type RawLoad = StripLoad | { type: 'line'; x: number; force: number; angle?: number };

/** Reinforcement as written (defaults filled in by normaliseSection). */
export type RawReinforcement =
  | {
      type: 'geosynthetic';
      name: string;
      elevation?: number;
      from?: number;
      to?: number;
      points?: Point[];
      strength: number;
      interaction: number;
      coverage?: number;
      dividedByF?: boolean;
    }
  | {
      type: 'nail';
      name: string;
      head: Point;
      inclination: number;
      toward?: 'left' | 'right';
      length: number;
      spacing: number;
      tensileCapacity: number;
      bond: number;
      facingCapacity?: number;
      dividedByF?: boolean;
    }
  | {
      type: 'anchor';
      name: string;
      head: Point;
      inclination: number;
      toward?: 'left' | 'right';
      freeLength: number;
      bondLength: number;
      spacing: number;
      capacity: number;
      bond?: number;
      acts?: 'load' | 'mobilised';
      dividedByF?: boolean;
    }
  | {
      type: 'pile';
      name: string;
      x: number;
      top?: number;
      bottom: number;
      shear: number;
      dividedByF?: boolean;
    };

/** The extra reinforcement to find, as written: a force at a level, or layers of a product. */
export interface RawRequiredReinforcement {
  level: number;
  from?: number;
  to?: number;
  dividedByF?: boolean;
  product?: { strength: number; interaction: number; coverage?: number };
  spacing?: number;
  maxLayers?: number;
}

export interface RawAnalysis {
  methods?: MethodId[];
  slices?: number;
  surface?: SurfaceSpec;
  infiniteSlope?: Omit<InfiniteSlopeSpec, 'waterRatio'> & { waterRatio?: number };
  interslice?: IntersliceFunction;
  trialBand?: number;
  searchEachMethod?: boolean;
  requiredReinforcement?: RawRequiredReinforcement;
  case?: string;
  requiredFs?: number;
}

export interface RawSeismic {
  kh?: number;
  kv?: number;
}

export interface RawCrack {
  depth: number | 'auto';
  waterDepth?: number;
}

/** What a case changes in a material of the section: the properties it gives replace the section's. */
export type RawMaterialOverride = Partial<RawMaterial>;

/** How a material drains in a rapid drawdown, as written (dR in the file's pressure unit). */
export type RawDrainage = { drains: 'free' } | { drains: 'slow'; dR: number; psiR: number };

export interface RawDrawdown {
  /** The piezometric line after drawdown. */
  after: { piezometric: RawBoundary };
  materials?: Record<string, RawDrainage>;
}

export interface RawEarthquake {
  /** Design peak ground acceleration, a fraction of g. */
  pga?: number;
  magnitude?: number;
  /** In the file's displacement unit (mm or in). */
  allowableDisplacement?: number;
}

/** A design case as written: its name, kind and requirement, and its overrides of the section's settings. */
export interface RawCase {
  name: string;
  kind: DesignCaseKind;
  requiredFs?: number;
  governs?: MethodId[];
  water?: RawWater;
  materials?: Record<string, RawMaterialOverride>;
  loads?: RawLoad[];
  reinforcement?: RawReinforcement[];
  seismic?: RawSeismic;
  crack?: RawCrack;
  /** Settings of the section's analysis to change (not its case or requiredFs: the case's own). */
  analysis?: Omit<RawAnalysis, 'case' | 'requiredFs'>;
  drawdown?: RawDrawdown;
  earthquake?: RawEarthquake;
}

export interface RawSection {
  format: typeof SECTION_FORMAT;
  id: string;
  title?: string;
  description?: string;
  station?: number;
  offset?: number;
  units: UnitSystem;
  ground: Point[];
  materials: Record<string, RawMaterial>;
  strata: RawStratum[];
  water?: RawWater;
  loads?: RawLoad[];
  reinforcement?: RawReinforcement[];
  seismic?: RawSeismic;
  crack?: RawCrack;
  analysis?: RawAnalysis;
  cases?: RawCase[];
  /** Random variables for the probabilistic analysis (probability/normalise-probability.ts). */
  probability?: RawProbability;
}
