/** Attribute values of an SVG element; null and undefined leave the attribute out. */
export type Attributes = Record<string, string | number | null | undefined>;

/**
 * Text safe inside an SVG (XML) document: & < > " ' escaped.
 *
 * @example escapeXml('c′ < 5 & φ′') // → 'c′ &lt; 5 &amp; φ′'
 */
export function escapeXml(text: string): string {
  return text
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** A number for an attribute: at most two decimals, no trailing zeros, never NaN. */
export function num(v: number): string {
  if (!Number.isFinite(v)) return '0';
  const r = Math.round(v * 100) / 100;
  return String(Object.is(r, -0) ? 0 : r);
}

/**
 * One SVG element as a string. Children are strings already made by this function (or
 * escaped text); an element without children is self-closing.
 *
 * @example svgElement('line', { x1: 0, y1: 0, x2: 10, y2: 0, stroke: '#000' })
 * // → '<line x1="0" y1="0" x2="10" y2="0" stroke="#000"/>'
 */
export function svgElement(
  tag: string,
  attributes: Attributes = {},
  children: string[] = [],
): string {
  let attrs = '';
  for (const [k, v] of Object.entries(attributes)) {
    if (v === null || v === undefined) continue;
    attrs += ` ${k}="${typeof v === 'number' ? num(v) : escapeXml(v)}"`;
  }
  return children.length === 0
    ? `<${tag}${attrs}/>`
    : `<${tag}${attrs}>${children.join('')}</${tag}>`;
}

/**
 * A text element (the text is escaped).
 *
 * @example svgText(10, 20, 'FS 1.25', { 'font-size': 12 }) // → '<text x="10" y="20" font-size="12">FS 1.25</text>'
 */
export function svgText(x: number, y: number, text: string, attributes: Attributes = {}): string {
  return `${svgElement('text', { x, y, ...attributes }).slice(0, -2)}>${escapeXml(text)}</text>`;
}

/**
 * The points of a polyline as an SVG path `d` (M x y L x y …), already in pixels.
 *
 * @example pathData([[0, 0], [10, 5]]) // → 'M0 0L10 5'
 */
export function pathData(points: readonly (readonly [number, number])[], close = false): string {
  let d = '';
  points.forEach(([x, y], i) => {
    d += `${i === 0 ? 'M' : 'L'}${num(x)} ${num(y)}`;
  });
  return close && d ? `${d}Z` : d;
}
