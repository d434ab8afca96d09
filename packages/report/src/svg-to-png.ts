import { Resvg } from '@resvg/resvg-js';

/**
 * A drawing's SVG as PNG, at the drawing's own size in pixels on a white ground, rendered by
 * resvg (its binary ships in its npm package; no browser). The drawings cut their geometry to
 * the plot area themselves, so the PNG shows what a browser shows; text in the system's fonts.
 */
export function svgToPng(svg: string): Buffer {
  return new Resvg(svg, {
    background: '#ffffff',
    font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' },
  })
    .render()
    .asPng();
}
