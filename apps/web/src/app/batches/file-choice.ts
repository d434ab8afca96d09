import {
  ChangeDetectionStrategy,
  Component,
  type ElementRef,
  input,
  model,
  viewChild,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { formatBytes } from './words';

let choices = 0;

/**
 * One file to choose, in the look of the submit page's files: its label, a button that opens the
 * browser's picker (the input itself hidden, as on the "From files" card), then the file chosen
 * with its size and a button to remove it, or "No file chosen". The file is a two-way binding:
 * `<sl-file-choice label="Terrain raster (.tif)" accept=".tif" testId="terrain-raster" [(file)]="terrain" />`.
 * The test id names the hidden input, so that a browser test sets its files.
 */
@Component({
  selector: 'sl-file-choice',
  imports: [MatButtonModule, MatIconModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './file-choice.html',
  styleUrl: './file-choice.scss',
})
export class FileChoice {
  /** What the file is, with the kinds it may be: "Alignment (.geojson)". */
  readonly label = input.required<string>();
  /** The input's accept list: ".tif,.tiff". */
  readonly accept = input('');
  /** The data-testid of the hidden input. */
  readonly testId = input<string | null>(null);
  readonly file = model<File | null>(null);

  protected readonly id = `file-choice-${++choices}`;
  protected readonly bytes = formatBytes;
  private readonly picker = viewChild.required<ElementRef<HTMLInputElement>>('picker');

  protected browse(): void {
    this.picker().nativeElement.click();
  }

  protected pick(e: Event): void {
    const el = e.target as HTMLInputElement;
    const f = el.files?.[0];
    if (f) this.file.set(f);
    el.value = ''; // so that the same file chosen again is seen
  }

  protected clear(): void {
    this.file.set(null);
    this.picker().nativeElement.value = '';
  }
}
