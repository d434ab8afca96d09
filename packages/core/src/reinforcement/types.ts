/**
 * The shapes of reinforcement at a slip surface: a crossing as the slicer finds it, and as a
 * result reports it. Types only (the result contract imports them; no solver code here).
 */
import type { MethodId, Point, Reinforcement } from '../model/types';
import type { ReportedSurface } from '../result';

/** What limits a reinforcement force where the slip surface crosses the element. */
export type ReinforcementMode =
  /** the element's own tensile strength (a pile: its shear resistance) */
  | 'strength'
  /** pullout (bond) of the part behind the slip surface */
  | 'pullout'
  /** pullout of the part in front, in the sliding mass */
  | 'front'
  /** a nail's facing with the bond of the part in front */
  | 'facing';

/**
 * One crossing of a reinforcing element with the slip surface, in sliding orientation: where,
 * on which slice, the force available there (the least of the element's capacities, kN per m
 * run, not divided by F), its direction on the sliding mass (a unit vector) and what limits it.
 * A tension element crossed where the movement would push it (in compression) carries
 * nothing: `counted` false.
 */
export interface Crossing {
  element: number;
  x: number;
  y: number;
  slice: number;
  force: number;
  ux: number;
  uy: number;
  mode: ReinforcementMode;
  counted: boolean;
  dividedByF: boolean;
  /** The capacities compared: strength, behind the surface, in front (Infinity where none limits). */
  capacities: { strength: number; behind: number; front: number };
}

/** One crossing of an element with the slip surface, as reported (section coordinates; kN per m run). */
export interface CrossingReport {
  at: Point;
  /** The slice it acts on, numbered from 1 at the left as in the slice table. */
  slice: number;
  /** The least of the element's capacities there (0 where it is pushed, not pulled). */
  available: number;
  /** The force in the equilibrium: available/F when divided by F, else available. */
  force: number;
  mode: ReinforcementMode;
  /** False where the movement pushes a tension element: it carries nothing there. */
  counted: boolean;
  /** Its direction on the sliding mass, degrees anticlockwise from +x. */
  direction: number;
  /** The capacities compared (null where none limits). */
  capacities: { strength: number; behind: number | null; front: number | null };
}

/** One element as reported for a method on its surface. */
export interface ReinforcementReport {
  name: string;
  type: Reinforcement['type'];
  dividedByF: boolean;
  /** The sum of the forces of its crossings in the equilibrium (kN per m run). */
  force: number;
  crossings: CrossingReport[];
}

/**
 * The extra reinforcement a case below its requirement needs (section units): a uniform force
 * per run along a level line, or a number of layers of a product from that level up at a
 * spacing; the critical FS with it, the method and surface, and the full analyses it took.
 */
export interface RequiredReinforcementReport {
  kind: 'force' | 'layers';
  level: number;
  from: number;
  to: number;
  spacing?: number;
  dividedByF: boolean;
  requiredFs: number;
  /** Whether a value in range meets the requirement (else `reason` says why not). */
  reached: boolean;
  /** The force per run (kN/m or lbf/ft), or the number of layers; null when not reached. */
  value: number | null;
  fs: number | null;
  method: MethodId | null;
  surface: ReportedSurface | null;
  analyses: number;
  reason?: string;
}
