/**
 * The rigorous methods: Spencer (1967) and Morgenstern–Price (1965) in the general limit
 * equilibrium form of Fredlund & Krahn (1977).
 */
import { dot, sum } from 'mathjs';
import {
  morgensternPrice,
  spencer,
  type Point,
  type SliceMethodResult,
  type SliceSet,
} from '@scarpline/core';
import { circleOptions, cut, homogeneous, mohrCoulomb, relErr, simpleSlope } from './support';

const ground = simpleSlope(10, 2);
const center: Point = [35, 25];
const circle = { type: 'circle' as const, center, radius: 24 };
const water = {
  kind: 'piezometric' as const,
  line: [
    [0, 2],
    [40, 6],
    [140, 7],
  ] as Point[],
  unitWeight: 9.81,
};
const section = homogeneous(ground, mohrCoulomb(19, 8, 28, 20), {
  water,
  seismic: { kh: 0.08, kv: 0 },
  loads: [
    { type: 'strip', from: 45, to: 52, pressure: 20 },
    { type: 'line', x: 48, force: 25, angle: 15 },
  ],
});

describe('Spencer and Morgenstern–Price', () => {
  const sliced = cut(section, circle, 40);
  const o = circleOptions(sliced, center, section);

  test('Spencer ≡ Morgenstern–Price with f constant (Fredlund & Krahn 1977), to 1e-6', () => {
    const a = spencer(sliced.slices, o);
    const b = morgensternPrice(sliced.slices, { ...o, fn: { shape: 'constant' } });
    expect(a.converged && b.converged).toBe(true);
    expect(relErr(b.fs, a.fs)).toBeLessThan(1e-6);
    expect(Math.abs(b.lambda! - a.lambda!)).toBeLessThan(1e-6);
  });

  test('F hardly depends on the interslice function (Fredlund & Krahn 1977: within about 1 %, from memory)', () => {
    const fs = (['constant', 'half-sine', 'clipped-sine', 'trapezoid'] as const).map(
      (shape) => morgensternPrice(sliced.slices, { ...o, fn: { shape } }).fs,
    );
    for (const v of fs) expect(relErr(v, fs[0])).toBeLessThan(0.01);
  });

  test('a polyline surface: Spencer satisfies equilibrium about two different moment points (same F)', () => {
    const poly = {
      type: 'polyline' as const,
      points: [
        [16, 1],
        [25, -3],
        [45, 0],
        [52, 12],
      ] as Point[],
    };
    const s = cut(section, poly, 40);
    const a = spencer(s.slices, { seismic: section.seismic, pivot: [30, 40] });
    const b = spencer(s.slices, { seismic: section.seismic, pivot: [-20, 90] });
    expect(a.converged && b.converged).toBe(true);
    expect(relErr(a.fs, b.fs)).toBeLessThan(1e-7);
  });
});

/**
 * Independent equilibrium check: from the reported slice forces, every slice's ΣFx and ΣFy
 * and the whole mass's ΣM about an arbitrary point are recomputed with mathjs vector algebra, from
 * the geometry alone (no solver code), and must vanish.
 */
function residuals(s: SliceSet, r: SliceMethodResult, kh: number, point: Point) {
  const rows: number[][] = [];
  const moments: number[] = [];
  for (let i = 0; i < s.n; i++) {
    const b = s.xr[i] - s.xl[i];
    const dy = s.yBaseR[i] - s.yBaseL[i];
    const l = Math.hypot(b, dy);
    const [sn, cs] = [dy / l, b / l];
    const N = r.normal[i] + s.porePressure[i] * l;
    const S = r.shear[i];
    const W = s.weight[i];
    const El = i > 0 ? r.E[i - 1] : 0;
    const Xl = i > 0 ? r.X[i - 1] : 0;
    // columns: N, S, W, kh·W, Qx, Qy, E_left, X_left, E_right, X_right
    const fx = [-sn, cs, 0, -1, 1, 0, 1, 0, -1, 0];
    const fy = [cs, sn, -1, 0, 0, 1, 0, 1, 0, -1];
    const mag = [N, S, W, kh * W, s.qx[i], s.qy[i], El, Xl, r.E[i], r.X[i]];
    rows.push([dot(fx, mag), dot(fy, mag)]);
    const xm = 0.5 * (s.xl[i] + s.xr[i]) - point[0];
    const ym = 0.5 * (s.yBaseL[i] + s.yBaseR[i]) - point[1];
    const cxp = s.cx[i] - point[0];
    const cyp = s.cy[i] - point[1];
    moments.push(
      N * (xm * cs + ym * sn) +
        S * (xm * sn - ym * cs) -
        cxp * W +
        cyp * kh * W +
        (s.qm[i] - point[0] * s.qy[i] + point[1] * s.qx[i]),
    );
  }
  let scale = 0;
  for (let i = 0; i < s.n; i++) scale += s.weight[i];
  return { rows, moment: sum(moments), scale };
}

describe('independent equilibrium of the reported slice forces (mathjs)', () => {
  const cases = {
    'Spencer on a circle': () => {
      const sliced = cut(section, circle, 30);
      return {
        s: sliced.slices,
        r: spencer(sliced.slices, circleOptions(sliced, center, section)),
      };
    },
    'Morgenstern–Price (half-sine) on a polyline': () => {
      const sliced = cut(
        section,
        {
          type: 'polyline',
          points: [
            [16, 1],
            [25, -3],
            [45, 0],
            [52, 12],
          ],
        },
        30,
      );
      return {
        s: sliced.slices,
        r: morgensternPrice(sliced.slices, {
          seismic: section.seismic,
          pivot: [30, 40],
          fn: { shape: 'half-sine' },
        }),
      };
    },
  };
  for (const [name, make] of Object.entries(cases)) {
    test(`${name}: ΣFx = ΣFy = 0 in every slice and ΣM = 0 about another point`, () => {
      const { s, r } = make();
      expect(r.converged).toBe(true);
      const { rows, moment, scale } = residuals(s, r, section.seismic.kh, [-40, 77]);
      for (const [fx, fy] of rows) {
        expect(Math.abs(fx)).toBeLessThan(1e-7 * scale);
        expect(Math.abs(fy)).toBeLessThan(1e-7 * scale);
      }
      expect(Math.abs(moment)).toBeLessThan(1e-6 * scale * 24);
      // and the interslice force vanishes at the upper end
      expect(Math.abs(r.E[s.n - 1])).toBeLessThan(1e-7 * scale);
    });
  }
});
