import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { fixed, fsText, unitOf } from './format';
import type { DrawdownReport, DrawdownStage, UnitSystem } from './section-types';

/** Which stage set a slice's strength, in words (the slice table's column and its legend). */
export const DRAWDOWN_STAGE_WORDS: Readonly<Record<DrawdownStage, string>> = {
  drained: 'drained (drains freely)',
  undrained: 'undrained (stage 2)',
  'drained-lower': 'drained, lower than undrained (stage 3)',
};

/** What each stage of the procedure does, in plain words. */
const STAGE_WORDS: Readonly<Record<1 | 2 | 3, { title: string; what: string }>> = {
  1: {
    title: 'Stage 1, before drawdown',
    what: 'effective stresses with the water before drawdown; they give the consolidation stresses on each slice base',
  },
  2: {
    title: 'Stage 2, undrained',
    what: 'soils that drain slowly take the undrained strength their consolidation stresses give; the water after drawdown acts on the slope',
  },
  3: {
    title: 'Stage 3, drained where weaker',
    what: 'where a slice’s drained strength, with the pore pressures after drawdown, is lower than its undrained strength, the drained strength is used',
  },
};

/**
 * The rapid-drawdown part of a case in plain words: the factor of safety of each stage of the
 * three-stage procedure (Duncan, Wright & Wong 1990), the fully drained drawdown beside it,
 * and how many slices each stage's strength held.
 */
@Component({
  selector: 'sl-drawdown-report',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p>
      A rapid drawdown analyzed in three stages (Duncan, Wright &amp; Wong 1990; US Army Corps of
      Engineers EM 1110-2-1902, Appendix G). The factor of safety of the procedure is that of its
      last stage.
    </p>
    <ol class="stages" data-testid="drawdown-stages">
      @for (s of stages(); track s.stage) {
        <li>
          <strong>{{ s.title }}:</strong> {{ s.what }}.
          <span class="fs"
            >F = <span class="sl-num">{{ s.fs }}</span></span
          >
        </li>
      }
    </ol>
    <p data-testid="drawdown-drained">
      For comparison, the fully drained drawdown (drained strengths in every soil with the pore
      pressures after drawdown):
      <span class="fs"
        >F = <span class="sl-num">{{ drainedFs() }}</span></span
      >{{ comparison() }}
    </p>
    @if (counts(); as c) {
      <p data-testid="drawdown-slices">
        On the critical surface, {{ c }}. The slice table gives each slice's strength and the stage
        that set it ({{ unit() }}).
      </p>
    }
  `,
  styles: `
    p {
      margin: 0 0 8px;
      line-height: 1.45;
    }
    .stages {
      margin: 0 0 8px;
      padding-left: 22px;
      line-height: 1.45;
    }
    .stages li {
      margin-bottom: 4px;
    }
    .fs {
      white-space: nowrap;
      font-weight: 600;
    }
    .sl-num {
      font-variant-numeric: tabular-nums;
    }
  `,
})
export class DrawdownReportView {
  readonly report = input.required<DrawdownReport>();
  readonly units = input<UnitSystem>('si');

  protected readonly stages = computed(() =>
    [...this.report().stages]
      .sort((a, b) => a.stage - b.stage)
      .map((s) => ({ stage: s.stage, ...STAGE_WORDS[s.stage], fs: fsText(s.fs) })),
  );
  /** The three-stage F: that of the last stage that gave one. */
  private readonly threeStage = computed(() => {
    const given = [...this.report().stages]
      .sort((a, b) => b.stage - a.stage)
      .find((s) => s.fs !== null);
    return given?.fs ?? null;
  });
  protected readonly drainedFs = computed(() => fsText(this.report().drainedFs));
  protected readonly comparison = computed(() => {
    const f3 = this.threeStage();
    const fd = this.report().drainedFs;
    if (f3 === null || fd === null) return '.';
    const d = f3 - fd;
    if (Math.abs(d) < 0.0005) return ', the same as the three-stage F.';
    return d < 0
      ? `, ${fixed(-d, 3)} above the three-stage F.`
      : `, ${fixed(d, 3)} below the three-stage F.`;
  });
  protected readonly counts = computed(() => {
    const slices = this.report().slices;
    if (slices.length === 0) return null;
    const n = (stage: DrawdownStage) => slices.filter((s) => s.stage === stage).length;
    return (['undrained', 'drained-lower', 'drained'] as const)
      .filter((stage) => n(stage) > 0)
      .map((stage) => `${n(stage)} of ${slices.length} slices ${DRAWDOWN_STAGE_WORDS[stage]}`)
      .join(', ');
  });
  protected readonly unit = computed(() => `strengths in ${unitOf(this.units(), 'pressure')}`);
}
