/**
 * The earthquake part of a seismic case, checked against the outside world: the yield
 * coefficient of a dry cohesionless infinite slope, ky = tan(φ′ − β) (closed form; Kramer &
 * Stewart, Geotechnical Earthquake Engineering, 2nd ed. 2024, eq. 10.14 with F = 1, and their
 * figure 10.24); the yield coefficient of a circle, where the pseudo-static FS is 1.000; and the
 * displacement regressions of Jibson (2007, Engineering Geology 91, eq. 6 and 7) and
 * Ambraseys & Menu (1988, Earthquake Engineering and Structural Dynamics 16) against their
 * equations as published, evaluated with mathjs from the printed expression, and against the
 * worked example of Kramer & Stewart (Example 10.4).
 *
 * Sources of the coefficients (each confirmed in at least two places): the USGS's description
 * of each equation in its SLAMMER program (Jibson's own), the USGS's ground-failure code, and
 * the chapter on seismic slope stability of Kramer & Stewart (2024), as stored text (the book's
 * identity recognised from its equation and example numbers).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluate } from 'mathjs';
import {
  ambraseysMenu1988,
  analyzeSection,
  caseView,
  infiniteSlope,
  jibson2007,
  jibson2007Magnitude,
  parseSections,
  seismicReport,
  slidingBlockEstimate,
  yieldCoefficient,
  type FsAtKh,
  type PseudoStaticAnalysis,
  type Section,
  type StationResult,
} from '@scarpline/core';
import { GAMMA_W, mohrCoulomb } from './support';

/** A dry cohesionless infinite slope at β with φ′, as the core computes it at any kh. */
function infiniteFsAt(beta: number, phi: number): FsAtKh {
  const material = mohrCoulomb(19, 0, phi);
  return (kh) => ({
    fs: infiniteSlope({
      angle: beta,
      depth: 3,
      waterRatio: 0,
      material,
      waterUnitWeight: GAMMA_W,
      kh,
    }).fs,
    surface: { type: 'plane', angle: beta, depth: 3 },
  });
}

/** The least FS of a section's analysis (its one case) and its surface. */
function leastFs(station: StationResult): PseudoStaticAnalysis {
  const result = caseView(station);
  const g = result.governing;
  if (!g) return { fs: null, surface: null };
  return { fs: g.fs, surface: result.results.find((r) => r.method === g.method)?.surface ?? null };
}

/** The section's full analysis at kh, kv as the section gives it. */
const sectionFsAt =
  (section: Section): FsAtKh =>
  (kh) =>
    leastFs(analyzeSection({ ...section, seismic: { ...section.seismic, kh } }));

function example(file: string): Section {
  const text = readFileSync(join(__dirname, '..', '..', 'examples', file), 'utf8');
  return parseSections(text, file).sections[0];
}

describe('yield coefficient of a dry cohesionless infinite slope: ky = tan(φ′ − β) (closed form)', () => {
  test.each([
    [20, 30],
    [20, 40],
    [26.57, 32],
    [33.7, 38],
    [15, 45],
  ])('β = %f°, φ′ = %f°', (beta, phi) => {
    const ref = evaluate(`tan(${phi} deg - ${beta} deg)`) as number;
    const tight = yieldCoefficient(infiniteFsAt(beta, phi), {
      fsTolerance: 1e-12,
      khTolerance: 1e-12,
    });
    expect(tight.outcome).toBe('found');
    expect(Math.abs(tight.ky! - ref)).toBeLessThan(1e-9);
    // with the default tolerance: F at ky reads 1.000, and ky is close to the closed form
    const y = yieldCoefficient(infiniteFsAt(beta, phi));
    expect(y.outcome).toBe('found');
    expect(Math.abs(y.fs! - 1)).toBeLessThanOrEqual(5e-4);
    expect(Math.abs(y.ky! - ref)).toBeLessThan(2e-3);
    expect(y.analyses).toBeLessThan(15);
  });

  test('Kramer & Stewart (2024), fig. 10.24: a block on a 20° plane has ky = 0.17 with φ = 30°, 0.36 with φ = 40°, 0 with φ = 20°', () => {
    // the figure prints two decimals, cut short (tan 10° = 0.1763, tan 20° = 0.3640)
    const twoDecimals = (x: number) => Math.trunc(x * 100) / 100;
    expect(twoDecimals(yieldCoefficient(infiniteFsAt(20, 30)).ky!)).toBe(0.17);
    expect(twoDecimals(yieldCoefficient(infiniteFsAt(20, 40)).ky!)).toBe(0.36);
    const verge = yieldCoefficient(infiniteFsAt(20, 20));
    expect(verge.outcome).toBe('found');
    expect(verge.ky).toBe(0);
  });

  test('φ′ < β: not stable statically, ky = 0 with the static FS; φ′ − β > 45°: ky above the cap of 1', () => {
    const unstable = yieldCoefficient(infiniteFsAt(30, 28));
    expect(unstable.outcome).toBe('statically-unstable');
    expect(unstable.ky).toBe(0);
    expect(unstable.fs).toBeCloseTo(evaluate('tan(28 deg) / tan(30 deg)') as number, 12);
    const above = yieldCoefficient(infiniteFsAt(5, 55));
    expect(above.outcome).toBe('above-cap');
    expect(above.ky).toBeNull();
    expect(above.fs!).toBeGreaterThan(1);
  });
});

describe('yield coefficient of a circle: the pseudo-static FS at ky is 1.000', () => {
  test('the given circle of examples/cut-surcharge-seismic.yaml (Bishop, Spencer, Morgenstern–Price; loads, crack, ru)', () => {
    const section = example('cut-surcharge-seismic.yaml');
    const y = yieldCoefficient(sectionFsAt(section));
    expect(y.outcome).toBe('found');
    // its own FS at kh = 0.12 is above 1, so ky lies above 0.12
    expect(leastFs(analyzeSection(section)).fs!).toBeGreaterThan(1);
    expect(y.ky!).toBeGreaterThan(0.12);
    // an independent analysis at ky: FS = 1.000 within the root finder's tolerance
    const atKy = leastFs(
      analyzeSection({ ...section, seismic: { ...section.seismic, kh: y.ky! } }),
    );
    expect(Math.abs(atKy.fs! - 1)).toBeLessThanOrEqual(y.fsTolerance);
    expect(atKy.fs!.toFixed(3)).toBe('1.000');
    // and F crosses 1 there: above it just below ky, below it just above
    expect(sectionFsAt(section)(y.ky! - 0.01).fs!).toBeGreaterThan(1);
    expect(sectionFsAt(section)(y.ky! + 0.01).fs!).toBeLessThan(1);
  });

  test('the searched circle of examples/cut-homogeneous.yaml (the search repeated at every kh)', () => {
    const given = example('cut-homogeneous.yaml');
    const section: Section = {
      ...given,
      analysis: { ...given.analysis, methods: ['bishop'], surface: { type: 'grid' } },
    };
    const y = yieldCoefficient(sectionFsAt(section));
    expect(y.outcome).toBe('found');
    const atKy = leastFs(
      analyzeSection({ ...section, seismic: { ...section.seismic, kh: y.ky! } }),
    );
    expect(Math.abs(atKy.fs! - 1)).toBeLessThanOrEqual(y.fsTolerance);
    expect(y.surface).toEqual(atKy.surface);
    // the critical circle moves as kh grows: the static critical circle, held fixed, has F ≥ 1
    // at ky (the least FS of the search is at most that circle's)
    const staticCircle = leastFs(analyzeSection(section)).surface;
    expect(staticCircle?.type).toBe('circle');
    expect(staticCircle).not.toEqual(y.surface);
    const held: Section = {
      ...section,
      seismic: { ...section.seismic, kh: y.ky! },
      analysis: { ...section.analysis, surface: staticCircle as Section['analysis']['surface'] },
    };
    expect(leastFs(analyzeSection(held)).fs!).toBeGreaterThanOrEqual(1 - y.fsTolerance);
  });
});

/** ac/amax at which each relation is checked. */
const RATIOS = [0.1, 0.2, 0.35, 0.5, 0.67, 0.8, 0.9];

describe('Jibson (2007) eq. 6: log D = 0.215 + log[(1 − ac/amax)^2.341 (ac/amax)^−1.438], D in cm, σ = 0.510', () => {
  test.each(RATIOS)('ac/amax = %f', (r) => {
    const pga = 0.4;
    const d = evaluate('10^(0.215 + log10((1 - r)^2.341 * r^(-1.438)))', { r }) as number;
    const e = slidingBlockEstimate(jibson2007, r * pga, pga, null)!;
    expect(e.relation).toBe('jibson-2007');
    expect(Math.abs(e.median - d / 100) / (d / 100)).toBeLessThan(1e-12);
    expect(Math.abs(e.plusOneSd - (d / 100) * 10 ** 0.51) / e.plusOneSd).toBeLessThan(1e-12);
  });
});

describe('Jibson (2007) eq. 7: log D = −2.710 + log[(1 − ac/amax)^2.335 (ac/amax)^−1.478] + 0.424 M, σ = 0.454', () => {
  test.each(RATIOS.flatMap((r) => [5.5, 6.5, 7.5].map((m) => [r, m])))(
    'ac/amax = %f, M = %f',
    (r, m) => {
      const pga = 0.3;
      const d = evaluate('10^(-2.710 + log10((1 - r)^2.335 * r^(-1.478)) + 0.424 * M)', {
        r,
        M: m,
      }) as number;
      const e = slidingBlockEstimate(jibson2007Magnitude, r * pga, pga, m)!;
      expect(Math.abs(e.median - d / 100) / (d / 100)).toBeLessThan(1e-12);
      expect(Math.abs(e.plusOneSd - (d / 100) * 10 ** 0.454) / e.plusOneSd).toBeLessThan(1e-12);
    },
  );

  test('Kramer & Stewart (2024), Example 10.4: ay = 0.067 g, amax = 0.10 g, M 6.7 → log D = −0.7364, D50 = 0.18 cm, D84 = 0.52 cm', () => {
    const e = slidingBlockEstimate(jibson2007Magnitude, 0.067, 0.1, 6.7)!;
    expect(Math.log10(e.median * 100).toFixed(4)).toBe('-0.7364');
    expect((e.median * 100).toFixed(2)).toBe('0.18');
    expect((e.plusOneSd * 100).toFixed(2)).toBe('0.52');
    expect(e.inRange).toBe(true);
  });

  test('no magnitude, no estimate', () => {
    expect(slidingBlockEstimate(jibson2007Magnitude, 0.1, 0.3, null)).toBeNull();
  });
});

describe('Ambraseys & Menu (1988): log u = 0.90 + log[(1 − ac/amax)^2.53 (ac/amax)^−1.09], u in cm, σ = 0.30', () => {
  test.each(RATIOS)('ac/amax = %f', (r) => {
    const pga = 0.5;
    const u = evaluate('10^(0.90 + log10((1 - r)^2.53 * r^(-1.09)))', { r }) as number;
    const e = slidingBlockEstimate(ambraseysMenu1988, r * pga, pga, null)!;
    expect(e.relation).toBe('ambraseys-menu-1988');
    expect(Math.abs(e.median - u / 100) / (u / 100)).toBeLessThan(1e-12);
    expect(Math.abs(e.plusOneSd - (u / 100) * 10 ** 0.3) / e.plusOneSd).toBeLessThan(1e-12);
  });

  test('Jibson (2007) eq. 6 gives about one third of the Ambraseys & Menu median (Kramer & Stewart 2024, §10.9.2)', () => {
    for (const r of [0.2, 0.35, 0.5, 0.67, 0.8, 0.9]) {
      const ratio =
        slidingBlockEstimate(jibson2007, r, 1, null)!.median /
        slidingBlockEstimate(ambraseysMenu1988, r, 1, null)!.median;
      expect(ratio).toBeGreaterThan(0.25);
      expect(ratio).toBeLessThan(0.4);
    }
  });
});

describe('the sliding block outside the relations', () => {
  test('ky ≥ amax: zero displacement (the block does not slide; Newmark 1965)', () => {
    for (const relation of [jibson2007, jibson2007Magnitude, ambraseysMenu1988]) {
      for (const ky of [0.25, 0.3]) {
        const e = slidingBlockEstimate(relation, ky, 0.25, 6.5)!;
        expect(e.median).toBe(0);
        expect(e.plusOneSd).toBe(0);
        expect(e.warnings.map((w) => w.code)).toEqual(['no-sliding']);
      }
    }
  });

  test('outside the fitted ranges: a warning each, inRange false', () => {
    // Ambraseys & Menu: ac/amax < 0.1 and Ms outside 6.6–7.3
    const am = slidingBlockEstimate(ambraseysMenu1988, 0.02, 0.4, 5.8)!;
    expect(am.inRange).toBe(false);
    expect(am.warnings).toHaveLength(2);
    expect(am.warnings.every((w) => w.code === 'displacement-outside-range')).toBe(true);
    expect(am.warnings[0].message).toContain('ac/amax = 0.050');
    expect(am.warnings[1].message).toContain('M = 5.8 lies outside the 6.6–7.3');
    // Jibson: M 8 above 5.3–7.6, ky 0.6 g above 0.4 g
    const j = slidingBlockEstimate(jibson2007Magnitude, 0.6, 0.9, 8)!;
    expect(j.inRange).toBe(false);
    expect(j.warnings.map((w) => w.message.split(' = ')[0])).toEqual([
      'Jibson (2007), eq. 7: M',
      'Jibson (2007), eq. 7: ky (g)',
    ]);
    // inside every range: none
    expect(slidingBlockEstimate(jibson2007, 0.1, 0.25, 6.8)!.warnings).toEqual([]);
  });
});

describe('the seismic report of a case', () => {
  test('dry infinite slope β = 20°, φ′ = 30° (ky = tan 10°), pga 0.3 g, M 6.5, allowable 0.1 m', () => {
    const out = seismicReport(infiniteFsAt(20, 30), {
      pga: 0.3,
      magnitude: 6.5,
      allowableDisplacement: 0.1,
    });
    const ky = evaluate('tan(10 deg)') as number;
    const s = out.seismic;
    expect(Math.abs(s.ky! - ky)).toBeLessThan(2e-3);
    expect(s.kySurface).toEqual({ type: 'plane', angle: 20, depth: 3 });
    expect(s.analyses).toBe(out.yield.analyses);
    expect(s.displacements.map((e) => e.relation)).toEqual([
      'jibson-2007',
      'jibson-2007-magnitude',
      'ambraseys-menu-1988',
    ]);
    // each median from its published equation at the ky found (m)
    const r = s.ky! / 0.3;
    const dj = evaluate('10^(0.215 + log10((1 - r)^2.341 * r^(-1.438))) / 100', { r }) as number;
    const dm = evaluate('10^(-2.710 + log10((1 - r)^2.335 * r^(-1.478)) + 0.424 * 6.5) / 100', {
      r,
    }) as number;
    const da = evaluate('10^(0.90 + log10((1 - r)^2.53 * r^(-1.09))) / 100', { r }) as number;
    expect(s.displacements[0].median).toBeCloseTo(dj, 12);
    expect(s.displacements[1].median).toBeCloseTo(dm, 12);
    expect(s.displacements[2].median).toBeCloseTo(da, 12);
    // the largest median is Ambraseys & Menu's, 0.015 m: within 0.1 m, not within 0.01 m
    expect(Math.max(...s.displacements.map((e) => e.median))).toBe(s.displacements[2].median);
    expect(da.toFixed(3)).toBe('0.015');
    // M 6.5 lies below the magnitudes of Ambraseys & Menu's data (6.6–7.3)
    expect(out.warnings.map((w) => w.message)).toEqual([
      'Ambraseys & Menu (1988): M = 6.5 lies outside the 6.6–7.3 of the data it was fitted to; the estimate is an extrapolation',
    ]);
    expect(s.displacements.map((e) => e.inRange)).toEqual([true, true, false]);
    expect(s.allowable).toBe(0.1);
    expect(s.within).toBe(true);
    expect(
      seismicReport(infiniteFsAt(20, 30), { pga: 0.3, magnitude: 6.5, allowableDisplacement: 0.01 })
        .seismic.within,
    ).toBe(false);
  });

  test('not stable statically: ky = 0, no displacement, not within any allowable', () => {
    const out = seismicReport(infiniteFsAt(30, 28), {
      pga: 0.3,
      magnitude: null,
      allowableDisplacement: 0.5,
    });
    expect(out.seismic.ky).toBe(0);
    expect(out.seismic.displacements).toEqual([]);
    expect(out.seismic.within).toBe(false);
    expect(out.warnings.map((w) => w.code)).toEqual(['statically-unstable']);
  });

  test('ky above the cap and pga below it: every relation gives zero, within the allowable', () => {
    const out = seismicReport(infiniteFsAt(5, 55), {
      pga: 0.4,
      magnitude: 7,
      allowableDisplacement: 0.05,
    });
    expect(out.seismic.ky).toBeNull();
    expect(out.seismic.kySurface).toBeNull();
    expect(out.seismic.displacements.map((e) => e.median)).toEqual([0, 0, 0]);
    expect(out.seismic.displacements[0].warnings[0].message).toContain(
      'ky > 1.000 ≥ pga = 0.400 g',
    );
    expect(out.seismic.within).toBe(true);
    expect(out.warnings.map((w) => w.code)).toEqual(['yield-above-cap', 'no-sliding']);
    // a pga above the cap: no estimate
    const strong = seismicReport(infiniteFsAt(5, 55), {
      pga: 1.2,
      magnitude: null,
      allowableDisplacement: 0.05,
    });
    expect(strong.seismic.displacements).toEqual([]);
    expect(strong.seismic.within).toBeNull();
    expect(strong.warnings.map((w) => w.code)).toEqual([
      'yield-above-cap',
      'displacement-not-estimated',
    ]);
  });

  test('no earthquake given: ky alone', () => {
    const out = seismicReport(infiniteFsAt(20, 30), null);
    expect(out.seismic.ky!).toBeGreaterThan(0.17);
    expect(out.seismic.pga).toBeNull();
    expect(out.seismic.displacements).toEqual([]);
    expect(out.seismic.within).toBeNull();
  });
});
