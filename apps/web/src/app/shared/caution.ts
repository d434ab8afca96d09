import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { CAUTION } from '@scarpline/core/caution';

/** The engineering caution, shown on every page that shows a result. */
@Component({
  selector: 'sl-caution',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <aside class="caution" role="note" aria-label="Engineering caution">
      <mat-icon fontSet="material-icons-outlined" aria-hidden="true">engineering</mat-icon>
      <span><strong>Caution.</strong> {{ text }}</span>
    </aside>
  `,
  styles: `
    .caution {
      display: flex;
      gap: 10px;
      align-items: flex-start;
      background: var(--sl-warn-soft);
      color: #4a3300;
      border-left: 4px solid var(--sl-warn);
      border-radius: 6px;
      padding: 10px 14px;
      margin: 0 0 16px;
      font-size: 14px;
      line-height: 1.4;
    }
  `,
})
export class Caution {
  /** The solver's own words (an import-free module of the core: no solver code comes along). */
  protected readonly text = CAUTION;
}
