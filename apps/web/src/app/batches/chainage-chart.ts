import {
  ChangeDetectionStrategy,
  Component,
  computed,
  ElementRef,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { observedWidth } from '../shared/observed-width';
import { steppedIndex } from '../shared/stepped-index';
import { VERDICT_WORDS } from '@scarpline/core/verdict';
import type { SectionListItem, Verdict } from './batch-types';
import { niceStep, scaleLinear, type LinearScale } from '@scarpline/core/draw';
import { batchUnits, formatChainage, formatFs, lengthUnit, type Units } from './scales';

/** One station of the chart: a section with a station and a governing FS. */
export interface ChainagePoint {
  sectionId: number;
  station: number;
  label: string;
  fs: number;
  required: number | null;
  /** meets, below, or no-requirement (a plotted station has an FS). */
  verdict: Verdict;
}

/** The stations to plot (those with a station and an FS), by chainage, and how many were left out. */
export function chainagePoints(items: readonly SectionListItem[]): {
  points: ChainagePoint[];
  units: Units | null;
  skipped: number;
} {
  const units = batchUnits(items);
  const points: ChainagePoint[] = [];
  for (const s of items) {
    const r = s.result;
    if (s.station === null || !r || r.governingFs === null || !Number.isFinite(r.governingFs)) {
      continue;
    }
    points.push({
      sectionId: s.id,
      station: s.station,
      label: s.stationLabel ?? formatChainage(s.station, units),
      fs: r.governingFs,
      required: r.requiredFs,
      verdict: r.verdict,
    });
  }
  points.sort((a, b) => a.station - b.station || a.sectionId - b.sectionId);
  return { points, units, skipped: items.length - points.length };
}

export interface PlacedPoint extends ChainagePoint {
  x: number;
  y: number;
  /** Above the top of the FS axis: drawn at the top edge. */
  clipped: boolean;
  /** The baseline of a failing point's station label; null when there is no room for it. */
  labelY: number | null;
}

export interface ChainageLayout {
  width: number;
  height: number;
  plot: { left: number; right: number; top: number; bottom: number };
  x: LinearScale;
  y: LinearScale;
  yMax: number;
  xTicks: { value: number; x: number; text: string }[];
  yTicks: { value: number; y: number; text: string }[];
  points: PlacedPoint[];
  /** The required FS as a step line (SVG path data); empty when none is required. */
  requiredPath: string;
  units: Units | null;
}

const MARGIN = { left: 52, right: 18, top: 30, bottom: 46 };

/**
 * Places the points: x by chainage across the width, y by FS from 0 up. The FS axis stops at
 * a round value above the required FS (at least 3, and 2.5 × the largest required FS) so that
 * the stations near the requirement stay readable; higher FS are drawn at the top edge.
 */
export function chainageLayout(
  points: readonly ChainagePoint[],
  width: number,
  height: number,
  units: Units | null,
): ChainageLayout {
  const plot = {
    left: MARGIN.left,
    right: Math.max(MARGIN.left + 10, width - MARGIN.right),
    top: MARGIN.top,
    bottom: Math.max(MARGIN.top + 10, height - MARGIN.bottom),
  };
  const stations = points.map((p) => p.station);
  let s0 = Math.min(...stations);
  let s1 = Math.max(...stations);
  if (!Number.isFinite(s0)) [s0, s1] = [0, 1];
  const pad = s1 > s0 ? (s1 - s0) * 0.02 : 10;
  const x = scaleLinear([s0 - pad, s1 + pad], [plot.left, plot.right]);

  const maxRequired = Math.max(0, ...points.map((p) => p.required ?? 0));
  const maxFs = Math.max(0, ...points.map((p) => p.fs));
  const cap = Math.max(3, 2.5 * maxRequired);
  const top = Math.min(Math.max(maxFs, maxRequired * 1.2, 0.5), cap);
  const yStep = niceStep(top / 5);
  const yMax = Math.ceil(top / yStep - 1e-9) * yStep;
  const y = scaleLinear([0, yMax], [plot.bottom, plot.top]);

  const xCount = Math.max(2, Math.floor((plot.right - plot.left) / 90));
  const xTicks = x.ticks(xCount).map((value) => ({
    value,
    x: x(value),
    text: formatChainage(value, units),
  }));
  const yTicks = y.ticks(5).map((value) => ({
    value,
    y: y(value),
    text: String(Number(value.toFixed(2))),
  }));

  // Failing stations are labelled above their marker, a line higher when a neighbour's label
  // is in the way; a label that finds no room is left out (the summary names them all).
  const boxes: { x0: number; x1: number; y0: number; y1: number }[] = [];
  const placed = points.map((p): PlacedPoint => {
    const clipped = p.fs > yMax;
    const px = x(p.station);
    const py = y(Math.min(p.fs, yMax));
    let labelY: number | null = null;
    if (p.verdict === 'below') {
      const half = (p.label.length * 6.2) / 2 + 2;
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
    return { ...p, x: px, y: py, clipped, labelY };
  });

  return {
    width,
    height,
    plot,
    x,
    y,
    yMax,
    xTicks,
    yTicks,
    points: placed,
    requiredPath: stepPath(placed, y, plot.left, plot.right),
    units,
  };
}

/** The required FS of each station over half the way to its neighbours: a step line. */
function stepPath(
  points: readonly PlacedPoint[],
  y: (v: number) => number,
  left: number,
  right: number,
): string {
  const parts: string[] = [];
  let open = false;
  let lastY = 0;
  points.forEach((p, i) => {
    if (p.required === null) {
      open = false;
      return;
    }
    const prev = points[i - 1];
    const next = points[i + 1];
    const x0 = prev ? (prev.x + p.x) / 2 : left;
    const x1 = next ? (p.x + next.x) / 2 : right;
    const py = y(p.required);
    const r = (v: number) => Number(v.toFixed(2));
    if (!open) parts.push(`M${r(x0)} ${r(py)}`);
    else if (py !== lastY) parts.push(`V${r(py)}`);
    parts.push(`H${r(x1)}`);
    open = true;
    lastY = py;
  });
  return parts.join(' ');
}

/** The shape of a failing station's marker: a triangle pointing down, centred on (x, y). */
export function downTriangle(x: number, y: number, size = 7): string {
  const r = (v: number) => Number(v.toFixed(2));
  return `M${r(x - size)} ${r(y - size * 0.8)} L${r(x + size)} ${r(y - size * 0.8)} L${r(x)} ${r(y + size * 0.9)} Z`;
}

/**
 * The governing FS of every station along the chainage, with the required FS as a step line;
 * failing stations are downward triangles in the fail colour and labelled. Our own SVG.
 */
@Component({
  selector: 'sl-chainage-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './chainage-chart.html',
  styleUrl: './chainage-chart.scss',
})
export class ChainageChart {
  /** Every section of the batch (not one page). */
  readonly sections = input.required<readonly SectionListItem[]>();
  /** The drawing width in px; measured from the container when not given. */
  readonly width = input<number | null>(null);
  readonly height = input(320);
  /** A click (or Enter) on a station: the section id. */
  readonly open = output<number>();

  /** The width of the container, once measured. */
  private readonly measured = observedWidth();
  protected readonly active = signal<number | null>(null);
  protected readonly focusIndex = signal(0);

  protected readonly data = computed(() => chainagePoints(this.sections()));
  protected readonly layout = computed(() =>
    chainageLayout(
      this.data().points,
      this.width() ?? this.measured() ?? 960,
      this.height(),
      this.data().units,
    ),
  );
  protected readonly failing = computed(() =>
    this.data().points.filter((p) => p.verdict === 'below'),
  );
  protected readonly xTitle = computed(() => {
    const u = lengthUnit(this.data().units);
    return u ? `Chainage (${u})` : 'Chainage';
  });
  protected readonly summary = computed(() => {
    const { points, skipped } = this.data();
    const fails = this.failing();
    const judged = points.filter((p) => p.verdict === 'meets' || p.verdict === 'below').length;
    const parts: string[] = [];
    if (fails.length > 0) {
      const names = fails.slice(0, 12).map((p) => p.label);
      const more = fails.length > 12 ? `, and ${fails.length - 12} more` : '';
      parts.push(
        `${fails.length} of ${judged} stations ${VERDICT_WORDS.below}: ${names.join(', ')}${more}.`,
      );
    } else if (judged > 0) {
      parts.push(`All ${judged} stations meet the required FS.`);
    }
    const free = points.length - judged;
    if (free > 0) parts.push(`${free}: ${VERDICT_WORDS['no-requirement']}.`);
    const above = this.layout().points.filter((p) => p.clipped).length;
    if (above > 0) {
      parts.push(`${above} with FS above ${this.layout().yMax} are drawn at the top edge.`);
    }
    if (skipped > 0) parts.push(`${skipped} not plotted (no station or no result yet).`);
    return parts.join(' ');
  });
  protected readonly activePoint = computed(() => {
    const i = this.active();
    return i === null ? null : (this.layout().points[i] ?? null);
  });

  protected readonly fsText = formatFs;
  protected readonly triangle = downTriangle;

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected readonly words = VERDICT_WORDS;

  protected describe(p: PlacedPoint): string {
    const req = p.required === null ? '' : `, required ${formatFs(p.required)}`;
    return `Station ${p.label}: FS ${formatFs(p.fs)}${req} (${VERDICT_WORDS[p.verdict]})`;
  }

  protected choose(p: PlacedPoint): void {
    this.open.emit(p.sectionId);
  }

  protected key(e: KeyboardEvent, i: number, p: PlacedPoint): void {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      this.choose(p);
      return;
    }
    const next = steppedIndex(e.key, i, this.layout().points.length);
    if (next === null) return;
    e.preventDefault();
    this.focusIndex.set(next);
    this.active.set(next);
    const el = this.host.nativeElement.querySelectorAll<SVGGElement>('.pt')[next];
    el?.focus();
  }
}
