/**
 * The front door on every example: each of the eight methods runs (or says why it does not
 * apply), never returns NaN or hangs, and every result matches schemas/result.schema.json.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv2020 from 'ajv/dist/2020';
import { resultSchema } from '@scarpline/schemas';
import {
  CAUTION,
  METHOD_IDS,
  US_TO_SI,
  analyzeSection,
  caseSection,
  caseView,
  parseSections,
  type Section,
} from '@scarpline/core';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const files = readdirSync(EXAMPLES).filter((f) => /\.ya?ml$/.test(f));
// every example section, each of its design cases as the section that case sees
const sections: [string, Section][] = files.flatMap((f) =>
  parseSections(readFileSync(join(EXAMPLES, f), 'utf8'), f).sections.flatMap((s) =>
    s.cases
      ? s.cases.map((c) => [`${f} ${s.id} ${c.name}`, caseSection(s, c)] as [string, Section])
      : [[`${f} ${s.id}`, s] as [string, Section]],
  ),
);
const validate = new Ajv2020({ strict: false }).compile(resultSchema);

describe('analyzeSection on every example, every method', () => {
  test.each(sections)('%s', (_name, section) => {
    const all = { ...section, analysis: { ...section.analysis, methods: [...METHOD_IDS] } };
    if (!all.analysis.infiniteSlope)
      all.analysis.infiniteSlope = { angle: 20, depth: 2, waterRatio: 0 };
    const station = analyzeSection(all);
    const json = JSON.stringify(station);
    expect(json).not.toMatch(/NaN|Infinity/);
    expect(validate(JSON.parse(json))).toBe(true);
    expect(station.caution).toBe(CAUTION);
    // a file without cases is its one case, and the station's verdict is that case's
    expect(station.cases).toHaveLength(1);
    const r = caseView(station);
    expect(station.verdict).toBe(r.verdict);
    expect(r.results.map((m) => m.method)).toEqual([...METHOD_IDS]);
    for (const m of r.results) {
      if (m.converged) {
        expect(m.fs).toBeGreaterThan(0.2);
        expect(m.fs).toBeLessThan(20);
      } else {
        expect(m.reason).toEqual(expect.any(String));
      }
    }
    // the slice methods that apply to any circle all converge on the examples' circles — but on
    // the nailed cut's critical circle (a small mass under four rows of nails) no (F, λ) exists:
    // scanned over λ from −1.5 to 1.5, Fm and Ff come within 0.7 % of each other but never meet,
    // and the rigorous methods say so (their reason is checked above)
    const rigorous = section.reinforcement.some((e) => e.type === 'nail')
      ? []
      : (['spencer', 'morgenstern-price'] as const);
    for (const id of ['bishop', 'janbu', ...rigorous] as const) {
      expect(r.results.find((m) => m.method === id)?.converged).toBe(true);
    }
    const converged = r.results.filter((m) => m.converged).map((m) => m.fs as number);
    expect(r.governing?.fs).toBe(Math.min(...converged));
    expect(r.verdict).toBe(r.governing!.fs >= section.analysis.requiredFs! ? 'meets' : 'below');
  });
});

describe('units: a us file is answered in us units', () => {
  const [, us] = sections.find(([n]) => n.startsWith('cut-us-units'))!;
  const inUs = caseView(analyzeSection(us));
  const inSi = caseView(analyzeSection({ ...us, units: 'si' }));
  test('the same factors of safety either way (the solver works in SI)', () => {
    for (let i = 0; i < inUs.results.length; i++)
      expect(inUs.results[i].fs).toBeCloseTo(inSi.results[i].fs!, 12);
  });
  test('lengths in ft, forces in lbf/ft, pressures in psf (exact NIST factors)', () => {
    const ft = 0.3048;
    const lbfPerFt = 4.4482216152605e-3 / ft; // kN/m per lbf/ft
    const psf = 4.4482216152605e-3 / (ft * ft); // kPa per psf
    const a = inUs.results[0];
    const b = inSi.results[0];
    expect(a.slices.length).toBe(b.slices.length);
    for (let i = 0; i < a.slices.length; i++) {
      expect(a.slices[i].x * ft).toBeCloseTo(b.slices[i].x, 9);
      expect(a.slices[i].weight * lbfPerFt).toBeCloseTo(b.slices[i].weight, 6);
      expect(a.slices[i].porePressure * psf).toBeCloseTo(b.slices[i].porePressure, 6);
    }
    if (a.surface?.type === 'circle' && b.surface?.type === 'circle')
      expect(a.surface.radius * ft).toBeCloseTo(b.surface.radius, 9);
    expect(US_TO_SI.length).toBe(ft);
  });
});

describe('a searched surface: the result carries the search and still matches the schema', () => {
  test.each(sections)('%s', (_name, section) => {
    const station = analyzeSection({
      ...section,
      analysis: { ...section.analysis, surface: { type: 'auto' } },
    });
    expect(validate(JSON.parse(JSON.stringify(station)))).toBe(true);
    const r = caseView(station);
    expect(r.search?.map?.fs.length).toBeGreaterThan(0);
    const band = r.search!.trialBand;
    expect(band.within).toBe(0.05);
    expect(band.surfaces.length).toBeGreaterThan(0);
    expect(band.surfaces.length).toBeLessThanOrEqual(Math.min(100, band.count));
    // the lowest trial circle is not below the governing FS by more than the fast slicing's error
    const least = band.surfaces[0].fs;
    expect(least).toBeGreaterThan(0.98 * r.governing!.fs);
    // every one kept is within the band of the least, lowest first
    band.surfaces.forEach((t, i) => {
      expect(t.fs).toBeLessThanOrEqual(1.05 * least * (1 + 1e-12));
      if (i > 0) expect(t.fs).toBeGreaterThanOrEqual(band.surfaces[i - 1].fs);
    });
  });

  test('analysis.trialBand sets the band: a wider one keeps at least as many, 0 keeps none', () => {
    const s = sections[0][1];
    const run = (trialBand: number) =>
      caseView(
        analyzeSection({ ...s, analysis: { ...s.analysis, surface: { type: 'auto' }, trialBand } }),
      ).search!.trialBand;
    const [none, narrow, wide] = [run(0), run(0.02), run(0.2)];
    expect(none).toEqual({ within: 0, count: 0, surfaces: [] });
    expect(wide.count).toBeGreaterThanOrEqual(narrow.count);
    expect(narrow.count).toBeGreaterThan(0);
    const least = wide.surfaces[0].fs;
    for (const t of wide.surfaces) expect(t.fs).toBeLessThanOrEqual(1.2 * least * (1 + 1e-12));
    expect(wide.surfaces.some((t) => t.fs > 1.02 * least)).toBe(true);
  });
});
