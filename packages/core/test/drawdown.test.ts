/**
 * The plumbing of a rapid drawdown: the two slicings before and after drawdown cut alike, the
 * drainage of each material with its warnings, and analyzeDrawdown's reports. The computation itself is checked against
 * published forms in tests/verification/drawdown.test.ts.
 */
import {
  WorkMeter,
  analyzeDrawdown,
  drawdownSections,
  prepareSection,
  resolveDrainage,
  sliceSurface,
  type CircleSurface,
  type DrawdownSpec,
} from '@scarpline/core';
import { makeSection, mc, wetSection } from './helpers/make-section';

const circle: CircleSurface = { type: 'circle', center: [22, 32], radius: 20 };

describe('the slicings before and after drawdown', () => {
  const section = wetSection();
  const spec: DrawdownSpec = {
    after: {
      kind: 'piezometric',
      line: [
        [0, 5],
        [20, 6],
        [35, 12],
        [50, 12],
      ],
      unitWeight: 9.81,
    },
    materials: {},
  };
  test('cut every surface into the same slices, each at both lines', () => {
    const { before, after } = drawdownSections(section, spec);
    const plain = prepareSection(section);
    for (const [xc, yc, r] of [
      [22, 32, 20],
      [25, 30, 14],
      [18, 40, 29],
    ]) {
      const c: CircleSurface = { type: 'circle', center: [xc, yc], radius: r };
      const a = sliceSurface(before, c, 30);
      const b = sliceSurface(after, c, 30);
      const p = sliceSurface(plain, c, 30);
      if (!a.ok || !b.ok || !p.ok) throw new Error('the test circles are admissible');
      expect(Array.from(b.slices.xl)).toEqual(Array.from(a.slices.xl));
      expect(Array.from(b.slices.xr)).toEqual(Array.from(a.slices.xr));
      // every edge of the section's own slicing is kept: the after line only adds edges
      const edges = new Set(Array.from(a.slices.xl));
      for (const x of Array.from(p.slices.xl)) expect(edges.has(x)).toBe(true);
    }
  });
});

describe('the drainage of each material', () => {
  const materials = [
    mc('fill', 19, 5, 30),
    {
      name: 'soft',
      unitWeight: 17,
      saturatedUnitWeight: 17,
      strength: { model: 'undrained' as const, su: 20, suRate: 0, suDatum: null },
    },
    { name: 'rock', unitWeight: 0, saturatedUnitWeight: 0, strength: { model: 'rigid' as const } },
    mc('clay', 18, 8, 24),
  ];
  test('a Mohr–Coulomb soil listed slow takes its envelopes; one not listed drains freely', () => {
    const d = resolveDrainage(materials, {
      after: { kind: 'none', unitWeight: 9.81 },
      materials: { clay: { drains: 'slow', dR: 12, psiR: 14 } },
    });
    expect(d.warnings).toEqual([]);
    expect(d.byMaterial.map((m) => m.drains)).toEqual(['free', 'total', 'free', 'slow']);
    const clay = d.byMaterial[3];
    if (clay.drains !== 'slow') throw new Error('slow');
    expect(clay.envelopes.c).toBe(8);
    expect(clay.envelopes.dR).toBe(12);
    expect(clay.envelopes.tanPhi).toBeCloseTo(Math.tan((24 * Math.PI) / 180), 12);
  });
  test('an undrained or rigid material listed slow, and a name that is no material, are told', () => {
    const d = resolveDrainage(materials, {
      after: { kind: 'none', unitWeight: 9.81 },
      materials: {
        soft: { drains: 'slow', dR: 12, psiR: 14 },
        rock: { drains: 'slow', dR: 12, psiR: 14 },
        peat: { drains: 'free' },
      },
    });
    expect(d.byMaterial.map((m) => m.drains)).toEqual(['free', 'total', 'free', 'free']);
    expect(d.warnings.map((w) => w.code).sort()).toEqual([
      'drawdown-strength-kept',
      'drawdown-strength-kept',
      'drawdown-unknown-material',
    ]);
    expect(d.warnings.find((w) => w.message.includes('soft'))!.message).toMatch(/keeps Su/);
    expect(d.warnings.find((w) => w.message.includes('rock'))!.message).toMatch(/rigid base/);
  });
});

describe('analyzeDrawdown', () => {
  // a clay cut with a pond at its toe that falls from 18 m to 11 m; an undrained crust keeps Su
  const ground: [number, number][] = [
    [0, 10],
    [10, 10],
    [30, 20],
    [50, 20],
  ];
  const section = makeSection({
    materials: {
      crust: {
        name: 'crust',
        unitWeight: 18,
        saturatedUnitWeight: 18,
        strength: { model: 'undrained', su: 30, suRate: 0, suDatum: null },
      },
      clay: mc('clay', 18, 8, 25, 19),
    },
    strata: [
      { material: 'crust', top: ground },
      {
        material: 'clay',
        top: [
          [0, 10],
          [10, 10],
          [27, 18.5],
          [50, 18.5],
        ],
      },
    ],
    water: {
      kind: 'piezometric',
      line: [
        [0, 18],
        [50, 18],
      ],
      unitWeight: 9.81,
    },
    analysis: {
      methods: ['bishop', 'spencer', 'phi-zero-circle', 'infinite-slope'],
      slices: 30,
      surface: circle,
      infiniteSlope: null,
      case: null,
      requiredFs: null,
    },
  });
  const spec: DrawdownSpec = {
    after: {
      kind: 'piezometric',
      line: [
        [0, 11],
        [12, 11],
        [30, 17],
        [50, 17],
      ],
      unitWeight: 9.81,
    },
    materials: { clay: { drains: 'slow', dR: 10, psiR: 14 } },
  };

  test('methods of slices run the stages; the others are not run, with the reason', () => {
    const r = analyzeDrawdown(section, spec, new WorkMeter());
    expect(JSON.stringify(r)).not.toMatch(/NaN|Infinity/);
    expect(r.search).toBeNull();
    expect(r.results.map((m) => [m.method, m.converged])).toEqual([
      ['bishop', true],
      ['spencer', true],
      ['phi-zero-circle', false],
      ['infinite-slope', false],
    ]);
    for (const m of r.results.slice(2)) expect(m.reason).toMatch(/method of slices/);
    expect(r.warnings).toEqual([]);
    // the governing method is the lower of the two
    const lower = r.results[0].fs! < r.results[1].fs! ? 'bishop' : 'spencer';
    expect(r.drawdown).toEqual(r.byMethod[lower]);
    expect(r.drawdown.stages.map((s) => s.stage)).toEqual([1, 2, 3]);
    expect(r.drawdown.stages[2].fs).toBe(r.results.find((m) => m.method === lower)!.fs);
    // the slice table: left to right, as the method's report
    const report = r.results.find((m) => m.method === lower)!;
    expect(r.drawdown.slices.map((s) => s.x)).toEqual(report.slices.map((s) => s.x));
    // the crust keeps Su; the clay took undrained strengths, not the crust's
    const crust = r.drawdown.slices.filter((s) => s.material === 'crust');
    expect(crust.length).toBeGreaterThan(0);
    for (const s of crust) expect(s).toMatchObject({ strength: 30, stage: 'undrained' });
    expect(r.drawdown.slices.some((s) => s.material === 'clay' && s.stage === 'undrained')).toBe(
      true,
    );
  });

  test('`governs` names the methods the drawdown report follows', () => {
    const r = analyzeDrawdown(section, spec, new WorkMeter(), ['spencer']);
    expect(r.drawdown).toEqual(r.byMethod.spencer);
  });

  test('without a slip surface no method runs', () => {
    const none = { ...section, analysis: { ...section.analysis, surface: null } };
    const r = analyzeDrawdown(none, spec, new WorkMeter());
    expect(r.results.every((m) => !m.converged)).toBe(true);
    expect(r.drawdown).toEqual({
      stages: [
        { stage: 1, fs: null },
        { stage: 2, fs: null },
        { stage: 3, fs: null },
      ],
      drainedFs: null,
      slices: [],
    });
  });

  test('a searched surface: the search and its warnings come back, every trial charged', () => {
    const searched = {
      ...section,
      analysis: {
        ...section.analysis,
        methods: ['bishop' as const],
        surface: { type: 'auto' as const },
      },
    };
    const meter = new WorkMeter();
    const r = analyzeDrawdown(searched, spec, meter);
    expect(r.search).not.toBeNull();
    expect(r.search!.circle).not.toBeNull();
    expect(r.search!.cohesionless).toBeNull();
    expect(meter.trials).toBeGreaterThanOrEqual(r.search!.trials);
    expect(r.results[0].fs).toBeCloseTo(r.search!.circle!.fs, 5);
  });
});
