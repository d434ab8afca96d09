import type { UnitSystem } from '../model/types';
import { chainageLabel } from './chainage-label';
import { niceStep } from './nice-ticks';
import { BELOW_REQUIRED, GRID_LINE, INK, MEETS, MUTED } from './palette';
import { scaleLinear, type LinearScale } from './scale-linear';

/** One station of a corridor: its governing FS (null when none) and required FS. */
export interface ChainagePoint {
  station: number;
  fs: number | null;
  requiredFs: number | null;
  /** How the station is written (default: its chainage, chainageLabel). */
  label?: string;
}

/** How a station is marked: its FS against its requirement, or no FS. */
export type ChainageMark = 'meets' | 'below' | 'no-requirement' | 'no-fs';

/** A station placed on the chart (pixels). */
export interface PlacedStation<P extends ChainagePoint = ChainagePoint> {
  point: P;
  label: string;
  mark: ChainageMark;
  x: number;
  /** The marker's y: its FS, the top edge when above the axis, under the axis when it has none. */
  y: number;
  /** Above the top of the FS axis: drawn at the top edge with a mark that says so. */
  clipped: boolean;
  /** The baseline of a station's label (stations below the requirement only); null when there is no room. */
  labelY: number | null;
}

/** The chart of the FS along a chainage, laid out in pixels: what every drawing of it draws. */
export interface ChainageLayout<P extends ChainagePoint = ChainagePoint> {
  width: number;
  height: number;
  plot: { left: number; right: number; top: number; bottom: number };
  x: LinearScale;
  y: LinearScale;
  yMax: number;
  xTicks: { value: number; x: number; text: string }[];
  yTicks: { value: number; y: number; text: string }[];
  stations: PlacedStation<P>[];
  /** The required FS as a step line (path data: M, H, V); empty when none is required. */
  requiredPath: string;
  /** The governing FS as a line through the stations, broken where one has none (path data). */
  fsPath: string;
}

/** The look of the chart, one for every drawing of it (the command's SVG and the web page). */
export const CHAINAGE_STYLE = {
  grid: { stroke: GRID_LINE },
  axis: { stroke: INK },
  tick: { fill: INK, 'font-size': 11 },
  title: { fill: MUTED, 'font-size': 11 },
  required: { stroke: INK, 'stroke-width': 1.5, 'stroke-dasharray': '8 4', fill: 'none' },
  fsLine: { stroke: MUTED, 'stroke-width': 1.2, fill: 'none' },
  meets: { fill: MEETS, stroke: '#ffffff', 'stroke-width': 1 },
  below: { fill: BELOW_REQUIRED, stroke: '#ffffff', 'stroke-width': 1 },
  'no-requirement': { fill: '#ffffff', stroke: INK, 'stroke-width': 1.5 },
  'no-fs': { fill: 'none', stroke: MUTED, 'stroke-width': 1.5 },
  clipped: { fill: INK },
  label: { fill: BELOW_REQUIRED, 'font-size': 11, 'font-weight': 600 },
} as const;

const r2 = (v: number) => Number(v.toFixed(2));

/**
 * The marker of a station as path data, centred on (x, y): a dot for one that meets its
 * requirement, a downward triangle for one below it, a ring for one with no requirement, a
 * cross for one with no FS. Shape and colour both say it (never colour alone).
 *
 * @example chainageMarker('below', 100, 50) // → 'M93 44.4L107 44.4L100 56.3Z'
 */
export function chainageMarker(mark: ChainageMark, x: number, y: number, size = 7): string {
  if (mark === 'below')
    return `M${r2(x - size)} ${r2(y - size * 0.8)}L${r2(x + size)} ${r2(y - size * 0.8)}L${r2(x)} ${r2(y + size * 0.9)}Z`;
  if (mark === 'no-fs') {
    const h = size * 0.6;
    return `M${r2(x - h)} ${r2(y - h)}L${r2(x + h)} ${r2(y + h)}M${r2(x + h)} ${r2(y - h)}L${r2(x - h)} ${r2(y + h)}`;
  }
  const r = mark === 'meets' ? size * 0.6 : size * 0.55;
  return `M${r2(x - r)} ${r2(y)}a${r2(r)} ${r2(r)} 0 1 0 ${r2(2 * r)} 0a${r2(r)} ${r2(r)} 0 1 0 ${r2(-2 * r)} 0Z`;
}

/** The mark above the top edge for a station whose FS is off the axis: a small upward triangle. */
export const clippedMarker = (x: number, y: number): string =>
  `M${r2(x - 3.5)} ${r2(y - 7)}L${r2(x + 3.5)} ${r2(y - 7)}L${r2(x)} ${r2(y - 12)}Z`;

const markOf = (p: ChainagePoint): ChainageMark =>
  p.fs === null || !Number.isFinite(p.fs)
    ? 'no-fs'
    : p.requiredFs === null
      ? 'no-requirement'
      : p.fs < p.requiredFs
        ? 'below'
        : 'meets';

/** The chainage axis of a chart: the plot's ends, a station's x, and the ticks. */
export interface ChainageAxis {
  left: number;
  right: number;
  x: LinearScale;
  ticks: { value: number; x: number; text: string }[];
}

/**
 * The chainage axis that every chart along a corridor shares (the governing FS, P(FS < 1)):
 * the stations' range and 2 % either side over the plot's width less its margins (the FS
 * chart's, 56 and 18, unless given), with ticks about every 90 units of width. Given the
 * same stations and width, a station sits at the same x in each chart.
 *
 * @example chainageAxis([1000, 1020, 1040], { width: 960, units: 'si' }).x(1020) // → 499
 */
export function chainageAxis(
  stations: readonly number[],
  options: { width: number; units: UnitSystem | null; margin?: { left: number; right: number } },
): ChainageAxis {
  const margin = options.margin ?? { left: 56, right: 18 };
  const left = margin.left;
  const right = Math.max(margin.left + 10, options.width - margin.right);
  let s0 = Math.min(...stations);
  let s1 = Math.max(...stations);
  if (!Number.isFinite(s0)) [s0, s1] = [0, 1];
  const pad = s1 > s0 ? (s1 - s0) * 0.02 : 10;
  const x = scaleLinear([s0 - pad, s1 + pad], [left, right]);
  const { units } = options;
  const write = (v: number) =>
    units === null ? String(Number(v.toFixed(3))) : chainageLabel(v, units);
  const ticks = x
    .ticks(Math.max(2, Math.floor((right - left) / 90)))
    .map((value) => ({ value, x: x(value), text: write(value) }));
  return { left, right, x, ticks };
}

/**
 * The chart of the governing FS along the chainage, laid out: x by chainage, y by FS from 0 up
 * to a round value above the required FS (at least 3 and 2.5 times the largest requirement;
 * higher FS are drawn at the top edge and marked), the required FS as a step line held half-way
 * to the neighbouring stations, the FS as a line broken where a station has none, each station
 * marked (chainageMarker), and the stations below their requirement labelled above their
 * marker where there is room. The same layout draws the command's chainage.svg
 * (drawChainage) and the web page's chart.
 *
 * @example chainageLayout([{ station: 1000, fs: 1.62, requiredFs: 1.5 }], { width: 960, height: 320, units: 'si' })
 */
export function chainageLayout<P extends ChainagePoint>(
  points: readonly P[],
  options: {
    width: number;
    height: number;
    units: UnitSystem | null;
    margin?: { left: number; right: number; top: number; bottom: number };
  },
): ChainageLayout<P> {
  const { width, height, units } = options;
  const margin = options.margin ?? { left: 56, right: 18, top: 30, bottom: 46 };
  const pts = [...points].sort((a, b) => a.station - b.station);
  const axis = chainageAxis(
    pts.map((p) => p.station),
    { width, units, margin },
  );
  const plot = {
    left: axis.left,
    right: axis.right,
    top: margin.top,
    bottom: Math.max(margin.top + 10, height - margin.bottom),
  };
  const x = axis.x;

  const fsValues = pts
    .map((p) => p.fs)
    .filter((v): v is number => v !== null && Number.isFinite(v));
  const maxRequired = Math.max(0, ...pts.map((p) => p.requiredFs ?? 0));
  const maxFs = Math.max(0, ...fsValues);
  const cap = Math.max(3, 2.5 * maxRequired);
  const top = Math.min(Math.max(maxFs, maxRequired * 1.2, 0.5), cap);
  const yStep = niceStep(top / 5);
  const yMax = Math.ceil(top / yStep - 1e-9) * yStep;
  const y = scaleLinear([0, yMax], [plot.bottom, plot.top]);

  const write = (v: number) =>
    units === null ? String(Number(v.toFixed(3))) : chainageLabel(v, units);
  const xTicks = axis.ticks;
  const yTicks = y
    .ticks(5)
    .map((value) => ({ value, y: y(value), text: String(Number(value.toFixed(2))) }));

  // labels of the stations below their requirement, a line higher when a neighbour's is in the
  // way; one that finds no room is left out (the words beside the chart name them all)
  const boxes: { x0: number; x1: number; y0: number; y1: number }[] = [];
  const placed = pts.map((p): PlacedStation<P> => {
    const mark = markOf(p);
    const label = p.label ?? write(p.station);
    const px = x(p.station);
    const clipped = p.fs !== null && p.fs > yMax;
    const py = p.fs === null ? plot.bottom - 6 : y(Math.min(p.fs, yMax));
    let labelY: number | null = null;
    if (mark === 'below') {
      const half = (label.length * 6.2) / 2 + 2;
      for (let lift = 0; lift < 3 && labelY === null; lift++) {
        const ly = py - 12 - lift * 13;
        const box = { x0: px - half, x1: px + half, y0: ly - 10, y1: ly + 2 };
        const free =
          ly - 10 >= 0 &&
          box.x0 >= 0 &&
          box.x1 <= width &&
          !boxes.some((b) => box.x0 < b.x1 && box.x1 > b.x0 && box.y0 < b.y1 && box.y1 > b.y0);
        if (free) {
          boxes.push(box);
          labelY = ly;
        }
      }
    }
    return { point: p, label, mark, x: px, y: py, clipped, labelY };
  });

  // the required FS: each station's value held half-way to its neighbours
  const req: string[] = [];
  let open = false;
  let lastY = 0;
  placed.forEach((s, i) => {
    const required = s.point.requiredFs;
    if (required === null) {
      open = false;
      return;
    }
    const prev = placed[i - 1];
    const next = placed[i + 1];
    const x0 = prev ? (prev.x + s.x) / 2 : plot.left;
    const x1 = next ? (s.x + next.x) / 2 : plot.right;
    const py = r2(y(Math.min(required, yMax)));
    if (!open) req.push(`M${r2(x0)} ${py}`);
    else if (py !== lastY) req.push(`V${py}`);
    req.push(`H${r2(x1)}`);
    open = true;
    lastY = py;
  });
  let fsPath = '';
  let pen = false;
  for (const s of placed) {
    if (s.mark === 'no-fs') {
      pen = false;
      continue;
    }
    fsPath += `${pen ? 'L' : 'M'}${r2(s.x)} ${r2(s.y)}`;
    pen = true;
  }
  return {
    width,
    height,
    plot,
    x,
    y,
    yMax,
    xTicks,
    yTicks,
    stations: placed,
    requiredPath: req.join(''),
    fsPath,
  };
}
