import { ChangeDetectionStrategy, Component, computed, input, linkedSignal } from '@angular/core';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { fixed, surfaceText, unitOf } from './format';
import { methodName } from '../shared/method-names';
import { DRAWDOWN_STAGE_WORDS } from './drawdown-report';
import type {
  DrawdownReport,
  MethodId,
  MethodReport,
  SliceReport,
  UnitSystem,
} from './section-types';

/**
 * The slices of one method (the governing one unless another is picked): every quantity the
 * result holds for each slice, in the section's units, with the strength each base took and,
 * for a strength that varies with stress, the stress it was taken at, and the reinforcement
 * force on each slice where the result has it.
 */
@Component({
  selector: 'sl-slice-table',
  imports: [MatFormFieldModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="head">
      <p class="note" data-testid="slice-note">
        @if (governingWithout(); as g) {
          {{ name(g) }} (governing) has no slices.
        }
        @if (shown(); as r) {
          Slices of <strong>{{ name(r.method) }}</strong>
          @if (r.method === governing()) {
            (governing)
          }
          on the {{ surface() }} · {{ r.slices.length }} slices · forces per
          {{ unitOf(units(), 'length') }} run
        } @else {
          No method of this result has slices.
        }
      </p>
      @if (withSlices().length > 1) {
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="pick">
          <mat-label>Method</mat-label>
          <mat-select [value]="picked()" (valueChange)="picked.set($event)">
            @for (m of withSlices(); track m.method) {
              <mat-option [value]="m.method">{{ name(m.method) }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
      }
    </div>
    @if (shown(); as r) {
      <div
        class="scroll"
        tabindex="0"
        role="region"
        [attr.aria-label]="'Slices of ' + name(r.method) + ', scrolls both ways'"
      >
        <table data-testid="slice-table">
          <thead>
            <tr>
              <th scope="col" class="sl-num">#</th>
              <th scope="col" class="sl-num">
                x<span class="u">{{ u().length }}</span>
              </th>
              <th scope="col" class="sl-num">
                width b<span class="u">{{ u().length }}</span>
              </th>
              <th scope="col" class="sl-num">base α<span class="u">°</span></th>
              <th scope="col" class="sl-num">
                base length l<span class="u">{{ u().length }}</span>
              </th>
              <th scope="col" class="sl-num">
                weight W<span class="u">{{ u().force }}</span>
              </th>
              <th scope="col" class="sl-num">
                pore pressure u<span class="u">{{ u().pressure }}</span>
              </th>
              <th scope="col" class="sl-num">
                normal N′<span class="u">{{ u().force }}</span>
              </th>
              <th scope="col" class="sl-num">
                shear S<span class="u">{{ u().force }}</span>
              </th>
              <th scope="col" class="sl-num">
                interslice E<span class="u">{{ u().force }}</span>
              </th>
              <th scope="col" class="sl-num">
                interslice X<span class="u">{{ u().force }}</span>
              </th>
              <th scope="col" class="sl-num">
                line of thrust y<span class="u">{{ u().length }}</span>
              </th>
              <th scope="col">base material</th>
              @if (strengthColumns(); as sc) {
                @if (sc.c) {
                  <th scope="col" class="sl-num">
                    strength c′ or Su<span class="u">{{ u().pressure }}</span>
                  </th>
                }
                @if (sc.phi) {
                  <th scope="col" class="sl-num">φ′<span class="u">°</span></th>
                }
                @if (sc.at) {
                  <th scope="col" class="sl-num" data-testid="strength-at">
                    taken at {{ sc.at }}<span class="u">{{ u().pressure }}</span>
                  </th>
                }
              }
              @if (reinforced()) {
                <th scope="col" class="sl-num" data-testid="slice-reinforcement">
                  reinforcement T<span class="u">{{ u().force }}</span>
                </th>
              }
              @if (stages(); as st) {
                <th scope="col" class="sl-num">
                  strength<span class="u">{{ u().pressure }}</span>
                </th>
                <th scope="col">set by (rapid drawdown)</th>
              }
            </tr>
          </thead>
          <tbody>
            @for (s of r.slices; track $index) {
              <tr>
                <td class="sl-num">{{ $index + 1 }}</td>
                <td class="sl-num">{{ f(s.x) }}</td>
                <td class="sl-num">{{ f(s.width, 3) }}</td>
                <td class="sl-num">{{ f(s.alpha, 1) }}</td>
                <td class="sl-num">{{ f(s.baseLength, 3) }}</td>
                <td class="sl-num">{{ f(s.weight) }}</td>
                <td class="sl-num">{{ f(s.porePressure) }}</td>
                <td class="sl-num" [class.neg]="s.normal < 0">{{ f(s.normal) }}</td>
                <td class="sl-num">{{ f(s.shear) }}</td>
                <td class="sl-num" [attr.title]="s.interslice.E === null ? notComputed : null">
                  {{ f(s.interslice.E) }}
                </td>
                <td class="sl-num" [attr.title]="s.interslice.X === null ? notComputed : null">
                  {{ f(s.interslice.X) }}
                </td>
                <td class="sl-num">{{ f(s.interslice.thrust) }}</td>
                <td>{{ s.material }}</td>
                @if (strengthColumns(); as sc) {
                  @if (sc.c) {
                    <td class="sl-num">{{ f(s.cohesion) }}</td>
                  }
                  @if (sc.phi) {
                    <td class="sl-num">{{ f(s.frictionAngle, 1) }}</td>
                  }
                  @if (sc.at) {
                    <td class="sl-num" [attr.title]="stressWords(s)">
                      @if (sc.mixed && s.strengthAt) {
                        <span class="k">{{ s.strengthAt.kind === 'normal' ? 'σ′n' : 'σ′v' }}</span>
                      }
                      {{ f(s.strengthAt?.stress) }}
                    </td>
                  }
                }
                @if (reinforced()) {
                  <td class="sl-num">{{ s.reinforcement ? f(s.reinforcement) : '' }}</td>
                }
                @if (stages(); as st) {
                  <td class="sl-num">{{ f(st[$index].strength) }}</td>
                  <td [attr.data-stage]="st[$index].stage">{{ stageWords[st[$index].stage] }}</td>
                }
              </tr>
            }
          </tbody>
        </table>
      </div>
      @if (drawdown() !== null && stages() === null && r.method === governing()) {
        <p class="note" data-testid="drawdown-unmatched">
          The rapid drawdown's strengths were reported for
          {{ drawdown()!.length }} slices, not these {{ r.slices.length }}: they are not shown here.
        </p>
      }
      @if (intersliceNote(); as note) {
        <p class="note" data-testid="interslice-note">{{ note }}</p>
      }
      <p class="legend">
        x: middle of the slice; α: inclination of the base, positive where it rises to the right;
        N′: effective normal force on the base; S: mobilised shear on the base; E, X: interslice
        normal and shear force on the slice's right side (— where the method does not compute it);
        line of thrust: height where E acts there (— where undefined). A negative N′ is marked.
        @if (strengthColumns()?.c) {
          c′ or Su, φ′: the strength the base took (φ′ = 0 for Su).
        }
        @if (reinforced()) {
          T: the reinforcement force on the slice in the method's equilibrium (blank where no
          element crosses its base).
        }
        @if (strengthColumns()?.at) {
          Taken at: for a strength that varies with stress, the effective normal stress σ′n on the
          base or, for Su from σ′v, the vertical effective stress σ′v above it (— for a fixed
          strength).
        }
      </p>
    }
  `,
  styles: `
    .head {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      justify-content: space-between;
      gap: 8px 16px;
      margin-bottom: 8px;
    }
    .note {
      margin: 0;
    }
    .pick {
      width: 240px;
    }
    .scroll {
      overflow: auto;
      max-height: 480px;
      border: 1px solid var(--sl-line);
      border-radius: 6px;
    }
    table {
      border-collapse: separate;
      border-spacing: 0;
      width: 100%;
      font-size: 13px;
      font-variant-numeric: tabular-nums;
    }
    th,
    td {
      padding: 5px 8px;
      border-bottom: 1px solid var(--sl-line);
      white-space: nowrap;
      text-align: left;
    }
    thead th {
      position: sticky;
      top: 0;
      z-index: 1;
      background: var(--sl-card);
      color: var(--sl-ink-soft);
      font-weight: 600;
      vertical-align: bottom;
      box-shadow: 0 1px 0 var(--sl-line);
    }
    .u {
      display: block;
      font-weight: 400;
      color: var(--sl-muted);
    }
    .sl-num {
      text-align: right;
    }
    .neg {
      color: var(--sl-fail);
      font-weight: 600;
    }
    .neg::after {
      content: ' (tension)';
      font-weight: 400;
    }
    .k {
      color: var(--sl-muted);
      margin-right: 4px;
    }
    .legend {
      font-size: 12.5px;
      color: var(--sl-muted);
      margin: 8px 0 0;
      line-height: 1.4;
    }
  `,
})
export class SliceTable {
  readonly methods = input.required<readonly MethodReport[]>();
  /** The governing method: shown first. */
  readonly governing = input<MethodId | null>(null);
  readonly units = input<UnitSystem>('si');
  /**
   * A rapid-drawdown case's strength of each slice of the governing surface and the stage
   * that set it (DrawdownReport.slices); null for any other case.
   */
  readonly drawdown = input<DrawdownReport['slices'] | null>(null);

  protected readonly stageWords = DRAWDOWN_STAGE_WORDS;
  protected readonly withSlices = computed(() => this.methods().filter((m) => m.slices.length));
  /** The method picked; the governing one (or the first with slices) until the user picks. */
  protected readonly picked = linkedSignal<MethodId | null>(() => {
    const list = this.withSlices();
    const gov = this.governing();
    return list.find((m) => m.method === gov)?.method ?? list[0]?.method ?? null;
  });
  /** The governing method when it has no slices (the infinite slope). */
  protected readonly governingWithout = computed(() => {
    const gov = this.governing();
    return gov !== null && !this.withSlices().some((m) => m.method === gov) ? gov : null;
  });
  protected readonly shown = computed(
    () => this.withSlices().find((m) => m.method === this.picked()) ?? null,
  );
  /** The drawdown's strengths, slice by slice, while the governing method's slices are shown. */
  protected readonly stages = computed(() => {
    const d = this.drawdown();
    const r = this.shown();
    if (d === null || r === null || r.method !== this.governing()) return null;
    return d.length === r.slices.length ? d : null;
  });
  /**
   * Which strength columns the shown slices fill: c (c′ or Su) and φ′ where any slice has
   * them (results of earlier versions have neither), and the stress a strength that varies
   * with stress was taken at where any slice has one (σ′n, σ′v, or both kinds in one surface);
   * null when none.
   */
  protected readonly strengthColumns = computed(() => {
    const slices = this.shown()?.slices ?? [];
    const has = (v: number | null | undefined) => typeof v === 'number' && Number.isFinite(v);
    const c = slices.some((s) => has(s.cohesion));
    const phi = slices.some((s) => has(s.frictionAngle));
    const kinds = new Set(
      slices.filter((s) => s.strengthAt && has(s.strengthAt.stress)).map((s) => s.strengthAt!.kind),
    );
    const at =
      kinds.size === 0
        ? null
        : kinds.size === 2
          ? 'σ′n or σ′v'
          : kinds.has('normal')
            ? 'σ′n'
            : 'σ′v';
    return c || phi || at ? { c, phi, at, mixed: kinds.size === 2 } : null;
  });
  /** Whether the shown slices carry reinforcement forces (results with reinforcement only). */
  protected readonly reinforced = computed(() =>
    (this.shown()?.slices ?? []).some((s) => typeof s.reinforcement === 'number'),
  );
  protected readonly surface = computed(() =>
    surfaceText(this.shown()?.surface ?? null, this.units()),
  );
  protected readonly u = computed(() => ({
    length: unitOf(this.units(), 'length'),
    force: unitOf(this.units(), 'forcePerLength'),
    pressure: unitOf(this.units(), 'pressure'),
  }));
  protected readonly unitOf = unitOf;
  protected readonly name = methodName;
  protected readonly notComputed = 'not computed by this method';
  /** Which interslice forces the shown method does not compute, in words. */
  protected readonly intersliceNote = computed(() => {
    const r = this.shown();
    if (!r || r.slices.length === 0) return null;
    const noE = r.slices.every((s) => s.interslice.E === null);
    const noX = r.slices.every((s) => s.interslice.X === null);
    if (!noE && !noX) return null;
    const what = noE && noX ? 'E and X' : noE ? 'E' : 'X';
    const assumes =
      r.method === 'bishop'
        ? ' (it assumes X = 0 and solves moment equilibrium without E)'
        : r.method === 'janbu'
          ? ' (it assumes X = 0)'
          : '';
    return `${this.name(r.method)} does not compute ${what}${assumes}: shown as —.`;
  });

  /** The stress a slice's strength was taken at, in words (a cell's title). */
  protected stressWords(s: SliceReport): string | null {
    const at = s.strengthAt;
    if (!at) return 'a fixed strength';
    const p = this.u().pressure;
    return at.kind === 'normal'
      ? `at the effective normal stress σ′n = ${this.f(at.stress)} ${p} on the base`
      : `Su at the vertical effective stress σ′v = ${this.f(at.stress)} ${p} above the base`;
  }

  protected f(v: number | null | undefined, digits = 2): string {
    return fixed(v, digits);
  }
}
