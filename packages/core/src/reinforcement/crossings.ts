import type { BasePiece } from '../slices/base-curve';
import type { SliceSet } from '../slices/slice-set';
import { type PreparedElement, resistanceBetween } from './prepare-reinforcement';
import type { Crossing, ReinforcementMode } from './types';

interface Hit {
  /** Length along the element. */
  s: number;
  x: number;
  y: number;
  /** Slope of the slip surface there. */
  slope: number;
}

/**
 * The crossings found for one element, in objects kept from call to call (the search cuts
 * thousands of surfaces): `count` of them are this element's.
 */
const found: { hits: Hit[]; count: number } = { hits: [], count: 0 };

function addHit(s: number, x: number, y: number, slope: number): void {
  const h = found.hits[found.count] ?? (found.hits[found.count] = { s: 0, x: 0, y: 0, slope: 0 });
  h.s = s;
  h.x = x;
  h.y = y;
  h.slope = slope;
  found.count++;
}

/** Where the segment (x0, y0)–(x1, y1) crosses a piece of the surface (into `found`). */
function pieceHits(
  p: BasePiece,
  x0: number,
  y0: number,
  x1: number,
  y1: number,
  s0: number,
  len: number,
): void {
  const dx = x1 - x0;
  const dy = y1 - y0;
  if (Math.max(x0, x1) < p.x0 || Math.min(x0, x1) > p.x1) return;
  if (p.arc) {
    const fx = x0 - p.xc;
    const fy = y0 - p.yc;
    const a = dx * dx + dy * dy;
    const b = 2 * (fx * dx + fy * dy);
    const c = fx * fx + fy * fy - p.r * p.r;
    const disc = b * b - 4 * a * c;
    if (!(disc > 0) || !(a > 0)) return;
    const q = Math.sqrt(disc);
    for (let k = 0; k < 2; k++) {
      const t = (-b + (k === 0 ? -q : q)) / (2 * a);
      if (!(t >= 0 && t <= 1)) continue;
      const x = x0 + t * dx;
      const y = y0 + t * dy;
      if (!(y < p.yc) || x < p.x0 || x > p.x1) continue;
      addHit(s0 + t * len, x, y, (x - p.xc) / (p.yc - y));
    }
    return;
  }
  const ex = p.x1 - p.x0;
  const ey = p.y1 - p.y0;
  const den = dx * ey - dy * ex;
  if (Math.abs(den) < 1e-12 * Math.max(1, a2(dx, dy) * a2(ex, ey))) return;
  const t = ((p.x0 - x0) * ey - (p.y0 - y0) * ex) / den;
  const u = ((p.x0 - x0) * dy - (p.y0 - y0) * dx) / den;
  if (u < 0 || u > 1 || !(t >= 0 && t <= 1)) return;
  const x = x0 + t * dx;
  if (x < p.x0 || x > p.x1) return;
  addHit(s0 + t * len, x, y0 + t * dy, ey / ex);
}

const a2 = (x: number, y: number) => Math.sqrt(x * x + y * y);

/** The slice whose base holds x (the last one at the upper end). */
function sliceAt(s: SliceSet, x: number): number {
  let lo = 0;
  let hi = s.n - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (s.xl[mid] <= x) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/**
 * The crossings of the elements with the slip surface `pieces` (sliding orientation, the mass
 * moving toward −x), their forces added to the slices: to rx, ry, rm for an element divided by
 * F, to qx, qy, qm for one applied at full value; each force acts at its crossing on the base.
 * For each crossing the side of the element below the surface (behind, in stable ground) and
 * the side above (in front, in the mass) run to the next crossing or the element's end:
 * - a geosynthetic carries the least of its strength and the pullout of either side;
 * - a nail the least of its bar strength, the bond behind, and its facing with the bond in front;
 * - an anchor mobilised, the least of its capacity and its bond behind; applied as a load, its
 *   capacity times the share of its bond length behind the surface;
 * - a pile its shear resistance, along the surface against the movement.
 * A tension element only where the pull toward its stable side opposes the movement (along the
 * surface toward −x); elsewhere it would be pushed and carries nothing (common practice:
 * nails, anchors and geosynthetics are not counted in compression).
 */
export function reinforceSlices(
  elements: readonly PreparedElement[],
  pieces: readonly BasePiece[],
  s: SliceSet,
  out: Crossing[],
): void {
  const n = s.n;
  s.rx.fill(0, 0, n);
  s.ry.fill(0, 0, n);
  s.rm.fill(0, 0, n);
  let used = 0;
  for (const e of elements) {
    found.count = 0;
    for (let k = 0; k + 1 < e.xs.length; k++) {
      const len = e.s[k + 1] - e.s[k];
      for (const p of pieces) pieceHits(p, e.xs[k], e.ys[k], e.xs[k + 1], e.ys[k + 1], e.s[k], len);
    }
    if (found.count === 0) continue;
    const hits = found.hits;
    // in order along the element (a few at most: insertion)
    for (let i = 1; i < found.count; i++) {
      const h = hits[i];
      let j = i - 1;
      while (j >= 0 && hits[j].s > h.s) {
        hits[j + 1] = hits[j];
        j--;
      }
      hits[j + 1] = h;
    }
    // a crossing at the joint of two pieces is found on both
    let count = 1;
    for (let i = 1; i < found.count; i++) {
      if (hits[i].s - hits[count - 1].s < 1e-9) continue;
      const h = hits[count];
      hits[count] = hits[i];
      hits[i] = h;
      count++;
    }
    const total = e.s[e.s.length - 1];
    for (let h = 0; h < count; h++) {
      const hit = hits[h];
      // the element's direction at the crossing
      let k = 1;
      while (k < e.s.length - 1 && e.s[k] < hit.s) k++;
      const len = e.s[k] - e.s[k - 1];
      const dx = (e.xs[k] - e.xs[k - 1]) / len;
      const dy = (e.ys[k] - e.ys[k - 1]) / len;
      // upward normal of the surface (−slope, 1): going forward dives below it → behind is forward
      const forwardBehind = -hit.slope * dx + dy < 0;
      const prev = h > 0 ? hits[h - 1].s : 0;
      const next = h + 1 < count ? hits[h + 1].s : total;
      const b0 = forwardBehind ? hit.s : prev;
      const b1 = forwardBehind ? next : hit.s;
      const f0 = forwardBehind ? prev : hit.s;
      const f1 = forwardBehind ? hit.s : next;
      const norm = Math.hypot(1, hit.slope);
      const tx = 1 / norm;
      const ty = hit.slope / norm;
      let ux: number;
      let uy: number;
      let counted = true;
      let force: number;
      let mode: ReinforcementMode = 'strength';
      const behind = resistanceBetween(e, b0, b1);
      const front = resistanceBetween(e, f0, f1);
      let capBehind = Infinity;
      let capFront = Infinity;
      if (e.type === 'pile') {
        ux = tx;
        uy = ty;
        force = e.strength;
      } else {
        const sign = forwardBehind ? 1 : -1;
        ux = sign * dx;
        uy = sign * dy;
        // the movement is −(tx, ty): the pull must oppose it
        counted = ux * tx + uy * ty > 0;
        const frontCap = e.type === 'anchor' ? Infinity : e.facing + front;
        capBehind = behind;
        capFront = frontCap;
        if (e.asLoad) {
          const bond = e.R[e.R.length - 1];
          const share = bond > 0 ? Math.min(1, behind / bond) : 1;
          force = e.strength * share;
          mode = share < 1 ? 'pullout' : 'strength';
        } else {
          force = e.strength;
          if (behind < force) {
            force = behind;
            mode = 'pullout';
          }
          if (frontCap < force) {
            force = frontCap;
            mode = e.type === 'nail' ? 'facing' : 'front';
          }
        }
      }
      const slice = sliceAt(s, hit.x);
      // the crossing's record, in an object kept from the cut before where there is one
      const c: Crossing =
        out[used] ??
        (out[used] = {
          element: 0,
          x: 0,
          y: 0,
          slice: 0,
          force: 0,
          ux: 0,
          uy: 0,
          mode: 'strength',
          counted: false,
          dividedByF: false,
          capacities: { strength: 0, behind: 0, front: 0 },
        });
      used++;
      c.element = e.index;
      c.x = hit.x;
      c.y = hit.y;
      c.slice = slice;
      c.force = counted ? force : 0;
      c.ux = ux;
      c.uy = uy;
      c.mode = mode;
      c.counted = counted;
      c.dividedByF = e.dividedByF;
      c.capacities.strength = e.strength;
      c.capacities.behind = capBehind;
      c.capacities.front = capFront;
      if (!counted || !(c.force > 0)) continue;
      const fx = c.force * ux;
      const fy = c.force * uy;
      const m = hit.x * fy - hit.y * fx;
      if (e.dividedByF) {
        s.rx[slice] += fx;
        s.ry[slice] += fy;
        s.rm[slice] += m;
      } else {
        s.qx[slice] += fx;
        s.qy[slice] += fy;
        s.qm[slice] += m;
      }
    }
  }
  out.length = used;
}
