/**
 * The rigorous methods: Spencer (1967) and Morgenstern–Price (1965) in the general limit
 * equilibrium form of Fredlund & Krahn (1977).
 */
import { dot, sum } from 'mathjs';
import {
  intersliceFunction,
  morgensternPrice,
  spencer,
  type IntersliceFunction,
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
    const trapezoid: IntersliceFunction = {
      shape: 'piecewise-linear',
      points: [
        [0, 0.2],
        [0.25, 1],
        [0.75, 1],
        [1, 0.2],
      ],
    };
    const fns: IntersliceFunction[] = [{ shape: 'constant' }, { shape: 'half-sine' }, trapezoid];
    const fs = fns.map((fn) => morgensternPrice(sliced.slices, { ...o, fn }).fs);
    for (const v of fs) expect(relErr(v, fs[0])).toBeLessThan(0.01);
  });

  test('piecewise-linear f through [[0, 1], [1, 1]] is the constant f (closed form: a straight line): the same F and λ as Spencer, to 1e-9', () => {
    const a = spencer(sliced.slices, o);
    const fn: IntersliceFunction = {
      shape: 'piecewise-linear',
      points: [
        [0, 1],
        [1, 1],
      ],
    };
    const b = morgensternPrice(sliced.slices, { ...o, fn });
    expect(a.converged && b.converged).toBe(true);
    expect(relErr(b.fs, a.fs)).toBeLessThan(1e-9);
    expect(Math.abs(b.lambda! - a.lambda!)).toBeLessThan(1e-9);
  });

  test('piecewise-linear f through sin(πξ) at every slice boundary reproduces the half-sine exactly (f is taken only at the boundaries), to 1e-12', () => {
    const s = sliced.slices;
    const L = s.xr[s.n - 1] - s.xl[0];
    const xis = [0, ...Array.from(s.xr, (x) => (x - s.xl[0]) / L)];
    const fn: IntersliceFunction = {
      shape: 'piecewise-linear',
      points: xis.map((xi): [number, number] => [xi, Math.sin(Math.PI * xi)]),
    };
    const a = morgensternPrice(s, { ...o, fn: { shape: 'half-sine' } });
    const b = morgensternPrice(s, { ...o, fn });
    expect(a.converged && b.converged).toBe(true);
    expect(relErr(b.fs, a.fs)).toBeLessThan(1e-12);
    expect(Math.abs(b.lambda! - a.lambda!)).toBeLessThan(1e-12);
  });

  test('piecewise-linear f through the half-sine at eleven points (within π²/800 ≈ 0.012 of it, the bound h²·max|f″|/8 of linear interpolation): F within 0.1 % of the half-sine', () => {
    const points = Array.from({ length: 11 }, (_, k): [number, number] => [
      k / 10,
      Math.sin((Math.PI * k) / 10),
    ]);
    const fn: IntersliceFunction = { shape: 'piecewise-linear', points };
    for (let k = 0; k <= 200; k++) {
      const xi = k / 200;
      expect(Math.abs(intersliceFunction(fn, xi) - Math.sin(Math.PI * xi))).toBeLessThanOrEqual(
        Math.PI ** 2 / 800 + 1e-12,
      );
    }
    const a = morgensternPrice(sliced.slices, { ...o, fn: { shape: 'half-sine' } });
    const b = morgensternPrice(sliced.slices, { ...o, fn });
    expect(relErr(b.fs, a.fs)).toBeLessThan(1e-3);
  });

  test('piecewise-linear f is the closed-form trapezoid e + (1 − e)·min(1, min(ξ, 1 − ξ)/r) through its four corners, to 1e-12', () => {
    const [e, r] = [0.3, 0.2];
    const fn: IntersliceFunction = {
      shape: 'piecewise-linear',
      points: [
        [0, e],
        [r, 1],
        [1 - r, 1],
        [1, e],
      ],
    };
    for (let k = 0; k <= 100; k++) {
      const xi = k / 100;
      const closed = e + (1 - e) * Math.min(1, Math.min(xi, 1 - xi) / r);
      expect(Math.abs(intersliceFunction(fn, xi) - closed)).toBeLessThan(1e-12);
    }
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
