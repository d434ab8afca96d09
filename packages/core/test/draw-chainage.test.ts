/** The FS-along-the-chainage drawing and chainage labels. */
import { XMLValidator } from 'fast-xml-parser';
import { CAUTION, chainageLabel, drawChainage } from '@scarpline/core';
import { CHAINAGE_STYLE, chainageLayout, chainageMarker } from '@scarpline/core/draw';

describe('chainageLabel', () => {
  test('km + m for si, hundreds of feet + feet for us (road and rail notation)', () => {
    expect(chainageLabel(1240, 'si')).toBe('1+240');
    expect(chainageLabel(20, 'si')).toBe('0+020');
    expect(chainageLabel(1240.5, 'si')).toBe('1+240.5');
    expect(chainageLabel(15000, 'us')).toBe('150+00');
    expect(chainageLabel(15007, 'us')).toBe('150+07');
  });
});

describe('chainageLayout: the one chart of the command and the web page', () => {
  const points = [
    { station: 1060, fs: 1.3, requiredFs: 1.5 },
    { station: 1000, fs: 2.0, requiredFs: 1.5 },
    { station: 1040, fs: 1.8, requiredFs: 1.6 },
    { station: 1020, fs: null, requiredFs: 1.5 },
    { station: 1080, fs: 9, requiredFs: null },
  ];
  const l = chainageLayout(points, { width: 640, height: 300, units: 'si' });

  test('places the stations in chainage order by their scales, marks each, and clips an FS off the axis', () => {
    expect(l.stations.map((s) => s.point.station)).toEqual([1000, 1020, 1040, 1060, 1080]);
    expect(l.stations.map((s) => s.mark)).toEqual([
      'meets',
      'no-fs',
      'meets',
      'below',
      'no-requirement',
    ]);
    for (const s of l.stations) expect(s.x).toBeCloseTo(l.x(s.point.station), 9);
    expect(l.stations[0].y).toBeCloseTo(l.y(2), 9);
    expect(l.yMax).toBe(4); // 2.5 × 1.6 = 4 caps the axis; 9 is drawn at the top edge
    expect(l.stations[4]).toMatchObject({ clipped: true, y: l.y(4) });
    expect(l.stations[3].labelY).not.toBeNull();
    expect(l.xTicks.map((t) => t.text)).toContain('1+040');
  });

  test('the FS line breaks at a station without an FS; the required FS steps half-way between stations', () => {
    expect(l.fsPath.match(/M/g)).toHaveLength(2);
    const half = (l.x(1040) + l.x(1060)) / 2;
    expect(l.requiredPath).toContain(`H${Number(half.toFixed(2))}`);
  });

  test('the markers differ in shape, not only in colour', () => {
    const shapes = (['meets', 'below', 'no-requirement', 'no-fs'] as const).map((m) =>
      chainageMarker(m, 10, 10).replace(/[\d.-]+/g, '#'),
    );
    expect(new Set(shapes).size).toBeGreaterThanOrEqual(3); // a dot and a ring share a shape but not a fill
    expect(CHAINAGE_STYLE.meets.fill).not.toBe(CHAINAGE_STYLE['no-requirement'].fill);
  });
});

describe('drawChainage', () => {
  const points = [
    { station: 1000, fs: 1.62, requiredFs: 1.5 },
    { station: 1020, fs: 1.41, requiredFs: 1.5 },
    { station: 1040, fs: null, requiredFs: 1.5 },
    { station: 1060, fs: 1.7, requiredFs: 1.6 },
    { station: 1080, fs: 1.55, requiredFs: 1.6 },
  ];
  const svg = drawChainage(points, { units: 'si', title: 'wcb-main' });

  test('is well-formed SVG with chainage labels and the caution', () => {
    expect(XMLValidator.validate(svg)).toBe(true);
    expect(svg).toContain('1+000');
    expect(svg).toContain('chainage (m)');
    expect(svg.replace(/\s+/g, ' ')).toContain(CAUTION.slice(0, 60));
  });

  test('marks each station: meets, below the required FS, or without a result', () => {
    expect(svg.match(/class="meets"/g)).toHaveLength(2);
    expect(svg.match(/class="below"/g)).toHaveLength(2);
    expect(svg.match(/class="no-fs"/g)).toHaveLength(1);
    // a label over each station below its requirement
    expect(svg).toMatch(/>1\+020</);
    expect(svg).toMatch(/>1\+080</);
  });

  test('draws the required FS as a step line that changes where the requirement does', () => {
    const d = /class="required"/.test(svg)
      ? /<path d="([^"]+)"[^>]*class="required"/.exec(svg)?.[1]
      : '';
    const ys = new Set(
      [...(d ?? '').matchAll(/M[\d.]+ ([\d.]+)|V([\d.]+)/g)].map((m) => m[1] ?? m[2]),
    );
    expect(ys.size).toBe(2); // 1.5 then 1.6
  });
});
