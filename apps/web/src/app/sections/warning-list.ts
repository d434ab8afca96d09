import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { METHOD_NAMES, methodName } from '../shared/method-names';
import type { InputWarning, MethodReport, Warning } from './section-types';
import { explain, type WarningExplanation } from './warning-codes';

/** Where in its file a warning of the input is: `batch.yaml:12:5` and the path into the data. */
export interface WarningLocation {
  /** file:line:column. */
  at: string;
  /** e.g. sections[3].materials.clay.unitWeight; empty for the file itself. */
  path: string;
}

/** One warning to show: its code explained, the message, and where it came from. */
export interface WarningItem {
  /** The input checks, or the result (the search and the methods). */
  origin: 'input' | 'result';
  code: string;
  message: string;
  explanation: WarningExplanation | null;
  /** Where it was raised: "the input checks", "the analysis" or a method's name. */
  sources: string[];
  /** For a warning of the input: each place in the file it is about. */
  locations: WarningLocation[];
}

/** A warning of the input as file:line:column and its path. */
export function locationOf(w: InputWarning): WarningLocation {
  return { at: `${w.file}:${w.line}:${w.column}`, path: w.path };
}

/**
 * Every warning of the input (located in its file) and of the result (the search, each
 * method), each code in plain words: what it means and what to check. A code without an
 * explanation shows the message.
 */
export function warningItems(
  warnings: readonly Warning[],
  methods: readonly MethodReport[],
  inputWarnings: readonly InputWarning[],
): WarningItem[] {
  const byKey = new Map<string, WarningItem>();
  const add = (
    origin: WarningItem['origin'],
    code: string,
    message: string,
    source: string,
    location?: WarningLocation,
  ) => {
    const key = `${origin}\u0000${code}\u0000${message}`;
    let item = byKey.get(key);
    if (!item) {
      item = { origin, code, message, explanation: explain(code), sources: [], locations: [] };
      byKey.set(key, item);
    }
    if (!item.sources.includes(source)) item.sources.push(source);
    if (location && !item.locations.some((l) => l.at === location.at && l.path === location.path)) {
      item.locations.push(location);
    }
  };
  for (const w of inputWarnings) {
    if (w.severity === 'warning') {
      add('input', w.code, w.message, 'the input checks', locationOf(w));
    }
  }
  for (const w of warnings) {
    // The result repeats a method's failure as "bishop: reason": shown once, under the method.
    const m = /^([a-z-]+): (.*)$/s.exec(w.message);
    if (m && m[1] in METHOD_NAMES) add('result', w.code, m[2], methodName(m[1]));
    else add('result', w.code, w.message, 'the analysis');
  }
  for (const r of methods) {
    for (const w of r.warnings) add('result', w.code, w.message, methodName(r.method));
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
                @if (w.locations.length) {
                  <p class="where" data-testid="warning-location">
                    <span class="label">Where:</span>
                    @for (l of w.locations; track $index) {
                      <span class="place"
                        >{{ $first ? ' ' : '; ' }}<code>{{ l.at }}</code>
                        @if (l.path) {
                          at <code>{{ l.path }}</code>
                        }
                      </span>
                    }
                  </p>
                }
                @if (w.explanation; as e) {
                  <p class="meaning">{{ e.meaning }}</p>
                  <p class="check"><span class="label">What to check:</span> {{ e.check }}</p>
                  <p class="message">
                    <span class="label">{{
                      w.origin === 'input' ? 'Input check:' : 'Solver:'
                    }}</span>
                    {{ w.message }}
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
    .where {
      font-size: 13px;
      overflow-wrap: anywhere;
    }
    .where code {
      margin-left: 0;
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
  /** The warnings of the input checks about the section, located in its file. */
  readonly inputWarnings = input<readonly InputWarning[]>([]);

  protected readonly items = computed(() =>
    warningItems(this.warnings(), this.methods(), this.inputWarnings()),
  );
}
