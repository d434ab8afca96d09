import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { caseKindWords } from '../shared/case-kinds';
import { methodName } from '../shared/method-names';
import { verdictView } from '../shared/verdict';
import { fsText, plain } from './format';
import type { CaseView } from './section-types';

/**
 * The design cases of a station side by side: name, kind, governing method, FS, required FS,
 * FS / required, verdict; the governing case marked. Each case's name shows that case in the
 * drawing, the methods and the slices below.
 */
@Component({
  selector: 'sl-case-table',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="scroll" tabindex="0" role="region" aria-label="Design cases, scrolls sideways">
      <table data-testid="case-table">
        <caption>
          Every design case: the station meets its requirement only when every case does. Pick a
          case to see its drawing, methods and slices.
        </caption>
        <thead>
          <tr>
            <th scope="col">Case</th>
            <th scope="col">Kind</th>
            <th scope="col">Governing method</th>
            <th scope="col" class="sl-num">FS</th>
            <th scope="col" class="sl-num">Required FS</th>
            <th scope="col" class="sl-num">FS / required</th>
            <th scope="col">Verdict</th>
          </tr>
        </thead>
        <tbody>
          @for (row of rows(); track row.name) {
            <tr
              [class.governing]="row.governing"
              [class.picked]="row.name === picked()"
              [attr.data-case]="row.name"
            >
              <th scope="row">
                <button
                  type="button"
                  class="pick"
                  data-testid="pick-case"
                  [attr.aria-pressed]="row.name === picked()"
                  (click)="pick.emit(row.name)"
                >
                  <mat-icon aria-hidden="true">{{
                    row.name === picked() ? 'radio_button_checked' : 'radio_button_unchecked'
                  }}</mat-icon>
                  {{ row.name }}
                </button>
                @if (row.governing) {
                  <span class="gov-mark" data-testid="governing-case-mark">
                    <mat-icon aria-hidden="true">star</mat-icon> governing
                  </span>
                }
              </th>
              <td>{{ row.kind }}</td>
              <td>{{ row.method }}</td>
              <td class="sl-num fs">{{ row.fs }}</td>
              <td class="sl-num">{{ row.required }}</td>
              <td class="sl-num">{{ row.ratio }}</td>
              <td>
                <span
                  class="verdict verdict-{{ row.verdict.code }}"
                  [attr.title]="row.verdict.words"
                >
                  <mat-icon aria-hidden="true">{{ row.verdict.icon }}</mat-icon>
                  {{ row.verdict.words }}
                </span>
              </td>
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
      min-width: 720px;
      font-size: 14px;
    }
    caption {
      text-align: left;
      padding: 0 0 8px;
      color: var(--sl-ink-soft);
    }
    th,
    td {
      padding: 6px 10px;
      border-bottom: 1px solid var(--sl-line);
      text-align: left;
      vertical-align: middle;
    }
    thead th {
      font-weight: 600;
      color: var(--sl-muted);
      font-size: 13px;
    }
    tbody th {
      font-weight: 500;
      white-space: nowrap;
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
    tr.picked th,
    tr.picked td {
      border-bottom: 2px solid var(--sl-ink);
    }
    .pick {
      display: inline-flex;
      align-items: center;
      gap: 6px;
      padding: 4px 6px;
      border: 0;
      border-radius: 4px;
      background: none;
      font: inherit;
      color: inherit;
      cursor: pointer;
      text-align: left;
    }
    .pick:hover,
    .pick:focus-visible {
      background: var(--sl-paper);
    }
    .pick mat-icon,
    .gov-mark mat-icon,
    .verdict mat-icon {
      font-size: 18px;
      width: 18px;
      height: 18px;
    }
    .gov-mark {
      display: inline-flex;
      align-items: center;
      gap: 2px;
      margin-left: 4px;
      font-size: 12px;
      font-weight: 600;
      color: var(--sl-clay);
    }
    .verdict {
      display: inline-flex;
      align-items: center;
      gap: 4px;
      white-space: nowrap;
    }
    .verdict-meets {
      color: var(--sl-pass);
    }
    .verdict-below {
      color: var(--sl-fail);
      font-weight: 600;
    }
  `,
})
export class CaseTable {
  readonly cases = input.required<readonly CaseView[]>();
  /** The name of the governing case. */
  readonly governingCase = input<string | null>(null);
  /** The name of the case shown below. */
  readonly picked = input<string | null>(null);
  /** A case picked: its name. */
  readonly pick = output<string>();

  protected readonly rows = computed(() =>
    this.cases().map((c) => ({
      name: c.name,
      kind: caseKindWords(c.kind),
      governing: c.name === this.governingCase(),
      method: c.governing ? methodName(c.governing.method) : '—',
      // no significant slope: a large FS there means nothing (the verdict says why)
      fs: c.verdict === 'no-slope' ? '—' : fsText(c.governing?.fs),
      required: plain(c.requiredFs),
      ratio: fsText(c.ratio),
      verdict: verdictView(c.verdict),
    })),
  );
}
