/**
 * Clipping in code: the rectangle clippers against closed forms, and every example's section
 * drawing without an SVG clip path, each drawn shape of its plot inside the plot rectangle, so
 * that a browser, librsvg and ImageMagick show the same drawing.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { XMLParser } from 'fast-xml-parser';
import { PNG } from 'pngjs';
import {
  analyzeSection,
  caseView,
  drawChainage,
  drawSection,
  parseSections,
} from '@scarpline/core';
import { chainageLayout } from '../src/draw/chainage-layout';
import { clipPolygon, clipPolyline, clipSegment, type Rect } from '../src/draw/clip-rect';

const EXAMPLES = join(__dirname, '..', '..', '..', 'examples');
const SQUARE: Rect = { x0: 0, y0: 0, x1: 10, y1: 10 };

/** Shoelace area of a ring (closed form). */
const area = (ring: readonly [number, number][]): number =>
  Math.abs(
    ring.reduce((sum, p, i) => {
      const q = ring[(i + 1) % ring.length];
      return sum + p[0] * q[1] - q[0] * p[1];
    }, 0) / 2,
  );

describe('clipping to a rectangle', () => {
  test('a polygon keeps exactly its area inside (Sutherland–Hodgman)', () => {
    // a diamond of half-diagonal 10 centred on the square's corner (0, 0): a quarter inside, 50
    expect(
      area(
        clipPolygon(
          [
            [-10, 0],
            [0, -10],
            [10, 0],
            [0, 10],
          ],
          SQUARE,
        ),
      ),
    ).toBeCloseTo(50, 9);
    // a polygon over the whole square becomes the square
    const big = clipPolygon(
      [
        [-5, -5],
        [15, -5],
        [15, 15],
        [-5, 15],
      ],
      SQUARE,
    );
    expect(area(big)).toBeCloseTo(100, 9);
    for (const p of big) expect(p.every((v) => v >= 0 && v <= 10)).toBe(true);
    // wholly outside: nothing; wholly inside: unchanged
    expect(
      clipPolygon(
        [
          [20, 20],
          [30, 20],
          [25, 30],
        ],
        SQUARE,
      ),
    ).toEqual([]);
    const tri: [number, number][] = [
      [1, 1],
      [9, 1],
      [5, 8],
    ];
    expect(clipPolygon(tri, SQUARE)).toEqual(tri);
    // a concave U whose arms both leave through the top keeps its area inside: 10·10 − 4·8
    const u: [number, number][] = [
      [0, 0],
      [10, 0],
      [10, 20],
      [7, 20],
      [7, 2],
      [3, 2],
      [3, 20],
      [0, 20],
    ];
    expect(area(clipPolygon(u, SQUARE))).toBeCloseTo(100 - 4 * 8, 9);
  });

  test('a segment keeps its part inside (Liang–Barsky), by similar triangles', () => {
    expect(clipSegment([-5, 5], [5, 5], SQUARE)).toEqual([
      [0, 5],
      [5, 5],
    ]);
    const diag = clipSegment([-2, 0], [22, 12], SQUARE)!; // y = (x + 2) / 2
    expect(diag[0][0]).toBeCloseTo(0, 12);
    expect(diag[0][1]).toBeCloseTo(1, 12);
    expect(diag[1][0]).toBeCloseTo(10, 12);
    expect(diag[1][1]).toBeCloseTo(6, 12);
    expect(clipSegment([-5, -5], [-1, 20], SQUARE)).toBeNull();
    expect(clipSegment([11, 0], [11, 10], SQUARE)).toBeNull(); // parallel, outside
  });

  test('a polyline that leaves and comes back is two runs', () => {
    const runs = clipPolyline(
      [
        [1, 5],
        [5, 5],
        [5, 15],
        [8, 15],
        [8, 5],
        [9, 5],
      ],
      SQUARE,
    );
    expect(runs).toEqual([
      [
        [1, 5],
        [5, 5],
        [5, 10],
      ],
      [
        [8, 10],
        [8, 5],
        [9, 5],
      ],
    ]);
    expect(
      clipPolyline(
        [
          [-3, -3],
          [-1, -8],
        ],
        SQUARE,
      ),
    ).toEqual([]);
  });
});

const parser = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '' });
type El = Record<string, unknown>;

/** Every element under a node, with its tag. */
function elements(node: unknown, out: { tag: string; el: El }[] = []): { tag: string; el: El }[] {
  if (node && typeof node === 'object')
    for (const [k, v] of Object.entries(node as El)) {
      if (k.startsWith('#') || typeof v !== 'object' || v === null) continue;
      for (const e of Array.isArray(v) ? v : [v]) {
        if (e && typeof e === 'object') {
          out.push({ tag: k, el: e as El });
          elements(e, out);
        }
      }
    }
  return out;
}

/** The points a path's absolute M, L, H, V commands visit (the drawings use no others). */
function pathPoints(d: string): [number, number][] {
  const pts: [number, number][] = [];
  let [x, y] = [0, 0];
  for (const m of d.matchAll(/([MLHVZ])([^MLHVZ]*)/g)) {
    const v = m[2]
      .trim()
      .split(/[\s,]+/)
      .filter(Boolean)
      .map(Number);
    if (m[1] === 'M' || m[1] === 'L') [x, y] = [v[0], v[1]];
    else if (m[1] === 'H') x = v[0];
    else if (m[1] === 'V') y = v[0];
    else continue;
    pts.push([x, y]);
  }
  return pts;
}

/** The corners (or anchor points) of a drawn element. */
function pointsOf(tag: string, e: El): [number, number][] {
  const n = (k: string) => Number(e[k] ?? 0);
  switch (tag) {
    case 'path':
      expect(String(e.d)).toMatch(/^[MLHVZ\d\s.,-]*$/); // no arcs or relative commands to miss
      return pathPoints(String(e.d));
    case 'line':
      return [
        [n('x1'), n('y1')],
        [n('x2'), n('y2')],
      ];
    case 'circle':
      return [
        [n('cx') - n('r'), n('cy') - n('r')],
        [n('cx') + n('r'), n('cy') + n('r')],
      ];
    case 'rect':
      return [
        [n('x'), n('y')],
        [n('x') + n('width'), n('y') + n('height')],
      ];
    case 'text':
      return [[n('x'), n('y')]];
    default:
      return [];
  }
}

const files = readdirSync(EXAMPLES).filter((f) => f.endsWith('.yaml'));

describe('the section drawings clip in code', () => {
  test.each(files)(
    '%s: no clip path, every shape of the plot inside the plot rectangle',
    (file) => {
      const s = parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file).sections[0];
      const svg = drawSection(s, caseView(analyzeSection(s)));
      expect(svg).not.toMatch(/clip-path|<clipPath/);
      const all = elements(parser.parse(svg));
      const frame = all.find((x) => x.tag === 'rect' && x.el.class === 'plot-frame')!.el;
      const [x0, y0] = [Number(frame.x), Number(frame.y)];
      const [x1, y1] = [x0 + Number(frame.width), y0 + Number(frame.height)];
      const plot = all.find((x) => x.tag === 'g' && x.el.class === 'plot')!.el;
      const shapes = elements(plot);
      expect(shapes.length).toBeGreaterThan(5);
      const tol = 0.006; // coordinates are written to two decimals
      let checked = 0;
      for (const { tag, el } of shapes)
        for (const [x, y] of pointsOf(tag, el)) {
          checked++;
          const where = `${file}: <${tag}> ${JSON.stringify(el).slice(0, 120)}`;
          expect([where, x >= x0 - tol && x <= x1 + tol]).toEqual([where, true]);
          expect([where, y >= y0 - tol && y <= y1 + tol]).toEqual([where, true]);
        }
      expect(checked).toBeGreaterThan(20);
    },
  );
});

describe('the chainage drawing keeps inside its plot without a clip path', () => {
  test('an FS far above the axis is drawn at its top edge; the lines stay in the plot', () => {
    const points = [
      { station: 1000, fs: 2, requiredFs: 1.5 },
      { station: 1020, fs: 9, requiredFs: 1.5 },
      { station: 1040, fs: 0.8, requiredFs: 1.5 },
    ];
    const svg = drawChainage(points, { units: 'si', title: 'wcb-main' });
    expect(svg).not.toMatch(/clip-path|<clipPath/);
    const l = chainageLayout(points, { width: 640, height: 300, units: 'si' });
    for (const d of [l.fsPath, l.requiredPath])
      for (const [x, y] of pathPoints(d)) {
        expect(x).toBeGreaterThanOrEqual(l.plot.left - 0.01);
        expect(x).toBeLessThanOrEqual(l.plot.right + 0.01);
        expect(y).toBeGreaterThanOrEqual(l.plot.top - 0.01);
        expect(y).toBeLessThanOrEqual(l.plot.bottom + 0.01);
      }
    expect(pathPoints(l.fsPath)).toHaveLength(3);
  });
});

/** Whether rsvg-convert runs here, installing Debian's librsvg2-bin when missing and root may. */
function rsvgConvert(): { ok: true } | { ok: false; why: string } {
  const runs = () => spawnSync('rsvg-convert', ['--version']).status === 0;
  if (runs()) return { ok: true };
  if (process.getuid?.() !== 0 || spawnSync('apt-get', ['--version']).status !== 0)
    return { ok: false, why: 'rsvg-convert is not installed and apt-get cannot install it here' };
  const apt = (args: string[]) =>
    spawnSync('apt-get', args, {
      timeout: 240_000,
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    }).status === 0;
  const install = ['install', '-y', '--no-install-recommends', 'librsvg2-bin'];
  if (!apt(install) && !(apt(['update']) && apt(install)))
    return {
      ok: false,
      why: "apt-get could not install librsvg2-bin (Debian's registry unreachable?)",
    };
  return runs()
    ? { ok: true }
    : { ok: false, why: 'librsvg2-bin installed but rsvg-convert does not run' };
}

const rsvg = rsvgConvert();
if (!rsvg.ok) console.warn(`skipping the rsvg-convert check: ${rsvg.why}`);
const rsvgTest = rsvg.ok ? test : test.skip;

describe('librsvg renders the drawing', () => {
  rsvgTest(
    `rsvg-convert: the levee's strata colours fill the image${rsvg.ok ? '' : ` (skipped: ${rsvg.why})`}`,
    () => {
      const file = 'levee-land-side.yaml';
      const s = parseSections(readFileSync(join(EXAMPLES, file), 'utf8'), file).sections[0];
      const svg = drawSection(s, caseView(analyzeSection(s)));
      const dir = mkdtempSync(join(tmpdir(), 'scarpline-rsvg-'));
      writeFileSync(join(dir, 'levee.svg'), svg);
      execFileSync('rsvg-convert', ['-o', join(dir, 'levee.png'), join(dir, 'levee.svg')]);
      const png = PNG.sync.read(readFileSync(join(dir, 'levee.png')));
      const [, w, h] = /width="(\d+)" height="(\d+)"/.exec(svg)!;
      expect([png.width, png.height]).toEqual([Number(w), Number(h)]);
      const strata = /<g class="strata">(.*?)<\/g>/.exec(svg)![1];
      const fills = [...new Set([...strata.matchAll(/fill="(#[0-9a-f]{6})"/g)].map((m) => m[1]))];
      expect(fills.length).toBe(3);
      const count = new Map<string, number>();
      for (let i = 0; i < png.data.length; i += 4) {
        const hex = `#${[0, 1, 2].map((k) => png.data[i + k].toString(16).padStart(2, '0')).join('')}`;
        count.set(hex, (count.get(hex) ?? 0) + 1);
      }
      // each material's fill covers a good many pixels of the image, as in a browser
      for (const f of fills) expect([f, (count.get(f) ?? 0) > 500]).toEqual([f, true]);
    },
  );
});
