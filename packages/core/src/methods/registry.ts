import type {
  CircleSurface,
  IntersliceFunction,
  MethodId,
  Point,
  PolylineSurface,
  Section,
} from '../model/types';
import type { MethodReport, ReportedSurface } from '../result';
import { type BaseStrengths, withBaseStrengths } from '../slices/base-strengths';
import type { PreparedSection } from '../slices/prepare-section';
import type { SliceSet, SlicedSurface } from '../slices/slice-surface';
import { bishop } from './bishop';
import { failed } from './failed';
import { infiniteSlope } from './infinite-slope';
import { janbu } from './janbu';
import { logSpiral } from './log-spiral';
import { intersliceName, morgensternPrice } from './morgenstern-price';
import { ordinary } from './ordinary';
import { spencer } from './spencer';
import { phiZeroCircle } from './phi-zero-circle';
import type { Crossing } from '../reinforcement/types';
import type { SliceMethodResult } from './types';

/**
 * What a method is given: the section, a surface, its slices and the point moments are taken
 * about (sliding orientation), and, when given, a strength for each slice base in place of its
 * material's (a method of slices takes them; the others, which take the strength of the
 * materials, refuse them).
 */
export interface MethodInput {
  prepared: PreparedSection;
  surface: CircleSurface | PolylineSurface;
  cut: SlicedSurface;
  pivot: Point;
  strengths?: BaseStrengths;
}

/** What a method of a surface gives back, in SI: its solution and what only it reports. */
export interface MethodOutput {
  result: SliceMethodResult;
  /** Fields of the method's report of its own (λ, θ, f0, the mass and its lever arm…). */
  extra?: Partial<MethodReport>;
  /** The slices to report when they are not those of the surface (the log spiral's own). */
  slices?: SliceSet;
  /** Their crossings with the reinforcement, when the slices are the method's own. */
  crossings?: Crossing[];
}

/** A method that works on a slip surface. */
interface SurfaceMethod {
  /** The kinds of surface it takes. */
  surfaces: readonly ('circle' | 'polyline')[];
  /** A method of slices: the cohesionless-circle warning applies. */
  slices: boolean;
  /** The interslice forces it solves for (the others are reported as null: not computed). */
  interslice: { E: boolean; X: boolean };
  run: (input: MethodInput) => MethodOutput;
}

/** A method that works on the section's own plane (the infinite slope): no search, no slices. */
interface PlaneMethod {
  surfaces: readonly [];
  slices: false;
  runPlane: (
    section: Section,
  ) => Pick<MethodReport, 'fs' | 'converged' | 'reason' | 'surface' | 'warnings'>;
}

export type MethodEntry = (SurfaceMethod | PlaneMethod) & {
  /** The published source it follows, as the README and the reports cite it. */
  reference: string;
};

const deg = (r: number) => (r * 180) / Math.PI;

/** The slices a method of slices solves: the cut's, with the given base strengths when there are. */
const slicesOf = ({ cut, strengths }: MethodInput): SliceSet =>
  strengths ? withBaseStrengths(cut.slices, strengths) : cut.slices;

/** A method that takes its strength from the materials, given base strengths: not run. */
function refuseStrengths(method: string, input: MethodInput): MethodOutput | null {
  if (!input.strengths) return null;
  const reason = `${method}: takes the strength of the materials, not a strength for each slice base; use a method of slices (ordinary, Bishop, Janbu, Spencer, Morgenstern–Price)`;
  return { result: failed(input.cut.slices.n, 0, reason, undefined, 'not-applicable') };
}

/**
 * Every method of the solver: the surfaces it takes, how to run it and its published
 * source. analyzeSection dispatches through this table; adding a method is adding a row
 * (and its id to MethodId and the section schema).
 *
 * @example METHODS.spencer.surfaces // → ['circle', 'polyline']
 */
export const METHODS: Record<MethodId, MethodEntry> = {
  ordinary: {
    reference: 'Fellenius 1936',
    surfaces: ['circle'],
    slices: true,
    interslice: { E: false, X: false },
    run: (input) => {
      const slices = slicesOf(input);
      const { prepared, pivot } = input;
      return { result: ordinary(slices, { seismic: prepared.section.seismic, pivot }), slices };
    },
  },
  bishop: {
    reference: 'Bishop 1955',
    surfaces: ['circle'],
    slices: true,
    interslice: { E: false, X: false },
    run: (input) => {
      const slices = slicesOf(input);
      const { prepared, pivot } = input;
      return { result: bishop(slices, { seismic: prepared.section.seismic, pivot }), slices };
    },
  },
  janbu: {
    reference: 'Janbu 1954, 1973',
    surfaces: ['circle', 'polyline'],
    slices: true,
    interslice: { E: true, X: false },
    run: (input) => {
      const slices = slicesOf(input);
      const result = janbu(slices, { seismic: input.prepared.section.seismic });
      return {
        result,
        slices,
        extra: result.converged
          ? { fsUncorrected: result.fsUncorrected, correction: result.correction }
          : {},
      };
    },
  },
  spencer: {
    reference: 'Spencer 1967',
    surfaces: ['circle', 'polyline'],
    slices: true,
    interslice: { E: true, X: true },
    run: (input) => {
      const slices = slicesOf(input);
      const { prepared, pivot } = input;
      const result = spencer(slices, { seismic: prepared.section.seismic, pivot });
      return {
        result,
        slices,
        extra:
          result.converged && result.lambda !== undefined
            ? { lambda: result.lambda, theta: deg(Math.atan(result.lambda)) }
            : {},
      };
    },
  },
  'morgenstern-price': {
    reference: 'Morgenstern & Price 1965; Fredlund & Krahn 1977',
    surfaces: ['circle', 'polyline'],
    slices: true,
    interslice: { E: true, X: true },
    run: (input) => {
      const slices = slicesOf(input);
      const { prepared, pivot } = input;
      const section = prepared.section;
      const fn: IntersliceFunction = section.analysis.interslice ?? { shape: 'half-sine' };
      const result = morgensternPrice(slices, { seismic: section.seismic, pivot, fn });
      return {
        result,
        slices,
        extra: {
          intersliceFunction: intersliceName(fn),
          ...(result.converged && result.lambda !== undefined ? { lambda: result.lambda } : {}),
        },
      };
    },
  },
  'phi-zero-circle': {
    reference: 'Fellenius; Petterson',
    surfaces: ['circle'],
    slices: false,
    interslice: { E: false, X: false },
    run: (input) => {
      const refused = refuseStrengths('φ = 0 circle', input);
      if (refused) return refused;
      const { cut, prepared, surface } = input;
      const c = surface as CircleSurface;
      const result = phiZeroCircle(prepared, cut, c.center, c.radius, prepared.section.seismic);
      return {
        result,
        extra: result.converged ? { massWeight: result.massWeight, leverArm: result.leverArm } : {},
      };
    },
  },
  'log-spiral': {
    reference: 'Rendulic 1935; Taylor 1937; Chen 1975',
    surfaces: ['circle'],
    slices: false,
    interslice: { E: false, X: false },
    run: (input) => {
      const refused = refuseStrengths('log spiral', input);
      if (refused) return refused;
      const { cut, prepared, surface } = input;
      const section = prepared.section;
      const c = surface as CircleSurface;
      const result = logSpiral(
        prepared,
        cut.slices,
        c.center,
        section.seismic,
        section.analysis.slices,
      );
      if (!(result.converged && result.spiral && result.spiralSlices)) return { result };
      const sp = result.spiral;
      const spiral: ReportedSurface = {
        type: 'log-spiral',
        pole: sp.pole,
        r0: sp.r0,
        r1: sp.r1,
        points: sp.points,
      };
      return {
        result,
        extra: { surface: spiral },
        slices: result.spiralSlices,
        crossings: result.spiralCrossings ?? [],
      };
    },
  },
  'infinite-slope': {
    reference: 'Skempton & DeLory 1957',
    surfaces: [],
    slices: false,
    runPlane: (section) => {
      const spec = section.analysis.infiniteSlope;
      if (!spec) {
        const reason = 'infinite slope: give analysis.infiniteSlope (angle, depth, waterRatio)';
        return {
          fs: null,
          converged: false,
          reason,
          surface: null,
          warnings: [{ code: 'not-applicable', message: reason }],
        };
      }
      const r = infiniteSlope({
        ...spec,
        material: section.materials[section.strata[0].material],
        waterUnitWeight: section.water.unitWeight,
        kh: section.seismic.kh,
      });
      return {
        fs: r.converged ? r.fs : null,
        converged: r.converged,
        ...(r.reason ? { reason: r.reason } : {}),
        surface: { type: 'plane', angle: spec.angle, depth: spec.depth },
        warnings: [
          ...(r.reason ? [{ code: 'no-convergence', message: r.reason }] : []),
          ...(section.reinforcement.length > 0
            ? [
                {
                  code: 'reinforcement-ignored',
                  message:
                    'infinite slope: the reinforcement is not taken on the infinite plane; the methods of slices take it',
                },
              ]
            : []),
        ],
      };
    },
  },
};

/** The methods that take a kind of surface, for the words of a refusal. */
export function methodsFor(kind: 'circle' | 'polyline'): MethodId[] {
  return (Object.keys(METHODS) as MethodId[]).filter((id) =>
    (METHODS[id].surfaces as readonly string[]).includes(kind),
  );
}
