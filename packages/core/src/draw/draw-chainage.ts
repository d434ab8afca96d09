import { CAUTION } from '../caution';
import type { UnitSystem } from '../model/types';
import { axisBottom, axisLeft } from './axis';
import { chainageLabel } from './chainage-label';
import { legend, type LegendItem } from './legend';
import { BELOW_REQUIRED, INK, MUTED } from './palette';
import { scaleLinear } from './scale-linear';
import { pathData, svgElement, svgText } from './svg-element';
import { cautionBlock, cautionLines, svgDocument } from './svg-document';
import type { Frame } from './types';
import { VERDICT_WORDS } from '../verdict';

/** One station of a corridor: its governing FS (null when none) and required FS. */
export interface ChainagePoint {
  station: number;
  fs: number | null;
  requiredFs: number | null;
}

export interface DrawChainageOptions {
  title?: string;
  units?: UnitSystem;
  width?: number;
  height?: number;
  caution?: string;
}

/**
 * The governing FS along the chainage as an SVG document: a line through the stations'
 * FS (broken where a station has none), filled dots where the required FS is met and open
 * squares where it is not, the required FS as a dashed step line, stations without a result
 * marked under the axis, chainage labels, a legend and the caution.
 *
 * @example drawChainage([{ station: 1000, fs: 1.62, requiredFs: 1.5 }, …], { units: 'si' })
 */
export function drawChainage(
  points: readonly ChainagePoint[],
  options: DrawChainageOptions = {},
): string {
  const width = options.width ?? 1100;
  const plotH = options.height ?? 360;
  const units = options.units ?? 'si';
  const pts = [...points].sort((a, b) => a.station - b.station);
  const left = 70;
  const top = 132;
  const plotW = width - left - 40;
  const stations = pts.map((p) => p.station);
  let s0 = stations.length ? Math.min(...stations) : 0;
  let s1 = stations.length ? Math.max(...stations) : 1;
  if (s1 === s0) [s0, s1] = [s0 - 1, s1 + 1];
  const pad = (s1 - s0) * 0.02;
  const values = pts
    .flatMap((p) => [p.fs, p.requiredFs])
    .filter((v): v is number => v !== null && Number.isFinite(v));
  // the axis stops at 2.5 times the highest required FS: higher values are marked at the top
  const required = pts.map((p) => p.requiredFs).filter((v): v is number => v !== null);
  const cap = required.length ? 2.5 * Math.max(...required) : Infinity;
  const yMax = values.length ? Math.min(Math.max(...values) * 1.12, cap) : 2;
  const clip = (v: number) => Math.min(v, yMax);
  const frame: Frame = {
    left,
    top,
    width: plotW,
    height: plotH,
    x: scaleLinear([s0 - pad, s1 + pad], [left, left + plotW]),
    y: scaleLinear([0, yMax], [top + plotH, top]),
  };
  const parts: string[] = [];
  // required FS: a step line, each station's value held half-way to its neighbours
  const req: [number, number][][] = [];
  let run: [number, number][] = [];
  pts.forEach((p, i) => {
    if (p.requiredFs === null) {
      if (run.length) req.push(run);
      run = [];
      return;
    }
    const a = i > 0 ? (p.station + pts[i - 1].station) / 2 : p.station - pad;
    const b = i + 1 < pts.length ? (p.station + pts[i + 1].station) / 2 : p.station + pad;
    run.push([frame.x(a), frame.y(p.requiredFs)], [frame.x(b), frame.y(p.requiredFs)]);
  });
  if (run.length) req.push(run);
  for (const r of req)
    parts.push(
      svgElement('path', {
        d: pathData(r),
        fill: 'none',
        stroke: INK,
        'stroke-width': 1.4,
        'stroke-dasharray': '8 4',
        class: 'required',
      }),
    );
  // FS line, broken at stations without a result
  let seg: [number, number][] = [];
  const segs: [number, number][][] = [];
  for (const p of pts) {
    if (p.fs === null) {
      if (seg.length) segs.push(seg);
      seg = [];
    } else seg.push([frame.x(p.station), frame.y(clip(p.fs))]);
  }
  if (seg.length) segs.push(seg);
  for (const sgm of segs)
    parts.push(
      svgElement('path', { d: pathData(sgm), fill: 'none', stroke: MUTED, 'stroke-width': 1.2 }),
    );
  let below = 0;
  let none = 0;
  let above = 0;
  for (const p of pts) {
    const x = frame.x(p.station);
    if (p.fs === null) {
      none++;
      const y = frame.top + frame.height;
      parts.push(
        svgElement('path', {
          d: `M${x - 4} ${y - 8}L${x + 4} ${y}M${x + 4} ${y - 8}L${x - 4} ${y}`,
          stroke: MUTED,
          'stroke-width': 1.2,
          class: 'no-result',
        }),
      );
      continue;
    }
    if (p.fs > yMax) {
      above++;
      const y = frame.top;
      parts.push(
        svgElement('path', {
          d: `M${x - 4} ${y + 7}L${x + 4} ${y + 7}L${x} ${y + 1}Z`,
          fill: INK,
          class: 'above',
        }),
      );
      continue;
    }
    const y = frame.y(p.fs);
    if (p.requiredFs !== null && p.fs < p.requiredFs) {
      below++;
      parts.push(
        svgElement('rect', {
          x: x - 4,
          y: y - 4,
          width: 8,
          height: 8,
          fill: '#ffffff',
          stroke: BELOW_REQUIRED,
          'stroke-width': 1.6,
          class: 'below',
        }),
      );
    } else parts.push(svgElement('circle', { cx: x, cy: y, r: 3.5, fill: INK, class: 'meets' }));
  }
  const L = units === 'us' ? 'ft' : 'm';
  const items: LegendItem[] = [
    {
      swatch: 'line',
      style: { stroke: INK, 'stroke-width': 1.4, 'stroke-dasharray': '8 4' },
      label: 'required FS',
    },
    { swatch: 'line', style: { stroke: MUTED, 'stroke-width': 1.2 }, label: 'governing FS' },
    {
      swatch: 'none',
      style: {},
      label: `● ${VERDICT_WORDS.meets} (${pts.length - none - below - above})`,
    },
    { swatch: 'none', style: {}, label: `□ ${VERDICT_WORDS.below} (${below})` },
  ];
  if (above)
    items.push({
      swatch: 'none',
      style: {},
      label: `▲ above ${yMax.toFixed(2)}, off the axis (${above})`,
    });
  if (none)
    items.push({ swatch: 'none', style: {}, label: `× ${VERDICT_WORDS['no-fs']} (${none})` });
  const title = options.title ?? 'Factor of safety along the chainage';
  const cautionTop = top + plotH + 62;
  const caution = cautionLines(options.caution ?? CAUTION, width);
  const height = cautionTop + caution.length * 14 + 14;
  const body = [
    svgElement('rect', { width, height, fill: '#ffffff' }),
    svgText(24, 28, title, { 'font-size': 15, 'font-weight': 700, fill: INK }),
    axisBottom(frame, `chainage (${L})`, (v) => chainageLabel(v, units)),
    axisLeft(frame, 'factor of safety'),
    ...parts,
    svgElement('rect', {
      x: frame.left,
      y: frame.top,
      width: frame.width,
      height: frame.height,
      fill: 'none',
      stroke: INK,
      'stroke-width': 0.8,
    }),
    legend(items, left + plotW - 250, 8),
    cautionBlock(caution, cautionTop),
  ];
  return svgDocument(width, height, title, body);
}
