import type { SliceSet } from '../slices/slice-surface';
import type { FastGeometry, FastSection } from './fast-section';
import { lookupY } from './lookup';

/** Where a circle met the ground, in the section's coordinates (filled by sliceCircleFast). */
export interface CircleEnds {
  xa: number;
  xb: number;
}

const roots = new Float64Array(64);
let frame: CircleFrame | null = null;
let edgeL = new Float64Array(8);
let edgeR = new Float64Array(8);

/**
 * The ends of the sliding mass above the lower arc of a circle, in the section's own
 * coordinates: one run of soil above the arc between two meets with the ground (as the
 * exact slicer), or false.
 */
export function circleEnds(
  G: FastGeometry,
  xc: number,
  yc: number,
  r: number,
  out: CircleEnds,
): boolean {
  const gx = G.ground.xs;
  const gy = G.ground.ys;
  const lo = Math.max(xc - r, gx[0]);
  const hi = Math.min(xc + r, gx[G.ground.last]);
  if (!(hi > lo)) return false;
  const r2 = r * r;
  let m = 0;
  roots[m++] = lo;
  for (let i = 0; i < G.ground.last && m < 60; i++) {
    const x0 = gx[i];
    const x1 = gx[i + 1];
    if (x1 < lo || x0 > hi || x1 <= x0) continue;
    const k = (gy[i + 1] - gy[i]) / (x1 - x0);
    const q = gy[i] - k * x0 - yc; // y − yc = k x + q
    const a = 1 + k * k;
    const b = -2 * xc + 2 * k * q;
    const c = xc * xc + q * q - r2;
    const disc = b * b - 4 * a * c;
    if (disc < 0) continue;
    const s = Math.sqrt(disc);
    const xr1 = (-b - s) / (2 * a);
    const xr2 = (-b + s) / (2 * a);
    if (xr1 >= x0 && xr1 <= x1 && xr1 > lo && xr1 < hi && k * xr1 + q <= 0) roots[m++] = xr1;
    if (xr2 >= x0 && xr2 <= x1 && xr2 > lo && xr2 < hi && k * xr2 + q <= 0) roots[m++] = xr2;
  }
  roots[m++] = hi;
  // insertion sort (few points)
  for (let i = 1; i < m; i++) {
    const v = roots[i];
    let j = i - 1;
    while (j >= 0 && roots[j] > v) {
      roots[j + 1] = roots[j];
      j--;
    }
    roots[j + 1] = v;
  }
  let xa = NaN;
  let xb = NaN;
  let runs = 0;
  let open = false;
  for (let i = 0; i + 1 < m; i++) {
    const a = roots[i];
    const b = roots[i + 1];
    if (b - a < 1e-12) continue;
    const xm = 0.5 * (a + b);
    const u = xm - xc;
    const depth = lookupY(G.ground, xm) - (yc - Math.sqrt(Math.max(0, r2 - u * u)));
    if (depth > 1e-9) {
      if (!open) {
        if (++runs > 1) return false;
        xa = a;
        open = true;
      }
      xb = b;
    } else open = false;
  }
  // both ends must be meets with the ground, not the arc's or the section's side
  if (runs !== 1 || xa === lo || xb === hi) return false;
  out.xa = xa;
  out.xb = xb;
  return true;
}

/** Base elevation at x: the arc, or the rigid top where the arc dips below it. */
export function baseAt(G: FastGeometry, xc: number, yc: number, r2: number, x: number): number {
  const u = x - xc;
  const arc = yc - Math.sqrt(Math.max(0, r2 - u * u));
  if (G.rigid) {
    const yr = lookupY(G.rigid, x);
    if (yr > arc) return yr;
  }
  return arc;
}

/** A circle placed in its sliding orientation: the geometry, centre, ends and crack water. */
export interface CircleFrame {
  G: FastGeometry;
  mirrored: boolean;
  xc: number;
  xa: number;
  xb: number;
  crackHw: number;
}

/** A frame to reuse from call to call (the search's hot path allocates nothing). */
export function circleFrameBuffer(fs: FastSection): CircleFrame {
  return { G: fs.normal, mirrored: false, xc: 0.5, xa: 0.5, xb: 0.5, crackHw: 0.5 };
}

/**
 * Ends of the mass above a circle, the orientation it slides in (mirrored when it moves toward
 * +x), and where a tension crack cuts it: written into `frame`; false when not admissible.
 */
export function circleFrame(
  fs: FastSection,
  xc0: number,
  yc: number,
  r: number,
  ends: CircleEnds,
  frame: CircleFrame,
): boolean {
  if (!circleEnds(fs.normal, xc0, yc, r, ends)) return false;
  const gN = fs.normal.ground;
  const mirrored = lookupY(gN, ends.xa) > lookupY(gN, ends.xb);
  const G = mirrored ? fs.mirrored : fs.normal;
  const xc = mirrored ? -xc0 : xc0;
  const xa = mirrored ? -ends.xb : ends.xa;
  let xb = mirrored ? -ends.xa : ends.xb;
  let crackHw = 0;
  if (G.crackDepth > 0) {
    const x = crackEnd(G, xc, yc, r * r, xa, xb);
    if (!(x > xa)) return false;
    xb = x;
    crackHw = Math.min(G.crackWater, G.crackDepth);
  }
  frame.G = G;
  frame.mirrored = mirrored;
  frame.xc = xc;
  frame.xa = xa;
  frame.xb = xb;
  frame.crackHw = crackHw;
  return true;
}

/**
 * Where a tension crack of the section's depth cuts the surface near its upper end xb (the
 * surface lies the crack depth below the ground there), or NaN when it never does.
 */
export function crackEnd(
  G: FastGeometry,
  xc: number,
  yc: number,
  r2: number,
  xa: number,
  xb: number,
): number {
  const dc = G.crackDepth;
  const f = (x: number) => lookupY(G.ground, x) - baseAt(G, xc, yc, r2, x) - dc;
  let a = NaN;
  for (let k = 1; k <= 16; k++) {
    const x = xb - ((xb - xa) * k) / 16;
    if (f(x) >= 0) {
      a = x;
      break;
    }
  }
  if (Number.isNaN(a)) return NaN;
  let b = a + (xb - xa) / 16;
  for (let it = 0; it < 40; it++) {
    const mid = 0.5 * (a + b);
    if (f(mid) >= 0) a = mid;
    else b = mid;
  }
  return a;
}

/**
 * The search's fast slicing of a circle into `n` slices of equal width, written into a
 * reusable SliceSet (sliding orientation, as sliceSurface). Boundaries are evaluated once
 * at each slice edge; a slice's soil is the trapezoids between them above the chord of the
 * base (exact where no vertex falls inside the slice, otherwise an O(1/n²) error), its pore
 * pressure and strength are taken at the middle of the chord; a rigid base is followed; ponded water, surcharges,
 * line loads and a tension crack with water enter as in the exact slicer. The critical
 * surface the search finds is always re-evaluated with the exact slicer.
 * Returns false (and leaves `out` unusable) when the circle is not admissible.
 *
 * @example sliceCircleFast(fast, 25, 42, 24, 50, buffer, ends)
 */
export function sliceCircleFast(
  fs: FastSection,
  xc0: number,
  yc: number,
  r: number,
  n: number,
  out: SliceSet,
  ends: CircleEnds,
): boolean {
  const f = frame ?? (frame = circleFrameBuffer(fs));
  if (!circleFrame(fs, xc0, yc, r, ends, f)) return false;
  const { G, mirrored, xc, xa, xb, crackHw } = f;
  const r2 = r * r;
  const ground = G.ground;

  const w = (xb - xa) / n;
  const tops = G.tops;
  const soil = G.soil;
  const nt = tops.length;
  const piezo = G.piezo;
  const gw = G.gw;
  const ru = G.ru;
  if (edgeL.length < nt) {
    edgeL = new Float64Array(nt);
    edgeR = new Float64Array(nt);
  }
  // values at the slice edges, each edge evaluated once and shared by its two slices
  let gL = lookupY(ground, xa);
  let ybL = baseAt(G, xc, yc, r2, xa);
  let pL = piezo ? lookupY(piezo, xa) : -Infinity;
  edgeL[0] = gL;
  for (let k = 1; k < nt; k++) edgeL[k] = lookupY(tops[k], xa);
  let total = 0;
  const { gamma, gammaSat, c: cohesion, tanPhi, suRate, suDatum, material, strips, lines } = G;
  const { xl, xr, yBaseL, yBaseR, yTopL, yTopR, area, weight: weights, cx, cy, porePressure } = out;
  const outC = out.cohesion;
  const outT = out.tanPhi;
  const outM = out.material;
  const { qx: outQx, qy: outQy, qm: outQm } = out;
  for (let i = 0; i < n; i++) {
    const x0 = xa + i * w;
    const x1 = i + 1 === n ? xb : xa + (i + 1) * w;
    const b = x1 - x0;
    const xm = 0.5 * (x0 + x1);
    const gR = lookupY(ground, x1);
    const ybR = baseAt(G, xc, yc, r2, x1);
    const pR = piezo ? lookupY(piezo, x1) : -Infinity;
    edgeR[0] = gR;
    for (let k = 1; k < nt; k++) edgeR[k] = lookupY(tops[k], x1);
    xl[i] = x0;
    xr[i] = x1;
    yBaseL[i] = ybL;
    yBaseR[i] = ybR;
    yTopL[i] = gL;
    yTopR[i] = gR;
    const ybm = 0.5 * (ybL + ybR);
    const gm = 0.5 * (gL + gR);
    const pm = 0.5 * (pL + pR);
    // soil above the chord, stratum by stratum: trapezoids between the edge values
    let W = 0;
    let WY = 0;
    let A = 0;
    let base = 0;
    for (let k = 0; k < soil; k++) {
      const tl = edgeL[k];
      const tr = edgeR[k];
      if (0.5 * (tl + tr) <= ybm) break;
      const nl = k + 1 < nt ? edgeL[k + 1] : -Infinity;
      const nr = k + 1 < nt ? edgeR[k + 1] : -Infinity;
      const bl = nl > ybL ? nl : ybL;
      const br = nr > ybR ? nr : ybR;
      const hl = tl > bl ? tl - bl : 0;
      const hr = tr > br ? tr - br : 0;
      const t = 0.5 * (hl + hr);
      const yMid = 0.25 * (tl + bl + tr + br);
      if (t > 0) {
        let gk = gamma[k];
        if (piezo && gammaSat[k] !== gk) {
          // the saturated part: below the piezometric line
          const wl = Math.max(0, Math.min(tl, pL) - bl);
          const wr = Math.max(0, Math.min(tr, pR) - br);
          const wet = 0.5 * (Math.min(wl, hl) + Math.min(wr, hr));
          const wk = gamma[k] * (t - wet) + gammaSat[k] * wet;
          W += wk;
          gk = wk / t;
          WY += gk * t * yMid;
        } else {
          W += gk * t;
          WY += gk * t * yMid;
        }
        A += t;
      }
      base = k;
      if (0.5 * (nl + nr) <= ybm) break;
    }
    const weight = W * b;
    area[i] = A * b;
    weights[i] = weight;
    cx[i] = xm;
    cy[i] = W > 0 ? WY / W : 0.5 * (gm + ybm);
    total += weight;
    outM[i] = base < material.length ? material[base] : 0;
    porePressure[i] = piezo ? (pm > ybm ? gw * (pm - ybm) : 0) : ru > 0 ? ru * W : 0;
    const datum = suDatum[base];
    outC[i] = cohesion[base] + (datum > ybm ? suRate[base] * (datum - ybm) : 0);
    outT[i] = tanPhi[base];
    // loads on the top
    let qx = 0;
    let qy = 0;
    let qm = 0;
    if (pm > gm) {
      const h = pm - gm;
      const fy = -gw * h * b;
      const fx = gw * h * (gR - gL);
      qx += fx;
      qy += fy;
      qm += xm * fy - gm * fx;
    }
    for (let k = 0; k < strips.length; k += 3) {
      const a = strips[k] > x0 ? strips[k] : x0;
      const c = strips[k + 1] < x1 ? strips[k + 1] : x1;
      if (c > a) {
        const f = -strips[k + 2] * (c - a);
        qy += f;
        qm += 0.5 * (a + c) * f;
      }
    }
    for (let k = 0; k < lines.length; k += 3) {
      const x = lines[k];
      if ((x >= x0 && x < x1) || (i + 1 === n && x === x1)) {
        const yq = lookupY(ground, x);
        qx += lines[k + 1];
        qy += lines[k + 2];
        qm += x * lines[k + 2] - yq * lines[k + 1];
      }
    }
    outQx[i] = qx;
    outQy[i] = qy;
    outQm[i] = qm;
    gL = gR;
    ybL = ybR;
    pL = pR;
    const swap = edgeL;
    edgeL = edgeR;
    edgeR = swap;
  }
  if (crackHw > 0) {
    const Pw = 0.5 * gw * crackHw * crackHw;
    out.qx[n - 1] -= Pw;
    out.qm[n - 1] += (out.yBaseR[n - 1] + crackHw / 3) * Pw;
  }
  out.n = n;
  out.mirrored = mirrored;
  return total > 0;
}
