import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  signal,
  ViewEncapsulation,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { DomSanitizer, type SafeHtml } from '@angular/platform-browser';
import { map, switchMap } from 'rxjs';
import { loadState, type Loaded } from '../shared/load-state';
import { PageState } from '../shared/page-state';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { ReportsApi } from '../reports/reports-api';
import { SectionsApi } from './sections-api';

interface Drawing {
  text: string;
  html: SafeHtml;
}

/**
 * The cross-section as the server draws it for the current run (of one design case when
 * named) (strata, water, loads, the
 * critical surfaces, slices, the FS map of the search, axes, legend, caution), inlined so it
 * scales with the page, with a download of the same SVG file and of the server's PNG rendering
 * of it, and of the section's PDF report. Reloads when `version` changes.
 */
@Component({
  selector: 'sl-section-drawing',
  imports: [MatButtonModule, MatButtonToggleModule, MatIconModule, PageState],
  changeDetection: ChangeDetectionStrategy.OnPush,
  // The SVG is inserted as HTML, so its sizing rules must reach outside the view's scope.
  encapsulation: ViewEncapsulation.None,
  template: `
    <div class="sl-drawing-tools">
      <mat-button-toggle-group
        [value]="fit() ? 'fit' : 'full'"
        (change)="fit.set($event.value === 'fit')"
        aria-label="Drawing size"
        hideSingleSelectionIndicator
      >
        <mat-button-toggle value="fit">Fit width</mat-button-toggle>
        <mat-button-toggle value="full">Full size</mat-button-toggle>
      </mat-button-toggle-group>
      <button
        mat-stroked-button
        type="button"
        data-testid="download-svg"
        [disabled]="loaded().state !== 'ready'"
        (click)="download()"
      >
        <mat-icon aria-hidden="true">download</mat-icon>
        Download SVG
      </button>
      <button
        mat-stroked-button
        type="button"
        data-testid="download-png"
        [disabled]="loaded().state !== 'ready' || pngBusy()"
        (click)="downloadPng()"
      >
        <mat-icon aria-hidden="true">image</mat-icon>
        Download PNG
      </button>
      <button
        mat-stroked-button
        type="button"
        data-testid="download-section-report"
        [disabled]="reportBusy()"
        (click)="downloadReport()"
      >
        <mat-icon aria-hidden="true">picture_as_pdf</mat-icon>
        {{ reportBusy() ? 'Preparing the report…' : 'Report (PDF)' }}
      </button>
    </div>
    @if (pngFailed()) {
      <p class="sl-drawing-png-error" role="alert">The PNG could not be made: {{ pngFailed() }}</p>
    }
    @if (reportProblem(); as p) {
      <p class="sl-drawing-png-error" role="alert" data-testid="section-report-problem">
        The report could not be made: {{ p.title }}{{ p.detail ? ' — ' + p.detail : '' }}
      </p>
    }
    @switch (loaded().state) {
      @case ('ready') {
        <div
          class="sl-drawing-box"
          [class.sl-drawing-fit]="fit()"
          data-testid="section-drawing"
          tabindex="0"
          role="region"
          [attr.aria-label]="
            caseName() === null
              ? 'Cross-section drawing'
              : 'Cross-section drawing of the case ' + caseName()
          "
          [innerHTML]="drawing()?.html"
        ></div>
      }
      @default {
        <div data-testid="section-drawing-state" class="sl-drawing-state">
          <sl-page-state
            [state]="state()"
            [problem]="problem()"
            loadingText="Drawing the section…"
            (retry)="retry()"
          />
        </div>
      }
    }
  `,
  styles: `
    sl-section-drawing {
      display: block;
    }
    .sl-drawing-tools {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      justify-content: flex-end;
      margin-bottom: 8px;
    }
    .sl-drawing-box {
      overflow: auto;
      border: 1px solid var(--sl-line);
      border-radius: 6px;
      background: #fff;
    }
    .sl-drawing-box > svg {
      display: block;
    }
    .sl-drawing-box.sl-drawing-fit > svg {
      width: 100%;
      height: auto;
    }
    .sl-drawing-state {
      min-height: 120px;
    }
    .sl-drawing-png-error {
      margin: 0 0 8px;
      text-align: right;
      color: var(--sl-fail);
    }
  `,
})
export class SectionDrawing {
  private readonly api = inject(SectionsApi);
  private readonly sanitizer = inject(DomSanitizer);
  private readonly reports = inject(ReportsApi);

  readonly sectionId = input.required<number>();
  /** Changes when the run or its status changes: the drawing is fetched again. */
  readonly version = input<string>('');
  /** The name of the downloaded file. */
  readonly fileName = input<string>('section.svg');
  /** The design case to draw (the section as it sees it); null: the result as stored. */
  readonly caseName = input<string | null>(null);

  protected readonly fit = signal(true);
  protected readonly pngBusy = signal(false);
  protected readonly pngFailed = signal<string | null>(null);
  protected readonly reportBusy = signal(false);
  protected readonly reportProblem = signal<Problem | null>(null);
  private readonly tries = signal(0);

  private readonly request = computed(() => ({
    id: this.sectionId(),
    caseName: this.caseName(),
    version: this.version(),
    tries: this.tries(),
  }));

  protected readonly loaded = toSignal(
    toObservable(this.request).pipe(
      switchMap(({ id, caseName }) =>
        loadState(
          this.api.plotSvg(id, caseName).pipe(
            // Our own server's drawing of the solver's result: trusted markup, inlined as is.
            map((text): Drawing => ({ text, html: this.sanitizer.bypassSecurityTrustHtml(text) })),
          ),
        ),
      ),
    ),
    { initialValue: { state: 'loading' } satisfies Loaded<Drawing> },
  );
  protected readonly drawing = computed(() => {
    const l = this.loaded();
    return l.state === 'ready' ? l.value : null;
  });
  protected readonly state = computed(() => this.loaded().state);
  protected readonly problem = computed(() => {
    const l = this.loaded();
    return l.state === 'error' ? l.problem : null;
  });

  protected retry(): void {
    this.tries.update((n) => n + 1);
  }

  protected download(): void {
    const d = this.drawing();
    if (!d) return;
    this.save(new Blob([d.text], { type: 'image/svg+xml' }), this.fileName());
  }

  /** The server's PNG of the same drawing (same case), saved under the SVG's name as .png. */
  protected downloadPng(): void {
    this.pngBusy.set(true);
    this.pngFailed.set(null);
    this.api.plotPng(this.sectionId(), this.caseName()).subscribe({
      next: (png) => {
        this.pngBusy.set(false);
        this.save(png, this.fileName().replace(/(\.svg)?$/i, '.png'));
      },
      error: (err: unknown) => {
        this.pngBusy.set(false);
        this.pngFailed.set(
          err instanceof HttpErrorResponse ? err.statusText || 'no answer' : String(err),
        );
      },
    });
  }

  /** The section's PDF report of its current run, under the name the server gives it. */
  protected downloadReport(): void {
    this.reportBusy.set(true);
    this.reportProblem.set(null);
    this.reports.sectionPdf(this.sectionId()).subscribe({
      next: (d) => {
        this.reportBusy.set(false);
        this.save(d.blob, d.fileName);
      },
      error: (err: unknown) => {
        this.reportBusy.set(false);
        this.reportProblem.set(toProblem(err));
      },
    });
  }

  private save(blob: Blob, name: string): void {
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = name;
    document.body.appendChild(a);
    a.click();
    a.remove();
    setTimeout(() => URL.revokeObjectURL(url), 0);
  }
}
