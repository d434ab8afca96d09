/**
 * Culmann's planar wedge (Culmann 1866; e.g. Craig's Soil Mechanics, and every slope text):
 * a dry homogeneous slope cut by one plane through its toe at θ to the horizontal. The wedge
 * is a rigid block, so F = (c′L + W cos θ tan φ′) / (W sin θ), with W = γ·(area of the wedge)
 * and L the length of the plane. On one plane every method that satisfies force equilibrium
 * must give exactly this F (common practice): Spencer, Morgenstern–Price, Janbu's F0.
 */
import { janbu, morgensternPrice, polygonArea, spencer, type Point } from '@scarpline/core';
import { cut, homogeneous, mohrCoulomb, relErr } from './support';

// toe (10, 0), crest (20, 10): β = 45°
const ground: Point[] = [
  [0, 0],
  [10, 0],
  [20, 10],
  [40, 10],
];
const theta = (30 * Math.PI) / 180;
const xExit = 10 + 10 / Math.tan(theta);
const wedge: Point[] = [
  [10, 0],
  [xExit, 10],
  [20, 10],
];
const gamma = 18;
const c = 10;
const phi = (25 * Math.PI) / 180;
const W = gamma * Math.abs(polygonArea(wedge));
const L = 10 / Math.sin(theta);
const culmann = (c * L + W * Math.cos(theta) * Math.tan(phi)) / (W * Math.sin(theta));

const section = homogeneous(ground, mohrCoulomb(gamma, c, 25));
const plane = {
  type: 'polyline' as const,
  points: [
    [10, 0],
    [35, 25 * Math.tan(theta)],
  ] as Point[],
};

describe('Culmann planar wedge through the toe', () => {
  const sliced = cut(section, plane, 30);
  const opts = { seismic: section.seismic, pivot: [0, 40] as Point };

  test('the sliced wedge weighs γ·area', () => {
    expect(
      relErr(
        sliced.slices.weight.reduce((a, b) => a + b, 0),
        W,
      ),
    ).toBeLessThan(1e-12);
  });
  test('Spencer = closed form', () => {
    expect(relErr(spencer(sliced.slices, opts).fs, culmann)).toBeLessThan(1e-8);
  });
  test('Morgenstern–Price (half-sine) = closed form', () => {
    expect(
      relErr(morgensternPrice(sliced.slices, { ...opts, fn: { shape: 'half-sine' } }).fs, culmann),
    ).toBeLessThan(1e-8);
  });
  test('Janbu F0 (force equilibrium) = closed form', () => {
    expect(
      relErr(janbu(sliced.slices, { seismic: section.seismic }).fsUncorrected!, culmann),
    ).toBeLessThan(1e-8);
  });
  test('the result does not depend on the number of slices', () => {
    const other = cut(section, plane, 7);
    expect(relErr(spencer(other.slices, opts).fs, culmann)).toBeLessThan(1e-8);
  });
});
