#!/usr/bin/env node
// Writes corridor.json: a corridor batch (format scarpline-batch/1) of the Wendlecombe bypass,
// an invented road, with a cross-section every 20 m from chainage 1+000 to 2+200 (61 sections,
// right-hand side, centreline at x = 0). The natural ground rises and falls along the line, so
// the road runs alternately on embankment and in cut. Every station has a long-term and an
// earthquake case; the embankment stations an end-of-construction case as well.
// It also writes wendlecombe-uncertain.json: the same sections under the long-term case alone,
// with the weathered mudstone's strength uncertain, so that each station carries a probability
// of failure. Deterministic: a seeded pseudo-random generator makes the same files every time.
// Invented demonstration data: not for design.
//
//   node examples/corridor/generate.js
'use strict';
const fs = require('node:fs');
const path = require('node:path');

/** mulberry32: a small seeded pseudo-random generator, uniform on [0, 1). */
function random(seed) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rand = random(2860);
const r2 = (v) => Math.round(v * 100) / 100;
const point = (x, y) => [r2(x), r2(y)];

const HALF_WIDTH = 8; // carriageway and verge, m from the centreline
const SLOPE = 2; // side slopes 1 vertical : 2 horizontal
const X_END = 50;

/** Natural ground level on the centreline at chainage s (m). */
function terrain(s) {
  return (
    40 +
    6 * Math.sin((2 * Math.PI * (s - 1000)) / 900) +
    2.5 * Math.sin((2 * Math.PI * s) / 310 + 1)
  );
}
/** Road formation level at chainage s (m): a steady grade. */
const formation = (s) => 41 + 0.004 * (s - 1000);

function section(s) {
  const T = terrain(s) + (rand() - 0.5) * 0.6;
  const F = formation(s);
  const c = 0.03 + 0.05 * Math.sin(s / 170); // cross-fall of the natural ground
  const natural = (x) => T + c * x;
  // Natural ground beyond the side slope, with small undulations.
  const tail = (from) => {
    const pts = [];
    for (let x = Math.ceil(from / 6) * 6; x < X_END; x += 6) {
      if (x - from >= 2) pts.push(point(x, natural(x) + (rand() - 0.5) * 0.4));
    }
    pts.push(point(X_END, natural(X_END)));
    return pts;
  };
  const h = F - natural(HALF_WIDTH);
  const fill = h > 0;
  // Where the side slope meets the natural ground.
  const xm = fill
    ? (F - T + HALF_WIDTH / SLOPE) / (c + 1 / SLOPE)
    : (T - F + HALF_WIDTH / SLOPE) / (1 / SLOPE - c);
  const meet = point(xm, natural(xm));
  const ground = [point(0, F), point(HALF_WIDTH, F)];
  if (xm - HALF_WIDTH >= 0.5) ground.push(meet);
  ground.push(...tail(Math.max(xm, HALF_WIDTH)));

  const item = { station: s };
  if (s === 1600) item.title = 'Wendlecombe bypass, Ch 1+600 right, over the Corrin culvert';
  item.ground = ground;
  if (fill) {
    // On embankment the natural strata run under the fill: give them as elevations.
    const under = [
      point(0, natural(0)),
      point(HALF_WIDTH, natural(HALF_WIDTH)),
      ...ground.slice(2),
    ];
    const shift = (pts, d) => pts.map(([x, y]) => [x, r2(y - d)]);
    item.materials = {
      fill: {
        description: 'Compacted granular fill from the cuttings',
        unitWeight: 20,
        strength: { model: 'mohr-coulomb', cohesion: 2, frictionAngle: 33 },
      },
    };
    item.strata = [
      { material: 'fill' },
      { material: 'weathered-mudstone', elevation: under },
      { material: 'mudstone', elevation: shift(under, 6) },
    ];
    item.water = { elevation: shift(under, 1.5) };
    // The weathered mudstone under a new fill has not drained by the end of construction.
    item.cases = [
      {
        name: 'end of construction',
        kind: 'end-of-construction',
        requiredFs: 1.3,
        materials: { 'weathered-mudstone': { strength: { model: 'undrained', su: 40 } } },
      },
    ];
  }
  if (fill && (s === 1720 || s === 1740)) {
    // The highest fill, by the Corrin culvert's wing walls: steepened with geogrids at 2 m spacing
    // from 1 m above the natural ground at the toe, each ending 0.3 m inside the side slope.
    const toe = meet[1];
    item.reinforcement = [];
    for (let y = toe + 1; y < F - 1; y += 2) {
      item.reinforcement.push({
        type: 'geosynthetic',
        name: `geogrid at ${r2(y)} m`,
        elevation: r2(y),
        from: 0,
        to: r2(HALF_WIDTH + SLOPE * (F - y) - 0.3),
        strength: 35,
        interaction: 0.8,
      });
    }
    // At the end of construction the soft foundation still governs: how much basal force at the
    // foot of the fill would bring it to its requirement?
    const base = r2(toe + 0.3);
    item.cases[0].analysis = {
      requiredReinforcement: {
        level: base,
        from: 0,
        to: r2(HALF_WIDTH + SLOPE * (F - base) - 0.3),
      },
    };
  }
  if (s === 1600) {
    // Over the culvert: a higher requirement in the long term, and less movement in an earthquake.
    item.analysis = { requiredFs: 1.6 };
    item.cases = [
      ...(item.cases ?? []),
      { name: 'earthquake', earthquake: { allowableDisplacement: 50 } },
    ];
  }
  return item;
}

const sections = [];
for (let s = 1000; s <= 2200; s += 20) sections.push(section(s));

const batch = {
  format: 'scarpline-batch/1',
  id: 'wcb-main',
  title: 'Wendlecombe bypass, main line, right-hand side',
  description:
    'Invented demonstration corridor (not for design): sections every 20 m, centreline at x = 0, road platform 8 m wide, side slopes 1:2 in fill and in cut. In cut the strata follow the cut surface by depth; on embankment they are given as elevations under the fill. Design cases: long term (required FS 1.5, 1.6 over the culvert at 1+600) and an earthquake (kh 0.1; pga 0.2 g, magnitude 6, 100 mm allowed, 50 mm over the culvert) everywhere, and the end of construction (the weathered mudstone undrained) on embankment. The highest fill (1+720, 1+740) is reinforced with geogrids.',
  units: 'si',
  template: {
    offset: 0,
    materials: {
      'weathered-mudstone': {
        description: 'Highly weathered MUDSTONE, recovered as stiff clay',
        unitWeight: 20,
        saturatedUnitWeight: 20.5,
        strength: { model: 'mohr-coulomb', cohesion: 5, frictionAngle: 26 },
      },
      mudstone: {
        description: 'Moderately weathered MUDSTONE: treated as a rigid base',
        strength: { model: 'rigid' },
      },
    },
    strata: [{ material: 'weathered-mudstone' }, { material: 'mudstone', depth: 6 }],
    water: { depth: 2.5 },
    loads: [{ type: 'strip', from: 0, to: 7.3, pressure: 10 }],
    analysis: {
      methods: ['bishop', 'spencer'],
      slices: 30,
      surface: { type: 'auto' },
      requiredFs: 1.5,
    },
    // Every station: long term (the requirement of the analysis), and an earthquake.
    cases: [
      { name: 'long term', kind: 'long-term' },
      {
        name: 'earthquake',
        kind: 'seismic',
        requiredFs: 1.1,
        seismic: { kh: 0.1 },
        earthquake: { pga: 0.2, magnitude: 6, allowableDisplacement: 100 },
      },
    ],
  },
  sections,
};

// --- JSON in the layout Prettier gives it (printWidth 100), so that the lint check passes.
const WIDTH = 100;
const isBig = (v) =>
  (Array.isArray(v) && v.length > 1) ||
  (v !== null && typeof v === 'object' && !Array.isArray(v) && Object.keys(v).length > 1);
const isObject = (v) => v !== null && typeof v === 'object' && !Array.isArray(v);

function inline(v) {
  if (Array.isArray(v)) return `[${v.map(inline).join(', ')}]`;
  return JSON.stringify(v);
}

function print(v, indent, prefix, trailing) {
  const pad = ' '.repeat(indent);
  if (isObject(v)) {
    const keys = Object.keys(v);
    if (keys.length === 0) return [`${pad}${prefix}{}${trailing}`];
    const lines = [`${pad}${prefix}{`];
    keys.forEach((k, i) => {
      lines.push(
        ...print(v[k], indent + 2, `${JSON.stringify(k)}: `, i < keys.length - 1 ? ',' : ''),
      );
    });
    lines.push(`${pad}}${trailing}`);
    return lines;
  }
  if (Array.isArray(v)) {
    const hasObject = v.some((e) => isObject(e) && Object.keys(e).length > 0);
    const allBig = v.length > 1 && v.every(isBig);
    const one = `${pad}${prefix}${inline(v)}${trailing}`;
    if (!hasObject && !allBig && one.length <= WIDTH) return [one];
    const lines = [`${pad}${prefix}[`];
    v.forEach((e, i) => lines.push(...print(e, indent + 2, '', i < v.length - 1 ? ',' : '')));
    lines.push(`${pad}]${trailing}`);
    return lines;
  }
  return [`${pad}${prefix}${JSON.stringify(v)}${trailing}`];
}

/**
 * The same corridor under its long-term case alone, with the weathered mudstone's c′ and φ′
 * uncertain (and the fill's φ′ on embankment): every station's probability of failure on its
 * critical surface (a `probability` block). The spread is our own invented one: c′ lognormal
 * with a COV of 0.4, φ′ normal with an SD of 3° (2° for the compacted fill), the mudstone's
 * correlated −0.3 as c′ and φ′ commonly are; the means are the values the corridor analyses.
 */
function uncertain(b) {
  const longTerm = b.template.cases.filter((c) => c.kind === 'long-term');
  const names = new Set(longTerm.map((c) => c.name));
  const mudstone = b.template.materials['weathered-mudstone'].strength;
  const probability = {
    method: 'latin-hypercube',
    realisations: 1000,
    seed: 2860,
    surface: 'critical',
    variables: [
      {
        name: 'c′ weathered mudstone',
        target: 'materials.weathered-mudstone.cohesion',
        distribution: 'lognormal',
        mean: mudstone.cohesion,
        cov: 0.4,
      },
      {
        name: 'φ′ weathered mudstone',
        target: 'materials.weathered-mudstone.frictionAngle',
        distribution: 'normal',
        mean: mudstone.frictionAngle,
        sd: 3,
      },
    ],
    correlations: [
      { between: ['c′ weathered mudstone', 'φ′ weathered mudstone'], coefficient: -0.3 },
    ],
  };
  // An embankment's own fill (made from the cuttings) is uncertain too; the section's block
  // replaces the template's, so it repeats the mudstone's variables beside the fill's φ′.
  const withFill = (fill) => ({
    ...probability,
    variables: [
      ...probability.variables,
      {
        name: 'φ′ fill',
        target: 'materials.fill.frictionAngle',
        distribution: 'normal',
        mean: fill.strength.frictionAngle,
        sd: 2,
      },
    ],
  });
  return {
    format: b.format,
    id: 'wcb-uncertain',
    title: 'Wendlecombe bypass, main line, uncertain strength',
    description:
      "Invented demonstration corridor (not for design): the main line's sections under the long-term case alone, with the weathered mudstone's c′ and φ′ (and the fill's φ′ on embankment) as random variables, so that each station carries its probability of failure on its critical surface (1 000 Latin hypercube realisations, seed 2860).",
    units: b.units,
    template: {
      ...b.template,
      cases: longTerm,
      probability,
    },
    sections: b.sections.map(({ cases, ...s }) => {
      const kept = (cases ?? []).filter((c) => names.has(c.name));
      return {
        ...s,
        ...(kept.length ? { cases: kept } : {}),
        ...(s.materials?.fill ? { probability: withFill(s.materials.fill) } : {}),
      };
    }),
  };
}

for (const [file, b] of [
  ['corridor.json', batch],
  ['wendlecombe-uncertain.json', uncertain(batch)],
]) {
  const out = path.join(__dirname, file);
  fs.writeFileSync(out, `${print(b, 0, '', '').join('\n')}\n`);
  console.log(`wrote ${path.relative(process.cwd(), out)}: ${b.sections.length} sections`);
}
