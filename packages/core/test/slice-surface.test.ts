/**
 * Geometry and slicing checks. References are closed forms and independent exact
 * computations (shoelace areas, disk ∩ polygon by triangle-sector decomposition, polygon
 * clipping), never the slicer itself.
 */
import { circlePolygonMoments } from '../src/geometry/circle-polygon-moments';
import { polygonArea } from '../src/geometry/polygon-area';
import type { Point, Section } from '../src/model/types';
import { prepareSection } from '../src/slices/prepare-section';
import { type SliceSet, type SlicedSurface, sliceSurface } from '../src/slices/slice-surface';
import { makeSection, mc } from './helpers/make-section';

const sum = (a: Float64Array) => a.reduce((s, v) => s + v, 0);

function sliced(
  section: Section,
  surface: Parameters<typeof sliceSurface>[1],
  n = 30,
): SlicedSurface {
  const out = sliceSurface(prepareSection(section), surface, n);
  if (!out.ok) throw new Error(out.reason);
  return out;
}

/** Sutherland–Hodgman clip of a polygon to the half-plane y ≤ level (or y ≥ level). */
function clipY(poly: Point[], level: number, below: boolean): Point[] {
  const inside = (p: Point) => (below ? p[1] <= level : p[1] >= level);
  const out: Point[] = [];
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % poly.length];
    if (inside(a)) out.push(a);
    if (inside(a) !== inside(b)) {
      const t = (level - a[1]) / (b[1] - a[1]);
      out.push([a[0] + t * (b[0] - a[0]), level]);
    }
  }
  return out;
}

// A 2:1 cut, toe at x = 10 (y = 10), crest at x = 30 (y = 20).
const cut = makeSection();
const deep = -100;
const soilPolygon: Point[] = [
  [0, 10],
  [10, 10],
  [30, 20],
  [50, 20],
  [50, deep],
  [0, deep],
];
// A polyline surface entering at x = 22/3 on the toe flat and leaving at x = 30 + 12·12/14.
const poly = {
  type: 'polyline' as const,
  points: [
    [5, 12],
    [12, 6],
    [30, 8],
    [42, 22],
  ] as Point[],
};
const xEntry = 5 + (2 / 6) * 7;
const xExit = 30 + (12 * 12) / 14;
const massPolygon: Point[] = [
  [xEntry, 10],
  [10, 10],
  [30, 20],
  [xExit, 20],
  [30, 8],
  [12, 6],
];
const circle = { type: 'circle' as const, center: [25, 35] as Point, radius: 22 };

describe('sliceSurface: ends and areas', () => {
  test('polyline surface: ends where it meets the ground (closed form)', () => {
    const r = sliced(cut, poly);
    expect(r.lowerEnd[0]).toBeCloseTo(xEntry, 10);
    expect(r.upperEnd[0]).toBeCloseTo(xExit, 10);
    expect(r.slices.mirrored).toBe(false);
  });

  test('polyline surface: slice areas sum to the shoelace area of the sliding mass', () => {
    const r = sliced(cut, poly, 25);
    const exact = Math.abs(polygonArea(massPolygon));
    expect(Math.abs(sum(r.slices.area) - exact) / exact).toBeLessThan(1e-12);
  });

  test('circle: total weight and centroid equal the exact disk ∩ soil computation', () => {
    const r = sliced(cut, circle, 20);
    const exact = circlePolygonMoments(circle.center, circle.radius, soilPolygon);
    const W = sum(r.slices.weight);
    expect(Math.abs(W - 18 * Math.abs(exact.area)) / W).toBeLessThan(1e-12);
    let mx = 0;
    let my = 0;
    for (let i = 0; i < r.slices.n; i++) {
      mx += r.slices.weight[i] * r.slices.cx[i];
      my += r.slices.weight[i] * r.slices.cy[i];
    }
    expect(mx / W).toBeCloseTo(exact.mx / exact.area, 9);
    expect(my / W).toBeCloseTo(exact.my / exact.area, 9);
  });

  test('circle through two strata: weight = Σ γᵢ·area(disk ∩ stratumᵢ)', () => {
    const boundary: Point[] = [
      [0, 10],
      [10, 10],
      [20, 15],
      [50, 15],
    ];
    const s = makeSection({
      materials: { upper: mc('upper', 19, 5, 30), lower: mc('lower', 16, 20, 20) },
      strata: [
        { material: 'upper', top: cut.ground },
        { material: 'lower', top: boundary },
      ],
    });
    const r = sliced(s, circle, 30);
    const upperPoly: Point[] = [...cut.ground, ...[...boundary].reverse()];
    const lowerPoly: Point[] = [...boundary, [50, deep], [0, deep]];
    const exact =
      19 * Math.abs(circlePolygonMoments(circle.center, circle.radius, upperPoly).area) +
      16 * Math.abs(circlePolygonMoments(circle.center, circle.radius, lowerPoly).area);
    expect(Math.abs(sum(r.slices.weight) - exact) / exact).toBeLessThan(1e-12);
    // each slice has one base material: both base ends lie in it
    for (let i = 0; i < r.slices.n; i++) {
      const mid = 0.5 * (r.slices.yBaseL[i] + r.slices.yBaseR[i]);
      const x = 0.5 * (r.slices.xl[i] + r.slices.xr[i]);
      const yB = x < 20 ? 10 + 0.5 * (x - 10) : 15;
      expect(r.slices.material[i]).toBe(mid < yB ? 1 : 0);
    }
  });

  test('slicing invariance: refining n changes the total weight by < 1e-9 (polyline and circle)', () => {
    for (const surface of [poly, circle]) {
      const w = [7, 30, 113, 400].map((n) => sum(sliced(cut, surface, n).slices.weight));
      for (const v of w) expect(Math.abs(v - w[0]) / w[0]).toBeLessThan(1e-9);
    }
  });

  test('slice edges fall on every ground vertex inside the mass', () => {
    const r = sliced(cut, circle, 9);
    const edges = Array.from(r.slices.xl);
    for (const gx of [30]) expect(edges.some((x) => Math.abs(x - gx) < 1e-9)).toBe(true);
    expect(r.slices.n).toBeGreaterThanOrEqual(9);
  });
});

describe('sliceSurface: orientation', () => {
  test('a slope facing the other way gives the mirrored slices', () => {
    const m = (p: Point): Point => [100 - p[0], p[1]];
    const ground = [...cut.ground].reverse().map(m);
    const flipped = makeSection({ ground, strata: [{ material: 'soil', top: ground }] });
    const flippedCircle = {
      type: 'circle' as const,
      center: m(circle.center),
      radius: circle.radius,
    };
    const a = sliced(cut, circle, 30).slices;
    const b = sliced(flipped, flippedCircle, 30).slices;
    expect(b.mirrored).toBe(true);
    expect(b.n).toBe(a.n);
    for (let i = 0; i < a.n; i++) {
      expect(b.xl[i] + 100).toBeCloseTo(a.xl[i], 9);
      expect(b.weight[i]).toBeCloseTo(a.weight[i], 9);
      expect(b.yBaseL[i]).toBeCloseTo(a.yBaseL[i], 9);
    }
    const ra = sliced(cut, circle, 30);
    const rb = sliced(flipped, flippedCircle, 30);
    expect(rb.upperEnd[0]).toBeCloseTo(100 - ra.upperEnd[0], 9);
    expect(rb.base[0][0]).toBeCloseTo(100 - ra.base[ra.base.length - 1][0], 9);
  });

  test('in sliding orientation the crest is on the right and the base rises there', () => {
    const r = sliced(cut, circle, 30);
    const s = r.slices;
    expect(s.yBaseR[s.n - 1]).toBeGreaterThan(s.yBaseL[0]);
    expect(r.upperEnd[1]).toBeGreaterThan(r.lowerEnd[1]);
  });
});

describe('sliceSurface: water', () => {
  const level = 14;
  const wet = makeSection({
    materials: { soil: mc('soil', 18, 10, 25, 20) },
    water: {
      kind: 'piezometric',
      line: [
        [0, level],
        [50, level],
      ],
      unitWeight: 9.81,
    },
  });

  test('weight uses γ above and γsat below the piezometric line (polygon clipping)', () => {
    const r = sliced(wet, poly, 20);
    const below = Math.abs(polygonArea(clipY(massPolygon, level, true)));
    const above = Math.abs(polygonArea(clipY(massPolygon, level, false)));
    expect(sum(r.slices.weight)).toBeCloseTo(18 * above + 20 * below, 8);
  });

  test('pore pressure at the base middle is γw·(y_line − y_base)', () => {
    const r = sliced(wet, poly, 20);
    for (let i = 0; i < r.slices.n; i++) {
      const yb = 0.5 * (r.slices.yBaseL[i] + r.slices.yBaseR[i]);
      expect(r.slices.porePressure[i]).toBeCloseTo(9.81 * Math.max(0, level - yb), 9);
    }
  });

  test('ponded water: vertical force = weight of the water, horizontal = ½·γw·H² on the slope face', () => {
    const r = sliced(wet, poly, 20);
    // water above the toe between the entry and where the slope reaches the water level
    const pond: Point[] = [
      [xEntry, 10],
      [10, 10],
      [18, level],
      [xEntry, level],
    ];
    expect(-sum(r.slices.qy)).toBeCloseTo(9.81 * Math.abs(polygonArea(pond)), 9);
    expect(sum(r.slices.qx)).toBeCloseTo(0.5 * 9.81 * 4 * 4, 9);
  });

  test('ru: u = ru·W/b', () => {
    const s = makeSection({ water: { kind: 'ru', ru: 0.3, unitWeight: 9.81 } });
    const r = sliced(s, circle, 20).slices;
    for (let i = 0; i < r.n; i++) {
      expect(r.porePressure[i]).toBeCloseTo((0.3 * r.weight[i]) / (r.xr[i] - r.xl[i]), 9);
    }
  });
});

describe('sliceSurface: rigid base, loads, crack, strength', () => {
  test('a circle dipping into a rigid base follows its top between the crossings', () => {
    const rock: Point[] = [
      [0, 12],
      [50, 12],
    ];
    const s = makeSection({
      materials: {
        soil: mc('soil', 18, 10, 25),
        rock: { name: 'rock', unitWeight: 0, saturatedUnitWeight: 0, strength: { model: 'rigid' } },
      },
      strata: [
        { material: 'soil', top: cut.ground },
        {
          material: 'rock',
          top: [
            [0, 10],
            [10, 10],
            [12, 11],
            [14, 12],
            [50, 12],
          ],
        },
      ],
    });
    const c = { type: 'circle' as const, center: [25, 35] as Point, radius: 25 };
    const r = sliced(s, c, 40);
    for (let i = 0; i < r.slices.n; i++)
      expect(r.slices.yBaseL[i]).toBeGreaterThanOrEqual(12 - 1e-9);
    // the arc is below y = 12 for |x − 25| < √(25² − 23²) = √96
    const half = Math.sqrt(96);
    const flat = r.base.filter((p) => Math.abs(p[0] - 25) < half - 1e-6);
    expect(flat.length).toBeGreaterThan(3);
    for (const p of flat) expect(p[1]).toBeCloseTo(12, 9);
    // weight = disk ∩ soil above y = 12, exactly: clip the soil polygon
    const soilAbove = clipY(soilPolygon, 12, false);
    const exact = 18 * Math.abs(circlePolygonMoments(c.center, c.radius, soilAbove).area);
    expect(sum(r.slices.weight)).toBeCloseTo(exact, 8);
    rock.length = 0;
  });

  test('strip and line loads: totals and moments', () => {
    const s = makeSection({
      loads: [
        { type: 'strip', from: 32, to: 38, pressure: 20 },
        { type: 'line', x: 35, force: 30, angle: 10 },
      ],
    });
    const r = sliced(s, circle, 30).slices;
    const th = (10 * Math.PI) / 180;
    expect(sum(r.qy)).toBeCloseTo(-20 * 6 - 30 * Math.cos(th), 9);
    expect(sum(r.qx)).toBeCloseTo(30 * Math.sin(th), 9);
    // moment about the origin: strip resultant at x = 35 on y = 20; line load at (35, 20)
    const m = 35 * -120 + 35 * (-30 * Math.cos(th)) - 20 * (30 * Math.sin(th));
    expect(sum(r.qm)).toBeCloseTo(m, 8);
  });

  test('a load outside the sliding mass does not act on it', () => {
    const s = makeSection({ loads: [{ type: 'strip', from: 45, to: 50, pressure: 50 }] });
    expect(sum(sliced(s, circle, 30).slices.qy)).toBe(0);
  });

  test('tension crack: the surface stops where it is the crack depth below the ground; water force ½·γw·hw²', () => {
    const s = makeSection({ crack: { depth: 2, waterDepth: 1.5 } });
    const r = sliced(s, circle, 30);
    const S: SliceSet = r.slices;
    expect(S.yTopR[S.n - 1] - S.yBaseR[S.n - 1]).toBeCloseTo(2, 9);
    expect(r.crack?.waterForce).toBeCloseTo(0.5 * 9.81 * 1.5 * 1.5, 12);
    expect(sum(S.qx)).toBeCloseTo(-0.5 * 9.81 * 1.5 * 1.5, 12);
    // on the crest y = 20: the arc is 2 m below it where 35 − √(22² − u²) = 18
    expect(r.upperEnd[0]).toBeCloseTo(25 + Math.sqrt(22 * 22 - 17 * 17), 9);
  });

  test('automatic crack depth is Rankine 2c′·tan(45° + φ′/2)/γ', () => {
    const s = makeSection({ crack: { depth: 'auto', waterDepth: 0 } });
    const r = sliced(s, circle, 30);
    expect(r.crack?.depth).toBeCloseTo((2 * 10 * Math.tan(((45 + 12.5) * Math.PI) / 180)) / 18, 12);
  });

  test('undrained strength grows with depth below its datum', () => {
    const s = makeSection({
      materials: {
        clay: {
          name: 'clay',
          unitWeight: 17,
          saturatedUnitWeight: 17,
          strength: { model: 'undrained', su: 20, suRate: 1.5, suDatum: 18 },
        },
      },
      strata: [{ material: 'clay', top: cut.ground }],
    });
    const r = sliced(s, circle, 30).slices;
    for (let i = 0; i < r.n; i++) {
      const xm = 0.5 * (r.xl[i] + r.xr[i]);
      const ym = 35 - Math.sqrt(22 * 22 - (xm - 25) ** 2);
      expect(r.cohesion[i]).toBeCloseTo(20 + 1.5 * Math.max(0, 18 - ym), 9);
      expect(r.tanPhi[i]).toBe(0);
    }
  });
});

describe('sliceSurface: rejections', () => {
  const prepared = prepareSection(cut);
  const why = (surface: Parameters<typeof sliceSurface>[1]) => {
    const out = sliceSurface(prepared, surface, 20);
    return out.ok ? 'ok' : out.code;
  };
  test('a circle above the ground', () => {
    expect(why({ type: 'circle', center: [25, 60], radius: 10 })).toBe('misses-ground');
  });
  test('a circle that leaves the section through its side', () => {
    expect(why({ type: 'circle', center: [0, 30], radius: 25 })).toBe('leaves-section');
  });
  test('a circle that comes out of the ground and goes back in', () => {
    const ditch = makeSection({
      ground: [
        [0, 10],
        [20, 10],
        [25, 4],
        [30, 10],
        [50, 10],
      ],
    });
    const out = sliceSurface(
      prepareSection(ditch),
      { type: 'circle', center: [25, 20], radius: 13 },
      20,
    );
    expect(out.ok ? 'ok' : out.code).toBe('reemerges');
  });
  test('a polyline that turns back', () => {
    expect(
      why({
        type: 'polyline',
        points: [
          [5, 12],
          [12, 6],
          [11, 8],
          [42, 22],
        ],
      }),
    ).toBe('not-admissible');
  });
  test('a polyline that ends below the ground', () => {
    expect(
      why({
        type: 'polyline',
        points: [
          [5, 12],
          [12, 6],
          [30, 8],
          [35, 12],
        ],
      }),
    ).toBe('leaves-section');
  });
  test('a crack deeper than the mass', () => {
    const s = makeSection({ crack: { depth: 30, waterDepth: 0 } });
    const out = sliceSurface(prepareSection(s), circle, 20);
    expect(out.ok ? 'ok' : out.code).toBe('crack-too-deep');
  });
});
