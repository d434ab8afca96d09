import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';

/** The styles a report writes in. */
export type FontStyle = 'regular' | 'italic' | 'bold';

/**
 * Fira Sans from @fontsource/fira-sans (WOFF, which fontkit inside pdfkit reads): Regular,
 * Italic and SemiBold, each in its Latin and its Greek subset. The files split the font by
 * script, so text is written in runs, each in the subset that holds its characters (fontName).
 */
const FILES: Record<FontStyle, string> = {
  regular: '400-normal',
  italic: '400-italic',
  bold: '600-normal',
};

const SCRIPTS = ['latin', 'greek'] as const;
type Script = (typeof SCRIPTS)[number];

let cache: { name: string; data: Buffer }[] | null = null;

/** The font files, read once: a name for each style and script, and the WOFF's bytes. */
export function fontFiles(): { name: string; data: Buffer }[] {
  if (cache) return cache;
  const dir = join(dirname(require.resolve('@fontsource/fira-sans/package.json')), 'files');
  cache = (Object.keys(FILES) as FontStyle[]).flatMap((style) =>
    SCRIPTS.map((script) => ({
      name: fontName(style, script),
      data: readFileSync(join(dir, `fira-sans-${script}-${FILES[style]}.woff`)),
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

/**
 * The text cut into runs of one script each.
 *
 * @example scriptRuns('φ′ 30°') // → [{ text: 'φ', script: 'greek' }, { text: '′ 30°', script: 'latin' }]
 */
export function scriptRuns(text: string): { text: string; script: Script }[] {
  const runs: { text: string; script: Script }[] = [];
  for (const ch of withGlyphs(text)) {
    const script: Script = isGreek(ch.codePointAt(0) ?? 0) ? 'greek' : 'latin';
    const last = runs[runs.length - 1];
    if (last && last.script === script) last.text += ch;
    else runs.push({ text: ch, script });
  }
  return runs;
}

/**
 * Characters neither subset holds, each written as the nearest one that a subset holds: the
 * prime of c′ and φ′ as a right single quotation mark, and so on.
 */
const SUBSTITUTES: Record<string, string> = {
  '\u2032': '\u2019',
  '\u2033': '\u201d',
  '\u2264': '<=',
  '\u2265': '>=',
  '\u2192': '->',
  '\u221a': 'sqrt',
};

const MISSING = new RegExp(`[${Object.keys(SUBSTITUTES).join('')}]`, 'g');

/** The text with the characters the fonts lack replaced (SUBSTITUTES). */
export const withGlyphs = (text: string): string =>
  text.replace(MISSING, (ch) => SUBSTITUTES[ch] ?? ch);

/** The family the drawings' Greek runs are given (fontCallback maps it to the Greek subset). */
export const GREEK_FAMILY = 'fira-greek';

/**
 * A drawing's SVG made ready for svg-to-pdfkit, which writes a text element in one font: the
 * characters the fonts lack replaced, and each run of Greek in a text wrapped in a tspan of
 * GREEK_FAMILY; text drawn over a halo (paint-order stroke) as two texts, the halo first.
 */
export function svgForPdf(svg: string): string {
  return haloFirst(svg).replace(
    /(<text\b[^>]*>)([^<]*)(<\/text>)/g,
    (_m, open: string, body: string, close: string) => {
      const runs = scriptRuns(body);
      if (runs.every((r) => r.script === 'latin')) return `${open}${withGlyphs(body)}${close}`;
      const inner = runs
        .map((r) =>
          r.script === 'greek' ? `<tspan font-family="${GREEK_FAMILY}">${r.text}</tspan>` : r.text,
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
