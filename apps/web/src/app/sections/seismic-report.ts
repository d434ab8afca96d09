import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { fixed, plain } from './format';
import type { SeismicReport, UnitSystem } from './section-types';

/** The published relations the displacement estimates come from, by their codes. */
const RELATIONS: Readonly<Record<string, string>> = {
  'jibson-2007': 'Jibson (2007)',
  'ambraseys-menu-1988': 'Ambraseys & Menu (1988)',
};

/** The displacement's unit in the section's units (the result gives mm, or in for a us file). */
export function displacementUnit(units: UnitSystem): string {
  return units === 'us' ? 'in' : 'mm';
}

/**
 * The earthquake part of a seismic case in plain words: the yield coefficient ky, and the
 * permanent displacement each published relation estimates from ky and the design peak ground
 * acceleration (median and one standard deviation above), against the allowable displacement,
 * each within or outside the data its relation was fitted to.
 */
@Component({
  selector: 'sl-seismic-report',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (kh() !== null && kh()! > 0) {
      <p>
        The factors of safety above are pseudo-static, with the horizontal seismic coefficient kh =
        <span class="sl-num">{{ plain(kh()) }}</span>.
      </p>
    }
    <p data-testid="yield-coefficient">
      @if (report().ky !== null) {
        <strong
          >Yield coefficient k<sub>y</sub> =
          <span class="sl-num">{{ fixed(report().ky, 3) }}</span>:</strong
        >
        the horizontal seismic coefficient at which the least factor of safety of the search falls
        to 1.0 ({{ report().analyses }} {{ report().analyses === 1 ? 'search' : 'searches' }}).
        Shaking stronger than k<sub>y</sub>·g moves the sliding mass; weaker shaking does not.
      } @else {
        <strong>No yield coefficient:</strong> no horizontal seismic coefficient in the range
        searched brings the least factor of safety down to 1.0 ({{ report().analyses }}
        {{ report().analyses === 1 ? 'search' : 'searches' }}).
      }
    </p>
    @if (pgaLine(); as line) {
      <p data-testid="ground-motion">{{ line }}</p>
    }
    @if (rows().length > 0) {
      <div class="scroll" tabindex="0" role="region" aria-label="Displacement estimates">
        <table data-testid="displacement-table">
          <caption>
            Permanent displacement of the sliding mass ({{
              unit()
            }}), estimated by published relations
          </caption>
          <thead>
            <tr>
              <th scope="col">Relation</th>
              <th scope="col" class="sl-num">Median</th>
              <th scope="col" class="sl-num">Median + 1 SD</th>
              <th scope="col" class="sl-num">Allowable</th>
              <th scope="col">Within its data</th>
            </tr>
          </thead>
          <tbody>
            @for (d of rows(); track d.relation) {
              <tr>
                <th scope="row">{{ d.name }}</th>
                <td class="sl-num">{{ d.median }}</td>
                <td class="sl-num">{{ d.plusOneSd }}</td>
                <td class="sl-num">{{ allowable() }}</td>
                <td>
                  {{ d.inRange ? 'yes' : 'no: outside the data it was fitted to' }}
                  @for (w of d.warnings; track $index) {
                    <div class="warn">{{ w }}</div>
                  }
                </td>
              </tr>
            }
          </tbody>
        </table>
      </div>
      <p data-testid="displacement-verdict" [class.sl-fail]="report().within === false">
        {{ verdict() }}
      </p>
      <p class="muted">
        Each relation estimates the displacement of a rigid block sliding on the critical surface
        (Newmark's method) from k<sub>y</sub> and the peak ground acceleration. Their scatter is
        large: the "+ 1 SD" value is one standard deviation of the relation's logarithm above the
        median, and an estimate outside the data a relation was fitted to is less certain.
      </p>
    } @else if (report().pga === null) {
      <p class="muted">
        No design peak ground acceleration given, so no displacement is estimated.
      </p>
    }
  `,
  styles: `
    p {
      margin: 0 0 8px;
      line-height: 1.45;
    }
    .muted {
      color: var(--sl-muted);
      font-size: 13px;
    }
    .scroll {
      overflow-x: auto;
      margin-bottom: 8px;
    }
    table {
      border-collapse: collapse;
      min-width: 560px;
      font-size: 14px;
    }
    caption {
      text-align: left;
      font-weight: 600;
      padding: 0 0 6px;
    }
    th,
    td {
      padding: 6px 12px 6px 0;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: top;
    }
    thead th {
      font-weight: 600;
      color: var(--sl-muted);
      font-size: 13px;
    }
    tbody th {
      font-weight: 500;
    }
    .sl-num {
      text-align: right;
      font-variant-numeric: tabular-nums;
    }
    .warn {
      font-size: 13px;
      color: var(--sl-warn);
    }
  `,
})
export class SeismicReportView {
  readonly report = input.required<SeismicReport>();
  readonly units = input<UnitSystem>('si');
  /** The case's pseudo-static kh, when the input says it. */
  readonly kh = input<number | null>(null);

  protected readonly plain = plain;
  protected readonly fixed = fixed;
  protected readonly unit = computed(() => displacementUnit(this.units()));
  private readonly digits = computed(() => (this.units() === 'us' ? 2 : 1));

  /** The design ground motion, and ky over it (the ratio the relations take), in a sentence. */
  protected readonly pgaLine = computed(() => {
    const { ky, pga, magnitude } = this.report();
    if (pga === null) return null;
    const m = magnitude === null ? '' : `, magnitude ${plain(magnitude, 1)}`;
    const ratio =
      ky === null || pga <= 0
        ? ''
        : `; ky / PGA = ${fixed(ky / pga, 2)}, the ratio the relations below take`;
    return `Design peak ground acceleration ${plain(pga)} g${m}${ratio}.`;
  });
  protected readonly rows = computed(() =>
    this.report().displacements.map((d) => ({
      relation: d.relation,
      name: RELATIONS[d.relation] ?? d.relation,
      median: fixed(d.median, this.digits()),
      plusOneSd: fixed(d.plusOneSd, this.digits()),
      inRange: d.inRange,
      warnings: d.warnings.map((w) => w.message),
    })),
  );
  protected readonly allowable = computed(() => {
    const a = this.report().allowable;
    return a === null ? '—' : fixed(a, this.digits());
  });
  /** The governing estimate (the largest median) against the allowable, in words. */
  protected readonly verdict = computed(() => {
    const r = this.report();
    const largest = r.displacements.reduce<(typeof r.displacements)[number] | null>(
      (m, d) => (m === null || d.median > m.median ? d : m),
      null,
    );
    if (largest === null) return '';
    const u = this.unit();
    const median = `${fixed(largest.median, this.digits())} ${u}`;
    const by = RELATIONS[largest.relation] ?? largest.relation;
    const n = r.displacements.length;
    const the = n === 1 ? 'The median' : n === 2 ? 'The larger median' : 'The largest median';
    if (r.allowable === null || r.within === null) {
      return `${the} is ${median} (${by}); no allowable displacement is given to compare it with.`;
    }
    const allowed = `${fixed(r.allowable, this.digits())} ${u}`;
    return r.within
      ? `${the}, ${median} (${by}), is within the allowable ${allowed}.`
      : `${the}, ${median} (${by}), exceeds the allowable ${allowed}.`;
  });
}
