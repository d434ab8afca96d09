import { ChangeDetectionStrategy, Component } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';

@Component({
  selector: 'sl-not-found',
  imports: [MatButtonModule, RouterLink],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="sl-page">
      <div class="sl-card">
        <h1>No such page</h1>
        <p>The address does not lead to anything in Scarpline.</p>
        <a mat-stroked-button routerLink="/projects">Back to projects</a>
      </div>
    </div>
  `,
})
export class NotFound {}
