/**
 * Infinite slope: closed forms of Skempton & DeLory (1957), in every soil-mechanics textbook
 * (e.g. Craig's Soil Mechanics, ch. 9). The reference values are evaluated here with mathjs
 * from the textbook expressions, independently of the solver's code.
 */
import { evaluate } from 'mathjs';
import { infiniteSlope, spencer, type Point } from '@scarpline/core';
import { GAMMA_W, cut, homogeneous, mohrCoulomb, relErr, undrained } from './support';

const run = (
  angle: number,
  depth: number,
  waterRatio: number,
  material = mohrCoulomb(19, 0, 32, 20),
  kh = 0,
) => infiniteSlope({ angle, depth, waterRatio, material, waterUnitWeight: GAMMA_W, kh });

describe('infinite slope (Skempton & DeLory 1957)', () => {
  test.each([15, 25, 30])('dry, c′ = 0: F = tan φ′ / tan β (β = %i°)', (beta) => {
    const ref = evaluate(`tan(32 deg) / tan(${beta} deg)`);
    expect(relErr(run(beta, 3, 0).fs, ref)).toBeLessThan(1e-12);
  });

  test('seepage parallel to the slope at the surface, c′ = 0: F = (γ′/γsat)·tan φ′/tan β', () => {
    const ref = evaluate(`((20 - ${GAMMA_W}) / 20) * tan(32 deg) / tan(20 deg)`);
    expect(relErr(run(20, 4, 1).fs, ref)).toBeLessThan(1e-12);
  });

  test('c′ > 0, water table half way: F = [c′ + (γ̄ z cos²β − γw m z cos²β) tan φ′] / (γ̄ z sin β cos β)', () => {
    const m = 0.5;
    const ref = evaluate(
      `(8 + ((0.5*19 + 0.5*20) * 3 * cos(28 deg)^2 - ${GAMMA_W} * ${m} * 3 * cos(28 deg)^2) * tan(30 deg)) / ((0.5*19 + 0.5*20) * 3 * sin(28 deg) * cos(28 deg))`,
    );
    expect(relErr(run(28, 3, m, mohrCoulomb(19, 8, 30, 20)).fs, ref)).toBeLessThan(1e-12);
  });

  test('pseudo-static kh: F = [c′ + γz cos β (cos β − kh sin β) tan φ′] / [γz cos β (sin β + kh cos β)]', () => {
    const ref = evaluate(
      '(5 + 18*2*cos(25 deg)*(cos(25 deg) - 0.15*sin(25 deg))*tan(33 deg)) / (18*2*cos(25 deg)*(sin(25 deg) + 0.15*cos(25 deg)))',
    );
    expect(relErr(run(25, 2, 0, mohrCoulomb(18, 5, 33), 0.15).fs, ref)).toBeLessThan(1e-12);
  });

  test('undrained: F = Su / (γ z sin β cos β)', () => {
    const ref = evaluate('40 / (17 * 5 * sin(18 deg) * cos(18 deg))');
    expect(relErr(run(18, 5, 0, undrained(17, 40)).fs, ref)).toBeLessThan(1e-12);
  });

  test('a long planar slide parallel to a long slope tends to the infinite slope as 1/L (Spencer; common practice)', () => {
    // The end wedges add a resistance that does not grow with the length L of the slide, so
    // F(L) = F∞ + k/L: two lengths give F∞ by extrapolation in 1/L.
    // 1 in 2.75 slope (β ≈ 20°), 200 m long; a plane 3 m below it, turning up steeply at both ends
    const beta = Math.atan(1 / 2.75);
    const L = 200;
    const H = L * Math.tan(beta);
    const ground: Point[] = [
      [0, 0],
      [20, 0],
      [20 + L, H],
      [60 + L, H],
    ];
    const z = 3;
    const material = mohrCoulomb(19, 4, 30);
    const section = homogeneous(ground, material);
    const ref = run((beta * 180) / Math.PI, z, 0, material).fs;
    const lengths = [60, 180];
    const fs = lengths.map((len) => {
      const x0 = 20 + (L - len) / 2;
      const x1 = x0 + len;
      const y = (x: number) => (x - 20) * Math.tan(beta) - z;
      const points: Point[] = [
        [x0 - 2, y(x0 - 2) + z + 0.5],
        [x0 + 2, y(x0 + 2)],
        [x1 - 2, y(x1 - 2)],
        [x1 + 2, y(x1 + 2) + z + 0.5],
      ];
      const sliced = cut(section, { type: 'polyline', points }, 120);
      const r = spencer(sliced.slices, { seismic: section.seismic, pivot: [0, 300] });
      expect(r.converged).toBe(true);
      return r.fs;
    });
    expect(relErr(fs[1], ref)).toBeLessThan(relErr(fs[0], ref));
    const extrapolated = (fs[1] * lengths[1] - fs[0] * lengths[0]) / (lengths[1] - lengths[0]);
    expect(relErr(extrapolated, ref)).toBeLessThan(0.005);
  });
});
