import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** The styles a report writes in. */
export type FontStyle = 'regular' | 'italic' | 'bold';

/**
 * Fira Sans from @fontsource/fira-sans (WOFF, which fontkit inside pdfkit reads): Regular,
 * Italic and SemiBold, each in its Latin and its Greek subset. The files split the font by
 * script, so text is written in runs, each in the subset that holds its characters (fontName).
 * The few signs neither subset holds (the prime of c′ and φ′, √, ≤, ≥, →) are written in Noto
 * Sans Math (@fontsource/noto-sans-math, one weight for every style).
 */
const FILES: Record<FontStyle, string> = {
  regular: '400-normal',
  italic: '400-italic',
  bold: '600-normal',
};

const SCRIPTS = ['latin', 'greek', 'math'] as const;
type Script = (typeof SCRIPTS)[number];

let cache: { name: string; data: Buffer }[] | null = null;

/** The font file of a style and script. */
function fontFile(style: FontStyle, script: Script): string {
  if (script === 'math') {
    const dir = dirname(require.resolve('@fontsource/noto-sans-math/package.json'));
    return join(dir, 'files', 'noto-sans-math-latin-400-normal.woff');
  }
  const dir = dirname(require.resolve('@fontsource/fira-sans/package.json'));
  return join(dir, 'files', `fira-sans-${script}-${FILES[style]}.woff`);
}

/** The font files, read once: a name for each style and script, and the WOFF's bytes. */
export function fontFiles(): { name: string; data: Buffer }[] {
  if (cache) return cache;
  cache = (Object.keys(FILES) as FontStyle[]).flatMap((style) =>
    SCRIPTS.map((script) => ({
      name: fontName(style, script),
      data: readFileSync(fontFile(style, script)),
    })),
  );
  return cache;
}

/** The name a style and script is registered under in a document. */
export function fontName(style: FontStyle, script: Script = 'latin'): string {
  return `fira-${style}-${script}`;
}

/** Greek and Coptic, and Greek Extended: the characters of the Greek subset. */
const isGreek = (code: number) =>
  (code >= 0x0370 && code <= 0x03ff) || (code >= 0x1f00 && code <= 0x1fff);

/** The signs Fira Sans's subsets lack, which the math font holds. */
const MATH = new Set([0x2032, 0x2033, 0x2192, 0x221a, 0x2264, 0x2265]);

const scriptOf = (code: number): Script =>
  isGreek(code) ? 'greek' : MATH.has(code) ? 'math' : 'latin';

/**
 * The text cut into runs of one script each.
 *
 * @example scriptRuns('φ′ 30°') // → [{ text: 'φ', script: 'greek' }, { text: '′', script: 'math' }, { text: ' 30°', script: 'latin' }]
 */
export function scriptRuns(text: string): { text: string; script: Script }[] {
  const runs: { text: string; script: Script }[] = [];
  for (const ch of text) {
    const script = scriptOf(ch.codePointAt(0) ?? 0);
    const last = runs[runs.length - 1];
    if (last && last.script === script) last.text += ch;
    else runs.push({ text: ch, script });
  }
  return runs;
}

/** The families the drawings' Greek and math runs are given (fontCallback maps them to their subsets). */
export const GREEK_FAMILY = 'fira-greek';
export const MATH_FAMILY = 'noto-math';

/**
 * A drawing's SVG made ready for svg-to-pdfkit, which writes a text element in one font: each
 * run of Greek in a text wrapped in a tspan of GREEK_FAMILY, each run of the math signs in one
 * of MATH_FAMILY; text drawn over a halo (paint-order stroke) as two texts, the halo first.
 */
export function svgForPdf(svg: string): string {
  return haloFirst(svg).replace(
    /(<text\b[^>]*>)([^<]*)(<\/text>)/g,
    (_m, open: string, body: string, close: string) => {
      const runs = scriptRuns(body);
      if (runs.every((r) => r.script === 'latin')) return `${open}${body}${close}`;
      const family = { greek: GREEK_FAMILY, math: MATH_FAMILY } as const;
      const inner = runs
        .map((r) =>
          r.script === 'latin'
            ? r.text
            : `<tspan font-family="${family[r.script]}">${r.text}</tspan>`,
        )
        .join('');
      return `${open}${inner}${close}`;
    },
  );
}

/**
 * svg-to-pdfkit paints a text's stroke over its fill, ignoring `paint-order="stroke"`: such a
 * text (a label on a halo) becomes the halo alone (its fill the stroke's colour), then the
 * text without a stroke on it.
 */
function haloFirst(svg: string): string {
  return svg.replace(
    /<text\b([^>]*)\spaint-order="stroke"([^>]*)>([^<]*)<\/text>/g,
    (_m, a: string, b: string, body: string) => {
      const attrs = `${a}${b}`;
      const stroke = /\sstroke="([^"]*)"/.exec(attrs)?.[1] ?? '#ffffff';
      const halo = attrs.replace(/\sfill="[^"]*"/, '').concat(` fill="${stroke}"`);
      const plain = attrs.replace(/\sstroke(-[a-z]+)?="[^"]*"/g, '');
      return `<text${halo}>${body}</text><text${plain}>${body}</text>`;
    },
  );
}
