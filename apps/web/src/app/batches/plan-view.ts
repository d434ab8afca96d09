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
import type { ResultCollection, ResultFeature, Verdict } from './batch-types';
import { niceStep } from '@scarpline/core/draw';
import { formatChainage, formatFs, formatNumber, lengthUnit, type Units } from './scales';

/**
 * The FS bins, as multiples of the required FS: below 1 fails, then ever larger margins.
 * Colours: our own sequential ramp, dark plum (lowest FS) through clay and ochre to a pale
 * sage-teal, with lightness rising step by step so that order survives grey-scale printing.
 */
export const FS_BIN_EDGES = [1, 1.1, 1.25, 1.5, 2] as const;
export const FS_RAMP = ['#4a1739', '#8a3546', '#b8613e', '#c9913c', '#8fa860', '#5f9f96'] as const;
/** Lines with an FS but no required FS, and lines with no result yet. */
export const NO_RATIO_COLOUR = '#7b858b';

export interface FsBin {
  index: number;
  colour: string;
  label: string;
}

/**
 * The bin of an FS against its required FS (a result below it is always the lowest bin, one
 * that meets it never; the verdict is decided on the unrounded FS).
 */
export function fsBin(
  fs: number | null,
  required: number | null,
  verdict: Verdict | null = null,
): number | null {
  if (fs === null || required === null || !(required > 0)) return null;
  if (verdict === 'below') return 0;
  const ratio = fs / required;
  let i = 0;
  while (i < FS_BIN_EDGES.length && ratio >= FS_BIN_EDGES[i]) i++;
  return verdict === 'meets' ? Math.max(1, i) : i;
}

/** The legend: FS values when every section has the same required FS, multiples otherwise. */
export function fsBins(required: readonly number[]): FsBin[] {
  const one = required.length > 0 && required.every((r) => r === required[0]) ? required[0] : null;
  const v = (k: number) => (one === null ? `${k} ×` : formatFs(one * k));
  const unit = one === null ? ' required FS' : '';
  return FS_RAMP.map((colour, index) => {
    const lo = index === 0 ? null : FS_BIN_EDGES[index - 1];
    const hi = index < FS_BIN_EDGES.length ? FS_BIN_EDGES[index] : null;
    const label =
      lo === null
        ? `under ${v(hi as number)}${unit}: ${VERDICT_WORDS.below}`
        : hi === null
          ? `${v(lo)}${unit} and above`
          : `${v(lo)} – ${v(hi)}${unit}`;
    return { index, colour, label };
  });
}

export interface PlanLine {
  feature: ResultFeature;
  label: string;
  /** SVG polyline points per part, in drawing coordinates. */
  parts: [number, number][][];
  bin: number | null;
  colour: string;
  fails: boolean;
  /** Where its station label goes, or null when it would overlap another. */
  labelAt: { x: number; y: number; anchor: 'start' | 'end' } | null;
  /** A point on the line for the fail mark. */
  mid: [number, number];
}

export interface PlanLayout {
  width: number;
  height: number;
  lines: PlanLine[];
  /** Drawing units per coordinate unit (the same in x and y). */
  scale: number;
  bounds: { minX: number; maxX: number; minY: number; maxY: number };
  scaleBar: { x: number; y: number; length: number; value: number; text: string } | null;
  units: Units | null;
}

type Coord = [number, number];

/**
 * A feature's line in plan: its projected positions when the corridor names its system (the
 * geometry is then longitude and latitude, which would draw stretched), else its geometry.
 */
function coordsOf(f: ResultFeature): Coord[][] {
  const asLine = (c: unknown): Coord[] =>
    Array.isArray(c)
      ? c.flatMap((p): Coord[] =>
          Array.isArray(p) && Number.isFinite(p[0]) && Number.isFinite(p[1])
            ? [[Number(p[0]), Number(p[1])]]
            : [],
        )
      : [];
  const projected = asLine(f.properties.projected_coordinates);
  if (projected.length >= 2) return [projected];
  const g = f.geometry;
  if (!g || !Array.isArray(g.coordinates)) return [];
  if (g.type === 'LineString') return [asLine(g.coordinates)].filter((l) => l.length >= 2);
  if (g.type === 'MultiLineString') {
    return (g.coordinates as unknown[]).map(asLine).filter((l) => l.length >= 2);
  }
  return [];
}

const PAD = { left: 24, right: 64, top: 44, bottom: 52 };

/**
 * The stations' features of the results: the export gives a row per station and design case,
 * then the station's own row (its governing case, its verdict); the plan draws each section
 * line once, as its station's row.
 */
export function stationFeatures(collection: ResultCollection | null): ResultCollection | null {
  if (!collection || collection.features.every((f) => f.properties.row !== 'case')) {
    return collection;
  }
  return {
    ...collection,
    features: collection.features.filter((f) => f.properties.row !== 'case'),
  };
}

/**
 * The section lines in plan at one scale in x and y (north up): the corridor's bounding box
 * fitted into width × at most maxHeight, the height shrunk to what the drawing needs. The
 * coordinates are in the corridor's units (`units`, null when not known).
 */
export function planLayout(
  collection: ResultCollection | null,
  units: Units | null,
  width: number,
  maxHeight = 560,
): PlanLayout {
  const features = collection?.features ?? [];
  const withCoords = features
    .map((feature) => ({ feature, coords: coordsOf(feature) }))
    .filter((f) => f.coords.length > 0);
  const all = withCoords.flatMap((f) => f.coords.flat());
  if (all.length === 0) {
    return {
      width,
      height: 0,
      lines: [],
      scale: 0,
      bounds: { minX: 0, maxX: 0, minY: 0, maxY: 0 },
      scaleBar: null,
      units,
    };
  }
  const xs = all.map((c) => c[0]);
  const ys = all.map((c) => c[1]);
  const bounds = {
    minX: Math.min(...xs),
    maxX: Math.max(...xs),
    minY: Math.min(...ys),
    maxY: Math.max(...ys),
  };
  const spanX = bounds.maxX - bounds.minX;
  const spanY = bounds.maxY - bounds.minY;
  const availW = Math.max(20, width - PAD.left - PAD.right);
  const availH = Math.max(20, maxHeight - PAD.top - PAD.bottom);
  const fit = Math.min(
    spanX > 0 ? availW / spanX : Infinity,
    spanY > 0 ? availH / spanY : Infinity,
  );
  const scale = Number.isFinite(fit) ? fit : 1;
  const drawnW = spanX * scale;
  const drawnH = spanY * scale;
  const height = Math.ceil(drawnH + PAD.top + PAD.bottom);
  const ox = PAD.left + (availW - drawnW) / 2;
  const oy = PAD.top;
  const r = (v: number) => Number(v.toFixed(2));
  const project = ([x, y]: Coord): Coord => [
    r(ox + (x - bounds.minX) * scale),
    r(oy + (bounds.maxY - y) * scale),
  ];

  const taken: { x0: number; x1: number; y0: number; y1: number }[] = [];
  const fits = (box: { x0: number; x1: number; y0: number; y1: number }) =>
    box.x0 >= 0 &&
    box.x1 <= width &&
    !taken.some((t) => box.x0 < t.x1 && box.x1 > t.x0 && box.y0 < t.y1 && box.y1 > t.y0);

  const lines: PlanLine[] = withCoords.map(({ feature, coords }) => {
    const p = feature.properties;
    const bin = fsBin(p.fs, p.required_fs, p.verdict);
    const parts = coords.map((line) => line.map(project));
    const first = parts[0];
    const a = first[Math.floor((first.length - 1) / 2)];
    const b = first[Math.ceil((first.length - 1) / 2)];
    const label =
      p.chainage ?? (p.station === null ? p.section_id : formatChainage(p.station, units));
    return {
      feature,
      label,
      parts,
      bin,
      colour: bin === null ? NO_RATIO_COLOUR : FS_RAMP[bin],
      fails: p.verdict === 'below',
      labelAt: null,
      mid: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2],
    };
  });

  // Station labels beyond the line's right end, failing lines first, where they do not overlap.
  const order = [...lines].sort((a, b) => Number(b.fails) - Number(a.fails));
  for (const line of order) {
    const pts = line.parts.flat();
    const end = pts.reduce((best, q) => (q[0] > best[0] ? q : best), pts[0]);
    const w = line.label.length * 6.4 + 4;
    const candidates = [
      { x: end[0] + 6, y: end[1] + 4, anchor: 'start' as const },
      {
        x: pts.reduce((best, q) => (q[0] < best[0] ? q : best), pts[0])[0] - 6,
        y: end[1] + 4,
        anchor: 'end' as const,
      },
    ];
    for (const c of candidates) {
      const x0 = c.anchor === 'start' ? c.x : c.x - w;
      const box = { x0, x1: x0 + w, y0: c.y - 11, y1: c.y + 3 };
      if (fits(box)) {
        taken.push(box);
        line.labelAt = c;
        break;
      }
    }
  }

  // A scale bar of a round length near a fifth of the drawing.
  const value = niceStep(Math.max(drawnW, availW / 2) / scale / 5);
  const length = value * scale;
  const unit = lengthUnit(units);
  return {
    width,
    height,
    lines,
    scale,
    bounds,
    scaleBar: {
      x: PAD.left,
      y: height - 18,
      length,
      value,
      text: `${formatNumber(value)} ${unit || 'coordinate units'}`,
    },
    units,
  };
}

/**
 * The corridor in plan, our own SVG: each section line from the results GeoJSON, at one
 * scale in x and y with north up, coloured by its FS against the required FS, failing lines
 * thicker and marked, with a legend, a scale bar and a north arrow. Nothing from the network.
 */
@Component({
  selector: 'sl-plan-view',
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './plan-view.html',
  styleUrl: './plan-view.scss',
})
export class PlanView {
  /** The results as the export gives them (the rows of each case are left out: stationFeatures). */
  readonly results = input.required<ResultCollection | null>();
  /** The stations' rows of the results, one a section line. */
  protected readonly stations = computed(() => stationFeatures(this.results()));
  /** The units of the batch's sections: the coordinates are in these (null: not known). */
  readonly units = input<Units | null>(null);
  /** The drawing width in px; measured from the container when not given. */
  readonly width = input<number | null>(null);
  readonly maxHeight = input(560);
  /** A click (or Enter) on a section line. */
  readonly open = output<ResultFeature>();

  /** The width of the container, once measured. */
  private readonly measured = observedWidth();
  protected readonly active = signal<number | null>(null);
  protected readonly focusIndex = signal(0);

  protected readonly layout = computed(() =>
    planLayout(
      this.stations(),
      this.units(),
      this.width() ?? this.measured() ?? 960,
      this.maxHeight(),
    ),
  );
  protected readonly bins = computed(() =>
    fsBins(
      (this.stations()?.features ?? [])
        .map((f) => f.properties.required_fs)
        .filter((r): r is number => r !== null),
    ),
  );
  protected readonly withoutCoords = computed(() => {
    const n = this.stations()?.features.length ?? 0;
    return n - this.layout().lines.length;
  });
  protected readonly activeLine = computed(() => {
    const i = this.active();
    return i === null ? null : (this.layout().lines[i] ?? null);
  });
  protected readonly failCount = computed(() => this.layout().lines.filter((l) => l.fails).length);

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected points(part: [number, number][]): string {
    return part.map((p) => p.join(',')).join(' ');
  }

  protected readonly words = VERDICT_WORDS;

  protected describe(l: PlanLine): string {
    const p = l.feature.properties;
    const verdict = p.verdict === null ? 'no result yet' : VERDICT_WORDS[p.verdict];
    const req = p.required_fs === null ? '' : `, required ${formatFs(p.required_fs)}`;
    return `Station ${l.label}: FS ${formatFs(p.fs)}${req} (${verdict})`;
  }

  protected key(e: KeyboardEvent, i: number, l: PlanLine): void {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      this.open.emit(l.feature);
      return;
    }
    const next = steppedIndex(e.key, i, this.layout().lines.length);
    if (next === null) return;
    e.preventDefault();
    this.focusIndex.set(next);
    this.active.set(next);
    this.host.nativeElement.querySelectorAll<SVGGElement>('.line')[next]?.focus();
  }
}
