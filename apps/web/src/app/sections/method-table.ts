import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { fixed, fsText, plain, surfaceText, unitOf } from './format';
import { methodName } from '../shared/method-names';
import type { MethodId, MethodReport, UnitSystem } from './section-types';

/** A method's extra figures, in words (Janbu's correction, the φ = 0 circle's moment arm…). */
function extras(r: MethodReport, units: UnitSystem): string[] {
  const out: string[] = [];
  if (r.fsUncorrected !== undefined && r.correction !== undefined) {
    out.push(`F₀ ${fsText(r.fsUncorrected)} × f₀ ${fixed(r.correction, 3)}`);
  }
  if (r.intersliceFunction) out.push(`f(ξ): ${r.intersliceFunction}`);
  if (r.massWeight !== undefined) {
    out.push(`W ${fixed(r.massWeight, 1)} ${unitOf(units, 'forcePerLength')}`);
  }
  if (r.leverArm !== undefined)
    out.push(`lever arm ${fixed(r.leverArm)} ${unitOf(units, 'length')}`);
  if (r.crack) {
    out.push(
      `crack at x ${fixed(r.crack.x)}, ${fixed(r.crack.depth)} ${unitOf(units, 'length')} deep`,
    );
  }
  return out;
}

/** Every method of the result: FS, convergence, iterations, λ, the surface; the governing marked. */
@Component({
  selector: 'sl-method-table',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="scroll" tabindex="0" role="region" aria-label="Methods, scrolls sideways">
      <table data-testid="method-table">
        <caption>
          Factor of safety by method
          @if (requiredFs() !== null) {
            · required {{ plainRequired() }}
          }
        </caption>
        <thead>
          <tr>
            <th scope="col">Method</th>
            <th scope="col" class="sl-num">FS</th>
            <th scope="col">Solved</th>
            <th scope="col" class="sl-num">Iterations</th>
            <th scope="col" class="sl-num">λ</th>
            <th scope="col">Slip surface</th>
            <th scope="col">Method figures (f₀, f(ξ), mass, crack)</th>
          </tr>
        </thead>
        <tbody>
          @for (row of rows(); track $index) {
            <tr [class.governing]="row.governing" [attr.data-method]="row.report.method">
              <th scope="row">
                {{ row.name }}
                @if (row.governing) {
                  <span class="gov-mark" data-testid="governing-mark">
                    <mat-icon aria-hidden="true">star</mat-icon> governing
                  </span>
                }
              </th>
              <td class="sl-num fs">{{ row.fs }}</td>
              <td class="solved">
                @if (row.report.converged) {
                  <span class="yes"><mat-icon aria-hidden="true">check</mat-icon> converged</span>
                } @else {
                  <span class="no"> <mat-icon aria-hidden="true">block</mat-icon> not solved </span>
                  <div class="reason">{{ row.report.reason ?? 'no reason given' }}</div>
                }
              </td>
              <td class="sl-num">{{ row.report.iterations }}</td>
              <td class="sl-num">{{ row.lambda }}</td>
              <td class="surface">{{ row.surface }}</td>
              <td class="extras">{{ row.extras.join(' · ') || '—' }}</td>
            </tr>
          }
        </tbody>
      </table>
    </div>
  `,
  styles: `
    .scroll {
      overflow-x: auto;
    }
    table {
      border-collapse: collapse;
      width: 100%;
      min-width: 760px;
      font-size: 14px;
    }
    caption {
      text-align: left;
      font-weight: 600;
      padding: 0 0 8px;
    }
    th,
    td {
      padding: 8px 10px;
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
    .fs {
      font-weight: 600;
    }
    tr.governing {
      background: var(--sl-clay-soft);
    }
    .gov-mark {
      display: inline-flex;
      align-items: center;
      gap: 2px;
      margin-left: 6px;
      font-size: 12px;
      font-weight: 600;
      color: var(--sl-clay);
      white-space: nowrap;
    }
    .gov-mark mat-icon,
    .solved mat-icon {
      font-size: 16px;
      width: 16px;
      height: 16px;
    }
    .yes,
    .no {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      white-space: nowrap;
    }
    .no {
      color: var(--sl-fail);
    }
    .reason {
      font-size: 13px;
      color: var(--sl-ink-soft);
      max-width: 320px;
      margin-top: 2px;
    }
    .surface,
    .extras {
      font-size: 13px;
    }
  `,
})
export class MethodTable {
  readonly methods = input.required<readonly MethodReport[]>();
  readonly governing = input<{ method: MethodId; fs: number } | null>(null);
  readonly requiredFs = input<number | null>(null);
  readonly units = input<UnitSystem>('si');

  protected readonly plainRequired = computed(() => plain(this.requiredFs()));
  protected readonly rows = computed(() => {
    const gov = this.governing();
    const units = this.units();
    return this.methods().map((report) => ({
      report,
      name: methodName(report.method),
      governing: gov !== null && report.method === gov.method && report.converged,
      fs: fsText(report.fs),
      lambda:
        report.lambda === undefined
          ? '—'
          : report.theta !== undefined
            ? `${fixed(report.lambda, 3)} (θ ${fixed(report.theta, 1)}°)`
            : fixed(report.lambda, 3),
      surface: surfaceText(report.surface, units),
      extras: extras(report, units),
    }));
  });
}
