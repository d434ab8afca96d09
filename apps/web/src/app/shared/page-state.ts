import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import type { Problem } from '../core/models';

/**
 * The three states a page shows before (or instead of) its content: loading, an error with
 * a retry, or nothing there yet. Content projected inside is the empty state's extra action.
 */
@Component({
  selector: 'sl-page-state',
  imports: [MatButtonModule, MatIconModule, MatProgressSpinnerModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @switch (state()) {
      @case ('loading') {
        <div class="state" role="status" aria-live="polite">
          <mat-spinner diameter="28" />
          <span>{{ loadingText() }}</span>
        </div>
      }
      @case ('error') {
        <div class="state error" role="alert">
          <mat-icon fontSet="material-icons-outlined" aria-hidden="true">error</mat-icon>
          <div>
            <strong>{{ problem()?.title ?? 'Something went wrong' }}</strong>
            @if (problem()?.detail) {
              <div>{{ problem()?.detail }}</div>
            }
          </div>
          <button mat-stroked-button type="button" (click)="retry.emit()">Try again</button>
        </div>
      }
      @case ('empty') {
        <div class="state empty">
          <mat-icon fontSet="material-icons-outlined" aria-hidden="true">inbox</mat-icon>
          <span>{{ emptyText() }}</span>
          <ng-content />
        </div>
      }
    }
  `,
  styles: `
    .state {
      display: flex;
      align-items: center;
      gap: 12px;
      padding: 24px 16px;
      color: var(--sl-muted);
      flex-wrap: wrap;
    }
    .error {
      color: var(--sl-fail);
      background: var(--sl-fail-soft);
      border-radius: 8px;
    }
  `,
})
export class PageState {
  readonly state = input.required<'loading' | 'error' | 'empty' | 'ready'>();
  readonly problem = input<Problem | null>(null);
  readonly loadingText = input('Loading…');
  readonly emptyText = input('Nothing here yet.');
  readonly retry = output<void>();
}
