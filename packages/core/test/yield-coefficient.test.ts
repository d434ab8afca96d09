/**
 * The root finding of the yield coefficient on made-up F(kh): its outcomes, its count of
 * analyses, a least FS with a kink and one with a jump (the checks against published sources
 * are in tests/verification/seismic.test.ts).
 */
import { yieldCoefficient, type FsAtKh } from '@scarpline/core';

/** F(kh) from a plain function, counting the calls. */
function counted(f: (kh: number) => number | null): FsAtKh & { calls: number[] } {
  const calls: number[] = [];
  const fsAt = (kh: number) => {
    calls.push(kh);
    return { fs: f(kh), surface: { type: 'plane' as const, angle: 0, depth: kh } };
  };
  return Object.assign(fsAt, { calls });
}

describe('yieldCoefficient', () => {
  test('a straight line: the root, every analysis counted, the surface of the analysis at ky', () => {
    const fsAt = counted((kh) => 1.8 - 3 * kh);
    const y = yieldCoefficient(fsAt);
    expect(y.outcome).toBe('found');
    expect(y.ky!).toBeCloseTo(0.8 / 3, 3);
    expect(Math.abs(y.fs! - 1)).toBeLessThanOrEqual(5e-4);
    expect(y.analyses).toBe(fsAt.calls.length);
    expect(y.surface).toEqual({ type: 'plane', angle: 0, depth: y.ky });
    expect(y.warnings).toEqual([]);
  });

  test('no kh is analysed twice', () => {
    const fsAt = counted((kh) => 1.3 / (1 + 4 * kh));
    yieldCoefficient(fsAt, { fsTolerance: 1e-9, khTolerance: 1e-9 });
    expect(new Set(fsAt.calls).size).toBe(fsAt.calls.length);
  });

  test('the least of two surfaces (continuous, not smooth): the root on the branch that governs', () => {
    // the lines cross at kh = 0.2 (F = 1.1); F = 1 on the steeper one at kh = 0.25
    const y = yieldCoefficient(
      counted((kh) => Math.min(1.5 - 2 * kh, 1.2 - 0.5 * kh)),
      {
        fsTolerance: 1e-10,
        khTolerance: 1e-12,
      },
    );
    expect(y.ky!).toBeCloseTo(0.25, 9);
  });

  test('F jumps across 1 (the critical surface changes): ky at the jump, with a warning', () => {
    const y = yieldCoefficient(counted((kh) => (kh < 0.3 ? 1.3 - kh / 3 : 0.8 - kh)));
    expect(y.outcome).toBe('found');
    expect(Math.abs(y.ky! - 0.3)).toBeLessThanOrEqual(1e-4);
    expect(y.bracket![1] - y.bracket![0]).toBeLessThanOrEqual(1e-4);
    expect(y.warnings.map((w) => w.code)).toEqual(['yield-fs-jump']);
    expect(y.warnings[0].message).toContain('jumps from 1.200 to 0.500');
  });

  test('F < 1 at kh = 0: statically unstable, ky = 0, one analysis', () => {
    const y = yieldCoefficient(counted((kh) => 0.93 - kh));
    expect(y).toMatchObject({ outcome: 'statically-unstable', ky: 0, fs: 0.93, analyses: 1 });
    expect(y.warnings[0].message).toContain('0.930 < 1');
  });

  test('F = 1 at kh = 0 within the tolerance: ky = 0 found', () => {
    expect(yieldCoefficient(counted((kh) => 1.0002 - kh))).toMatchObject({
      outcome: 'found',
      ky: 0,
    });
  });

  test('F > 1 at the cap: above the cap, ky null', () => {
    const y = yieldCoefficient(
      counted((kh) => 3 - kh),
      { cap: 0.5 },
    );
    expect(y).toMatchObject({ outcome: 'above-cap', ky: null, fs: 2.5, bracket: null });
    expect(y.warnings[0].message).toContain('above 0.500');
  });

  test('an analysis without an FS: no factor of safety, ky null', () => {
    const y = yieldCoefficient(counted((kh) => (kh > 0.1 ? null : 1.5 - kh)));
    expect(y).toMatchObject({ outcome: 'no-factor-of-safety', ky: null, surface: null });
    expect(y.warnings.map((w) => w.code)).toEqual(['yield-not-found']);
  });

  test('out of analyses: not converged, the highest kh known to give F > 1', () => {
    const y = yieldCoefficient(
      counted((kh) => 1.3 / (1 + 4 * kh)),
      {
        maxAnalyses: 3,
        fsTolerance: 1e-12,
        khTolerance: 1e-12,
      },
    );
    expect(y.outcome).toBe('not-converged');
    expect(y.analyses).toBe(3);
    expect(y.fs!).toBeGreaterThan(1);
    expect(y.ky).toBe(y.bracket![0]);
    expect(y.ky!).toBeLessThan(0.3 / 4);
  });
});
