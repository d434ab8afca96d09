/**
 * φ = 0 (undrained, total stress). With φ = 0 the base normal force drops out of the
 * strength, so every method of slices reduces to the moment balance of the φ = 0 circle
 * (Fellenius 1927; common practice): ordinary = Bishop = Spencer = Morgenstern–Price =
 * the exact φ = 0 circle, up to the chords of the slices, which vanish as n grows.
 */
import {
  bishop,
  morgensternPrice,
  ordinary,
  prepareSection,
  spencer,
  phiZeroCircle,
  type Point,
} from '@scarpline/core';
import { circleOptions, cut, homogeneous, relErr, simpleSlope, undrained } from './support';

const ground = simpleSlope(10, 2);
const center: Point = [35, 25];
const radius = 24;
const circle = { type: 'circle' as const, center, radius };

function allMethods(section: ReturnType<typeof homogeneous>, n: number) {
  const sliced = cut(section, circle, n);
  const o = circleOptions(sliced, center, section);
  return {
    sliced,
    ordinary: ordinary(sliced.slices, o).fs,
    bishop: bishop(sliced.slices, o).fs,
    spencer: spencer(sliced.slices, o).fs,
    mp: morgensternPrice(sliced.slices, { ...o, fn: { shape: 'half-sine' } }).fs,
    exact: phiZeroCircle(prepareSection(section), sliced, center, radius, section.seismic).fs,
  };
}

describe('φ = 0: all methods are the φ = 0 circle', () => {
  const section = homogeneous(ground, undrained(18, 35));

  test('ordinary = Bishop = Spencer = Morgenstern–Price = φ = 0 circle (n = 200, within 0.05 %)', () => {
    const r = allMethods(section, 200);
    for (const v of [r.ordinary, r.bishop, r.spencer, r.mp])
      expect(relErr(v, r.exact)).toBeLessThan(5e-4);
  });

  test('slice-count convergence: the slice methods approach the exact circle as n grows', () => {
    const errs = [10, 40, 160].map((n) =>
      relErr(allMethods(section, n).bishop, allMethods(section, n).exact),
    );
    expect(errs[1]).toBeLessThan(errs[0]);
    expect(errs[2]).toBeLessThan(errs[1]);
    // chords under an arc: the error falls as 1/n² (ratio about 16 per factor of 4)
    expect(errs[1] / errs[2]).toBeGreaterThan(8);
  });

  test('Su growing with depth: the methods still agree with the exact circle', () => {
    const s = homogeneous(ground, undrained(18, 20, 2, 10));
    const r = allMethods(s, 200);
    for (const v of [r.ordinary, r.bishop, r.spencer])
      expect(relErr(v, r.exact)).toBeLessThan(5e-4);
  });

  test('with kh, a surcharge and a tension crack full of water the methods still agree', () => {
    const s = homogeneous(ground, undrained(18, 35), {
      seismic: { kh: 0.1, kv: 0 },
      loads: [{ type: 'strip', from: 44, to: 50, pressure: 15 }],
      crack: { depth: 2, waterDepth: 2 },
    });
    const r = allMethods(s, 200);
    for (const v of [r.ordinary, r.bishop, r.spencer])
      expect(relErr(v, r.exact)).toBeLessThan(1e-3);
  });
});

describe('φ = 0 circle against a hand computation', () => {
  // Level ground y = 0, circle centred h = 6 above it, R = 10: the mass is a circular
  // segment, symmetric about the centre, so its weight has no lever arm; a strip load q on
  // 0 ≤ x ≤ B (the centre at x = 0) is the only driving moment, q·B²/2.
  // Exact by hand: W = γ[R² acos(h/R) − h√(R² − h²)], arc L = 2R·acos(h/R), F = Su·L·R/(q·B²/2).
  const R = 10;
  const h = 6;
  const q = 100;
  const B = 6;
  const Su = 30;
  const gamma = 17;
  const level: Point[] = [
    [-30, 0],
    [30, 0],
  ];
  const section = homogeneous(level, undrained(gamma, Su), {
    loads: [{ type: 'strip', from: 0, to: B, pressure: q }],
  });
  const c = { type: 'circle' as const, center: [0, h] as Point, radius: R };
  const sliced = cut(section, c, 40);
  const r = phiZeroCircle(prepareSection(section), sliced, [0, h], R, section.seismic);
  const Wexact = gamma * (R * R * Math.acos(h / R) - h * Math.sqrt(R * R - h * h));
  const Lexact = 2 * R * Math.acos(h / R);

  test('W of the mass', () => expect(relErr(r.massWeight, Wexact)).toBeLessThan(1e-12));
  test('lever arm of W is zero', () => expect(Math.abs(r.leverArm)).toBeLessThan(1e-9));
  test('F = Su·L·R / (q·B²/2)', () =>
    expect(relErr(r.fs, (Su * Lexact * R) / ((q * B * B) / 2))).toBeLessThan(1e-12));
});
