import { lowerEnvelope, type Polyline } from '@scarpline/core';

/** Linear interpolation of a polyline with x strictly increasing (for independent checks). */
function y(line: Polyline, x: number): number {
  for (let i = 1; i < line.length; i++) {
    const [x0, y0] = line[i - 1];
    const [x1, y1] = line[i];
    if (x >= x0 && x <= x1) return y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
  }
  throw new Error(`x = ${x} outside`);
}

describe('lowerEnvelope', () => {
  test('two crossing lines: the minimum, with the crossing as a vertex', () => {
    // y = x and y = 5 cross at x = 5.
    expect(
      lowerEnvelope(
        [
          [0, 0],
          [10, 10],
        ],
        [
          [0, 5],
          [10, 5],
        ],
      ),
    ).toEqual([
      [0, 0],
      [5, 5],
      [10, 5],
    ]);
  });

  test('is the pointwise minimum everywhere (dense check against min(a, b))', () => {
    const a: Polyline = [
      [0, 3],
      [4, 8],
      [7, 1],
      [12, 6],
      [20, 2],
    ];
    const b: Polyline = [
      [-5, 4],
      [2, 4],
      [9, 5],
      [15, 0],
      [25, 7],
    ];
    const env = lowerEnvelope(a, b);
    expect(env[0][0]).toBe(0);
    expect(env[env.length - 1][0]).toBe(20);
    for (let k = 0; k <= 2000; k++) {
      const x = (20 * k) / 2000;
      expect(y(env, x)).toBeCloseTo(Math.min(y(a, x), y(b, x)), 12);
    }
  });

  test('adds a vertex at every crossing and keeps only vertices of the lower line', () => {
    const a: Polyline = [
      [0, 0],
      [10, 10],
    ];
    const b: Polyline = [
      [0, 2],
      [2, 0],
      [4, 6],
      [10, 4],
    ];
    // Crossings of y = x with b: on [0, 2] (b = 2 − x) at x = 1; on [2, 4] (b = 3x − 6) at
    // x = 3; on [4, 10] (b = 6 − (x − 4)/3) at x = 5.5. Between 3 and 5.5 a is lower, and b's
    // vertex at x = 4 (above a) is left out.
    const env = lowerEnvelope(a, b);
    expect(env.map((p) => p[0])).toEqual([0, 1, 2, 3, 5.5, 10]);
    expect(env[1][1]).toBeCloseTo(1, 12);
    expect(env[3][1]).toBeCloseTo(3, 12);
    expect(env[4][1]).toBeCloseTo(5.5, 12);
    expect(env[5]).toEqual([10, 4]);
  });

  test('only the common x-range', () => {
    expect(
      lowerEnvelope(
        [
          [0, 1],
          [10, 1],
        ],
        [
          [5, 3],
          [20, 3],
        ],
      ),
    ).toEqual([
      [5, 1],
      [10, 1],
    ]);
    expect(
      lowerEnvelope(
        [
          [0, 1],
          [4, 1],
        ],
        [
          [5, 3],
          [20, 3],
        ],
      ),
    ).toEqual([]);
    expect(
      lowerEnvelope(
        [],
        [
          [5, 3],
          [20, 3],
        ],
      ),
    ).toEqual([]);
  });

  test('identical polylines give the same polyline', () => {
    const a: Polyline = [
      [0, 1],
      [3, 4],
      [8, 2],
    ];
    expect(lowerEnvelope(a, a)).toEqual(a);
  });

  test('touching at a vertex is not a crossing', () => {
    expect(
      lowerEnvelope(
        [
          [0, 0],
          [5, 5],
          [10, 0],
        ],
        [
          [0, 5],
          [10, 5],
        ],
      ),
    ).toEqual([
      [0, 0],
      [5, 5],
      [10, 0],
    ]);
  });

  test('keeps a vertical step of the lower polyline', () => {
    const step: Polyline = [
      [0, 2],
      [5, 2],
      [5, 6],
      [10, 6],
    ];
    const level: Polyline = [
      [0, 4],
      [10, 4],
    ];
    expect(lowerEnvelope(step, level)).toEqual([
      [0, 2],
      [5, 2],
      [5, 4],
      [10, 4],
    ]);
  });

  test('is symmetric in its arguments', () => {
    const a: Polyline = [
      [0, 3],
      [4, 8],
      [7, 1],
      [12, 6],
    ];
    const b: Polyline = [
      [0, 4],
      [6, 4],
      [12, 5],
    ];
    expect(lowerEnvelope(a, b)).toEqual(lowerEnvelope(b, a));
  });
});
