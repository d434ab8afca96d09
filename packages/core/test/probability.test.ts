/**
 * The parts of the probabilistic analysis that are not formulas (tests/verification/
 * probability.test.ts checks those): targets, the section file's `probability` and its
 * messages, the units of a variable, repeatable and chunkable realisations, progress.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { evaluate } from 'mathjs';
import {
  analyzeProbability,
  analyzeSection,
  caseModels,
  criticalOf,
  applyValue,
  caseProbability,
  formatMessage,
  meanOf,
  parseSections,
  parseTarget,
  probabilityRun,
  quantile,
  realisationsFs,
  sdOf,
  sensitivity,
  stationProbability,
  stationProbabilityOrWarning,
  targetValue,
  type Distribution,
  type Section,
  type Target,
} from '@scarpline/core';

const EXAMPLE = join(__dirname, '..', '..', '..', 'examples', 'levee-probability.yaml');
const text = readFileSync(EXAMPLE, 'utf8');
const section = (): Section => parseSections(text, 'levee-probability.yaml').sections[0];
const target = (t: string): Target => {
  const p = parseTarget(t);
  if (!p.ok) throw new Error(p.reason);
  return p.target;
};

describe('targets: one home for a numeric input of a section', () => {
  test.each([
    ['materials.bank-clay.cohesion', 4],
    ['materials.bank-clay.frictionAngle', 27],
    ['materials.bank-clay.unitWeight', 19],
    ['materials.sand.saturatedUnitWeight', 20.5],
    ['water.level', 0],
    ['seismic.kh', 0],
    ['ground.2.y', 30],
    ['ground.4.x', 47],
  ])('%s reads %d from the example', (t, v) => {
    expect(targetValue(section(), target(t))).toEqual({ ok: true, value: v });
  });

  test('tan φ′ sets the friction angle to its arctangent', () => {
    const s = applyValue(section(), target('materials.sand.tanFrictionAngle'), 1);
    expect(s.ok && s.section.materials.sand.strength).toEqual({
      model: 'mohr-coulomb',
      cohesion: 0,
      frictionAngle: 45,
    });
  });

  test('applying a value gives a new section and leaves the one given as it was', () => {
    const s = section();
    const before = JSON.stringify(s);
    const w = applyValue(s, target('water.level'), -1.5);
    const g = applyValue(s, target('ground.2.y'), 31);
    const c = applyValue(s, target('materials.alluvium.cohesion'), 7);
    expect(JSON.stringify(s)).toBe(before);
    if (!w.ok || !g.ok || !c.ok) throw new Error('refused');
    expect(w.section.water.kind === 'piezometric' && w.section.water.line[0]).toEqual([0, 27.5]);
    expect(g.section.ground[2]).toEqual([28, 31]);
    expect(g.section.strata[0].top[2]).toEqual([28, 31]);
    expect(c.section.materials.alluvium.strength).toMatchObject({ cohesion: 7 });
    expect(c.section.materials['bank-clay']).toBe(s.materials['bank-clay']);
  });

  test('a target the section does not have, or a value it cannot take, is refused with the reason', () => {
    expect(applyValue(section(), target('materials.peat.cohesion'), 3)).toEqual({
      ok: false,
      reason: 'the section has no material "peat" (it has bank-clay, alluvium, sand)',
    });
    expect(applyValue(section(), target('materials.sand.su'), 3)).toMatchObject({
      ok: false,
      reason: 'material "sand" (mohr-coulomb) has no su',
    });
    expect(applyValue(section(), target('ground.1.x'), 50)).toMatchObject({ ok: false });
    expect(applyValue(section(), target('loads.0.pressure'), 10)).toMatchObject({ ok: false });
    expect(parseTarget('strata.0.top')).toMatchObject({ ok: false });
    expect(parseTarget('materials.clay.colour')).toMatchObject({ ok: false });
  });
});

describe('distributions', () => {
  // references evaluated with mathjs from the textbook forms
  test.each<[Distribution, number, number]>([
    [{ kind: 'uniform', min: 2, max: 6 }, 4, evaluate('4 / sqrt(12)')],
    [
      { kind: 'triangular', min: 0, mode: 1, max: 4 },
      5 / 3,
      evaluate('sqrt((0 + 16 + 1 - 0 - 0 - 4) / 18)'),
    ],
    [{ kind: 'lognormal', mean: 4, sd: 1.6 }, 4, 1.6],
  ])('%o: mean %d and SD %d', (d, mean, sd) => {
    expect(meanOf(d)).toBeCloseTo(mean, 12);
    expect(sdOf(d)).toBeCloseTo(sd, 12);
  });

  test('a truncated normal: its quantiles stay within the bounds; mean and SD against a numerical integral', () => {
    const d: Distribution = { kind: 'truncated-normal', mean: 25, sd: 3, min: 21, max: 35 };
    expect(quantile(d, 1e-9)).toBeGreaterThanOrEqual(21);
    expect(quantile(d, 1 - 1e-9)).toBeLessThanOrEqual(35);
    expect(quantile(d, 0.5)).toBeGreaterThan(25);
    const pdf = (x: number) => Math.exp(-0.5 * ((x - 25) / 3) ** 2);
    let z = 0;
    let m1 = 0;
    let m2 = 0;
    const n = 20000;
    for (let i = 0; i < n; i++) {
      const x = 21 + ((i + 0.5) * 14) / n;
      z += pdf(x);
      m1 += x * pdf(x);
      m2 += x * x * pdf(x);
    }
    const mean = m1 / z;
    expect(meanOf(d)).toBeCloseTo(mean, 6);
    expect(sdOf(d)).toBeCloseTo(Math.sqrt(m2 / z - mean * mean), 6);
  });

  test('the normal quantile is stdlib’s: Φ⁻¹(0.975) = 1.959964 (every statistics table)', () => {
    expect(quantile({ kind: 'normal', mean: 0, sd: 1 }, 0.975)).toBeCloseTo(1.959964, 6);
  });
});

describe('the section file’s probability', () => {
  test('the example reads with no message; its variables in SI with their names', () => {
    const r = parseSections(text, 'levee-probability.yaml');
    expect(r.messages).toEqual([]);
    const p = r.sections[0].probability!;
    expect(p.variables.map((v) => v.name)).toEqual([
      'c′ bank clay',
      'φ′ bank clay',
      'φ′ alluvium',
      'γ bank clay',
      'flood level',
    ]);
    expect(p.variables[0].distribution).toEqual({ kind: 'lognormal', mean: 4, sd: 1.6 });
    expect(p).toMatchObject({ seed: 520, method: 'latin-hypercube', realisations: 10000 });
  });

  test('a file in us units: each variable converted by the kind of its target', () => {
    const us = [
      'format: scarpline/1',
      'id: us',
      'units: us',
      'ground: [[0, 0], [20, 0], [60, 20], [100, 20]]',
      'materials: { clay: { unitWeight: 120, strength: { model: mohr-coulomb, cohesion: 200, frictionAngle: 25 } } }',
      'strata: [{ material: clay }]',
      'water: { piezometric: [[0, 0], [100, 10]] }',
      'probability:',
      '  variables:',
      '    - { target: materials.clay.cohesion, distribution: normal, mean: 200, sd: 50 }',
      '    - { target: materials.clay.frictionAngle, distribution: normal, mean: 25, sd: 2 }',
      '    - { target: water.level, distribution: uniform, min: -10, max: 0 }',
      '',
    ].join('\n');
    const r = parseSections(us, 'us.yaml');
    expect(r.messages.filter((m) => m.severity === 'error')).toEqual([]);
    const [c, phi, w] = r.sections[0].probability!.variables.map((v) => v.distribution);
    // 1 psf = 0.0478802589803 kPa (NIST SP 811, B.8)
    expect(c.kind === 'normal' && c.mean).toBeCloseTo(200 * 0.0478802589803, 9);
    expect(c.kind === 'normal' && c.sd).toBeCloseTo(50 * 0.0478802589803, 9);
    // the same conversion as the material's own cohesion
    expect(r.sections[0].materials.clay.strength).toMatchObject({
      cohesion: c.kind === 'normal' ? c.mean : NaN,
    });
    expect(phi).toEqual({ kind: 'normal', mean: 25, sd: 2 });
    expect(w).toEqual({ kind: 'uniform', min: -3.048, max: 0 });
  });

  test('bad variables get located messages', () => {
    const bad = text.replace(
      /probability:[\s\S]*$/,
      [
        'probability:',
        '  realisations: 500000',
        '  variables:',
        '    - { target: materials.peat.cohesion, distribution: normal, mean: 4, sd: 1 }',
        '    - { target: materials.sand.colour, distribution: normal, mean: 4, sd: 1 }',
        '    - { target: seismic.kh, distribution: normal, mean: 0.1, sd: 0.01, cov: 0.1 }',
        '    - { target: water.level, distribution: triangular, min: 1, mode: 0, max: 2 }',
        '    - { name: x, target: materials.sand.frictionAngle, distribution: lognormal, mean: 30, cov: 0.1 }',
        '    - { name: y, target: materials.alluvium.frictionAngle, distribution: normal, mean: 25, cov: 0.1 }',
        '  correlations:',
        '    - { between: [x, z], coefficient: 0.5 }',
        '    - { between: [x, y], coefficient: 0.5 }',
        '',
      ].join('\n'),
    );
    const r = parseSections(bad, 'bad.yaml');
    expect(r.sections).toEqual([]);
    expect(r.messages.map(formatMessage)).toEqual([
      expect.stringMatching(/^bad\.yaml:\d+:17 probability\.realisations: .*100 ?000/),
      expect.stringMatching(
        /^bad\.yaml:\d+:17 probability\.variables\[0\]\.target: "materials\.peat\.cohesion": the section has no material "peat"/,
      ),
      expect.stringMatching(
        /^bad\.yaml:\d+:17 probability\.variables\[1\]\.target: "materials\.sand\.colour" is not a target/,
      ),
      expect.stringMatching(
        /^bad\.yaml:\d+:\d+ probability\.variables\[2\]\.cov: give sd or cov, not both/,
      ),
      expect.stringMatching(
        /^bad\.yaml:\d+:\d+ probability\.variables\[3\]\.mode: the mode \(0\) must lie between min and max/,
      ),
      expect.stringMatching(
        /^bad\.yaml:\d+:\d+ probability\.correlations\[0\]\.between: no variable is named "z"/,
      ),
    ]);
  });

  test('correlations that cannot hold together are refused', () => {
    const bad = text.replace(
      /correlations:[\s\S]*$/,
      [
        'correlations:',
        '    - { between: [c′ bank clay, φ′ bank clay], coefficient: 0.9 }',
        '    - { between: [c′ bank clay, φ′ alluvium], coefficient: 0.9 }',
        '    - { between: [φ′ bank clay, φ′ alluvium], coefficient: -0.9 }',
        '',
      ].join('\n'),
    );
    expect(parseSections(bad, 'bad.yaml').messages.map(formatMessage)).toEqual([
      expect.stringMatching(
        /^bad\.yaml:\d+:\d+ probability\.correlations: these correlations cannot hold together/,
      ),
    ]);
  });

  test('realisations are capped lower when each searches again', () => {
    const bad = text
      .replace('surface: critical', 'surface: search')
      .replace('realisations: 10000', 'realisations: 6000');
    const m = parseSections(bad, 'bad.yaml').messages.map(formatMessage);
    expect(m).toEqual([expect.stringMatching(/probability\.realisations: .*5 ?000/)]);
  });
});

describe('a run repeats, and chunks of it are the run', () => {
  const s = section();
  const spec = { ...s.probability!, realisations: 300 };

  test('the same seed gives the same realisations; another seed others', () => {
    const a = analyzeProbability(s, spec).cases[0];
    const b = analyzeProbability(s, spec).cases[0];
    const c = analyzeProbability(s, { ...spec, seed: 521 }).cases[0];
    expect(b).toEqual(a);
    expect(c.meanFs).not.toBe(a.meanFs);
  });

  test.each(['monte-carlo', 'latin-hypercube'] as const)(
    '%s: realisations 0..300 in three chunks on separately prepared runs are those of one run',
    (method) => {
      const sp = { ...spec, method };
      const one = realisationsFs(probabilityRun(s, sp), 0, 0, 300);
      const first = probabilityRun(s, sp);
      // a worker that is given the critical surface found by another
      const criticals = { [first.cases[0].model.name]: first.cases[0].critical };
      const chunks = [
        ...realisationsFs(first, 0, 0, 120),
        ...realisationsFs(probabilityRun(s, sp, { criticals }), 0, 120, 121),
        ...realisationsFs(probabilityRun(s, sp, { criticals }), 0, 121, 300),
      ];
      expect(chunks).toEqual(one);
      const whole = analyzeProbability(s, sp).cases[0];
      expect(caseProbability(first.cases[0], sp, chunks)).toEqual(whole);
    },
  );

  test('progress is reported up to the total, and the result is plain JSON with the caution', () => {
    const seen: number[] = [];
    const r = analyzeProbability(s, spec, { onProgress: (done, total) => seen.push(done / total) });
    expect(seen[seen.length - 1]).toBe(1);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
    expect(r.caution).toMatch(/qualified/);
    const c = r.cases[0];
    expect(c.histogram.reduce((k, b) => k + b.count, 0)).toBe(c.valid);
    expect(c.cdf[c.cdf.length - 1][1]).toBe(1);
    expect(c.convergence[c.convergence.length - 1]).toMatchObject({ n: 300, p: c.pFailure.p });
  });

  test('an FS the variables do not move (rounding apart) has an SD of 0 and no β', () => {
    const rc = probabilityRun(s, spec).cases[0];
    // a critical surface that misses every varied material: the FS of each realisation is the
    // same number but for the last bits of its arithmetic
    const fs = Array.from({ length: 300 }, (_, i) => 2.018 + ((i % 3) - 1) * 4e-15);
    const c = caseProbability(rc, spec, fs);
    expect(c.sdFs).toBe(0);
    expect(c.betaNormal).toEqual({ beta: null, pf: null });
    expect(c.betaLognormal).toEqual({ beta: null, pf: null });
    expect(c.pFailure).toEqual({ p: 0, standardError: 0 });
    // a real spread, however small against the mean, keeps its β
    const varied = caseProbability(
      rc,
      spec,
      fs.map((x, i) => x + ((i % 3) - 1) * 1e-6),
    );
    expect(varied.sdFs).toBeGreaterThan(0);
    expect(varied.betaNormal.beta).toBeCloseTo((varied.meanFs! - 1) / varied.sdFs!, 6);
  });

  test('sensitivity: the widest FS range first; FS falls as the water rises', () => {
    const r = sensitivity(s, spec, { points: 5 });
    const series = r.cases[0].series;
    const widths = series.map((x) => x.fsHigh! - x.fsLow!);
    expect([...widths].sort((a, b) => b - a)).toEqual(widths);
    const water = series.find((x) => x.target === 'water.level')!;
    expect(water.points[0][1]!).toBeGreaterThan(water.points[4][1]!);
    expect(water.from).toBe(-1);
    expect(water.to).toBe(0.5);
  });
});

describe('a station’s probability of failure in a corridor run', () => {
  const s = section();
  // the bank clay's variables: their means are the section's values, so the run's critical
  // surface is the station's own (no search at the means) and only the realisations remain
  const variables = s.probability!.variables.filter((v) =>
    v.target.startsWith('materials.bank-clay.'),
  );
  const station: Section = {
    ...s,
    probability: { ...s.probability!, variables, realisations: 300 },
  };
  const analysed = analyzeSection(station);

  test('computed: the summary of the probabilistic analysis, no warning', () => {
    const r = stationProbabilityOrWarning(station, {}, analysed);
    expect(r.warning).toBeNull();
    expect(r.summary).toEqual(stationProbability(station, {}, analysed)!.summary);
    expect(r.summary![0].realisations).toBe(300);
  });

  test('stopped at the time limit during the realisations: no P_f, a warning that says so, the FS stands', () => {
    let asked = 0;
    const r = stationProbabilityOrWarning(station, { shouldStop: () => ++asked > 1 }, analysed);
    expect(r.summary).toBeNull();
    expect(r.warning!.code).toBe('probability-not-computed');
    expect(r.warning!.message).toMatch(
      /FS and the verdict stand.*stopped at its time limit after 127 realisations on the critical surface: ask for fewer realisations/,
    );
  });

  test('a variable the section does not have: no P_f, a warning with the reason', () => {
    const r = stationProbabilityOrWarning(
      {
        ...station,
        probability: {
          ...station.probability!,
          variables: [
            {
              name: 'c′ peat',
              target: 'materials.peat.cohesion',
              distribution: { kind: 'normal', mean: 5, sd: 1 },
            },
          ],
          correlations: [],
        },
      },
      {},
      analysed,
    );
    expect(r.summary).toBeNull();
    expect(r.warning!.code).toBe('probability-not-computed');
    expect(r.warning!.message).toMatch(/the section has no material "peat"/);
  });
});

describe('a corridor batch with random variables', () => {
  const corridor = JSON.parse(
    readFileSync(
      join(__dirname, '..', '..', '..', 'examples', 'corridor', 'corridor.json'),
      'utf8',
    ),
  ) as { template: Record<string, unknown>; sections: Record<string, unknown>[] };

  test('the template’s variables hold for every section; a section may give its own', () => {
    const batch = {
      ...corridor,
      template: {
        ...corridor.template,
        probability: {
          variables: [
            {
              target: 'materials.weathered-mudstone.frictionAngle',
              distribution: 'normal',
              mean: 26,
              sd: 2,
            },
          ],
        },
      },
      sections: corridor.sections.slice(0, 2).map((x, i) =>
        i === 1
          ? {
              ...x,
              probability: {
                variables: [{ target: 'seismic.kh', distribution: 'uniform', min: 0, max: 0.1 }],
              },
            }
          : x,
      ),
    };
    const r = parseSections(JSON.stringify(batch), 'corridor.json');
    expect(r.messages.filter((m) => m.severity === 'error')).toEqual([]);
    expect(r.sections.map((x) => x.probability!.variables[0].target)).toEqual([
      'materials.weathered-mudstone.frictionAngle',
      'seismic.kh',
    ]);
  });

  test('a template’s target that a section does not have is located in the template', () => {
    const batch = {
      ...corridor,
      template: {
        ...corridor.template,
        probability: {
          variables: [{ target: 'materials.peat.su', distribution: 'normal', mean: 20, sd: 4 }],
        },
      },
      sections: corridor.sections.slice(0, 2),
    };
    const m = parseSections(JSON.stringify(batch, null, 2), 'corridor.json').messages;
    expect(m.map(formatMessage)).toEqual([
      expect.stringMatching(
        /^corridor\.json:\d+:\d+ template\.probability\.variables\[0\]\.target: "materials\.peat\.su": the section has no material "peat"/,
      ),
    ]);
  });
});

describe('the FS of a case as the probabilistic analysis and solving take it', () => {
  test.each([
    'levee-drawdown-seismic.yaml',
    'embankment-basal-reinforcement.yaml',
    'embankment-stages.yaml',
  ])(
    '%s: each case’s critical FS is the governing FS of that case in the station’s analysis',
    (file) => {
      const text = readFileSync(join(__dirname, '..', '..', '..', 'examples', file), 'utf8');
      for (const s of parseSections(text, file).sections) {
        const station = analyzeSection(s);
        const models = caseModels(s);
        expect(models.map((m) => m.name)).toEqual(station.cases.map((c) => c.name));
        models.forEach((m, k) => {
          const fs = criticalOf(m.section).fs;
          expect([m.name, fs]).toEqual([m.name, station.cases[k].governing?.fs ?? null]);
        });
      }
    },
    60_000,
  );
});
