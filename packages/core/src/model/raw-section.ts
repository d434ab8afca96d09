/**
 * A section as written in a file that passed the schema (schemas/section.schema.json): the
 * file's own units, optional fields absent. normaliseSection turns it into a Section.
 */
import type { SECTION_FORMAT } from '../formats';
import type {
  InfiniteSlopeSpec,
  IntersliceFunction,
  MethodId,
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
  | RigidStrength;

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

export interface RawAnalysis {
  methods?: MethodId[];
  slices?: number;
  surface?: SurfaceSpec;
  infiniteSlope?: Omit<InfiniteSlopeSpec, 'waterRatio'> & { waterRatio?: number };
  interslice?: IntersliceFunction;
  trialBand?: number;
  searchEachMethod?: boolean;
  case?: string;
  requiredFs?: number;
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
  seismic?: { kh?: number; kv?: number };
  crack?: { depth: number | 'auto'; waterDepth?: number };
  analysis?: RawAnalysis;
}
