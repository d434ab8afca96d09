/** The FS-along-the-chainage drawing and chainage labels. */
import { XMLValidator } from 'fast-xml-parser';
import { CAUTION, chainageLabel, drawChainage } from '@scarpline/core';

describe('chainageLabel', () => {
  test('km + m for si, hundreds of feet + feet for us (road and rail notation)', () => {
    expect(chainageLabel(1240, 'si')).toBe('1+240');
    expect(chainageLabel(20, 'si')).toBe('0+020');
    expect(chainageLabel(1240.5, 'si')).toBe('1+240.5');
    expect(chainageLabel(15000, 'us')).toBe('150+00');
    expect(chainageLabel(15007, 'us')).toBe('150+07');
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
    expect(svg.match(/class="no-result"/g)).toHaveLength(1);
  });

  test('draws the required FS as a step line that changes where the requirement does', () => {
    const d = /class="required"/.test(svg)
      ? /<path d="([^"]+)"[^>]*class="required"/.exec(svg)?.[1]
      : '';
    const ys = new Set([...(d ?? '').matchAll(/[ML][\d.]+ ([\d.]+)/g)].map((m) => m[1]));
    expect(ys.size).toBe(2); // 1.5 then 1.6
  });
});
