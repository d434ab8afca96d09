import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-section-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">SectionDetail</div>',
})
export class SectionDetail {}
