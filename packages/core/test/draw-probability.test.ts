/** The drawings of a probabilistic analysis and of its sensitivity: each takes a result. */
import { XMLValidator } from 'fast-xml-parser';
import {
  CAUTION,
  drawProbability,
  drawSensitivity,
  drawTornado,
  type CaseProbability,
  type SensitivityCase,
} from '@scarpline/core';

// results as the analyses give them (made by hand here: a drawing takes a result)
const probability: CaseProbability = {
  case: 'long-term',
  requiredFs: 1.5,
  method: 'bishop',
  deterministicFs: 1.31,
  surface: 'critical',
  realisations: 10,
  valid: 9,
  meanFs: 1.3,
  sdFs: 0.15,
  minFs: 0.95,
  maxFs: 1.6,
  pFailure: { p: 1 / 9, standardError: Math.sqrt(((1 / 9) * (8 / 9)) / 9) },
  pBelowRequired: { p: 8 / 9, standardError: 0.1 },
  betaNormal: { beta: 2, pf: 0.0228 },
  betaLognormal: { beta: 2.1, pf: 0.0179 },
  histogram: [
    { from: 0.9, to: 1, count: 1 },
    { from: 1, to: 1.2, count: 2 },
    { from: 1.2, to: 1.4, count: 4 },
    { from: 1.4, to: 1.6, count: 2 },
  ],
  cdf: [
    [0.95, 1 / 9],
    [1.3, 5 / 9],
    [1.6, 1],
  ],
  convergence: [{ n: 10, p: 1 / 9, standardError: 0.1 }],
};

const sens: SensitivityCase = {
  case: 'long-term',
  fsAtMeans: 1.3,
  series: [
    {
      variable: 'φ′ clay',
      target: 'materials.clay.frictionAngle',
      points: [
        [20, 1.1],
        [25, 1.3],
        [30, null],
      ],
      fsLow: 1.1,
      fsHigh: 1.3,
      from: 20,
      to: 30,
    },
    {
      variable: 'water & level',
      target: 'water.level',
      points: [
        [-1, 1.35],
        [0, 1.25],
      ],
      fsLow: 1.25,
      fsHigh: 1.35,
      from: -1,
      to: 0,
    },
  ],
};

describe('drawings of the probabilistic results', () => {
  test.each([
    ['distribution', drawProbability(probability)],
    ['one at a time', drawSensitivity(sens, { requiredFs: 1.5 })],
    ['tornado', drawTornado(sens, { requiredFs: 1.5 })],
  ])('%s: well-formed SVG with the caution', (_, svg) => {
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg.replace(/\s+/g, ' ')).toContain(CAUTION.slice(0, 60));
  });

  test('the distribution: a bar for each bin with realisations, the CDF, FS = 1 and the required FS, P_f in the subtitle', () => {
    const svg = drawProbability(probability);
    expect(svg.match(/class="bar"/g)).toHaveLength(4);
    expect(svg).toContain('class="cdf"');
    expect(svg).toContain('>FS = 1<');
    expect(svg).toContain('>required 1.500<');
    expect(svg).toContain('P(FS &lt; 1) 11.1 %');
  });

  test('one at a time: a line for each run of values with an FS, each variable in the legend with its range', () => {
    const svg = drawSensitivity(sens);
    expect(svg.match(/class="series"/g)).toHaveLength(2);
    expect(svg).toContain('φ′ clay: 20 … 30');
    expect(svg).toContain('water &amp; level: -1 … 0');
  });

  test('the tornado: a bar by variable with its least and greatest FS, the FS at the means', () => {
    const svg = drawTornado(sens, { requiredFs: 1.5 });
    expect(svg.match(/class="bar"/g)).toHaveLength(2);
    expect(svg).toContain('>1.100<');
    expect(svg).toContain('>at the means 1.300<');
  });
});
