import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { fixed, fsText, plain, surfaceText, unitOf } from './format';
import { methodName } from '../shared/method-names';
import type { RequiredReinforcementReport, UnitSystem } from './section-types';

/**
 * The extra reinforcement a case below its requirement needs, in plain words: the uniform force
 * per run at the level given, or the number of layers of the product from that level up, with
 * the critical FS, method and surface it gives; or why no value in the range tried meets the
 * requirement. Each value tried was a full analysis with the search.
 */
@Component({
  selector: 'sl-required-reinforcement',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @let r = report();
    <p data-testid="required-reinforcement-value">
      @if (r.reached) {
        <strong>{{ valueText() }}</strong>
        {{ whatText() }} bring the critical factor of safety to
        <strong class="sl-num">{{ fs(r.fs) }}</strong>
        @if (r.method) {
          ({{ method(r.method) }})
        }
        against the required {{ plain(r.requiredFs) }}.
      } @else {
        <strong>No value found:</strong> {{ r.reason ?? 'no value in the range tried meets it' }}.
      }
    </p>
    <p class="muted">
      {{ placeText() }} · {{ r.dividedByF ? 'divided by F' : 'at full value, not divided by F' }} ·
      {{ r.analyses }} {{ r.analyses === 1 ? 'analysis' : 'analyses' }}, each with the full search
    </p>
    @if (r.reached && r.surface) {
      <p class="muted">Critical surface with it: {{ surface() }}.</p>
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
  `,
})
export class RequiredReinforcementView {
  readonly report = input.required<RequiredReinforcementReport>();
  readonly units = input<UnitSystem>('si');

  protected readonly plain = plain;
  protected readonly fs = fsText;
  protected readonly method = methodName;
  private readonly L = computed(() => unitOf(this.units(), 'length'));

  /** The value: a force per run with its unit, or a number of layers. */
  protected readonly valueText = computed(() => {
    const r = this.report();
    if (r.value === null) return '—';
    return r.kind === 'force'
      ? `${fixed(r.value, 1)} ${unitOf(this.units(), 'forcePerLength')}`
      : `${r.value} ${r.value === 1 ? 'layer' : 'layers'}`;
  });
  protected readonly whatText = computed(() =>
    this.report().kind === 'force'
      ? 'of uniform horizontal force per run at the level given'
      : 'of the geosynthetic product given',
  );
  /** Where it goes: the level and extent, and the spacing of layers. */
  protected readonly placeText = computed(() => {
    const r = this.report();
    const L = this.L();
    const at = `at elevation ${plain(r.level, 2)} ${L}, from x = ${plain(r.from, 2)} to ${plain(r.to, 2)} ${L}`;
    return r.kind === 'layers' && r.spacing !== undefined
      ? `the lowest layer ${at}, the others above it every ${plain(r.spacing, 2)} ${L}`
      : `along the line ${at}`;
  });
  protected readonly surface = computed(() => surfaceText(this.report().surface, this.units()));
}
