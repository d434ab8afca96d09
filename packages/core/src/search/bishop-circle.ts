import type { FastSection } from './fast-section';
import { lookupSlope, lookupY, walkY } from './lookup';
import {
  type CircleEnds,
  type CircleFrame,
  circleFrame,
  circleFrameBuffer,
} from './slice-circle-fast';

let cap = 0;
let sin = new Float64Array(0);
let cos = new Float64Array(0);
let C = new Float64Array(0);
let T = new Float64Array(0);
let Wv = new Float64Array(0);
let aN = new Float64Array(0);
let aS = new Float64Array(0);
let M0 = new Float64Array(0);
let edge = new Float64Array(0);
let frame: CircleFrame | null = null;

function grow(n: number, tops: number): void {
  if (n > cap) {
    cap = n;
    sin = new Float64Array(n);
    cos = new Float64Array(n);
    C = new Float64Array(n);
    T = new Float64Array(n);
    Wv = new Float64Array(n);
    aN = new Float64Array(n);
    aS = new Float64Array(n);
    M0 = new Float64Array(n);
  }
  if (edge.length < 2 * tops) edge = new Float64Array(2 * tops);
}

/**
 * The search's circle evaluator in one pass: slices of equal width cut and resolved straight
 * into the terms of Bishop's simplified method (Bishop 1955), then iterated. Each slice's base
 * is the tangent to the arc at its middle (so the normal force passes through the centre and
 * the shear acts at the radius), or the top of a rigid base where the arc dips below it;
 * boundaries are read once per slice edge; weight, pore pressure, strength and loads as in
 * sliceCircleFast. Returns the FS, or NaN for an inadmissible circle or where mα turns
 * negative. The critical circle is always re-evaluated with the exact slicer.
 *
 * @example bishopCircle(fast, 25, 42, 24, 50, 1.3, ends)
 */
export function bishopCircle(
  fs: FastSection,
  xc0: number,
  yc: number,
  r: number,
  n: number,
  guess: number,
  ends: CircleEnds,
): number {
  const f = frame ?? (frame = circleFrameBuffer(fs));
  if (!circleFrame(fs, xc0, yc, r, ends, f)) return NaN;
  const { G, xc, xa, xb, crackHw } = f;
  const r2 = r * r;
  const {
    tops,
    soil,
    piezo,
    rigid,
    ground,
    gw,
    ru,
    gamma,
    gammaSat,
    c,
    tanPhi,
    suRate,
    suDatum,
    strips,
    lines,
  } = G;
  // only the tops that reach above the circle's lowest point need reading
  const bottom = yc - r;
  let nt = 1;
  while (nt < tops.length && G.topMax[nt] > bottom) nt++;
  grow(n, tops.length);
  // local handles on the reused buffers (module bindings are slower to reach in hot loops)
  const sinA = sin;
  const cosA = cos;
  const Ca = C;
  const Ta = T;
  const Wa = Wv;
  const aNa = aN;
  const aSa = aS;
  const M0a = M0;
  const ed = edge;
  const seismic = fs.prepared.section.seismic;
  const kh = seismic.kh;
  const seismicH = kh !== 0;
  const kv1 = 1 + seismic.kv;
  const w = (xb - xa) / n;
  const ir = 1 / r;
  const loads = strips.length > 0 || lines.length > 0;
  // edge values: ground, strata tops (ed[k]), piezometric line; left in [0, nt), right in [nt, 2nt)
  let L = 0;
  let R = nt;
  ed[0] = lookupY(ground, xa);
  for (let k = 1; k < nt; k++) ed[k] = lookupY(tops[k], xa);
  let pL = piezo ? lookupY(piezo, xa) : -Infinity;
  let total = 0;
  for (let i = 0; i < n; i++) {
    const x0 = xa + i * w;
    const x1 = i + 1 === n ? xb : x0 + w;
    const b = x1 - x0;
    const xm = 0.5 * (x0 + x1);
    ed[R] = walkY(ground, x1);
    for (let k = 1; k < nt; k++) ed[R + k] = walkY(tops[k], x1);
    const pR = piezo ? walkY(piezo, x1) : -Infinity;
    // the base at the middle: tangent to the arc, or along the rigid top
    const u = xm - xc;
    const s = Math.sqrt(r2 - u * u);
    let ybm = yc - s;
    let sn = u * ir;
    let cs = s * ir;
    let an = 0;
    let as = r;
    if (rigid) {
      const yr = lookupY(rigid, xm);
      if (yr > ybm) {
        ybm = yr;
        const k = lookupSlope(rigid, xm);
        cs = 1 / Math.sqrt(1 + k * k);
        sn = k * cs;
        an = u * cs + (ybm - yc) * sn;
        as = u * sn - (ybm - yc) * cs;
      }
    }
    if (!(cs > 1e-6)) return NaN;
    const gm = 0.5 * (ed[L] + ed[R]);
    const pm = 0.5 * (pL + pR);
    let W = 0;
    let WY = 0;
    let base = 0;
    for (let k = 0; k < soil; k++) {
      const tm = 0.5 * (ed[L + k] + ed[R + k]);
      if (tm <= ybm) break;
      const nm = k + 1 < nt ? 0.5 * (ed[L + k + 1] + ed[R + k + 1]) : -Infinity;
      const bm = nm > ybm ? nm : ybm;
      const t = tm - bm;
      if (pm > bm && pm < tm && gammaSat[k] !== gamma[k]) {
        W += gamma[k] * (tm - pm) + gammaSat[k] * (pm - bm);
        if (seismicH)
          WY += gamma[k] * (tm - pm) * 0.5 * (tm + pm) + gammaSat[k] * (pm - bm) * 0.5 * (pm + bm);
      } else {
        const gk = pm >= tm ? gammaSat[k] : gamma[k];
        W += gk * t;
        if (seismicH) WY += gk * t * 0.5 * (tm + bm);
      }
      base = k;
      if (nm <= ybm) break;
    }
    const weight = W * b;
    total += weight;
    // the height of the weight matters only for the horizontal seismic force
    const cy = seismicH && W > 0 ? WY / W : ybm;
    const up = piezo ? (pm > ybm ? gw * (pm - ybm) : 0) : ru * W;
    const datum = suDatum[base];
    const ci = c[base] + (datum > ybm ? suRate[base] * (datum - ybm) : 0);
    const ti = tanPhi[base];
    const l = b / cs;
    // loads on the top
    let qx = 0;
    let qy = 0;
    let qm = 0;
    if (pm > gm) {
      const h = pm - gm;
      const fy = -gw * h * b;
      const fx = gw * h * (ed[R] - ed[L]);
      qx += fx;
      qy += fy;
      qm += xm * fy - gm * fx;
    }
    for (let k = 0; loads && k < strips.length; k += 3) {
      const a = strips[k] > x0 ? strips[k] : x0;
      const e = strips[k + 1] < x1 ? strips[k + 1] : x1;
      if (e > a) {
        const f = -strips[k + 2] * (e - a);
        qy += f;
        qm += 0.5 * (a + e) * f;
      }
    }
    for (let k = 0; loads && k < lines.length; k += 3) {
      const x = lines[k];
      if ((x >= x0 && x < x1) || (i + 1 === n && x === x1)) {
        const yq = lookupY(ground, x);
        qx += lines[k + 1];
        qy += lines[k + 2];
        qm += x * lines[k + 2] - yq * lines[k + 1];
      }
    }
    if (i + 1 === n && crackHw > 0) {
      const Pw = 0.5 * gw * crackHw * crackHw;
      qx -= Pw;
      qm += (ybm + crackHw / 3) * Pw;
    }
    sinA[i] = sn;
    cosA[i] = cs;
    Ta[i] = ti;
    Ca[i] = (ci - up * ti) * l;
    Wa[i] = qy - kv1 * weight;
    aNa[i] = an;
    aSa[i] = as;
    M0a[i] = -u * kv1 * weight + (cy - yc) * kh * weight + (qm - xc * qy + yc * qx);
    pL = pR;
    const swap = L;
    L = R;
    R = swap;
  }
  if (!(total > 0)) return NaN;
  // Bishop's fixed point: N = (−Hy − C sin α / F) / mα, F = Σ (C + N tan φ′)·aS / Σ −(N·aN + M0)
  let F = guess > 0 ? guess : 1;
  for (let it = 0; it < 60; it++) {
    const iF = 1 / F;
    let resist = 0;
    let drive = 0;
    for (let i = 0; i < n; i++) {
      const den = Ta[i] * iF * sinA[i] + cosA[i];
      if (den <= 1e-9) return NaN;
      const N = (-Wa[i] - Ca[i] * iF * sinA[i]) / den;
      resist += (Ca[i] + N * Ta[i]) * aSa[i];
      drive -= N * aNa[i] + M0a[i];
    }
    const next = resist / drive;
    if (!(next > 0) || !(next < 1e6)) return NaN;
    if (Math.abs(next - F) <= 1e-7 * next) return next;
    F = next;
  }
  return NaN;
}
