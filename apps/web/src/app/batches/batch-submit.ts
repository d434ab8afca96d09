import { ChangeDetectionStrategy, Component } from '@angular/core';

// Placeholder until the page is built.
@Component({
  selector: 'sl-batch-submit',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: '<div class="sl-page">BatchSubmit</div>',
})
export class BatchSubmit {}
