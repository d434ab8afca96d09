/**
 * Strengths given as straight pieces in τ–σ′n — a shear–normal function (points) and a
 * bilinear Mohr–Coulomb envelope — against Mohr–Coulomb itself (closed form: where the
 * pieces are one straight line τ = c′ + σ′n tan φ′, or every base's σ′n lies on the first
 * line, each base's strength is that line, so every method of slices must give the
 * Mohr–Coulomb F of the same line exactly, up to its own tolerance).
 */
import {
  analyzeSection,
  caseView,
  type Material,
  type MethodId,
  type Point,
  type Section,
} from '@scarpline/core';
import { GAMMA_W, homogeneous, relErr, simpleSlope } from './support';

const METHODS: MethodId[] = ['ordinary', 'bishop', 'janbu', 'spencer', 'morgenstern-price'];
const ground = simpleSlope(12, 1.5);
const center: Point = [30, 30];
const radius = 29;
const c = 9;
const phi = 31;
const t = Math.tan((phi * Math.PI) / 180);

function fsBy(strength: Material['strength']): Map<MethodId, { fs: number; stress: number[] }> {
  const material: Material = { name: 'soil', unitWeight: 19, saturatedUnitWeight: 20, strength };
  const section: Section = homogeneous(ground, material, {
    water: {
      kind: 'piezometric',
      line: [
        [0, -0.5],
        [20, -0.5],
        [50, 7],
        [140, 8],
      ],
      unitWeight: GAMMA_W,
    },
  });
  const r = caseView(
    analyzeSection({
      ...section,
      analysis: {
        ...section.analysis,
        methods: METHODS,
        slices: 50,
        surface: { type: 'circle', center, radius },
      },
    }),
  );
  return new Map(
    r.results.map((m) => {
      expect(m.converged).toBe(true);
      return [m.method, { fs: m.fs!, stress: m.slices.map((s) => s.strengthAt?.stress ?? NaN) }];
    }),
  );
}

const mc = fsBy({ model: 'mohr-coulomb', cohesion: c, frictionAngle: phi });

describe('a shear–normal function that is a straight line', () => {
  test.each([
    ['through three points, extended beyond the last', 'extend'],
    ['through three points reaching past every base', 'hold'],
  ] as const)('%s: the Mohr–Coulomb F in every method', (_name, beyond) => {
    const top = beyond === 'hold' ? 2000 : 150;
    const sn = fsBy({
      model: 'shear-normal',
      points: [
        [0, c],
        [60, c + 60 * t],
        [top, c + top * t],
      ],
      beyond,
    });
    for (const m of METHODS) expect(relErr(sn.get(m)!.fs, mc.get(m)!.fs)).toBeLessThan(1e-9);
  });
});

describe('a bilinear envelope', () => {
  test('with both angles equal: the Mohr–Coulomb F in every method', () => {
    const b = fsBy({
      model: 'bilinear',
      cohesion: c,
      frictionAngle: phi,
      breakStress: 40,
      frictionAngleBeyond: phi,
    });
    for (const m of METHODS) expect(relErr(b.get(m)!.fs, mc.get(m)!.fs)).toBeLessThan(1e-9);
  });

  test('with the break above every base’s σ′n: the first line’s F', () => {
    const b = fsBy({
      model: 'bilinear',
      cohesion: c,
      frictionAngle: phi,
      breakStress: 5000,
      frictionAngleBeyond: 20,
    });
    for (const m of METHODS) {
      expect(Math.max(...b.get(m)!.stress)).toBeLessThan(5000);
      expect(relErr(b.get(m)!.fs, mc.get(m)!.fs)).toBeLessThan(1e-9);
    }
  });

  test('with a flatter line beyond a break within the bases’ σ′n: lower F than the first line', () => {
    const b = fsBy({
      model: 'bilinear',
      cohesion: c,
      frictionAngle: phi,
      breakStress: 40,
      frictionAngleBeyond: 22,
    });
    for (const m of METHODS) {
      const stress = b.get(m)!.stress;
      expect(stress.some((s) => s > 40)).toBe(true);
      expect(b.get(m)!.fs).toBeLessThan(mc.get(m)!.fs * 0.99);
    }
  });
});
