import { INK } from './palette';
import { svgElement, svgText } from './svg-element';
import { wrapText } from './wrap-text';

/** The caution as lines that fit a drawing `width` pixels wide (24 px margins, ~6.2 px a character). */
export function cautionLines(caution: string, width: number): string[] {
  return wrapText(`Caution: ${caution}`, Math.floor((width - 48) / 6.2));
}

/** The caution block every drawing ends with, its first line at `top`. */
export function cautionBlock(lines: readonly string[], top: number): string {
  return svgElement(
    'g',
    { class: 'caution', 'font-size': 11, fill: INK, 'font-style': 'italic' },
    lines.map((t, i) => svgText(24, top + i * 14, t)),
  );
}

/**
 * The root element of a drawing: size, view box, the bundled font first, and an accessible label.
 *
 * @example svgDocument(800, 400, 'a section', [cautionBlock(cautionLines(CAUTION, 800), 380)])
 */
export function svgDocument(
  width: number,
  height: number,
  label: string,
  children: string[],
): string {
  return svgElement(
    'svg',
    {
      xmlns: 'http://www.w3.org/2000/svg',
      width,
      height,
      viewBox: `0 0 ${width} ${height}`,
      'font-family': 'Fira Sans, Helvetica, Arial, sans-serif',
      role: 'img',
      'aria-label': label,
    },
    children,
  );
}
