/**
 * A station under several design cases: each case analysed with its own settings, the
 * governing case, the station's verdict, the methods that govern, no significant slope, and a
 * seismic case's yield coefficient through the whole analysis.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { analyzeSection, designCases, parseSections, stationInUnits, stationVerdict } from '../src';
import type { DesignCase, Section } from '../src/model/types';
import { makeSection, mc } from './helpers/make-section';

/** A case of the section's own settings with some replaced. */
function caseOf(s: Section, over: Partial<DesignCase>): DesignCase {
  return { ...designCases(s)[0], ...over };
}

/** The homogeneous 2:1 cut of the helpers, on a given circle, with several methods. */
const cut = makeSection({
  analysis: {
    methods: ['bishop', 'spencer', 'ordinary'],
    slices: 30,
    surface: { type: 'circle', center: [12, 32], radius: 22 },
    infiniteSlope: null,
    case: null,
    requiredFs: 1.3,
  },
});

describe('the station under its cases', () => {
  test('the verdict of a station is the worst of its cases', () => {
    expect(stationVerdict(['meets', 'meets'])).toBe('meets');
    expect(stationVerdict(['meets', 'below', 'no-requirement'])).toBe('below');
    expect(stationVerdict(['meets', 'no-fs'])).toBe('no-fs');
    expect(stationVerdict(['no-slope', 'meets'])).toBe('meets');
    expect(stationVerdict(['no-slope'])).toBe('no-slope');
  });

  test('each case with its own water and requirement; the governing case by FS / required FS', () => {
    const dry = caseOf(cut, {
      name: 'end of construction',
      kind: 'end-of-construction',
      requiredFs: 1.3,
    });
    const wet = caseOf(cut, {
      name: 'long term',
      kind: 'long-term',
      requiredFs: 1.5,
      water: { kind: 'ru', ru: 0.3, unitWeight: 9.81 },
    });
    const r = analyzeSection({ ...cut, cases: [dry, wet] });
    expect(r.cases.map((c) => c.name)).toEqual(['end of construction', 'long term']);
    const [a, b] = r.cases;
    // the same circle, pore pressure lowers every method's FS
    expect(b.governing!.fs).toBeLessThan(a.governing!.fs);
    expect(a.ratio).toBeCloseTo(a.governing!.fs / 1.3, 12);
    expect(b.ratio).toBeCloseTo(b.governing!.fs / 1.5, 12);
    // each case as the same section analysed alone
    const alone = analyzeSection({
      ...cut,
      water: wet.water,
      analysis: { ...cut.analysis, requiredFs: 1.5 },
    });
    expect(b.governing).toEqual(alone.cases[0].governing);
    const gov = a.ratio! < b.ratio! ? a : b;
    expect(r.governing).toEqual({
      case: gov.name,
      method: gov.governing!.method,
      fs: gov.governing!.fs,
      requiredFs: gov.requiredFs,
      ratio: gov.ratio,
    });
    expect(r.verdict).toBe(stationVerdict(r.cases.map((c) => c.verdict)));
  });

  test('only the methods a case names govern it; the others are for comparison', () => {
    const all = analyzeSection({ ...cut, cases: [caseOf(cut, { name: 'all' })] }).cases[0];
    const byMethod = Object.fromEntries(all.results.map((m) => [m.method, m.fs!]));
    // the ordinary method gives the lowest FS on this circle
    expect(all.governing!.method).toBe('ordinary');
    const spencerOnly = analyzeSection({
      ...cut,
      cases: [caseOf(cut, { name: 'rigorous', governs: ['spencer'] })],
    }).cases[0];
    expect(spencerOnly.governs).toEqual(['spencer']);
    expect(spencerOnly.governing).toEqual({ method: 'spencer', fs: byMethod.spencer });
    expect(spencerOnly.results).toHaveLength(3);
  });

  test('ground that hardly rises has no significant slope, said in words', () => {
    const flat = makeSection({
      ground: [
        [0, 10],
        [20, 10.2],
        [40, 10.3],
      ],
      analysis: { ...cut.analysis, surface: { type: 'auto' } },
    });
    const r = analyzeSection(flat);
    expect(r.verdict).toBe('no-slope');
    expect(r.governing).toBeNull();
    expect(r.cases[0].warnings.map((w) => w.code)).toContain('no-significant-slope');
  });
});

describe('a seismic case: the yield coefficient through the whole analysis', () => {
  // Dry cohesionless infinite slope: F = tan φ′ (1 − kh tan β) / (tan β + kh) (the infinite
  // slope with a horizontal force kh·W, methods/infinite-slope.ts); F = 1 gives
  // kh = (tan φ′ − tan β) / (1 + tan φ′ tan β) = tan(φ′ − β) (closed form)
  test.each([
    [20, 30],
    [25, 35],
    [30, 38],
  ])('infinite slope β = %d°, φ′ = %d°: ky = tan(φ′ − β)', (beta, phi) => {
    const s = makeSection({
      materials: { soil: mc('soil', 19, 0, phi) },
      analysis: {
        methods: ['infinite-slope'],
        slices: 30,
        surface: null,
        infiniteSlope: { angle: beta, depth: 3, waterRatio: 0 },
        case: null,
        requiredFs: 1.1,
      },
    });
    const eq = caseOf(s, {
      name: 'earthquake',
      kind: 'seismic',
      requiredFs: 1.0,
      seismic: { kh: 0.05, kv: 0 },
      earthquake: { pga: 0.4, magnitude: 6.5, allowableDisplacement: 0.1 },
    });
    const r = analyzeSection({ ...s, cases: [eq] });
    const seismic = r.cases[0].seismic!;
    expect(seismic.ky).toBeCloseTo(Math.tan(((phi - beta) * Math.PI) / 180), 3);
    // displacements in mm for an si file; the allowable as given, 0.1 m = 100 mm
    expect(seismic.allowable).toBeCloseTo(100, 9);
    expect(seismic.displacements.length).toBeGreaterThan(0);
    const largest = Math.max(...seismic.displacements.map((d) => d.median));
    expect(seismic.within).toBe(largest <= 100);
    if (seismic.within === false) expect(r.cases[0].verdict).toBe('below');
  });
});

describe('a rapid-drawdown case through the whole analysis', () => {
  // the levee example (our own invented Wendle flood bank): its drawdown case is analysed by
  // the three stages, and the case's FS is the last stage's
  const text = readFileSync(
    join(__dirname, '..', '..', '..', 'examples', 'levee-drawdown-seismic.yaml'),
    'utf8',
  );
  const [levee] = parseSections(text, 'levee-drawdown-seismic.yaml').sections;

  test('the case reports its stages, and its governing FS is stage 3 of the governing method', () => {
    const r = analyzeSection(levee);
    const dd = r.cases.find((c) => c.kind === 'rapid-drawdown')!;
    expect(dd.drawdown).toBeDefined();
    expect(dd.drawdown!.stages.map((s) => s.stage)).toEqual([1, 2, 3]);
    expect(dd.governing!.fs).toBeCloseTo(dd.drawdown!.stages[2].fs!, 9);
    // stage 3 keeps the weaker of the undrained and drained strength on each base
    expect(dd.drawdown!.stages[2].fs!).toBeLessThanOrEqual(dd.drawdown!.stages[1].fs! + 1e-9);
    expect(dd.drawdown!.slices.length).toBeGreaterThan(0);
    // the other cases have no drawdown
    expect(r.cases.filter((c) => c.drawdown)).toHaveLength(1);
  });

  test('in us units the slices of the drawdown report are in ft and psf', () => {
    const si = analyzeSection(levee).cases.find((c) => c.drawdown)!.drawdown!;
    // an si result converted, as scarpline analyze --units us writes it
    const converted = stationInUnits(analyzeSection(levee), 'us').cases.find((c) => c.drawdown)!;
    for (const us of [converted.drawdown!]) {
      // 1 ft = 0.3048 m, 1 psf = 0.04788025898 kPa (NIST SP 811, B.8)
      expect(us.slices[0].x).toBeCloseTo(si.slices[0].x / 0.3048, 9);
      expect(us.slices[0].strength).toBeCloseTo(si.slices[0].strength / 0.04788025898, 6);
      expect(us.stages).toEqual(si.stages);
    }
  });
});
