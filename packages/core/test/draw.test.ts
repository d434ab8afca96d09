/**
 * The drawing functions: scales, ticks, palettes and shapes, and the composed drawings as
 * well-formed SVG carrying what an engineer reads off them.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import {
  CAUTION,
  analyzeSection,
  caseView,
  drawSection,
  parseSections,
  type Section,
} from '@scarpline/core';
import { niceStep, niceTicks } from '../src/draw/nice-ticks';
import { scaleLinear } from '../src/draw/scale-linear';
import { ACCENT, fsColor, materialFill, MATERIAL_RAMPS, RIGID_FILL } from '../src/draw/palette';
import { strataFills } from '../src/draw/strata-shapes';
import { sectionInUnits } from '../src/draw/section-in-units';
import { boxIsClear, insidePolygon, segmentHitsBox } from '../src/draw/free-place';
import { pondedPolygons } from '../src/draw/ponded-polygons';
import { circleBelowGround } from '../src/draw/circle-below-ground';
import { bandColour, fsMapDomain, fsMapLevels } from '../src/draw/fs-map-shape';
import { wrapText } from '../src/draw/wrap-text';
import type { SearchReport } from '../src/result';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const section = (file: string): Section =>
  parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file).sections[0];

/** WCAG relative luminance of #rrggbb. */
const luminance = (hex: string): number => {
  const c = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255);
  const l = c.map((v) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4));
  return 0.2126 * l[0] + 0.7152 * l[1] + 0.0722 * l[2];
};

/** The points of an SVG path's M and L commands. */
const pointsOf = (d: string): [number, number][] =>
  [...d.matchAll(/[ML](-?[\d.]+) (-?[\d.]+)/g)].map((m) => [Number(m[1]), Number(m[2])]);

const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' });
/** Every element of a tag in a parsed SVG tree. */
function all(
  node: unknown,
  tag: string,
  out: Record<string, unknown>[] = [],
): Record<string, unknown>[] {
  if (Array.isArray(node)) node.forEach((n) => all(n, tag, out));
  else if (node && typeof node === 'object') {
    for (const [k, v] of Object.entries(node)) {
      if (k === tag)
        (Array.isArray(v) ? v : [v]).forEach((e) => out.push(e as Record<string, unknown>));
      all(v, tag, out);
    }
  }
  return out;
}

describe('scales and ticks', () => {
  test('niceTicks steps by 1, 2 or 5 times a power of ten and stays inside the range', () => {
    expect(niceTicks(0, 47, 5)).toEqual([0, 10, 20, 30, 40]);
    expect(niceTicks(21.3, 27.9, 6)).toEqual([22, 24, 26]);
    expect(niceTicks(21.3, 27.9, 10)).toEqual([22, 23, 24, 25, 26, 27]);
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(5, 1, 5)).toEqual([]);
  });

  test('niceStep is the step of 1, 2 or 5 times a power of ten at or above the one asked', () => {
    expect(niceStep(9.4)).toBe(10);
    expect(niceStep(10)).toBe(10);
    expect(niceStep(0.3)).toBeCloseTo(0.5, 12);
    expect(niceStep(1.2)).toBe(2);
    expect(niceStep(2.5)).toBe(5); // no 2.5 in the set
    expect(niceStep(0)).toBe(1);
    expect(niceStep(Number.NaN)).toBe(1);
  });

  test('scaleLinear maps, inverts, and a y scale runs upward', () => {
    const x = scaleLinear([0, 50], [60, 860]);
    expect(x(25)).toBe(460);
    expect(x.invert(460)).toBe(25);
    const y = scaleLinear([20, 40], [400, 0]);
    expect(y(30)).toBe(200);
    expect(y(40)).toBeLessThan(y(20));
  });

  test('wrapText keeps lines within the width', () => {
    const lines = wrapText(CAUTION, 40);
    expect(lines.join(' ')).toBe(CAUTION);
    for (const l of lines) expect(l.length).toBeLessThanOrEqual(40);
  });
});

describe('palettes', () => {
  test('the FS ramp is sequential: its lightness rises steadily from low FS to high', () => {
    const l = Array.from({ length: 21 }, (_, k) => luminance(fsColor(k / 20)));
    for (let k = 1; k < l.length; k++) expect(l[k]).toBeGreaterThan(l[k - 1]);
    expect(fsColor(0)).toBe('#440154');
    expect(fsColor(1)).toBe('#fde725');
  });

  test('a material is coloured by its kind and strength: a hue a kind, weaker paler', () => {
    for (const kind of ['granular', 'cohesive', 'undrained'] as const) {
      const l = [5, 20, 60, 150, 300].map((strength) =>
        luminance(materialFill({ kind, strength })),
      );
      for (let k = 1; k < l.length; k++) expect(l[k]).toBeLessThan(l[k - 1]);
    }
    const same = [
      materialFill({ kind: 'granular', strength: 60 }),
      materialFill({ kind: 'cohesive', strength: 60 }),
      materialFill({ kind: 'undrained', strength: 60 }),
    ];
    expect(new Set(same).size).toBe(3);
    expect(materialFill({ kind: 'rigid', strength: Infinity })).toBe(RIGID_FILL);
    expect(Object.values(MATERIAL_RAMPS).flat()).not.toContain(ACCENT);
  });

  test("colour by material, not by depth: the levee's sand aquifer (the deepest) is not the darkest, and every material differs", () => {
    const model = sectionInUnits(section('levee-land-side.yaml'));
    const fills = strataFills(model);
    expect(new Set(Object.values(fills)).size).toBe(3);
    expect(luminance(fills.sand)).toBeGreaterThan(
      Math.min(luminance(fills['bank-clay']), luminance(fills.alluvium)),
    );
    // the same material has the same colour in another section
    const other = strataFills(sectionInUnits(section('fill-clean-sand.yaml')));
    for (const [m, f] of Object.entries(other))
      expect(f).toBe(
        materialFill(
          sectionInUnits(section('fill-clean-sand.yaml')).strata.find((t) => t.material === m)!
            .tint,
        ),
      );
  });
});

describe('placing words', () => {
  test('a box is clear of a line that misses it, not of one that crosses it or an area around it', () => {
    const box = { x0: 0, y0: 0, x1: 10, y1: 10 };
    expect(segmentHitsBox([-5, 5], [15, 5], box)).toBe(true);
    expect(segmentHitsBox([-5, 15], [15, 15], box)).toBe(false);
    expect(
      boxIsClear(box, {
        lines: [
          [
            [20, 0],
            [20, 10],
          ],
        ],
        areas: [],
        boxes: [],
      }),
    ).toBe(true);
    expect(
      boxIsClear(box, {
        lines: [
          [
            [5, -5],
            [5, 15],
          ],
        ],
        areas: [],
        boxes: [],
      }),
    ).toBe(false);
    const around: [number, number][] = [
      [-20, -20],
      [30, -20],
      [30, 30],
      [-20, 30],
    ];
    expect(insidePolygon([5, 5], around)).toBe(true);
    expect(boxIsClear(box, { lines: [], areas: [around], boxes: [] })).toBe(false);
    expect(
      boxIsClear(box, { lines: [], areas: [], boxes: [{ x0: 9, y0: 9, x1: 12, y1: 12 }] }),
    ).toBe(false);
  });
});

describe('shapes from geometry', () => {
  test('ponded water: the area where the piezometric line is above the ground', () => {
    // flat ground to x = 10 rising 1 in 2: the water at y = 2 meets it at x = 14
    const polys = pondedPolygons(
      [
        [0, 0],
        [10, 0],
        [20, 5],
      ],
      [
        [0, 2],
        [20, 2],
      ],
    );
    expect(polys).toHaveLength(1);
    const xs = polys[0].map((p) => p[0]);
    expect(Math.min(...xs)).toBe(0);
    expect(Math.max(...xs)).toBeCloseTo(14, 9);
    expect(
      pondedPolygons(
        [
          [0, 5],
          [20, 5],
        ],
        [
          [0, 2],
          [20, 2],
        ],
      ),
    ).toEqual([]);
  });

  test('a trial circle is drawn where it lies below the ground', () => {
    // centre 10 above flat ground, R 15: the chord half-width is √(15² − 10²) = 11.18
    const [arc] = circleBelowGround(
      [20, 40],
      15,
      [
        [0, 30],
        [50, 30],
      ],
      3600,
    );
    expect(arc[0][0]).toBeCloseTo(20 - Math.sqrt(125), 1);
    expect(arc[arc.length - 1][0]).toBeCloseTo(20 + Math.sqrt(125), 1);
    expect(Math.min(...arc.map((p) => p[1]))).toBeCloseTo(25, 3);
  });

  test("the FS map colours span the least FS (or the polished circle's, when lower) up to twice it", () => {
    expect(fsMapDomain({ xs: [0, 1], ys: [0], fs: [[1.2, 5]] })).toEqual([1.2, 2.4]);
    expect(fsMapDomain({ xs: [0, 1], ys: [0], fs: [[1.2, 1.5]] })).toEqual([1.2, 1.5]);
    expect(fsMapDomain({ xs: [0, 1], ys: [0], fs: [[1.2, 1.5]] }, 1.1)).toEqual([1.1, 1.5]);
    expect(fsMapDomain({ xs: [0], ys: [0], fs: [[null]] })).toBeNull();
  });

  test('the contour levels start at the least FS, end at the top, and step by a round value', () => {
    const levels = fsMapLevels([1.52, 3.04]);
    expect(levels[0]).toBe(1.52);
    expect(levels[levels.length - 1]).toBe(3.04);
    expect(levels.slice(1, -1)).toEqual([1.6, 1.8, 2, 2.2, 2.4, 2.6, 2.8, 3]);
  });
});

describe('drawSection', () => {
  test('the levee: well-formed SVG with strata, ponded water, the critical surface, slices and the caution', () => {
    const s = section('levee-land-side.yaml');
    const r = caseView(analyzeSection(s));
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    const tree = parser.parse(svg);
    const texts = all(tree, 'text').map((t) =>
      typeof t === 'object' ? String((t['#text'] as string | number | undefined) ?? '') : String(t),
    );
    const joined = texts.join(' ');
    // the materials by their own descriptions, in the legend and on the drawing
    for (const d of [
      'Compacted sandy CLAY (levee fill)',
      'Firm silty CLAY (floodplain alluvium)',
      'Medium dense SAND (river terrace aquifer)',
    ])
      expect(joined).toContain(d);
    expect(joined).toContain('ponded water');
    expect(joined).toContain('piezometric line');
    // the FS in a callout at the arc; no radius lines, no cross at the centre
    const callout = all(tree, 'g').find((g) => g.class === 'fs-callout');
    expect(JSON.stringify(callout)).toContain(`FS ${r.governing?.fs.toFixed(3)} (bishop)`);
    expect(all(tree, 'line').filter((l) => l['stroke-dasharray'] === '2 3')).toHaveLength(0);
    expect(all(tree, 'circle').filter((c) => c.class === 'critical-centre')).toHaveLength(1);
    expect(drawSection(s, r, { radii: true })).toContain('stroke-dasharray="2 3"');
    expect(joined).toMatch(/: below the required FS/);
    expect(joined).toContain('x (m)');
    expect(joined).toContain('elevation (m)');
    expect(joined.replace(/\s+/g, ' ')).toContain('Results are for review by a qualified');
    const paths = all(tree, 'path');
    const critical = paths.filter((p) => p.class === 'critical');
    expect(critical).toHaveLength(1);
    expect(critical[0].stroke).toBe(ACCENT);
    const slices = paths.find((p) => p.class === 'slices');
    // a line at every side between two slices: the outer sides end on the ground, with no height
    expect(String(slices?.d).match(/M/g)?.length).toBe(r.results[0].slices.length - 1);
    // the labels on the drawing stay clear of the slip surface and out of the sliding mass
    const arc = pointsOf(String(critical[0].d));
    const mass = [...arc, arc[0]];
    const labels = all(
      all(tree, 'g').find((g) => g.class === 'strata-labels'),
      'text',
    );
    expect(labels.length).toBeGreaterThanOrEqual(2);
    for (const t of labels) {
      const p: [number, number] = [Number(t.x), Number(t.y) - 4];
      expect(insidePolygon(p, mass)).toBe(false);
      const box = { x0: p[0] - 20, y0: p[1] - 6, x1: p[0] + 20, y1: p[1] + 6 };
      expect(boxIsClear(box, { lines: [arc], areas: [], boxes: [] })).toBe(true);
    }
  });

  test("the callout gives the governing method's FS, not the least of the methods on its surface", () => {
    const s = section('levee-land-side.yaml');
    const r = caseView(analyzeSection(s));
    const bishop = r.results[0];
    // A second method on the same surface with a higher FS that governs (as Spencer may
    // govern with Bishop for comparison on the same circle): the callout must name its FS.
    const other = { ...bishop, method: 'spencer' as const, fs: bishop.fs! + 0.002 };
    const svg = drawSection(s, {
      ...r,
      results: [bishop, other],
      governing: { method: 'spencer', fs: other.fs },
    });
    const callout = all(parser.parse(svg), 'g').find((g) => g.class === 'fs-callout');
    expect(JSON.stringify(callout)).toContain(`FS ${other.fs.toFixed(3)} (spencer)`);
  });

  test('a US section is drawn in feet with loads in psf', () => {
    const s = section('cut-us-units.yaml');
    const svg = drawSection(s, caseView(analyzeSection(s)));
    expect(svg).toContain('x (ft)');
    expect(svg).toContain('1800 psf');
    expect(svg).toContain('c′ 150 psf, φ′ 26°');
  });

  test('the search FS map: filled contours over the centres with an FS, its extent outlined exactly, a banded colour bar', () => {
    const s = section('cut-surcharge-seismic.yaml');
    const xs = [18, 20, 22, 24];
    const ys = [44, 46, 48];
    const fs = ys.map((y) =>
      xs.map((x) => (x === 24 && y === 48 ? null : 1.7 + 0.01 * ((x - 22) ** 2 + (y - 46) ** 2))),
    );
    const search: SearchReport = {
      type: 'grid',
      method: 'bishop',
      trials: 120,
      moves: [{ reason: 'minimum on the edge', grid: { x: [20, 26], y: [44, 48], nx: 4, ny: 3 } }],
      grid: { x: [18, 24], y: [44, 48], nx: 4, ny: 3 },
      map: { xs, ys, fs },
      trialBand: {
        within: 0.05,
        count: 7,
        surfaces: [{ surface: { type: 'circle', center: [22, 46], radius: 19 }, fs: 1.7 }],
      },
      howFound: null,
    };
    const r = { ...caseView(analyzeSection(s)), search };
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    const tree = parser.parse(svg);
    const map = all(tree, 'g').find((g) => g.class === 'fs-map');
    const bands = all(map, 'path').filter((b) => b.fill !== 'none');
    const levels = fsMapLevels(fsMapDomain(search.map!)!);
    expect(bands.length).toBeGreaterThanOrEqual(3);
    expect(bands.map((b) => b.fill)).toContain(fsColor(0)); // the least FS at the dark end
    // the filled area spans exactly the map's extent (a centre without a circle leaves its corner blank)
    const pts = bands.flatMap((b) => pointsOf(String(b.d)));
    const extent = pointsOf(String(all(map, 'path').find((c) => c.class === 'fs-map-extent')!.d));
    const [x0, y0] = [Math.min(...extent.map((p) => p[0])), Math.min(...extent.map((p) => p[1]))];
    const [x1, y1] = [Math.max(...extent.map((p) => p[0])), Math.max(...extent.map((p) => p[1]))];
    expect(Math.min(...pts.map((p) => p[0]))).toBeCloseTo(x0, 1);
    expect(Math.max(...pts.map((p) => p[0]))).toBeCloseTo(x1, 1);
    expect(Math.min(...pts.map((p) => p[1]))).toBeCloseTo(y0, 1);
    expect(Math.max(...pts.map((p) => p[1]))).toBeCloseTo(y1, 1);
    expect(all(map, 'path').filter((c) => c.fill === 'none')).toHaveLength(2); // extent and the move
    // the colour bar in the same bands
    const bar = all(tree, 'g').find((g) => g.class === 'color-bar');
    const barFills = all(bar, 'rect')
      .map((c) => c.fill)
      .filter((f) => f !== 'none');
    expect(barFills).toEqual(
      levels.slice(0, -1).map((_, k) => bandColour(levels, k, fsMapDomain(search.map!)!)),
    );
    for (const b of bands) expect(barFills).toContain(b.fill);
    expect(svg).toMatch(/grid search \(bishop\): 120 trials,(<\/text><text[^>]*>| )grid moved 1×/);
    expect(all(tree, 'g').some((g) => g.class === 'trial-surfaces')).toBe(true);
    expect(svg).toMatch(/trial surfaces within 5 % of the(<\/text><text[^>]*>| )least FS/);
    expect(svg).not.toMatch(/lowest trial surfaces/);
  });

  test('a section whose method did not converge still draws, and says so', () => {
    const s = section('cut-homogeneous.yaml');
    // a circle wholly above the ground: rejected, so no method gives an FS
    const r = caseView(
      analyzeSection({
        ...s,
        analysis: { ...s.analysis, surface: { type: 'circle', center: [30, 120], radius: 5 } },
      }),
    );
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg).toContain('no method converged');
    expect(svg).not.toContain('class="critical"');
  });
});
