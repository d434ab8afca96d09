/**
 * Reinforcement on the section drawing: every element drawn in its own shape where the section
 * puts it, and at each crossing of the governing critical surface that carries a force an
 * arrow in the force's direction labelled with the force and what limits it, in words.
 */
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import {
  analyzeSection,
  caseView,
  drawSection,
  parseSections,
  type Section,
} from '@scarpline/core';
import { REINFORCEMENT, REINFORCEMENT_TEXT } from '../src/draw/palette';
import { limitWords } from '../src/reinforcement/limit-words';
import type { SectionResult } from '../src/result';

// Invented demo data (the Wendlecombe corridor): a nailed cut with an anchor, a pile row at
// the toe and a grid behind the crest that the critical circle does not reach.
const NAILED = (units: 'si' | 'us') =>
  units === 'si'
    ? `
format: scarpline/1
id: wcb-1240-N
title: Wendlecombe bypass, nailed cut
station: 1240
units: si
ground: [[0, 62], [18, 62], [28, 72], [70, 74]]
materials:
  till: { unitWeight: 20.5, strength: { model: mohr-coulomb, cohesion: 6, frictionAngle: 29 } }
strata: [{ material: till }]
reinforcement:
  - { type: nail, name: nail row 1, head: [20, 64], inclination: 15, length: 10, spacing: 1.5, tensileCapacity: 150, bond: 30, facingCapacity: 60 }
  - { type: nail, name: nail row 2, head: [24, 68], inclination: 15, length: 10, spacing: 1.5, tensileCapacity: 150, bond: 30 }
  - { type: anchor, name: anchor A, head: [26.5, 70.5], inclination: 20, freeLength: 6, bondLength: 5, spacing: 2, capacity: 300, acts: mobilised }
  - { type: geosynthetic, name: crest grid, elevation: 73, from: 40, to: 60, strength: 40, interaction: 0.8 }
  - { type: pile, name: toe piles, x: 16, bottom: 55, shear: 50 }
analysis:
  methods: [bishop, spencer]
  slices: 30
  surface: { type: circle, center: [18, 84], radius: 23 }
  requiredFs: 1.5
`
    : `
format: scarpline/1
id: wcb-1240-N-us
title: Wendlecombe bypass, nailed cut (feet)
units: us
ground: [[0, 200], [60, 200], [93, 233], [230, 240]]
materials:
  till: { unitWeight: 128, strength: { model: mohr-coulomb, cohesion: 125, frictionAngle: 29 } }
strata: [{ material: till }]
reinforcement:
  - { type: nail, name: nail row 1, head: [66, 206], inclination: 15, length: 33, spacing: 5, tensileCapacity: 33000, bond: 2000 }
analysis:
  methods: [bishop]
  surface: { type: circle, center: [60, 275], radius: 76 }
`;

const read = (units: 'si' | 'us'): Section =>
  parseSections(NAILED(units), `nailed-${units}.yaml`).sections[0];

const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' });
type Node = Record<string, unknown>;
function all(node: unknown, tag: string, out: Node[] = []): Node[] {
  if (Array.isArray(node)) node.forEach((n) => all(n, tag, out));
  else if (node && typeof node === 'object') {
    for (const [k, v] of Object.entries(node)) {
      if (k === tag) (Array.isArray(v) ? v : [v]).forEach((e) => out.push(e as Node));
      all(v, tag, out);
    }
  }
  return out;
}
const textOf = (t: Node | string | number) =>
  typeof t === 'object' ? String((t['#text'] as string | number | undefined) ?? '') : String(t);
const pointsOf = (d: string): [number, number][] =>
  [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);
const length = (p: [number, number][]) => Math.hypot(p[1][0] - p[0][0], p[1][1] - p[0][1]);

/** WCAG relative luminance of #rrggbb. */
const luminance = (hex: string): number => {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const l = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * l[0] + 0.7152 * l[1] + 0.0722 * l[2];
};

describe('reinforcement on the section drawing', () => {
  const section = read('si');
  const result: SectionResult = caseView(analyzeSection(section));
  const governing = result.results.find((m) => m.method === result.governing?.method)!;
  const svg = drawSection(section, result);
  const tree = parser.parse(svg) as unknown;
  const groups = all(tree, 'g');
  const elements = groups.filter((g) => typeof g['data-element'] === 'string');

  test('the analysis has what the drawing shows: forces at four crossings, the grid not crossed', () => {
    const crossed = governing.reinforcement!.filter((e) => e.crossings.some((c) => c.counted));
    expect(crossed.map((e) => e.name).sort()).toEqual([
      'anchor A',
      'nail row 1',
      'nail row 2',
      'toe piles',
    ]);
    expect(governing.reinforcement!.find((e) => e.name === 'crest grid')!.crossings).toEqual([]);
  });

  test('every element is drawn, in a shape of its kind, named in its title', () => {
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(elements.map((g) => g['data-element'])).toEqual([
      'nail',
      'nail',
      'anchor',
      'geosynthetic',
      'pile',
    ]);
    expect(elements.map((g) => textOf(g.title as Node))).toEqual([
      'nail row 1',
      'nail row 2',
      'anchor A',
      'crest grid',
      'toe piles',
    ]);
    const strokes = new Set(all(elements, 'path').map((p) => p.stroke));
    expect(strokes).toEqual(new Set([REINFORCEMENT]));
    // a nail and an anchor have a head plate; the layer and the pile have none
    expect(elements.map((g) => all(g, 'rect').length)).toEqual([1, 1, 1, 0, 0]);
  });

  test('drawn where the section puts them: lengths at true scale, a level layer level, a pile vertical', () => {
    const [nail, , anchor, grid, pile] = elements.map((g) => all(g, 'path'));
    const nailPx = length(pointsOf(String(nail[0].d)));
    const free = length(pointsOf(String(anchor[0].d)));
    const bond = anchor.find((p) => p['data-part'] === 'bond')!;
    expect(Number(bond['stroke-width'])).toBeGreaterThan(Number(anchor[0]['stroke-width']));
    const bondPx = length(pointsOf(String(bond.d)));
    // equal scales: 10 m of nail, 6 m free and 5 m bonded (rounded to 0.1 px)
    expect(free / nailPx).toBeCloseTo(6 / 10, 2);
    expect(bondPx / nailPx).toBeCloseTo(5 / 10, 2);
    // the nail runs into the slope (right) and 15° down from its head
    const n = pointsOf(String(nail[0].d));
    expect(n[1][0]).toBeGreaterThan(n[0][0]);
    expect((Math.atan2(n[1][1] - n[0][1], n[1][0] - n[0][0]) * 180) / Math.PI).toBeCloseTo(15, 0);
    const g = pointsOf(String(grid[0].d));
    expect(g[0][1]).toBe(g[1][1]);
    expect(length(g) / nailPx).toBeCloseTo(20 / 10, 2);
    const p = pointsOf(String(pile[0].d));
    expect(p[0][0]).toBe(p[1][0]);
  });

  test('an arrow and a label at each crossing that carries a force: the force and what limits it, in words', () => {
    const labels = all(
      groups.find((g) => g.class === 'reinforcement-forces'),
      'text',
    );
    const expected = governing
      .reinforcement!.flatMap((e) =>
        e.crossings.filter((c) => c.counted && c.force > 0).map((c) => ({ e, c })),
      )
      .map(({ e, c }) => ({
        element: e.name,
        text: `${Number(c.force.toPrecision(3))} kN/m, ${limitWords(c.mode, e.type)}`,
      }));
    expect(expected).toHaveLength(4);
    expect(labels.map((t) => ({ element: t['data-crossing'], text: textOf(t) }))).toEqual(expected);
    // words, never the result's codes alone
    const words = labels.map(textOf).join(' ');
    expect(words).toContain('pullout behind the surface');
    expect(words).toContain('shear resistance');
    expect(labels.every((t) => t.fill === REINFORCEMENT_TEXT)).toBe(true);
    // each arrow starts at its crossing and points in the force's direction
    const arrows = all(
      groups.find((g) => g.class === 'reinforcement'),
      'line',
    );
    expect(arrows).toHaveLength(4);
    const crossings = governing.reinforcement!.flatMap((e) => e.crossings.filter((c) => c.counted));
    arrows.forEach((a, i) => {
      const angle =
        (Math.atan2(-(Number(a.y2) - Number(a.y1)), Number(a.x2) - Number(a.x1)) * 180) / Math.PI;
      expect(angle).toBeCloseTo(crossings[i].direction, 0);
      expect(a['marker-end']).toBe('url(#sl-rarrow)');
    });
  });

  test('a crossing that carries nothing is not marked', () => {
    const pushed: SectionResult = {
      ...result,
      results: result.results.map((m) => ({
        ...m,
        reinforcement: m.reinforcement?.map((e) =>
          e.name === 'toe piles'
            ? { ...e, force: 0, crossings: e.crossings.map((c) => ({ ...c, counted: false })) }
            : e,
        ),
      })),
    };
    const other = parser.parse(drawSection(section, pushed)) as unknown;
    const labels = all(
      all(other, 'g').find((g) => g.class === 'reinforcement-forces'),
      'text',
    );
    expect(labels.map((t) => t['data-crossing'])).toEqual(['nail row 1', 'nail row 2', 'anchor A']);
  });

  test('the legend names each kind present and the forces, with the method', () => {
    const legend = all(
      groups.find((g) => g.class === 'legend'),
      'text',
    )
      .map(textOf)
      .join(' ');
    expect(legend).toContain('geosynthetic layer');
    expect(legend).toContain('soil nails');
    expect(legend).toContain('bond length thick');
    expect(legend).toContain('piles or shear keys');
    expect(legend).toContain(`reinforcement force on the sliding mass (${governing.method})`);
  });

  test('a section without reinforcement draws none and says nothing of it', () => {
    const bare: Section = { ...section, reinforcement: [] };
    const r = caseView(analyzeSection(bare));
    const text = drawSection(bare, r);
    expect(text).not.toContain('data-element');
    expect(text).not.toContain('reinforcement');
  });

  test('a US section: the element in feet, the force in lbf/ft', () => {
    const us = read('us');
    const r = caseView(analyzeSection(us));
    const t = parser.parse(drawSection(us, r)) as unknown;
    const labels = all(
      all(t, 'g').find((g) => g.class === 'reinforcement-forces'),
      'text',
    ).map(textOf);
    expect(labels).toHaveLength(1);
    expect(labels[0]).toMatch(/^[\d.]+ lbf\/ft, /);
  });

  test('the force labels are dark enough to read on white (WCAG AA, 4.5:1)', () => {
    expect(1.05 / (luminance(REINFORCEMENT_TEXT) + 0.05)).toBeGreaterThanOrEqual(4.5);
  });
});
