import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { Auth } from '../core/auth';

/** Where the role guard sends a signed-in user whose role may not open a page. */
@Component({
  selector: 'sl-not-allowed',
  imports: [MatButtonModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="sl-page">
      <div class="sl-card">
        <h1>Not allowed</h1>
        <p>
          Your role ({{ auth.user()?.role ?? 'none' }}) does not allow
          <code>{{ from() ?? 'this page' }}</code>. Ask an administrator if you need it.
        </p>
        <a mat-stroked-button routerLink="/projects">Back to projects</a>
      </div>
    </div>
  `,
})
export class NotAllowed {
  protected readonly auth = inject(Auth);
  readonly from = input<string>();
}
