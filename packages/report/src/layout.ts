import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
import { CAUTION } from '@scarpline/core/caution';
import {
  fontFiles,
  fontName,
  GREEK_FAMILY,
  MATH_FAMILY,
  scriptRuns,
  svgForPdf,
  type FontStyle,
} from './fonts';

/** A4 portrait, in PDF points. */
const PAGE = { width: 595.28, height: 841.89 };
const MARGIN = { left: 50, right: 50, top: 62, bottom: 84 };
export const INK = '#1b1b1b';
export const MUTED = '#5a5a5a';
const RULE = '#8c8c8c';
const SHADE = '#efefef';

export interface TextStyle {
  style?: FontStyle;
  /** Points (default 9). */
  size?: number;
  color?: string;
}

/** A column of a table: its header, its width in points and how its cells align. */
export interface Column {
  head: string;
  width: number;
  align?: 'left' | 'right';
}

const lineHeight = (size: number) => size * 1.32;

/**
 * A report's pages, laid out top to bottom: the text is written line by line in runs of one
 * script (Fira Sans comes as a Latin and a Greek file), wrapped and broken over pages here, so
 * that nothing runs into the footer; tables repeat their header on each page they continue
 * on. Each page gets the header (Scarpline and the report's title), the caution and "page n
 * of m" as it begins.
 *
 * A layout without `total` is a dry run: it measures and breaks pages but draws nothing, and
 * counts the pages (renderPdf lays a report out dry first, then for real with the count). So
 * pdfkit can write out and let go of each page as the next begins, instead of holding every
 * page of a long corridor report in memory until the count is known.
 */
export class Layout {
  private readonly doc: PDFKit.PDFDocument;
  /** The number of the page being laid out (1-based). */
  page = 1;
  readonly left = MARGIN.left;
  readonly width = PAGE.width - MARGIN.left - MARGIN.right;
  private readonly bottom = PAGE.height - MARGIN.bottom;
  y = MARGIN.top;
  private readonly chunks: Buffer[] = [];
  private readonly done: Promise<Buffer>;

  private readonly dry: boolean;

  constructor(
    private readonly title: string,
    info: { subject: string; author?: string },
    private readonly total: number | null,
  ) {
    this.dry = total === null;
    this.doc = new PDFDocument({
      size: 'A4',
      margin: 0,
      info: {
        Title: title,
        Subject: info.subject,
        Creator: 'Scarpline',
        Producer: 'Scarpline (pdfkit)',
        ...(info.author ? { Author: info.author } : {}),
      },
    });
    for (const f of fontFiles()) this.doc.registerFont(f.name, f.data);
    this.doc.on('data', (c: Buffer) => this.chunks.push(c));
    this.done = new Promise((resolve, reject) => {
      this.doc.on('end', () => resolve(Buffer.concat(this.chunks)));
      this.doc.on('error', reject);
    });
    this.decorate();
  }

  /** The width of a line of text. */
  measure(text: string, t: TextStyle = {}): number {
    const style = t.style ?? 'regular';
    this.doc.fontSize(t.size ?? 9);
    let w = 0;
    for (const r of scriptRuns(text))
      w += this.doc.font(fontName(style, r.script)).widthOfString(r.text);
    return w;
  }

  /** One line of text with its top at (x, y); no wrapping. */
  draw(text: string, x: number, y: number, t: TextStyle = {}): void {
    if (this.dry) return;
    const style = t.style ?? 'regular';
    const size = t.size ?? 9;
    this.doc.fillColor(t.color ?? INK).fontSize(size);
    let at = x;
    for (const r of scriptRuns(text)) {
      this.doc.font(fontName(style, r.script));
      this.doc.text(r.text, at, y, { lineBreak: false });
      at += this.doc.widthOfString(r.text);
    }
  }

  /** The text cut to `width`, ending in an ellipsis when cut. */
  fit(text: string, width: number, t: TextStyle = {}): string {
    if (this.measure(text, t) <= width) return text;
    let s = text;
    while (s.length > 1 && this.measure(`${s}…`, t) > width) s = s.slice(0, -1);
    return `${s}…`;
  }

  /** The text broken into lines no wider than `width`, at spaces (a word too long is cut). */
  wrap(text: string, width: number, t: TextStyle = {}): string[] {
    const lines: string[] = [];
    for (const para of text.split('\n')) {
      let line = '';
      for (const word of para.split(/ +/)) {
        const next = line ? `${line} ${word}` : word;
        if (line && this.measure(next, t) > width) {
          lines.push(line);
          line = word;
        } else line = next;
      }
      lines.push(line);
    }
    return lines.map((l) => (this.measure(l, t) > width ? this.fit(l, width, t) : l));
  }

  /** A new page when `height` does not fit below the cursor; whether one was begun. */
  ensure(height: number): boolean {
    if (this.y + height <= this.bottom) return false;
    this.newPage();
    return true;
  }

  newPage(): void {
    if (!this.dry) this.doc.addPage();
    this.page++;
    this.y = MARGIN.top;
    this.decorate();
  }

  /** A line from (x0, y0) to (x1, y1). */
  private rule(x0: number, y0: number, x1: number, y1: number, width: number, color: string) {
    if (this.dry) return;
    this.doc.moveTo(x0, y0).lineTo(x1, y1).lineWidth(width).strokeColor(color).stroke();
  }

  /** Whether the cursor is at the top of a page. */
  get atTop(): boolean {
    return this.y === MARGIN.top;
  }

  gap(points: number): void {
    this.y += points;
  }

  /** Wrapped text from the left margin (plus `indent`), broken over pages line by line. */
  paragraph(text: string, t: TextStyle & { indent?: number; after?: number } = {}): void {
    const size = t.size ?? 9;
    const indent = t.indent ?? 0;
    for (const line of this.wrap(text, this.width - indent, t)) {
      this.ensure(lineHeight(size));
      this.draw(line, this.left + indent, this.y, t);
      this.y += lineHeight(size);
    }
    this.y += t.after ?? 2;
  }

  /** A heading, kept with at least `keep` points of what follows it. */
  heading(text: string, level: 1 | 2 | 3 = 2, keep = 60): void {
    const size = level === 1 ? 15 : level === 2 ? 11.5 : 9.5;
    const before = level === 1 ? 0 : level === 2 ? 10 : 6;
    if (!this.atTop) this.y += before;
    this.ensure(lineHeight(size) + keep);
    this.draw(text, this.left, this.y, { style: 'bold', size });
    this.y += lineHeight(size);
    if (level <= 2) {
      this.rule(this.left, this.y, this.left + this.width, this.y, level === 1 ? 0.9 : 0.5, RULE);
      this.y += 4;
    } else this.y += 1;
  }

  /** Label–value pairs in two columns, the values wrapped. */
  fields(pairs: readonly (readonly [string, string])[], labelWidth = 120, size = 9): void {
    const h = lineHeight(size);
    for (const [label, value] of pairs) {
      const lines = this.wrap(value || '—', this.width - labelWidth, { size });
      this.ensure(h * Math.min(lines.length, 3));
      this.draw(label, this.left, this.y, { size, color: MUTED });
      for (const l of lines) {
        this.ensure(h);
        this.draw(l, this.left + labelWidth, this.y, { size });
        this.y += h;
      }
    }
    this.y += 3;
  }

  /** Empty lines to write on by hand: a label under each (e.g. checked by, date, signature). */
  handLines(labels: readonly string[]): void {
    const gap = 14;
    const w = (this.width - gap * (labels.length - 1)) / labels.length;
    this.ensure(40);
    this.y += 22;
    labels.forEach((label, i) => {
      const x = this.left + i * (w + gap);
      this.rule(x, this.y, x + w, this.y, 0.6, INK);
      this.draw(label, x, this.y + 2, { size: 7.5, color: MUTED });
    });
    this.y += 16;
  }

  /**
   * A table: a shaded header row, then a row each, cells cut to their column (or, for the
   * columns in `wrap`, wrapped); the header is repeated at the top of each page it goes on to.
   * Columns wider in total than the page are narrowed in proportion.
   */
  table(
    columns: readonly Column[],
    rows: readonly (readonly string[])[],
    options: { size?: number; wrap?: readonly number[] } = {},
  ): void {
    const size = options.size ?? 8;
    const h = lineHeight(size) + 2;
    const total = columns.reduce((s, c) => s + c.width, 0);
    const k = total > this.width ? this.width / total : 1;
    const cols = columns.map((c) => ({ ...c, width: c.width * k }));
    const pad = 2.5;
    const cell = (text: string, i: number, x: number, y: number, t: TextStyle) => {
      const c = cols[i];
      const s = this.fit(text, c.width - 2 * pad, t);
      const dx = c.align === 'right' ? c.width - pad - this.measure(s, t) : pad;
      this.draw(s, x + dx, y, t);
    };
    const header = () => {
      const lines = cols.map((c) => this.wrap(c.head, c.width - 2 * pad, { size, style: 'bold' }));
      const hh = h * Math.max(...lines.map((l) => l.length)) - (h - lineHeight(size) - 2);
      if (!this.dry)
        this.doc
          .rect(this.left, this.y, this.width * Math.min(1, (total * k) / this.width), hh + 2)
          .fill(SHADE);
      let x = this.left;
      lines.forEach((ls, i) => {
        ls.forEach((l, j) => cell(l, i, x, this.y + 2 + j * (h - 2), { size, style: 'bold' }));
        x += cols[i].width;
      });
      this.y += hh + 3;
    };
    this.ensure(3 * h);
    header();
    for (const row of rows) {
      const wrapped = cols.map((c, i) =>
        options.wrap?.includes(i)
          ? this.wrap(row[i] ?? '', c.width - 2 * pad, { size })
          : [row[i] ?? ''],
      );
      const n = Math.max(...wrapped.map((w) => w.length));
      if (this.ensure(n * (h - 2) + 2)) header();
      let x = this.left;
      wrapped.forEach((ls, i) => {
        ls.forEach((l, j) => cell(l, i, x, this.y + 1 + j * (h - 2), { size }));
        x += cols[i].width;
      });
      this.y += n * (h - 2) + 2;
      const right = this.left + cols.reduce((s, c) => s + c.width, 0);
      this.rule(this.left, this.y - 0.5, right, this.y - 0.5, 0.25, '#c8c8c8');
    }
    this.y += 6;
  }

  /** The size an SVG drawing takes on the page (svg). */
  svgSize(svg: string, maxHeight = 420): { w: number; h: number } {
    const m = /<svg[^>]*?\swidth="([\d.]+)"[^>]*?\sheight="([\d.]+)"/.exec(svg);
    const [w0, h0] = m ? [Number(m[1]), Number(m[2])] : [1100, 700];
    const scale = Math.min(this.width / w0, maxHeight / h0);
    return { w: w0 * scale, h: h0 * scale };
  }

  /**
   * An SVG drawing as vector graphics (svg-to-pdfkit), as wide as the page allows and no
   * higher than `maxHeight`, on a new page when it does not fit below the cursor.
   */
  svg(svg: string, maxHeight = 420): void {
    const { w, h } = this.svgSize(svg, maxHeight);
    this.ensure(h + 4);
    if (!this.dry)
      SVGtoPDF(this.doc, svgForPdf(svg), this.left, this.y, {
        width: w,
        height: h,
        preserveAspectRatio: 'xMinYMin meet',
        fontCallback: (family, bold, italic) =>
          fontName(
            bold ? 'bold' : italic ? 'italic' : 'regular',
            family === GREEK_FAMILY ? 'greek' : family === MATH_FAMILY ? 'math' : 'latin',
          ),
        warningCallback: () => undefined,
      });
    this.y += h + 6;
  }

  /** The header and footer of the page begun: the caution, "page n of m". */
  private decorate(): void {
    if (this.dry) return;
    const top = 28;
    this.draw('Scarpline', this.left, top, { style: 'bold', size: 10 });
    const t = this.fit(this.title, this.width - 90, { size: 8.5, color: MUTED });
    this.draw(t, this.left + this.width - this.measure(t, { size: 8.5 }), top + 1.5, {
      size: 8.5,
      color: MUTED,
    });
    this.rule(this.left, top + 16, this.left + this.width, top + 16, 0.6, RULE);
    const foot = PAGE.height - MARGIN.bottom + 14;
    this.rule(this.left, foot, this.left + this.width, foot, 0.6, RULE);
    const page = `page ${this.page} of ${this.total}`;
    const pw = this.measure(page, { size: 8 });
    const caution = this.wrap(`Caution: ${CAUTION}`, this.width - pw - 24, {
      size: 7.5,
      style: 'italic',
    });
    caution.forEach((l, j) =>
      this.draw(l, this.left, foot + 5 + j * lineHeight(7.5), { size: 7.5, style: 'italic' }),
    );
    this.draw(page, this.left + this.width - pw, foot + 5, { size: 8 });
  }

  /** The file's bytes (a dry run: none; its `page` is the count). */
  finish(): Promise<Buffer> {
    if (!this.dry && this.page !== this.total)
      throw new Error(`the report took ${this.page} pages laid out again, ${this.total} at first`);
    this.doc.end();
    return this.done;
  }
}

/**
 * A report as a PDF: `body` lays it out twice, dry to count the pages, then for real with "page
 * n of m" on each (`final` false, then true: say progress on the final run only).
 */
export function renderPdf(
  title: string,
  info: { subject: string; author?: string },
  body: (l: Layout, final: boolean) => void,
): Promise<Buffer> {
  const dry = new Layout(title, info, null);
  body(dry, false);
  const l = new Layout(title, info, dry.page);
  body(l, true);
  return l.finish();
}
