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
import {
  CHAINAGE_MARK_WORDS,
  CHAINAGE_STYLE,
  chainageLayout,
  chainageMarker,
  clippedMarker,
  type ChainageMark,
  type ChainagePoint,
  type PlacedStation,
} from '@scarpline/core/draw';
import { batchUnits, formatChainage, formatFs, type Units } from './scales';
import { ChainageFrame } from './chainage-frame';

/** One station of the chart: a section with a station and a result (its governing FS or none). */
export interface ChartPoint extends ChainagePoint {
  sectionId: number;
  label: string;
  /** The result's verdict (meets, below, no-requirement, no-fs, no-slope). */
  verdict: Verdict;
  /**
   * Laid out but not drawn: the station has no significant slope, or (in a case's chart) it
   * does not have that case. Kept in the layout so that every chart of a batch shares its
   * chainage axis.
   */
  hidden: boolean;
}

/**
 * The stations to plot (those with a station and a result: an FS, or none when no method gave
 * one), by chainage, and how many were left out (no station, or no result yet). With a case's
 * name, each station's FS, required FS and verdict are that case's.
 */
export function chainagePoints(
  items: readonly SectionListItem[],
  caseName: string | null = null,
): {
  points: ChartPoint[];
  units: Units | null;
  skipped: number;
} {
  const units = batchUnits(items);
  const points: ChartPoint[] = [];
  for (const s of items) {
    const r = s.result;
    if (s.station === null || !r) continue;
    const of = caseName === null ? r : (r.cases?.find((c) => c.name === caseName) ?? null);
    const verdict = of?.verdict ?? 'no-fs';
    const hidden = of === null || verdict === 'no-slope';
    const fs =
      !hidden && of.governingFs !== null && Number.isFinite(of.governingFs) ? of.governingFs : null;
    points.push({
      sectionId: s.id,
      station: s.station,
      label: s.stationLabel ?? formatChainage(s.station, units),
      fs,
      requiredFs: hidden ? null : of.requiredFs,
      verdict,
      hidden,
    });
  }
  points.sort((a, b) => a.station - b.station || a.sectionId - b.sectionId);
  return { points, units, skipped: items.length - points.length };
}

let charts = 0;

/**
 * The governing FS of every station along the chainage (or, given a case, that case's FS): the
 * core's chart (chainageLayout and its marks and look, the same as the command's chainage.svg),
 * drawn here so that each station is a link to its section (click, Enter, arrow keys) with its
 * words on hover and focus.
 */
@Component({
  selector: 'sl-chainage-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChainageFrame],
  templateUrl: './chainage-chart.html',
  styleUrl: './chainage-chart.scss',
})
export class ChainageChart {
  /** Every section of the batch (not one page). */
  readonly sections = input.required<readonly SectionListItem[]>();
  /** The design case to chart; null: each station's governing case. */
  readonly caseName = input<string | null>(null);
  /** The drawing width in px; measured from the container when not given. */
  readonly width = input<number | null>(null);
  readonly height = input(320);
  /** A click (or Enter) on a station: the section id. */
  readonly open = output<number>();

  /** The id of the words that describe the chart (one per chart on the page). */
  protected readonly summaryId = `chainage-summary-${++charts}`;
  /** The width of the container, once measured. */
  private readonly measured = observedWidth();
  protected readonly active = signal<number | null>(null);
  protected readonly focusIndex = signal(0);

  protected readonly data = computed(() => chainagePoints(this.sections(), this.caseName()));
  protected readonly layout = computed(() =>
    chainageLayout(this.data().points, {
      width: this.width() ?? this.measured() ?? 960,
      height: this.height(),
      units: this.data().units,
    }),
  );
  /** The stations drawn (the hidden ones only hold the axis). */
  protected readonly shown = computed(() => this.layout().stations.filter((s) => !s.point.hidden));
  protected readonly failing = computed(() =>
    this.data().points.filter((p) => !p.hidden && p.verdict === 'below'),
  );
  protected readonly chartLabel = computed(() => {
    const c = this.caseName();
    return c === null
      ? 'Governing factor of safety along the chainage'
      : `Factor of safety of the case ${c} along the chainage`;
  });
  /** The marks the chart shows, with their words and counts, for the legend. */
  protected readonly legend = computed(() => {
    const count = (m: ChainageMark) => this.shown().filter((s) => s.mark === m).length;
    return (['meets', 'below', 'no-requirement', 'no-fs'] as const)
      .filter((m) => m === 'meets' || m === 'below' || count(m) > 0)
      .map((mark) => ({ mark, words: CHAINAGE_MARK_WORDS[mark], count: count(mark) }));
  });
  protected readonly summary = computed(() => {
    const { skipped } = this.data();
    const points = this.data().points.filter((p) => !p.hidden);
    const fails = this.failing();
    const judged = points.filter((p) => p.verdict === 'meets' || p.verdict === 'below').length;
    const parts: string[] = [];
    if (fails.length > 0) {
      const names = fails.slice(0, 12).map((p) => p.label);
      const more = fails.length > 12 ? `, and ${fails.length - 12} more` : '';
      const stations = judged === 1 ? 'station' : 'stations';
      parts.push(
        `${fails.length} of ${judged} ${stations} ${VERDICT_WORDS.below}: ${names.join(', ')}${more}.`,
      );
    } else if (judged > 0) {
      parts.push(
        judged === 1
          ? 'The station meets the required FS.'
          : `All ${judged} stations meet the required FS.`,
      );
    }
    const free = points.filter((p) => p.verdict === 'no-requirement').length;
    if (free > 0) parts.push(`${free}: ${VERDICT_WORDS['no-requirement']}.`);
    const none = points.filter((p) => p.fs === null).length;
    if (none > 0) parts.push(`${none}: ${VERDICT_WORDS['no-fs']} (× under the axis).`);
    const flat = this.data().points.filter((p) => p.verdict === 'no-slope').length;
    if (flat > 0) parts.push(`${flat}: ${VERDICT_WORDS['no-slope']} (not plotted).`);
    const without = this.data().points.filter((p) => p.hidden && p.verdict !== 'no-slope').length;
    if (without > 0) parts.push(`${without} without this case (not plotted).`);
    const above = this.shown().filter((p) => p.clipped).length;
    if (above > 0) {
      parts.push(`${above} with FS above ${this.layout().yMax} drawn at the top edge.`);
    }
    if (skipped > 0) parts.push(`${skipped} not plotted (no station or no result yet).`);
    return parts.join(' ');
  });
  protected readonly activePoint = computed(() => {
    const i = this.active();
    return i === null ? null : (this.shown()[i] ?? null);
  });

  protected readonly style = CHAINAGE_STYLE;
  protected readonly marker = chainageMarker;
  protected readonly clippedMarker = clippedMarker;

  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  protected describe(s: PlacedStation<ChartPoint>): string {
    const p = s.point;
    const req = p.requiredFs === null ? '' : `, required ${formatFs(p.requiredFs)}`;
    const fs = p.fs === null ? 'no FS' : `FS ${formatFs(p.fs)}`;
    const c = this.caseName();
    const station = c === null ? `Station ${p.label}` : `Station ${p.label}, case ${c}`;
    return `${station}: ${fs}${req} (${VERDICT_WORDS[p.verdict]})`;
  }

  protected choose(s: PlacedStation<ChartPoint>): void {
    this.open.emit(s.point.sectionId);
  }

  protected key(e: KeyboardEvent, i: number, s: PlacedStation<ChartPoint>): void {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      this.choose(s);
      return;
    }
    const next = steppedIndex(e.key, i, this.shown().length);
    if (next === null) return;
    e.preventDefault();
    this.focusIndex.set(next);
    this.active.set(next);
    const el = this.host.nativeElement.querySelectorAll<SVGGElement>('.pt')[next];
    el?.focus();
  }
}
