import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import type { LocatedError } from '../core/models';
import { METHOD_NAMES, methodName } from './format';
import type { MethodReport, Warning } from './section-types';
import { explain, type WarningExplanation } from './warning-codes';

/** One warning to show: its code explained, the solver's words, and where it came from. */
export interface WarningItem {
  code: string;
  message: string;
  explanation: WarningExplanation | null;
  /** Where it was raised: "the search", a method's name, or a path into the input. */
  sources: string[];
}

/**
 * Every warning of the result (the search, each method) and of the input, each code in plain
 * words: what it means and what to check. A code without an explanation shows the message.
 */
export function warningItems(
  warnings: readonly Warning[],
  methods: readonly MethodReport[],
  inputWarnings: readonly LocatedError[],
): WarningItem[] {
  const byKey = new Map<string, WarningItem>();
  const add = (code: string, message: string, source: string) => {
    const key = `${code}\u0000${message}`;
    const seen = byKey.get(key);
    if (seen) {
      if (!seen.sources.includes(source)) seen.sources.push(source);
      return;
    }
    byKey.set(key, { code, message, explanation: explain(code), sources: [source] });
  };
  for (const w of inputWarnings) {
    if (w.severity === 'warning') add(w.code, w.message, `input ${w.path || w.file}`.trim());
  }
  for (const w of warnings) {
    // The result repeats a method's failure as "bishop: reason": shown once, under the method.
    const m = /^([a-z-]+): (.*)$/s.exec(w.message);
    if (m && m[1] in METHOD_NAMES) add(w.code, m[2], methodName(m[1]));
    else add(w.code, w.message, 'the analysis');
  }
  for (const r of methods) {
    for (const w of r.warnings) add(w.code, w.message, methodName(r.method));
  }
  return [...byKey.values()];
}

@Component({
  selector: 'sl-warning-list',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <section class="sl-card" data-testid="warning-list" aria-labelledby="warnings-title">
      <h2 id="warnings-title">
        Warnings
        @if (items().length) {
          <span class="count">({{ items().length }})</span>
        }
      </h2>
      @if (items().length === 0) {
        <p class="none">
          <mat-icon aria-hidden="true">check</mat-icon>
          No warnings
        </p>
      } @else {
        <ul>
          @for (w of items(); track $index) {
            <li class="warning" [attr.data-code]="w.code">
              <mat-icon class="icon" aria-hidden="true">warning</mat-icon>
              <div class="body">
                <div class="title">
                  <strong>{{ w.explanation?.title ?? w.message }}</strong>
                  <span class="from">· {{ w.sources.join(', ') }}</span>
                </div>
                @if (w.explanation; as e) {
                  <p class="meaning">{{ e.meaning }}</p>
                  <p class="check"><span class="label">What to check:</span> {{ e.check }}</p>
                  <p class="message">
                    <span class="label">Solver:</span> {{ w.message }}
                    <code>{{ w.code }}</code>
                  </p>
                } @else {
                  <p class="message">
                    <code>{{ w.code }}</code>
                  </p>
                }
              </div>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    h2 {
      margin: 0 0 8px;
      font-size: 18px;
    }
    .count {
      color: var(--sl-muted);
      font-weight: 400;
    }
    .none {
      display: flex;
      gap: 6px;
      align-items: center;
      color: var(--sl-muted);
      margin: 0;
    }
    ul {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    .warning {
      display: flex;
      gap: 10px;
      padding: 10px 0;
      border-top: 1px solid var(--sl-line);
    }
    .warning:first-child {
      border-top: 0;
    }
    .icon {
      color: var(--sl-warn);
      flex: none;
    }
    .body {
      min-width: 0;
    }
    .from {
      color: var(--sl-muted);
      margin-left: 4px;
    }
    p {
      margin: 4px 0 0;
      line-height: 1.4;
    }
    .label {
      font-weight: 600;
    }
    .message {
      color: var(--sl-muted);
      font-size: 13px;
      overflow-wrap: anywhere;
    }
    code {
      font-size: 12px;
      background: var(--sl-paper);
      border-radius: 4px;
      padding: 0 4px;
      margin-left: 4px;
    }
  `,
})
export class WarningList {
  /** The result's own warnings (the search, and each method's failure repeated). */
  readonly warnings = input<readonly Warning[]>([]);
  /** The methods, whose warnings are listed under their names. */
  readonly methods = input<readonly MethodReport[]>([]);
  /** Warnings of the input checks, when the API gives them. */
  readonly inputWarnings = input<readonly LocatedError[]>([]);

  protected readonly items = computed(() =>
    warningItems(this.warnings(), this.methods(), this.inputWarnings()),
  );
}
