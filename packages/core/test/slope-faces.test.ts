/**
 * The slope faces the search gives ground ranges of their own: runs of segments steeper than
 * 5 % (common practice for "level" ground), all rising or all falling, highest first.
 */
import { searchSettings, slopeFaces } from '../src/search/search-settings';
import type { Polyline } from '../src/model/types';

describe('slopeFaces', () => {
  test('one batter between level ground is one face', () => {
    expect(
      slopeFaces([
        [0, 0],
        [10, 0],
        [20, 5],
        [30, 5],
      ]),
    ).toEqual([{ x0: 10, x1: 20, yLow: 0, yHigh: 5, crestRight: true }]);
  });

  test('a berm splits two batters; the higher comes first; a falling face has its crest on the left', () => {
    const ground: Polyline = [
      [0, 10],
      [8, 6],
      [11, 6],
      [13, 5],
      [30, 5],
      [40, 4.9],
    ];
    expect(slopeFaces(ground)).toEqual([
      { x0: 0, x1: 8, yLow: 6, yHigh: 10, crestRight: false },
      { x0: 11, x1: 13, yLow: 5, yHigh: 6, crestRight: false },
    ]);
  });

  test('a run that turns from rising to falling is two faces', () => {
    const faces = slopeFaces([
      [0, 0],
      [4, 2],
      [8, 0],
    ]);
    expect(faces.map((f) => f.crestRight)).toEqual([true, false]);
  });
});

describe('ground ranges of each face', () => {
  const lowStep: Polyline = [
    [0, 41],
    [8, 41],
    [9.76, 41.88],
    [12, 41.85],
    [48, 42.48],
    [50, 42.3],
  ];

  test('a low step beside a long gentle rise gets ranges at its own crest and toe', () => {
    const s = searchSettings({ type: 'auto' }, 'si', lowStep, 35);
    expect(s.faceRanges).toHaveLength(1);
    const [face] = s.faceRanges;
    expect(face.upper[0]).toBeLessThanOrEqual(9.76);
    expect(face.upper[1]).toBeGreaterThan(9.76);
    expect(face.lower[0]).toBeLessThan(8);
    expect(face.lower[1]).toBeGreaterThanOrEqual(8);
    expect(face.upper[1]).toBeLessThan(15);
  });

  test('one face that is the whole slope, or ranges given, or a grid search: none of their own', () => {
    const cut: Polyline = [
      [0, 0],
      [10, 0],
      [20, 5],
      [30, 5],
    ];
    expect(searchSettings({ type: 'auto' }, 'si', cut, -10).faceRanges).toEqual([]);
    expect(
      searchSettings({ type: 'auto', upper: [10, 12], lower: [8, 9] }, 'si', lowStep, 35)
        .faceRanges,
    ).toEqual([]);
    expect(searchSettings({ type: 'grid' }, 'si', lowStep, 35).faceRanges).toEqual([]);
  });
});
