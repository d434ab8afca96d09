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
import { CHAINAGE_STYLE, chainageAxis, scaleLinear } from '@scarpline/core/draw';
import { observedWidth } from '../shared/observed-width';
import { steppedIndex } from '../shared/stepped-index';
import { betaText, probabilityText } from '../studies/probability-format';
import type { SectionListItem } from './batch-types';
import { chainagePoints } from './chainage-chart';
import { ChainageFrame } from './chainage-frame';
import { batchUnits, formatChainage } from './scales';

/** One station's probability of failure under one case. */
export interface PfPoint {
  sectionId: number;
  station: number;
  label: string;
  case: string;
  /** P(FS < 1) counted, and its standard error. */
  pf: number;
  standardError: number;
  realisations: number;
  betaNormal: number | null;
  betaLognormal: number | null;
}

/**
 * The stations' P(FS < 1) by case, by chainage: one point per station with a station and a
 * probability, per case it has one for; the cases in the order they first appear.
 */
export function pfPoints(items: readonly SectionListItem[]): {
  points: PfPoint[];
  cases: string[];
} {
  const units = batchUnits(items);
  const points: PfPoint[] = [];
  const cases: string[] = [];
  for (const s of items) {
    if (s.station === null || !s.probability) continue;
    for (const p of s.probability) {
      if (!cases.includes(p.case)) cases.push(p.case);
      points.push({
        sectionId: s.id,
        station: s.station,
        label: s.stationLabel ?? formatChainage(s.station, units),
        case: p.case,
        pf: p.pFailure.p,
        standardError: p.pFailure.standardError,
        realisations: p.realisations,
        betaNormal: p.betaNormal,
        betaLognormal: p.betaLognormal,
      });
    }
  }
  points.sort(
    (a, b) =>
      a.station - b.station ||
      cases.indexOf(a.case) - cases.indexOf(b.case) ||
      a.sectionId - b.sectionId,
  );
  return { points, cases };
}

/** The marks of the cases: shape and colour both tell them apart (never colour alone). */
const CASE_MARKS = [
  { shape: 'circle', color: '#1f5f8b' },
  { shape: 'square', color: '#93511a' },
  { shape: 'diamond', color: '#2f6b3a' },
  { shape: 'triangle', color: '#6a3d8f' },
  { shape: 'cross', color: '#3c4d57' },
] as const;

const r2 = (v: number) => Number(v.toFixed(2));

/** A case's marker as path data about (x, y); an open one for a count of none (P below 1/N). */
export function caseMarker(index: number, x: number, y: number, size = 5.5): string {
  const s = size;
  switch (CASE_MARKS[index % CASE_MARKS.length].shape) {
    case 'circle':
      return `M${r2(x - s)} ${r2(y)}a${s} ${s} 0 1 0 ${2 * s} 0a${s} ${s} 0 1 0 ${-2 * s} 0Z`;
    case 'square':
      return `M${r2(x - s)} ${r2(y - s)}h${2 * s}v${2 * s}h${-2 * s}Z`;
    case 'diamond':
      return `M${r2(x)} ${r2(y - s * 1.3)}L${r2(x + s * 1.3)} ${r2(y)}L${r2(x)} ${r2(y + s * 1.3)}L${r2(x - s * 1.3)} ${r2(y)}Z`;
    case 'triangle':
      return `M${r2(x)} ${r2(y - s * 1.2)}L${r2(x + s * 1.2)} ${r2(y + s)}L${r2(x - s * 1.2)} ${r2(y + s)}Z`;
    case 'cross':
      return `M${r2(x - s)} ${r2(y - s)}L${r2(x + s)} ${r2(y + s)}M${r2(x + s)} ${r2(y - s)}L${r2(x - s)} ${r2(y + s)}`;
  }
}

/** The lowest decade drawn (10⁻⁸): below it, a count is shown at the bottom edge. */
const LEAST_EXPONENT = -8;
const SUPERSCRIPT = '⁰¹²³⁴⁵⁶⁷⁸⁹';
const decadeText = (e: number) =>
  e === 0
    ? '1'
    : `10${e < 0 ? '⁻' : ''}${String(Math.abs(e))
        .split('')
        .map((d) => SUPERSCRIPT[Number(d)])
        .join('')}`;

let charts = 0;

/**
 * The probability of failure P(FS < 1) of every station along the chainage, one series per
 * design case, on a logarithmic axis (the common practice for P_f). A station where no
 * realisation failed is drawn open at 1/N: its P_f is below what N realisations can count.
 * Each point is a link to its section (click, Enter, arrow keys), with its P_f, standard error
 * and β in words on hover and focus.
 */
@Component({
  selector: 'sl-probability-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [ChainageFrame],
  templateUrl: './probability-chart.html',
  styleUrl: './probability-chart.scss',
})
export class ProbabilityChart {
  /** Every section of the batch (not one page). */
  readonly sections = input.required<readonly SectionListItem[]>();
  readonly width = input<number | null>(null);
  readonly height = input(300);
  /** A click (or Enter) on a point: the section id. */
  readonly open = output<number>();

  protected readonly summaryId = `pf-summary-${++charts}`;
  private readonly measured = observedWidth();
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);
  protected readonly active = signal<number | null>(null);
  protected readonly focusIndex = signal(0);
  protected readonly style = CHAINAGE_STYLE;
  protected readonly marker = caseMarker;

  protected readonly data = computed(() => pfPoints(this.sections()));
  protected readonly units = computed(() => batchUnits(this.sections()));

  protected readonly layout = computed(() => {
    const { points, cases } = this.data();
    const width = this.width() ?? this.measured() ?? 960;
    const height = this.height();
    // the chainage axis of the FS chart above it (the same stations, width and margins), so
    // that a station sits at the same x in both
    const axis = chainageAxis(
      chainagePoints(this.sections()).points.map((p) => p.station),
      { width, units: this.units() },
    );
    const plot = { left: axis.left, right: axis.right, top: 14, bottom: height - 40 };
    const x = axis.x;
    /** Where a point sits: its P_f, or 1/N for a count of none. */
    const at = (p: PfPoint) => (p.pf > 0 ? p.pf : 1 / Math.max(1, p.realisations));
    const least = Math.min(...points.map((p) => Math.log10(at(p))));
    const bottomExp = Math.max(LEAST_EXPONENT, Math.min(-1, Math.floor(least)));
    const y = scaleLinear([bottomExp, 0], [plot.bottom, plot.top]);
    const yOf = (p: number) => y(Math.max(bottomExp, Math.log10(p)));
    const yTicks = [];
    for (let e = bottomExp; e <= 0; e++) yTicks.push({ value: e, y: y(e), text: decadeText(e) });
    const xTicks = axis.ticks;
    const placed = points.map((p) => ({
      point: p,
      caseIndex: cases.indexOf(p.case),
      x: x(p.station),
      y: yOf(at(p)),
      none: p.pf === 0,
    }));
    const lines = cases.map((c, i) => {
      const own = placed.filter((s) => s.point.case === c);
      return {
        case: c,
        index: i,
        color: CASE_MARKS[i % CASE_MARKS.length].color,
        d: own.map((s, k) => `${k === 0 ? 'M' : 'L'}${r2(s.x)} ${r2(s.y)}`).join(''),
      };
    });
    return { width, height, plot, xTicks, yTicks, placed, lines };
  });

  protected colorOf(index: number): string {
    return CASE_MARKS[index % CASE_MARKS.length].color;
  }

  protected readonly activePoint = computed(() => {
    const i = this.active();
    return i === null ? null : (this.layout().placed[i] ?? null);
  });

  protected describe(p: PfPoint): string {
    const pf =
      p.pf === 0
        ? `no realisation of ${p.realisations} failed (P(FS < 1) below ${probabilityText(1 / p.realisations)})`
        : `P(FS < 1) ${probabilityText(p.pf)} ± ${probabilityText(p.standardError)}`;
    return `Station ${p.label}, case ${p.case}: ${pf}, β ${betaText(p.betaNormal)} normal, ${betaText(p.betaLognormal)} lognormal`;
  }

  protected readonly summary = computed(() => {
    const { points, cases } = this.data();
    if (points.length === 0) return '';
    const stations = new Set(points.map((p) => p.sectionId)).size;
    const worst = points.reduce((a, b) => (b.pf > a.pf ? b : a));
    const parts = [
      `${stations} ${stations === 1 ? 'station carries its' : 'stations carry their'} probability of failure, ${cases.length} ${cases.length === 1 ? 'case' : 'cases'}.`,
    ];
    parts.push(
      worst.pf > 0
        ? `The greatest: ${probabilityText(worst.pf)} at station ${worst.label} (case ${worst.case}).`
        : 'No realisation failed at any station.',
    );
    const none = points.filter((p) => p.pf === 0).length;
    if (none > 0) parts.push(`${none} with no failed realisation, drawn open at 1/N.`);
    return parts.join(' ');
  });

  protected choose(p: PfPoint): void {
    this.open.emit(p.sectionId);
  }

  protected key(e: KeyboardEvent, i: number, p: PfPoint): void {
    if (e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      this.choose(p);
      return;
    }
    const next = steppedIndex(e.key, i, this.layout().placed.length);
    if (next === null) return;
    e.preventDefault();
    this.focusIndex.set(next);
    this.active.set(next);
    this.host.nativeElement.querySelectorAll<SVGGElement>('.pt')[next]?.focus();
  }
}
