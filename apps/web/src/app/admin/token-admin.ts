import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-token-admin',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">TokenAdmin</div>',
})
export class TokenAdmin {}
