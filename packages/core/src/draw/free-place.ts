/** What a label must keep clear of, in pixels: lines (slip surfaces), areas (the sliding mass) and boxes. */
export interface Obstacles {
  lines: (readonly (readonly [number, number])[])[];
  areas: (readonly (readonly [number, number])[])[];
  boxes: Box[];
}

/** A box in pixels. */
export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** Whether the segment a–b meets the box (Liang–Barsky clipping). */
export function segmentHitsBox(
  a: readonly [number, number],
  b: readonly [number, number],
  box: Box,
): boolean {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  let t0 = 0;
  let t1 = 1;
  const edges: [number, number][] = [
    [-dx, a[0] - box.x0],
    [dx, box.x1 - a[0]],
    [-dy, a[1] - box.y0],
    [dy, box.y1 - a[1]],
  ];
  for (const [p, q] of edges) {
    if (p === 0) {
      if (q < 0) return false;
    } else {
      const t = q / p;
      if (p < 0) t0 = Math.max(t0, t);
      else t1 = Math.min(t1, t);
      if (t0 > t1) return false;
    }
  }
  return true;
}

/** Whether a point is inside a polygon (even–odd rule). */
export function insidePolygon(
  p: readonly [number, number],
  ring: readonly (readonly [number, number])[],
): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = ring[i];
    const [xj, yj] = ring[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi)
      inside = !inside;
  }
  return inside;
}

const overlaps = (a: Box, b: Box) => a.x0 < b.x1 && a.x1 > b.x0 && a.y0 < b.y1 && a.y1 > b.y0;

/**
 * Whether a box keeps clear of every obstacle: no line crosses it, it is not inside or across an
 * area, and it overlaps no other box.
 *
 * @example boxIsClear({ x0: 0, y0: 0, x1: 10, y1: 10 }, { lines: [[[20, 0], [20, 10]]], areas: [], boxes: [] }) // → true
 */
export function boxIsClear(box: Box, o: Obstacles): boolean {
  if (o.boxes.some((b) => overlaps(box, b))) return false;
  for (const line of o.lines)
    for (let i = 1; i < line.length; i++)
      if (segmentHitsBox(line[i - 1], line[i], box)) return false;
  const corners: [number, number][] = [
    [box.x0, box.y0],
    [box.x1, box.y0],
    [box.x1, box.y1],
    [box.x0, box.y1],
    [(box.x0 + box.x1) / 2, (box.y0 + box.y1) / 2],
  ];
  for (const ring of o.areas) {
    if (corners.some((c) => insidePolygon(c, ring))) return false;
    for (let i = 0; i < ring.length; i++)
      if (segmentHitsBox(ring[i], ring[(i + 1) % ring.length], box)) return false;
  }
  return true;
}

/** The width in pixels of a line of text of this many characters at this font size (Fira Sans, about). */
export const textWidth = (chars: number, fontSize: number): number => chars * fontSize * 0.56;
