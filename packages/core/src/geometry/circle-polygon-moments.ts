import type { Point } from '../model/types';

/** Area and first moments of a plane region: centroid = (mx / area, my / area). */
export interface AreaMoments {
  area: number;
  /** ∫∫ x dA */
  mx: number;
  /** ∫∫ y dA */
  my: number;
}

/**
 * Exact area and first moments of the intersection of a disk with a simple polygon, by
 * summing the signed intersections of the disk with the triangles (centre, pᵢ, pᵢ₊₁): each
 * edge is split where it crosses the circle; a piece inside the circle contributes a
 * triangle, a piece outside contributes a circular sector. No slices, no quadrature. The
 * result carries the polygon's orientation (positive for counter-clockwise).
 *
 * @example circlePolygonMoments([0, 0], 1, [[-5, -5], [5, -5], [5, 0], [-5, 0]]).area // → π/2
 */
export function circlePolygonMoments(
  center: Point,
  radius: number,
  polygon: readonly Point[],
): AreaMoments {
  const [cx, cy] = center;
  const r2 = radius * radius;
  let area = 0;
  let mx = 0;
  let my = 0;
  const n = polygon.length;
  const ts: number[] = [];
  for (let i = 0; i < n; i++) {
    const px = polygon[i][0] - cx;
    const py = polygon[i][1] - cy;
    const qx = polygon[(i + 1) % n][0] - cx;
    const qy = polygon[(i + 1) % n][1] - cy;
    const dx = qx - px;
    const dy = qy - py;
    // |p + t d|² = r²  →  a t² + 2 b t + c = 0
    const a = dx * dx + dy * dy;
    if (a === 0) continue;
    const b = px * dx + py * dy;
    const c = px * px + py * py - r2;
    ts.length = 0;
    ts.push(0);
    const disc = b * b - a * c;
    if (disc > 0) {
      const s = Math.sqrt(disc);
      const t1 = (-b - s) / a;
      const t2 = (-b + s) / a;
      if (t1 > 0 && t1 < 1) ts.push(t1);
      if (t2 > 0 && t2 < 1) ts.push(t2);
    }
    ts.push(1);
    for (let k = 0; k + 1 < ts.length; k++) {
      const ax = px + ts[k] * dx;
      const ay = py + ts[k] * dy;
      const bx = px + ts[k + 1] * dx;
      const by = py + ts[k + 1] * dy;
      const tm = (ts[k] + ts[k + 1]) / 2;
      const mxp = px + tm * dx;
      const myp = py + tm * dy;
      const cross = ax * by - ay * bx;
      if (mxp * mxp + myp * myp <= r2) {
        // triangle (0, a, b): area cross/2, centroid (a + b)/3
        const ta = cross / 2;
        area += ta;
        mx += (ta * (ax + bx)) / 3;
        my += (ta * (ay + by)) / 3;
      } else {
        // sector from the direction of a to the direction of b
        const th1 = Math.atan2(ay, ax);
        const dth = Math.atan2(cross, ax * bx + ay * by);
        const th2 = th1 + dth;
        area += (r2 * dth) / 2;
        mx += ((r2 * radius) / 3) * (Math.sin(th2) - Math.sin(th1));
        my -= ((r2 * radius) / 3) * (Math.cos(th2) - Math.cos(th1));
      }
    }
  }
  // moments so far are about the centre; shift to the origin
  return { area, mx: mx + cx * area, my: my + cy * area };
}
