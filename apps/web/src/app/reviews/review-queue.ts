import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-review-queue',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">ReviewQueue</div>',
})
export class ReviewQueue {}
