import {
  distributionWords,
  percentText,
  probabilityBasisWords,
  variableDistributionWords,
  type ProbabilitySpec,
} from '../src';

describe('the words of a probabilistic analysis', () => {
  test('a probability as a percentage: two decimals, four below 0.1 %, none at 0', () => {
    expect(percentText(0.01234)).toBe('1.23 %');
    expect(percentText(0.000804)).toBe('0.0804 %');
    expect(percentText(0)).toBe('0 %');
    expect(percentText(NaN)).toBe('—');
  });

  test('each distribution with its parameters', () => {
    expect(distributionWords({ kind: 'normal', mean: 27, sd: 2.5 })).toBe(
      'normal, mean 27, SD 2.5',
    );
    expect(distributionWords({ kind: 'truncated-normal', mean: 25, sd: 3, min: 18, max: 32 })).toBe(
      'truncated normal, mean 25, SD 3, 18 … 32',
    );
    expect(distributionWords({ kind: 'triangular', min: -1, mode: 0, max: 0.5 })).toBe(
      'triangular, -1 … 0 … 0.5',
    );
    expect(distributionWords({ kind: 'uniform', min: 0, max: 0.1 })).toBe('uniform, 0 … 0.1');
  });

  test("a variable's distribution in the section's units: angles in degrees, ratios as they are", () => {
    const c = {
      name: 'c',
      target: 'materials.clay.cohesion',
      distribution: { kind: 'lognormal' as const, mean: 4, sd: 1.6 },
    };
    expect(variableDistributionWords(c, 'si')).toBe('lognormal, mean 4 kPa, SD 1.6 kPa');
    // 1 kPa = 20.885 psf (1 lbf/ft² = 47.880 26 Pa: NIST SP 811, appendix B.8): 4000/47.88026 = 83.542
    expect(variableDistributionWords(c, 'us')).toBe('lognormal, mean 83.542 psf, SD 33.417 psf');
    const phi = {
      name: 'φ',
      target: 'materials.clay.frictionAngle',
      distribution: { kind: 'normal' as const, mean: 27, sd: 2 },
    };
    expect(variableDistributionWords(phi, 'us')).toBe('normal, mean 27°, SD 2°');
    const kh = {
      name: 'kh',
      target: 'seismic.kh',
      distribution: { kind: 'uniform' as const, min: 0, max: 0.1 },
    };
    expect(variableDistributionWords(kh, 'si')).toBe('uniform, 0 … 0.1');
  });

  test('the run in a line', () => {
    const spec: ProbabilitySpec = {
      variables: [],
      correlations: [],
      seed: 3,
      method: 'monte-carlo',
      realisations: 500,
      surface: 'critical',
    };
    expect(probabilityBasisWords(spec)).toBe(
      "0 random variables, Monte Carlo sampling, seed 3, N = 500, on each case's critical surface at the means",
    );
  });
});
