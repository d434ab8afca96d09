/**
 * The drawing functions: scales, ticks, palettes and shapes, and the composed drawings as
 * well-formed SVG carrying what an engineer reads off them.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { CAUTION, analyzeSection, drawSection, parseSections, type Section } from '@scarpline/core';
import { niceStep, niceTicks } from '../src/draw/nice-ticks';
import { scaleLinear } from '../src/draw/scale-linear';
import { ACCENT, fsColor, strataColor } from '../src/draw/palette';
import { pondedPolygons } from '../src/draw/ponded-polygons';
import { circleBelowGround } from '../src/draw/circle-below-ground';
import { fsMapDomain } from '../src/draw/fs-map-shape';
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

  test('the strata ramp darkens with depth, and the accent is none of its colours', () => {
    const l = [0, 1, 2, 3, 4].map((i) => luminance(strataColor(i, 5)));
    for (let k = 1; k < l.length; k++) expect(l[k]).toBeLessThan(l[k - 1]);
    expect([0, 1, 2, 3, 4].map((i) => strataColor(i, 5))).not.toContain(ACCENT);
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

  test('the FS map colours span the least FS up to twice it', () => {
    expect(fsMapDomain({ xs: [0, 1], ys: [0], fs: [[1.2, 5]] })).toEqual([1.2, 2.4]);
    expect(fsMapDomain({ xs: [0, 1], ys: [0], fs: [[1.2, 1.5]] })).toEqual([1.2, 1.5]);
    expect(fsMapDomain({ xs: [0], ys: [0], fs: [[null]] })).toBeNull();
  });
});

describe('drawSection', () => {
  test('the levee: well-formed SVG with strata, ponded water, the critical surface, slices and the caution', () => {
    const s = section('levee-river-side.yaml');
    const r = analyzeSection(s);
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    const tree = parser.parse(svg);
    const texts = all(tree, 'text').map((t) =>
      typeof t === 'object' ? String((t['#text'] as string | number | undefined) ?? '') : String(t),
    );
    const joined = texts.join(' ');
    for (const m of ['bank-clay', 'alluvium', 'sand']) expect(texts).toContain(m);
    expect(joined).toContain('ponded water');
    expect(joined).toContain('piezometric line');
    expect(joined).toContain(`FS ${r.governing?.fs.toFixed(3)}`);
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
  });

  test('a US section is drawn in feet with loads in psf', () => {
    const s = section('cut-us-units.yaml');
    const svg = drawSection(s, analyzeSection(s));
    expect(svg).toContain('x (ft)');
    expect(svg).toContain('1800 psf');
    expect(svg).toContain('c′ 150 psf, φ′ 26°');
  });

  test('the search FS map: a cell per centre with an FS, coloured by the ramp, and a colour bar', () => {
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
      lowest: [{ surface: { type: 'circle', center: [22, 46], radius: 19 }, fs: 1.7 }],
      howFound: null,
    };
    const r = { ...analyzeSection(s), search };
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    const tree = parser.parse(svg);
    const map = all(tree, 'g').find((g) => g.class === 'fs-map');
    const cells = all(map, 'rect').filter((c) => c.fill !== 'none');
    expect(cells).toHaveLength(11); // 12 centres, one without an admissible circle
    expect(cells.map((c) => c.fill)).toContain(fsColor(0)); // the least FS at the dark end
    expect(all(map, 'rect').filter((c) => c.fill === 'none')).toHaveLength(2); // grid and its move
    expect(all(tree, 'g').some((g) => g.class === 'color-bar')).toBe(true);
    expect(all(tree, 'linearGradient')).toHaveLength(1);
    expect(svg).toMatch(/grid search \(bishop\): 120 trials,(<\/text><text[^>]*>| )grid moved 1×/);
    expect(all(tree, 'g').some((g) => g.class === 'trial-surfaces')).toBe(true);
  });

  test('a section whose method did not converge still draws, and says so', () => {
    const s = section('cut-homogeneous.yaml');
    // a circle wholly above the ground: rejected, so no method gives an FS
    const r = analyzeSection({
      ...s,
      analysis: { ...s.analysis, surface: { type: 'circle', center: [30, 120], radius: 5 } },
    });
    const svg = drawSection(s, r);
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg).toContain('no method converged');
    expect(svg).not.toContain('class="critical"');
  });
});
