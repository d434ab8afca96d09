/**
 * The log spiral (Rendulic 1935; Chen 1975). At φ = 0 the spiral r = r₀·exp(−θ tan φ_d)
 * is a circle, so the method must give the φ = 0 circle through the same ends (closed-form
 * limit); on a homogeneous c-φ slope it agrees with Spencer within a few per cent (the
 * literature reports the log spiral within a few per cent of rigorous methods of slices —
 * value from memory, hence the 5 % tolerance).
 */
import { logSpiral, prepareSection, spencer, phiZeroCircle, type Point } from '@scarpline/core';
import {
  circleOptions,
  cut,
  homogeneous,
  mohrCoulomb,
  relErr,
  simpleSlope,
  undrained,
} from './support';

const ground = simpleSlope(10, 2);
const center: Point = [35, 25];
const radius = 24;
const circle = { type: 'circle' as const, center, radius };

describe('log spiral', () => {
  test('φ = 0: the spiral is the circle, and F equals the exact φ = 0 circle', () => {
    const section = homogeneous(ground, undrained(18, 35));
    const prepared = prepareSection(section);
    const sliced = cut(section, circle, 60);
    const spiral = logSpiral(prepared, sliced.slices, center, section.seismic, 60);
    const exact = phiZeroCircle(prepared, sliced, center, radius, section.seismic);
    expect(spiral.converged).toBe(true);
    expect(relErr(spiral.fs, exact.fs)).toBeLessThan(2e-4);
    expect(spiral.spiral!.pole[0]).toBeCloseTo(center[0], 6);
    expect(spiral.spiral!.pole[1]).toBeCloseTo(center[1], 6);
    expect(spiral.spiral!.r0).toBeCloseTo(radius, 6);
  });

  test('φ → 0 is continuous: φ′ = 0.2° with the same c gives nearly the φ = 0 value', () => {
    const a = homogeneous(ground, undrained(18, 35));
    const b = homogeneous(ground, mohrCoulomb(18, 35, 0.2));
    const fa = logSpiral(prepareSection(a), cut(a, circle, 60).slices, center, a.seismic, 60).fs;
    const fb = logSpiral(prepareSection(b), cut(b, circle, 60).slices, center, b.seismic, 60).fs;
    expect(fb).toBeGreaterThan(fa);
    expect(relErr(fb, fa)).toBeLessThan(0.03);
  });

  test('the spiral obeys r₁ = r₀·exp(−Θ tan φ_d) and passes through both ends', () => {
    const section = homogeneous(ground, mohrCoulomb(19, 12, 25));
    const sliced = cut(section, circle, 40);
    const r = logSpiral(prepareSection(section), sliced.slices, center, section.seismic, 40);
    const sp = r.spiral!;
    const tanPhiD = Math.tan((sp.phiMobilised * Math.PI) / 180);
    expect(sp.r1 / sp.r0).toBeCloseTo(Math.exp(-((sp.sweep * Math.PI) / 180) * tanPhiD), 10);
    expect(Math.tan((25 * Math.PI) / 180) / tanPhiD).toBeCloseTo(r.fs, 8);
    const first = sp.points[0];
    const last = sp.points[sp.points.length - 1];
    expect(first[0]).toBeCloseTo(sliced.lowerEnd[0], 9);
    expect(last[0]).toBeCloseTo(sliced.upperEnd[0], 9);
  });

  test('homogeneous c-φ slope: log spiral within 5 % of Spencer on the same ends (value from memory)', () => {
    const section = homogeneous(ground, mohrCoulomb(19, 12, 25));
    const sliced = cut(section, circle, 40);
    const sp = logSpiral(prepareSection(section), sliced.slices, center, section.seismic, 40);
    const sf = spencer(sliced.slices, circleOptions(sliced, center, section));
    expect(relErr(sp.fs, sf.fs)).toBeLessThan(0.05);
  });

  test('refuses what it cannot do: layered soil', () => {
    const section = homogeneous(ground, mohrCoulomb(19, 12, 25), {
      materials: { soil: mohrCoulomb(19, 12, 25), clay: { ...undrained(17, 30), name: 'clay' } },
      strata: [
        { material: 'soil', top: ground },
        {
          material: 'clay',
          top: [
            [0, -1],
            [20, -1],
            [40, 3],
            [140, 3],
          ],
        },
      ],
    });
    const sliced = cut(section, circle, 40);
    const r = logSpiral(prepareSection(section), sliced.slices, center, section.seismic, 40);
    expect(r.converged).toBe(false);
    expect(r.reason).toMatch(/homogeneous/);
  });
});
