import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-batch-detail',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">BatchDetail</div>',
})
export class BatchDetail {}
