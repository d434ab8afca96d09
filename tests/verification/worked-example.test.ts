/**
 * A method comparison in the manner of Fredlund & Krahn (1977, Can. Geotech. J. 14(3),
 * "Comparison of slope stability methods of analysis"): a 2 : 1 slope 12.2 m (40 ft) high,
 * c′ = 28.7 kPa (600 psf), φ′ = 20°, γ = 18.85 kN/m³ (120 pcf), no pore pressure. The
 * geometry of their circle is not reproduced here (a toe circle of our own is used), so only
 * the relations between the methods are checked, against their table as remembered:
 * ordinary 1.928, Bishop 2.080, Spencer 2.073, Morgenstern–Price 2.076 — values from memory.
 * Tolerances are wide to reflect that: Bishop/ordinary between 1.03 and 1.12 (remembered
 * 1.079); Spencer and Morgenstern–Price within 1 % of Bishop (remembered −0.3 % and −0.2 %).
 */
import { bishop, morgensternPrice, ordinary, spencer, type Point } from '@scarpline/core';
import { circleOptions, cut, homogeneous, mohrCoulomb, relErr, simpleSlope } from './support';

const H = 12.2;
const section = homogeneous(simpleSlope(H, 2, 20, 60), mohrCoulomb(18.85, 28.7, 20));
const center: Point = [34, 28];
const toe: Point = [20, 0];
const radius = Math.hypot(center[0] - toe[0], center[1] - toe[1]);

describe('method comparison on a 2:1 c-φ slope (after Fredlund & Krahn 1977)', () => {
  const sliced = cut(section, { type: 'circle', center, radius }, 50);
  const o = circleOptions(sliced, center, section);
  const F = {
    ordinary: ordinary(sliced.slices, o).fs,
    bishop: bishop(sliced.slices, o).fs,
    spencer: spencer(sliced.slices, o).fs,
    mp: morgensternPrice(sliced.slices, { ...o, fn: { shape: 'half-sine' } }).fs,
  };
  test('Bishop exceeds the ordinary method by 3–12 %', () => {
    expect(F.bishop / F.ordinary).toBeGreaterThan(1.03);
    expect(F.bishop / F.ordinary).toBeLessThan(1.12);
  });
  test('Spencer and Morgenstern–Price within 1 % of Bishop', () => {
    expect(relErr(F.spencer, F.bishop)).toBeLessThan(0.01);
    expect(relErr(F.mp, F.bishop)).toBeLessThan(0.01);
  });
  test('the factors are of the remembered size for this slope (1.6 to 2.6)', () => {
    // a different circle from theirs, so only the order of magnitude is checked
    expect(F.bishop).toBeGreaterThan(1.6);
    expect(F.bishop).toBeLessThan(2.6);
  });
});
