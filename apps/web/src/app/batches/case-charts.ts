import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { VERDICT_WORDS } from '@scarpline/core/verdict';
import { caseKindWords } from '../shared/case-kinds';
import type { SectionListItem } from './batch-types';
import { ChainageChart } from './chainage-chart';
import { caseOfItem, type BatchCase } from './design-cases';
import { batchUnits, formatChainage } from './scales';

/**
 * The FS along the chainage of every design case, one chart under the other on one chainage
 * axis (small multiples): a checker sees at once which stations fall below which case, and a
 * station that fails two cases fails in both charts at the same place. Each chart is the
 * core's chainage chart of that case (its FS and its own required FS).
 */
@Component({
  selector: 'sl-case-charts',
  imports: [ChainageChart],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="headline" data-testid="cases-below">{{ headline() }}</p>
    @for (c of rows(); track c.name) {
      <figure class="case" data-testid="case-chart" [attr.data-case]="c.name">
        <figcaption>
          <span class="name">{{ c.name }}</span>
          @if (c.kind) {
            <span class="kind">{{ c.kind }}</span>
          }
          <span class="count" [class.sl-fail]="c.below > 0"
            >{{ c.below }} {{ c.below === 1 ? 'station' : 'stations' }} {{ belowWords }}</span
          >
        </figcaption>
        <sl-chainage-chart
          [sections]="sections()"
          [caseName]="c.name"
          [height]="height()"
          [width]="width()"
          (open)="open.emit($event)"
        />
      </figure>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .headline {
      margin: 0 0 12px;
      font-weight: 500;
    }
    .case {
      margin: 0 0 18px;
      padding-top: 10px;
      border-top: 1px solid var(--sl-line);
    }
    figcaption {
      display: flex;
      flex-wrap: wrap;
      align-items: baseline;
      gap: 4px 12px;
      margin-bottom: 2px;
    }
    .name {
      font-weight: 600;
    }
    .kind {
      color: var(--sl-muted);
      font-size: 13px;
    }
    .count {
      font-size: 13px;
      margin-left: auto;
    }
  `,
})
export class CaseCharts {
  /** Every section of the batch (not one page). */
  readonly sections = input.required<readonly SectionListItem[]>();
  /** The cases of the batch, in order (batchCases). */
  readonly cases = input.required<readonly BatchCase[]>();
  /** The height of each case's chart in px. */
  readonly height = input(220);
  /** The drawing width in px; measured by each chart when not given. */
  readonly width = input<number | null>(null);
  /** A click (or Enter) on a station: the section id. */
  readonly open = output<number>();

  protected readonly belowWords = VERDICT_WORDS.below;

  protected readonly rows = computed(() =>
    this.cases().map((c) => ({
      name: c.name,
      kind: c.kind === null ? null : caseKindWords(c.kind),
      below: this.sections().filter((s) => caseOfItem(s, c.name)?.verdict === 'below').length,
    })),
  );

  /** The stations below the required FS in at least one case, named. */
  protected readonly headline = computed(() => {
    const items = this.sections();
    const units = batchUnits(items);
    const solved = items.filter((s) => s.result !== null);
    const failing = solved
      .filter((s) => (s.result?.cases ?? []).some((c) => c.verdict === 'below'))
      .sort((a, b) => (a.station ?? Infinity) - (b.station ?? Infinity));
    const n = this.cases().length;
    if (failing.length === 0) {
      return solved.length === 0
        ? `${n} design cases: no results yet.`
        : `${n} design cases: no station of ${solved.length} is ${VERDICT_WORDS.below} in any case.`;
    }
    const label = (s: SectionListItem) =>
      s.stationLabel ?? (s.station === null ? s.key : formatChainage(s.station, units));
    const named = failing.slice(0, 12).map((s) => {
      const which = (s.result?.cases ?? []).filter((c) => c.verdict === 'below');
      return `${label(s)} (${which.map((c) => c.name).join(', ')})`;
    });
    const more = failing.length > 12 ? `, and ${failing.length - 12} more` : '';
    return `${n} design cases: ${failing.length} of ${solved.length} stations ${VERDICT_WORDS.below} in at least one case: ${named.join('; ')}${more}.`;
  });
}
