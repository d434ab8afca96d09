import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-project-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">ProjectList</div>',
})
export class ProjectList {}
