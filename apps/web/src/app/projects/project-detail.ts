import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-project-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">ProjectDetail</div>',
})
export class ProjectDetail {}
