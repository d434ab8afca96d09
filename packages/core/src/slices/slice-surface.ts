import type { CircleSurface, Point, Polyline, PolylineSurface } from '../model/types';
import { lookupY } from '../geometry/lookup';
import type { Crossing } from '../reinforcement/types';
import type { BasePiece } from './base-curve';
import { type RejectCode, type SliceWorkspace, cutSurface, sliceWorkspace } from './cut-surface';
import type { PreparedSection } from './prepare-section';
import { type SliceSet, copySliceSet } from './slice-set';

export type { SliceSet } from './slice-set';

export interface CrackInfo {
  /** x of the crack in the section's coordinates. */
  x: number;
  depth: number;
  waterDepth: number;
  /** Horizontal force of the water in the crack, ½·γw·hw² (kN/m). */
  waterForce: number;
}

export interface SlicedSurface {
  ok: true;
  slices: SliceSet;
  /** Where the slide starts (crest side; the top of the crack if there is one) and where it comes out, in the section's coordinates. */
  upperEnd: Point;
  lowerEnd: Point;
  crack: CrackInfo | null;
  /** The slip surface actually used (after following a rigid base and cutting at a crack), at slice edges, in the section's coordinates, left to right. */
  base: Polyline;
  /** The surface in sliding orientation, for exact integrals. */
  pieces: BasePiece[];
  /** Its crossings with the reinforcement, in sliding orientation (empty without reinforcement). */
  crossings: Crossing[];
}

export interface RejectedSurface {
  ok: false;
  code: RejectCode;
  reason: string;
}

export type SliceOutcome = SlicedSurface | RejectedSurface;

const fmt = (v: number) => (Math.abs(v) < 1e-9 ? '0' : v.toFixed(2));

/** The engineer's words for why a surface was rejected (numbers from the workspace). */
export function rejectReason(ws: SliceWorkspace, code: RejectCode): string {
  const d = ws.detail;
  switch (code) {
    case 'misses-ground':
      return d.outside
        ? 'the slip surface does not lie under the ground'
        : 'the slip surface does not cut the ground';
    case 'reemerges':
      return `the slip surface comes out of the ground between x = ${fmt(d.a)} and x = ${fmt(d.b)}`;
    case 'leaves-section':
      return d.atEdge
        ? `the slip surface leaves the section through its ${d.side} side below the ground`
        : `the slip surface ends below the ground on the ${d.side} (it must reach the ground at both ends)`;
    case 'crack-too-deep':
      return `the tension crack (${fmt(d.depth)} m deep) is deeper than the sliding mass`;
    case 'no-soil':
      return 'there is no soil above the slip surface';
    case 'not-admissible':
      return 'the circle radius must be positive';
  }
}

/**
 * The slices now in a workspace as a result of their own (copied out of its buffers; with
 * `copy` false, the workspace's own slices, valid until its next cut).
 */
export function slicedSurface(ws: SliceWorkspace, copy = true): SlicedSurface {
  const S = copy ? copySliceSet(ws.slices) : ws.slices;
  const n = S.n;
  const sx = ws.mirrored ? -1 : 1;
  const base: Polyline = [];
  for (let i = 0; i < n; i++) base.push([sx * S.xl[i], S.yBaseL[i]]);
  base.push([sx * S.xr[n - 1], S.yBaseR[n - 1]]);
  if (ws.mirrored) base.reverse();
  const ground = ws.g.at.ground;
  const hw = ws.crackWater;
  return {
    ok: true,
    slices: S,
    lowerEnd: [sx * ws.xa, lookupY(ground, ws.xa)],
    upperEnd: [sx * ws.xb, lookupY(ground, ws.xb)],
    crack:
      ws.crackDepth > 0
        ? {
            x: sx * ws.xb,
            depth: ws.crackDepth,
            waterDepth: hw,
            waterForce: 0.5 * ws.prepared.section.water.unitWeight * hw * hw,
          }
        : null,
    base,
    pieces: ws.pieces.map((p) => ({ ...p })),
    crossings: ws.crossings.map((c) => ({ ...c, capacities: { ...c.capacities } })),
  };
}

/**
 * Cut the sliding mass above a slip surface into slices.
 *
 * The surface is a circle (its lower arc) or a polyline. Its ends are where it meets the
 * ground; where it dips below the top of a rigid stratum it follows that top between the
 * two crossings (common practice); a tension crack cuts it off at the upper end. Slice edges
 * fall at every vertex of the ground, strata tops, piezometric line, at load edges, where
 * the surface crosses a boundary or the piezometric line, and where the piezometric line
 * crosses the ground or a boundary; between those, about `count` slices are spread evenly.
 * So every slice has one base material and linear boundaries, and its weight is summed
 * exactly, stratum by stratum (trapezoids, and circular segments under an arc). The search
 * cuts its trial circles with the same code (cutCircle, on a workspace it reuses).
 *
 * @example sliceSurface(prepareSection(section), { type: 'circle', center: [25, 42], radius: 24 }, 40)
 */
export function sliceSurface(
  prepared: PreparedSection,
  surface: CircleSurface | PolylineSurface,
  count: number,
): SliceOutcome {
  const reject = (code: RejectCode, reason: string): RejectedSurface => ({
    ok: false,
    code,
    reason,
  });
  if (surface.type === 'circle' && !(surface.radius > 0)) {
    return reject('not-admissible', 'the circle radius must be positive');
  }
  if (surface.type === 'polyline') {
    const p = surface.points;
    if (p.length < 2)
      return reject('not-admissible', 'a polyline surface needs at least two points');
    for (let i = 1; i < p.length; i++) {
      if (!(p[i][0] > p[i - 1][0])) {
        return reject(
          'not-admissible',
          `the polyline surface turns back at point ${i + 1} (x must increase)`,
        );
      }
    }
  }
  const ws = sliceWorkspace(prepared);
  const code = cutSurface(ws, surface, count);
  return code ? reject(code, rejectReason(ws, code)) : slicedSurface(ws);
}
