import { NgTemplateOutlet } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  type ElementRef,
  inject,
  input,
  signal,
  viewChild,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of, switchMap, type Observable } from 'rxjs';
import { BATCH_FORMAT } from '@scarpline/core/formats';
import type { LocatedError, Problem } from '../core/models';
import { locatedText, toProblem } from '../core/problem';
import { ProjectsApi } from '../projects/projects-api';
import type { SubmittedBatch } from './batch-types';
import { BatchesApi } from './batches-api';
import { TerrainSubmit } from './terrain-submit';
import { formatBytes } from './words';

/** The file names the upload takes. */
export const ACCEPTED = /\.(ya?ml|json|geojson|xml)$/i;
export const ACCEPT_ATTR = '.yaml,.yml,.json,.geojson,.xml';

export type PastedKind = 'batch' | 'geojson' | 'landxml' | 'json' | 'yaml';

export interface Pasted {
  kind: PastedKind;
  /** The file name it is uploaded as; the batch JSON goes as the body instead. */
  fileName: string;
  /** What the page says it is. */
  label: string;
}

/**
 * What pasted text is: LandXML cross-sections (XML), a batch in JSON (posted as the batch
 * itself), a GeoJSON corridor,
 * other JSON, or YAML (uploaded as a file of that kind, so the API reads it like a file).
 */
export function detectPasted(text: string): Pasted {
  const t = text.trim();
  if (t.startsWith('<')) {
    return { kind: 'landxml', fileName: 'pasted.xml', label: 'LandXML cross-sections' };
  }
  if (t.startsWith('{') || t.startsWith('[')) {
    let data: unknown;
    try {
      data = JSON.parse(t);
    } catch {
      // broken JSON: uploaded as a file, so the API locates the syntax error
      return /"type"\s*:\s*"FeatureCollection"/.test(t.slice(0, 4000))
        ? { kind: 'geojson', fileName: 'pasted.geojson', label: 'GeoJSON corridor' }
        : { kind: 'json', fileName: 'pasted.json', label: 'JSON' };
    }
    const d =
      data && typeof data === 'object' && !Array.isArray(data)
        ? (data as Record<string, unknown>)
        : {};
    if (d['type'] === 'FeatureCollection') {
      return { kind: 'geojson', fileName: 'pasted.geojson', label: 'GeoJSON corridor' };
    }
    if (d['format'] === BATCH_FORMAT) {
      return { kind: 'batch', fileName: 'batch.json', label: 'batch (JSON)' };
    }
    return { kind: 'json', fileName: 'pasted.json', label: 'JSON' };
  }
  return { kind: 'yaml', fileName: 'pasted.yaml', label: 'YAML' };
}

function kindOfFile(name: string): string {
  if (/\.geojson$/i.test(name)) return 'GeoJSON';
  if (/\.xml$/i.test(name)) return 'LandXML';
  if (/\.ya?ml$/i.test(name)) return 'YAML';
  return 'JSON';
}

/** The text's [start, end) offsets of a line (counted from 1). */
export function lineRange(text: string, line: number): [number, number] {
  let start = 0;
  for (let l = 1; l < line; l++) {
    const next = text.indexOf('\n', start);
    if (next < 0) return [text.length, text.length];
    start = next + 1;
  }
  const end = text.indexOf('\n', start);
  return [start, end < 0 ? text.length : end];
}

/** How the last submission went out: to tell which errors point into the pasted text. */
type Sent = { from: 'files' } | { from: 'text'; fileName: string };

/**
 * Submits a batch to a project: files (chosen or dropped) or pasted text. The API's located
 * errors are listed beside the input; nothing given is lost on an error.
 */
@Component({
  selector: 'sl-batch-submit',
  imports: [
    NgTemplateOutlet,
    RouterLink,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    TerrainSubmit,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './batch-submit.html',
  styleUrl: './batch-submit.scss',
})
export class BatchSubmit {
  private readonly api = inject(BatchesApi);
  private readonly router = inject(Router);
  private readonly snack = inject(MatSnackBar);
  private readonly projects = inject(ProjectsApi);

  /** The project id from the route. */
  readonly id = input.required<string>();
  protected readonly projectId = computed(() => Number(this.id()));
  protected readonly project = toSignal(
    toObservable(this.projectId).pipe(
      switchMap((id) =>
        this.projects.get(id).pipe(
          map((p) => p.name),
          catchError(() => of(null)),
        ),
      ),
    ),
    { initialValue: null },
  );

  protected readonly accept = ACCEPT_ATTR;
  protected readonly files = signal<File[]>([]);
  protected readonly rejected = signal<string[]>([]);
  protected readonly text = signal('');
  /** Which input to send when both hold something: the one last changed, or the user's pick. */
  protected readonly choice = signal<'files' | 'text'>('files');
  protected readonly dragging = signal(false);
  protected readonly busy = signal(false);
  protected readonly problem = signal<Problem | null>(null);
  protected readonly errors = signal<LocatedError[]>([]);
  protected readonly sent = signal<Sent | null>(null);

  private readonly fileInput = viewChild<ElementRef<HTMLInputElement>>('fileInput');
  private readonly pasteInput = viewChild<ElementRef<HTMLTextAreaElement>>('pasteInput');

  protected readonly pasted = computed(() =>
    this.text().trim() ? detectPasted(this.text()) : null,
  );
  protected readonly both = computed(() => this.files().length > 0 && this.pasted() !== null);
  protected readonly source = computed<'files' | 'text' | null>(() => {
    if (this.both()) return this.choice();
    if (this.files().length > 0) return 'files';
    return this.pasted() ? 'text' : null;
  });
  protected readonly totalBytes = computed(() => this.files().reduce((n, f) => n + f.size, 0));
  protected readonly textBytes = computed(() => new Blob([this.text()]).size);
  protected readonly textLines = computed(() => this.text().split('\n').length);
  /** Located errors that point into the pasted text (clicking one selects its line). */
  protected readonly inText = computed(() => {
    const s = this.sent();
    return s?.from === 'text' ? s.fileName : null;
  });

  protected readonly bytes = formatBytes;
  protected readonly kindOf = kindOfFile;
  protected readonly located = locatedText;

  protected addFiles(list: FileList | readonly File[] | null): void {
    if (!list) return;
    const add: File[] = [];
    const bad: string[] = [];
    for (const f of Array.from(list)) {
      if (ACCEPTED.test(f.name)) add.push(f);
      else bad.push(f.name);
    }
    this.rejected.set(bad);
    if (add.length === 0) return;
    // A file chosen again by the same name replaces the earlier one.
    const names = new Set(add.map((f) => f.name));
    this.files.update((old) => [...old.filter((f) => !names.has(f.name)), ...add]);
    this.choice.set('files');
  }

  protected onFileInput(e: Event): void {
    const el = e.target as HTMLInputElement;
    this.addFiles(el.files);
    el.value = ''; // so that choosing the same file again is seen
  }

  protected browse(): void {
    this.fileInput()?.nativeElement.click();
  }

  protected onDragOver(e: DragEvent): void {
    e.preventDefault();
    if (e.dataTransfer) e.dataTransfer.dropEffect = 'copy';
    this.dragging.set(true);
  }

  protected onDrop(e: DragEvent): void {
    e.preventDefault();
    this.dragging.set(false);
    this.addFiles(e.dataTransfer?.files ?? null);
  }

  protected remove(f: File): void {
    this.files.update((old) => old.filter((x) => x !== f));
  }

  protected clearFiles(): void {
    this.files.set([]);
    this.rejected.set([]);
  }

  protected onText(v: string): void {
    this.text.set(v);
    this.choice.set('text');
  }

  protected submit(): void {
    if (this.busy()) return;
    const source = this.source();
    this.problem.set(null);
    this.errors.set([]);
    if (source === null) {
      this.problem.set({
        title: 'Nothing to send',
        status: 0,
        detail: 'Choose or drop files, or paste a batch, a corridor or sections, first.',
      });
      return;
    }
    let request: Observable<SubmittedBatch>;
    if (source === 'files') {
      this.sent.set({ from: 'files' });
      request = this.api.upload(this.projectId(), this.files());
    } else {
      const p = detectPasted(this.text());
      this.sent.set({ from: 'text', fileName: p.fileName });
      request =
        p.kind === 'batch'
          ? this.api.submitJson(this.projectId(), this.text())
          : this.api.upload(this.projectId(), [
              new File([this.text()], p.fileName, {
                type: p.kind === 'yaml' ? 'application/yaml' : 'application/json',
              }),
            ]);
    }
    this.busy.set(true);
    request.subscribe({
      next: (b) => {
        this.busy.set(false);
        const w = b.warnings?.filter((m) => m.severity === 'warning').length ?? 0;
        this.snack.open(
          `Batch ${b.name} submitted: ${b.progress.total} sections${w ? `, ${w} warnings in the input` : ''}.`,
          'OK',
          { duration: 6000 },
        );
        void this.router.navigate(['/batches', b.id]);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.problem.set(p);
        this.errors.set(p.errors ?? []);
      },
    });
  }

  /** Whether a located error points into the pasted text (and so can select its line). */
  protected pointsIntoText(e: LocatedError): boolean {
    return this.inText() !== null && e.file === this.inText() && e.line !== undefined;
  }

  /** Selects the error's line in the textarea and scrolls it into view. */
  protected showLine(e: LocatedError): void {
    const ta = this.pasteInput()?.nativeElement;
    if (!ta || e.line === undefined) return;
    const [start, end] = lineRange(ta.value, e.line);
    ta.focus();
    ta.setSelectionRange(start, end);
    const lh = parseFloat(getComputedStyle(ta).lineHeight) || 18;
    ta.scrollTop = Math.max(0, (e.line - 3) * lh);
  }
}
