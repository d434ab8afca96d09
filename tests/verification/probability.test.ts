/**
 * Probability of failure, the Taylor series method, correlated sampling and solving for a
 * value, checked against closed forms.
 *
 * The infinite slope with no water (Skempton & DeLory 1957; every textbook, e.g. Craig's Soil
 * Mechanics, ch. 9): F = c′/(γ z sin β cos β) + tan φ′/tan β is linear in c′ and tan φ′, so
 * with both normal F is normal with μF = a μc + b μt and σF² = a²σc² + b²σt² + 2abρσcσt, and
 * P(F < 1) = Φ((1 − μF)/σF) exactly (the sum of jointly normal variables is normal). The
 * standard error of a probability counted from N realisations is √(P(1 − P)/N) (binomial);
 * of a mean σ/√N. The reliability indices are those of US Army Corps of Engineers ETL
 * 1110-2-547 (1997) and Duncan (2000), checked here against the definition P(F < 1) of each
 * assumed distribution, integrated numerically. Reference values are evaluated with mathjs.
 */
import { erf, evaluate } from 'mathjs';
import {
  analyzeProbability,
  betaLognormal,
  betaNormal,
  phiZeroCircle,
  prepareSection,
  probabilityRun,
  realisationValues,
  solveForValue,
  taylorSeries,
  type ProbabilitySpec,
  type Section,
} from '@scarpline/core';
import { cut, homogeneous, mohrCoulomb, relErr, simpleSlope, undrained } from './support';

const Phi = (z: number) => 0.5 * (1 + erf(z / Math.SQRT2));

// the slope: β = 30°, slip plane 3 m deep, γ = 19 kN/m³, no water
const BETA = 30;
const Z = 3;
const GAMMA = 19;
const a: number = evaluate(`1 / (${GAMMA} * ${Z} * sin(${BETA} deg) * cos(${BETA} deg))`);
const b: number = evaluate(`1 / tan(${BETA} deg)`);
const MU_C = 5;
const SD_C = 1;
const MU_T = 0.5;
const SD_T = 0.06;

function slope(): Section {
  const s = homogeneous(
    [
      [0, 0],
      [10, 0],
    ],
    mohrCoulomb(GAMMA, MU_C, (Math.atan(MU_T) * 180) / Math.PI),
  );
  return {
    ...s,
    analysis: {
      ...s.analysis,
      methods: ['infinite-slope'],
      surface: null,
      infiniteSlope: { angle: BETA, depth: Z, waterRatio: 0 },
    },
  };
}

function spec(over: Partial<ProbabilitySpec> = {}, rho = 0): ProbabilitySpec {
  return {
    variables: [
      {
        name: 'c',
        target: 'materials.soil.cohesion',
        distribution: { kind: 'normal', mean: MU_C, sd: SD_C },
      },
      {
        name: 't',
        target: 'materials.soil.tanFrictionAngle',
        distribution: { kind: 'normal', mean: MU_T, sd: SD_T },
      },
    ],
    correlations: rho !== 0 ? [{ between: ['c', 't'], coefficient: rho }] : [],
    seed: 11,
    method: 'monte-carlo',
    realisations: 4000,
    surface: 'critical',
    ...over,
  };
}

const muF = a * MU_C + b * MU_T;
const sdF = (rho = 0) =>
  Math.sqrt((a * SD_C) ** 2 + (b * SD_T) ** 2 + 2 * a * b * rho * SD_C * SD_T);
const pF = (rho = 0) => Phi((1 - muF) / sdF(rho));

describe('infinite slope with normal c′ and tan φ′, no water: the closed form', () => {
  test('the FS of the section at the means is the textbook F = c′/(γz sin β cos β) + tan φ′/tan β', () => {
    const r = taylorSeries(slope(), spec());
    expect(relErr(r.cases[0].fsMean!, muF)).toBeLessThan(1e-12);
  });

  test.each([0, -0.5])(
    'Monte Carlo (N = 4000, ρ = %d): mean, SD and P(F < 1) within three standard errors',
    (rho) => {
      const N = 4000;
      const c = analyzeProbability(slope(), spec({}, rho)).cases[0];
      expect(c.valid).toBe(N);
      expect(Math.abs(c.meanFs! - muF)).toBeLessThan((3 * sdF(rho)) / Math.sqrt(N));
      // the SD of a sample SD of a normal variable: σ/√(2(N − 1))
      expect(Math.abs(c.sdFs! - sdF(rho))).toBeLessThan((3 * sdF(rho)) / Math.sqrt(2 * (N - 1)));
      const p = pF(rho);
      expect(Math.abs(c.pFailure.p - p)).toBeLessThan(3 * Math.sqrt((p * (1 - p)) / N));
      // the reported standard error is the binomial one of the count
      expect(c.pFailure.standardError).toBeCloseTo(
        Math.sqrt((c.pFailure.p * (1 - c.pFailure.p)) / N),
        12,
      );
      // F is normal here: β normal from the sample moments implies about the same P_f
      expect(Math.abs(c.betaNormal.pf! - p)).toBeLessThan(0.02);
    },
  );

  test('Latin hypercube errs less than Monte Carlo on the same N (20 seeds, N = 200: RMS error of the mean and of P_f)', () => {
    const rms = (method: ProbabilitySpec['method']) => {
      let eMean = 0;
      let eP = 0;
      for (let seed = 1; seed <= 20; seed++) {
        const c = analyzeProbability(slope(), spec({ method, seed, realisations: 200 })).cases[0];
        eMean += (c.meanFs! - muF) ** 2;
        eP += (c.pFailure.p - pF()) ** 2;
      }
      return { mean: Math.sqrt(eMean / 20), p: Math.sqrt(eP / 20) };
    };
    const mc = rms('monte-carlo');
    const lhs = rms('latin-hypercube');
    expect(lhs.mean).toBeLessThan(mc.mean);
    expect(lhs.p).toBeLessThan(mc.p);
  });

  test('Taylor series method (USACE ETL 1110-2-547): σF of a linear F is exact, 2n + 1 analyses', () => {
    const t = taylorSeries(slope(), spec()).cases[0];
    expect(t.analyses).toBe(5);
    expect(relErr(t.sdFs!, sdF())).toBeLessThan(1e-9);
    expect(relErr(t.betaNormal.beta!, (muF - 1) / sdF())).toBeLessThan(1e-9);
    expect(t.terms.map((x) => x.variable)).toEqual(['c', 't']);
    expect(relErr(t.terms[0].share!, (a * SD_C) ** 2 / sdF() ** 2)).toBeLessThan(1e-9);
    expect(t.correlationShare).toBeNull();
  });

  test('Taylor series method with c′ and tan φ′ correlated (ρ = −0.5): σF² = Σ ΔFᵢ² + 2ρ ΔF_c ΔF_t, exact for a linear F', () => {
    // the first-order variance of a linear function of correlated variables (closed form above:
    // a²σc² + b²σt² + 2ab ρ σc σt)
    const t = taylorSeries(slope(), spec({}, -0.5)).cases[0];
    expect(relErr(t.sdFs!, sdF(-0.5))).toBeLessThan(1e-9);
    expect(t.sdFs!).toBeLessThan(sdF());
    const shares = t.terms.reduce((k, x) => k + x.share!, 0) + t.correlationShare!;
    expect(shares).toBeCloseTo(1, 12);
    expect(
      relErr(t.correlationShare!, (2 * a * b * -0.5 * SD_C * SD_T) / sdF(-0.5) ** 2),
    ).toBeLessThan(1e-9);
  });
});

describe('the reliability index against its definition', () => {
  // P(F < 1) by Simpson's rule on the density of each assumed distribution
  const simpson = (f: (x: number) => number, lo: number, hi: number, n = 20000) => {
    const h = (hi - lo) / n;
    let s = f(lo) + f(hi);
    for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * f(lo + i * h);
    return (s * h) / 3;
  };
  test.each([
    [1.3, 0.2],
    [1.5, 0.3],
    [1.1, 0.25],
  ])('μ = %d, σ = %d: Φ(−β) is P(F < 1) of a normal and of a lognormal F', (mu, sd) => {
    const normalPdf = (x: number) =>
      Math.exp(-0.5 * ((x - mu) / sd) ** 2) / (sd * Math.sqrt(2 * Math.PI));
    const pNormal = simpson(normalPdf, mu - 12 * sd, 1);
    expect(Math.abs(betaNormal(mu, sd).pf! - pNormal)).toBeLessThan(1e-9);
    // lognormal: ln F normal with ζ² = ln(1 + V²), λ = ln μ − ζ²/2
    const zeta = Math.sqrt(Math.log(1 + (sd / mu) ** 2));
    const lambda = Math.log(mu) - (zeta * zeta) / 2;
    const lognormalPdf = (x: number) =>
      x <= 0
        ? 0
        : Math.exp(-0.5 * ((Math.log(x) - lambda) / zeta) ** 2) /
          (x * zeta * Math.sqrt(2 * Math.PI));
    const pLognormal = simpson(lognormalPdf, 1e-9, 1);
    expect(Math.abs(betaLognormal(mu, sd).pf! - pLognormal)).toBeLessThan(1e-7);
  });
});

describe('correlated sampling', () => {
  test.each([-0.5, 0.3, 0.8])(
    'the normal scores of N = 5000 realisations have the requested correlation ρ = %d (within 3 standard errors, (1 − ρ²)/√N)',
    (rho) => {
      const N = 5000;
      const run = probabilityRun(slope(), spec({ realisations: N }, rho));
      const xs: number[] = [];
      const ys: number[] = [];
      for (let i = 0; i < N; i++) {
        const [c, t] = realisationValues(run, i);
        xs.push(c);
        ys.push(t);
      }
      const mean = (v: number[]) => v.reduce((s, x) => s + x, 0) / v.length;
      const mx = mean(xs);
      const my = mean(ys);
      let sxy = 0;
      let sxx = 0;
      let syy = 0;
      for (let i = 0; i < N; i++) {
        sxy += (xs[i] - mx) * (ys[i] - my);
        sxx += (xs[i] - mx) ** 2;
        syy += (ys[i] - my) ** 2;
      }
      const r = sxy / Math.sqrt(sxx * syy);
      expect(Math.abs(r - rho)).toBeLessThan((3 * (1 - rho * rho)) / Math.sqrt(N));
    },
  );
});

describe('solving for a value', () => {
  test.each([22, 28, 35])(
    'the friction angle that gives F = 1 on a dry cohesionless infinite slope of β = %i° is β',
    (beta) => {
      const s0 = slope();
      const s: Section = {
        ...s0,
        materials: { soil: mohrCoulomb(GAMMA, 0, 40) },
        analysis: { ...s0.analysis, infiniteSlope: { angle: beta, depth: Z, waterRatio: 0 } },
      };
      const r = solveForValue(s, {
        target: 'materials.soil.frictionAngle',
        targetFs: 1,
        range: [10, 45],
      });
      expect(r.found).toBe(true);
      expect(Math.abs(r.value! - beta)).toBeLessThan(1e-6);
      expect(r.surface).toEqual({ type: 'plane', angle: beta, depth: Z });
      expect(r.analyses).toBe(r.steps.length);
    },
  );

  const ground = simpleSlope(10, 2);
  const circle = { type: 'circle' as const, center: [35, 25] as [number, number], radius: 24 };
  const clay = (method: 'bishop' | 'phi-zero-circle', slices: number): Section => {
    const s = homogeneous(ground, undrained(18, 35));
    return { ...s, analysis: { ...s.analysis, methods: [method], slices, surface: circle } };
  };
  // the exact φ = 0 circle (disk ∩ soil, no slices): F is proportional to Su, so Su(F = 1) = Su/F
  const s0 = clay('phi-zero-circle', 200);
  const exactF = phiZeroCircle(
    prepareSection(s0),
    cut(s0, circle, 200),
    circle.center,
    circle.radius,
    s0.seismic,
  ).fs;
  const suAtOne = 35 / exactF;

  test('φ = 0: the Su that gives F = 1 on a circle with the exact φ = 0 computation is Su/F', () => {
    const r = solveForValue(clay('phi-zero-circle', 200), {
      target: 'materials.soil.su',
      targetFs: 1,
      range: [5, 100],
    });
    expect(r.found).toBe(true);
    expect(relErr(r.value!, suAtOne)).toBeLessThan(1e-6);
    expect(r.fs!).toBeCloseTo(1, 6);
  });

  test('φ = 0: Bishop on 200 slices gives the same Su within 0.05 % (the slices’ chords)', () => {
    const r = solveForValue(clay('bishop', 200), {
      target: 'materials.soil.su',
      targetFs: 1,
      range: [5, 100],
    });
    expect(r.found).toBe(true);
    expect(relErr(r.value!, suAtOne)).toBeLessThan(5e-4);
    expect(r.surface).toEqual({ type: 'circle', center: circle.center, radius: circle.radius });
  });

  test('a solve that cannot reach its target says so', () => {
    const r = solveForValue(clay('bishop', 40), {
      target: 'materials.soil.su',
      targetFs: 1,
      range: [2 * suAtOne, 4 * suAtOne],
    });
    expect(r.found).toBe(false);
    expect(r.value).toBeNull();
    expect(r.reason).toMatch(
      /^no value in .* gives FS = 1: over the range the critical FS lies between (1\.99\d|2\.00\d) and (3\.99\d|4\.00\d); widen the range/,
    );
    expect(r.analyses).toBeGreaterThan(1);
  });
});
