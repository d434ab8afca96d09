/** Geometry primitives against closed forms. */
import { circlePolygonMoments } from '../src/geometry/circle-polygon-moments';
import { polygonArea } from '../src/geometry/polygon-area';
import { polylineCrossings } from '../src/geometry/polyline-crossings';
import { yAt } from '../src/geometry/y-at';
import { pieceIntegrals } from '../src/slices/base-curve';

describe('yAt', () => {
  const line: [number, number][] = [
    [0, 0],
    [10, 5],
    [20, 5],
  ];
  test('interpolates, holds flat beyond the ends', () => {
    expect(yAt(line, 4)).toBeCloseTo(2, 15);
    expect(yAt(line, 10)).toBe(5);
    expect(yAt(line, 15)).toBe(5);
    expect(yAt(line, -3)).toBe(0);
    expect(yAt(line, 99)).toBe(5);
  });
});

describe('polygonArea (shoelace)', () => {
  test('rectangle and orientation', () => {
    expect(
      polygonArea([
        [0, 0],
        [2, 0],
        [2, 1],
        [0, 1],
      ]),
    ).toBe(2);
    expect(
      polygonArea([
        [0, 1],
        [2, 1],
        [2, 0],
        [0, 0],
      ]),
    ).toBe(-2);
  });
});

describe('circlePolygonMoments: disk ∩ polygon', () => {
  const r = 3;
  test('a half-disk: area πr²/2, centroid 4r/(3π) below the centre (closed form)', () => {
    const below = circlePolygonMoments([1, 2], r, [
      [-10, -10],
      [10, -10],
      [10, 2],
      [-10, 2],
    ]);
    expect(below.area).toBeCloseTo((Math.PI * r * r) / 2, 12);
    expect(below.mx / below.area).toBeCloseTo(1, 12);
    expect(below.my / below.area).toBeCloseTo(2 - (4 * r) / (3 * Math.PI), 12);
  });
  test('a circular segment of height h: area r²·acos((r−h)/r) − (r−h)·√(2rh − h²)', () => {
    const h = 1.2;
    const seg = circlePolygonMoments([0, 0], r, [
      [-10, -10],
      [10, -10],
      [10, -r + h],
      [-10, -r + h],
    ]);
    const exact = r * r * Math.acos((r - h) / r) - (r - h) * Math.sqrt(2 * r * h - h * h);
    expect(seg.area).toBeCloseTo(exact, 12);
    // centroid of a segment of half-angle θ: 4r·sin³θ / (3(2θ − sin 2θ)) from the centre
    const th = Math.acos((r - h) / r);
    expect(-seg.my / seg.area).toBeCloseTo(
      (4 * r * Math.sin(th) ** 3) / (3 * (2 * th - Math.sin(2 * th))),
      12,
    );
  });
  test('a polygon inside the disk keeps its shoelace area', () => {
    const tri: [number, number][] = [
      [0, 0],
      [1, 0],
      [0, 1],
    ];
    expect(circlePolygonMoments([0.2, 0.2], 5, tri).area).toBeCloseTo(0.5, 14);
  });
});

describe('polylineCrossings', () => {
  test('crossings are exact between vertices', () => {
    expect(
      polylineCrossings(
        [
          [0, 0],
          [10, 10],
        ],
        [
          [0, 5],
          [10, 5],
        ],
        0,
        10,
      ),
    ).toEqual([5]);
    const xs = polylineCrossings(
      [
        [0, 0],
        [5, 10],
        [10, 0],
      ],
      [
        [0, 4],
        [10, 4],
      ],
      0,
      10,
    );
    expect(xs[0]).toBeCloseTo(2, 14);
    expect(xs[1]).toBeCloseTo(8, 14);
  });
});

describe('pieceIntegrals of an arc', () => {
  test('∫ y dx under the lower half of a circle is the half-disk area below yc (closed form)', () => {
    const p = { arc: true as const, x0: -2, x1: 2, xc: 0, yc: 0, r: 2 };
    const [iY, iXY, iY2] = pieceIntegrals(p, -2, 2);
    expect(-iY).toBeCloseTo((Math.PI * 4) / 2, 12);
    expect(iXY).toBeCloseTo(0, 12);
    // ∫ (r² − x²) dx over [−r, r] = 4r³/3
    expect(iY2).toBeCloseTo((4 * 8) / 3, 12);
  });
});
