import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-user-admin',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">UserAdmin</div>',
})
export class UserAdmin {}
