import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  analyzeSection,
  caseSection,
  caseView,
  designCases,
  formatMessage,
  meanOf,
  parseSections,
  parseTarget,
  targetValue,
  type Polyline,
  type Section,
} from '@scarpline/core';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const yamlFiles = readdirSync(EXAMPLES)
  .filter((f) => /\.ya?ml$/.test(f))
  .sort();

function read(file: string): ReturnType<typeof parseSections> {
  return parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file);
}

/** y of a polyline (x increasing) by linear interpolation; independent of the product's code. */
function y(line: Polyline, x: number): number {
  for (let i = 1; i < line.length; i++) {
    const [x0, y0] = line[i - 1];
    const [x1, y1] = line[i];
    if (x >= x0 && x <= x1) return x1 === x0 ? y1 : y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
  }
  return NaN;
}

describe('examples', () => {
  test('there are at least six section files and a corridor batch', () => {
    expect(yamlFiles.length).toBeGreaterThanOrEqual(6);
    expect(readdirSync(join(EXAMPLES, 'corridor'))).toEqual(
      expect.arrayContaining(['generate.js', 'corridor.json']),
    );
  });

  test.each(yamlFiles)('%s is valid, without warnings, and described in a header', (file) => {
    const { sections, messages } = read(file);
    expect(messages.map(formatMessage)).toEqual([]);
    expect(sections.length).toBeGreaterThanOrEqual(1);
    expect(readFileSync(join(EXAMPLES, file), 'utf8').startsWith('# ')).toBe(true);
    // every case is named and has its requirement: the section's own, or each of its cases
    for (const c of sections.flatMap(designCases)) {
      expect(c.name).not.toBe('as given');
      expect(c.requiredFs).toEqual(expect.any(Number));
    }
  });

  test('the corridor batch is valid and has at least 50 stations', () => {
    const file = join(EXAMPLES, 'corridor', 'corridor.json');
    const { sections, messages } = parseSections(readFileSync(file, 'utf8'), 'corridor.json');
    expect(messages.map(formatMessage)).toEqual([]);
    expect(sections.length).toBeGreaterThanOrEqual(50);
    expect(new Set(sections.map((s) => s.id)).size).toBe(sections.length);
    // Both cut (ground rising away from the road) and embankment (falling) sections occur.
    const rises = sections.map((s) => s.ground[s.ground.length - 1][1] > s.ground[0][1]);
    expect(rises).toContain(true);
    expect(rises).toContain(false);
  });

  test("the corridor's cases: long term (each station's own settings, as the file had them before its cases), earthquake, and end of construction on embankment", () => {
    const file = join(EXAMPLES, 'corridor', 'corridor.json');
    const { sections } = parseSections(readFileSync(file, 'utf8'), 'corridor.json');
    const names = new Set(sections.map((s) => s.cases!.map((c) => c.name).join(', ')));
    expect(names).toEqual(
      new Set(['long term, earthquake', 'long term, earthquake, end of construction']),
    );
    for (const s of sections) {
      const [longTerm, quake] = s.cases!;
      const { cases: _view, ...view } = caseSection(s, longTerm);
      const { cases: _own, ...own } = s;
      expect(view).toEqual({ ...own, analysis: { ...own.analysis, case: 'long term' } });
      expect(quake).toMatchObject({
        kind: 'seismic',
        requiredFs: 1.1,
        seismic: { kh: 0.1, kv: 0 },
      });
    }
  });

  test("the corridor with uncertain strengths: the demo corridor's stations, long term only, every station with its random variables at the values it analyses", () => {
    const read = (name: string) =>
      parseSections(readFileSync(join(EXAMPLES, 'corridor', name), 'utf8'), name);
    const main = read('corridor.json').sections;
    const { sections, messages } = read('wendlecombe-uncertain.json');
    expect(messages.map(formatMessage)).toEqual([]);
    expect(sections.map((s) => [s.station, s.ground])).toEqual(
      main.map((s) => [s.station, s.ground]),
    );
    for (const s of sections) {
      expect(s.cases!.map((c) => c.kind)).toEqual(['long-term']);
      const p = s.probability!;
      expect(p).toMatchObject({ surface: 'critical', realisations: 1000 });
      const targets = p.variables.map((v) => v.target);
      expect(targets.slice(0, 2)).toEqual([
        'materials.weathered-mudstone.cohesion',
        'materials.weathered-mudstone.frictionAngle',
      ]);
      // an embankment's fill is uncertain too
      expect(targets.includes('materials.fill.frictionAngle')).toBe('fill' in s.materials);
      // each mean is the value the section analyses: a station's P_f starts from its own run
      for (const v of p.variables) {
        const t = parseTarget(v.target);
        if (!t.ok) throw new Error(t.reason);
        const now = targetValue(s, t.target);
        expect(now.ok && now.value).toBe(meanOf(v.distribution));
      }
    }
  });

  test('the cases asked for are all there', () => {
    const all: Section[] = yamlFiles.flatMap((f) => read(f).sections);
    const models = (s: Section) => Object.values(s.materials).map((m) => m.strength.model);
    // A homogeneous c′-φ′ cut.
    expect(all.some((s) => s.strata.length === 1 && models(s)[0] === 'mohr-coulomb')).toBe(true);
    // Undrained soft clay with Su growing with depth over a rigid base.
    expect(
      all.some(
        (s) =>
          Object.values(s.materials).some(
            (m) => m.strength.model === 'undrained' && m.strength.suRate > 0,
          ) && models(s).includes('rigid'),
      ),
    ).toBe(true);
    // Ponded water: the piezometric line above the ground somewhere.
    expect(
      all.some(
        (s) => s.water.kind === 'piezometric' && s.water.line.some(([x, w]) => w > y(s.ground, x)),
      ),
    ).toBe(true);
    // Morgenstern–Price with an interslice function given as points.
    expect(all.some((s) => s.analysis.interslice?.shape === 'piecewise-linear')).toBe(true);
    // A clean sand (c′ = 0).
    expect(
      all.some((s) =>
        Object.values(s.materials).some(
          (m) => m.strength.model === 'mohr-coulomb' && m.strength.cohesion === 0,
        ),
      ),
    ).toBe(true);
    // Strip and line loads with kh.
    expect(
      all.some(
        (s) =>
          s.seismic.kh > 0 &&
          s.loads.some((l) => l.type === 'strip') &&
          s.loads.some((l) => l.type === 'line'),
      ),
    ).toBe(true);
    // US units.
    expect(all.some((s) => s.units === 'us')).toBe(true);
  });

  // Each given circle enters the ground once and leaves it once, runs below the ground between,
  // and stays out of any rigid base. Checked by sampling the lower arc against the polylines.
  const circles = yamlFiles.flatMap((file) =>
    read(file)
      .sections.filter((s) => s.analysis.surface?.type === 'circle')
      .map((s) => [`${file} ${s.id}`, s] as const),
  );
  test.each(circles)('%s: the circle cuts the ground cleanly', (_name, s) => {
    const surface = s.analysis.surface;
    if (!surface || surface.type !== 'circle' || !('radius' in surface)) throw new Error('circle');
    const [cx, cy] = surface.center;
    const r = surface.radius;
    const x0 = Math.max(s.ground[0][0], cx - r);
    const x1 = Math.min(s.ground[s.ground.length - 1][0], cx + r);
    const arc = (x: number) => cy - Math.sqrt(Math.max(0, r * r - (x - cx) ** 2));
    const n = 20000;
    const crossings: number[] = [];
    let previous = 0;
    for (let k = 0; k <= n; k++) {
      const x = x0 + ((x1 - x0) * k) / n;
      const d = y(s.ground, x) - arc(x);
      if (k > 0 && Math.sign(d) !== Math.sign(previous)) crossings.push(x);
      previous = d;
    }
    expect(crossings).toHaveLength(2);
    const [entry, exit] = crossings;
    // Both crossings are on the ground, not at its ends.
    expect(entry).toBeGreaterThan(s.ground[0][0]);
    expect(exit).toBeLessThan(s.ground[s.ground.length - 1][0]);
    const rigid = s.strata.find((t) => s.materials[t.material].strength.model === 'rigid');
    for (let k = 1; k < 200; k++) {
      const x = entry + ((exit - entry) * k) / 200;
      expect(arc(x)).toBeLessThan(y(s.ground, x));
      if (rigid) expect(arc(x)).toBeGreaterThan(y(rigid.top, x));
    }
  });
});

describe('embankment-stages.yaml: one section of two cases for the two documents it replaces', () => {
  // The file as it was: the whole section written twice, one design case a document.
  const fixture = join(__dirname, 'fixtures', 'embankment-stages-two-documents.yaml');
  const documents = parseSections(readFileSync(fixture, 'utf8'), 'two-documents.yaml').sections;
  const [section] = read('embankment-stages.yaml').sections;

  test('one section with the two cases, in the order of the documents', () => {
    expect(read('embankment-stages.yaml').sections).toHaveLength(1);
    expect(documents.map((d) => [d.analysis.case, d.analysis.requiredFs])).toEqual([
      ['end-of-construction', 1.3],
      ['long-term', 1.5],
    ]);
    expect(section.cases!.map((c) => [c.kind, c.requiredFs])).toEqual([
      ['end-of-construction', 1.3],
      ['long-term', 1.5],
    ]);
  });

  test.each([0, 1])('case %i sees the section its document gave, and gives its numbers', (i) => {
    const view = caseSection(section, section.cases![i]);
    const document = documents[i];
    for (const key of [
      'ground',
      'materials',
      'strata',
      'water',
      'loads',
      'seismic',
      'crack',
    ] as const)
      expect(view[key]).toEqual(document[key]);
    expect({ ...view.analysis, case: null }).toEqual({ ...document.analysis, case: null });
    const fs = (s: Section) => caseView(analyzeSection(s)).results.map((r) => [r.method, r.fs]);
    const numbers = fs(view);
    expect(numbers).toEqual(fs(document));
    expect(numbers.every(([, f]) => typeof f === 'number' && f > 0.5 && f < 5)).toBe(true);
  });

  test('the station analyzed whole gives each case the numbers and verdict of its document', () => {
    const station = analyzeSection(section);
    expect(station.cases.map((c) => c.name)).toEqual(['end of construction', 'long term']);
    station.cases.forEach((c, i) => {
      const alone = caseView(analyzeSection(documents[i]));
      expect(c.results.map((r) => [r.method, r.fs])).toEqual(
        alone.results.map((r) => [r.method, r.fs]),
      );
      expect([c.requiredFs, c.verdict]).toEqual([alone.requiredFs, alone.verdict]);
    });
  });
});
