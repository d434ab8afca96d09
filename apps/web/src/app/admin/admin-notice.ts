import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { toProblem } from '../core/problem';

/** What the last change in an admin table came to: done, or refused and why. */
export interface Notice {
  ok: boolean;
  text: string;
}

/** A change the API refused: what was not done, then its reason (`“x” was not revoked: …`). */
export function refused(notDone: string, err: unknown): Notice {
  const p = toProblem(err);
  return { ok: false, text: `${notDone}: ${p.detail ?? p.title}` };
}

/**
 * The outcome of the last change in an admin table: `<p slAdminNotice [notice]="…">`, a live
 * region that is always there (empty until the first change) so that screen readers announce
 * each new notice; an icon and the words, not colour alone. The page's own `.outcome`, `.ok`
 * and `.bad` styles (_outcome.scss) dress the paragraph.
 */
@Component({
  // eslint-disable-next-line @angular-eslint/component-selector -- on a <p>, which it stays (a paragraph the page styles)
  selector: 'p[slAdminNotice]',
  imports: [MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: {
    'aria-live': 'polite',
    '[class.outcome]': 'notice() !== null',
    '[class.ok]': 'notice()?.ok === true',
    '[class.bad]': 'notice()?.ok === false',
  },
  template: `
    @if (notice(); as n) {
      <mat-icon aria-hidden="true">{{ n.ok ? 'check_circle' : 'error' }}</mat-icon>
      <span>{{ n.text }}</span>
    }
  `,
})
export class AdminNotice {
  readonly notice = input<Notice | null>(null);
}
