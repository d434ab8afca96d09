import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { NgTemplateOutlet } from '@angular/common';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import type { LocatedError, Problem } from '../core/models';
import { fromSi, toSi } from '@scarpline/core/units';
import { caseKindWords } from '../shared/case-kinds';
import { plain, unitOf } from './format';
import { toProblem } from '../core/problem';
import {
  buildModel,
  buildPatch,
  errorText,
  keepCase,
  mayRemove,
  newPoint,
  newStressPoint,
  placeErrors,
  removeCase,
  type CaseEdit,
  type Field,
  type PointsEdit,
  type RerunModel,
} from './rerun-model';
import type { Point, SectionView } from './section-types';
import { SectionsApi } from './sections-api';
import { REINFORCEMENT_KIND_WORDS } from './reinforcement-table';

/**
 * Re-run a section with edited parameters: each material's unit weights and strength, the
 * water, the required FS, and for a section with design cases each case's own values (its
 * required FS, kh and kv, its earthquake, the materials it sets its own properties for); a
 * case can be removed. Values are SI, as the API takes edits; only what changed is sent, as a
 * JSON merge patch. The API's located errors are shown by their fields and in a list.
 */
@Component({
  selector: 'sl-rerun-form',
  imports: [
    NgTemplateOutlet,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './rerun-form.html',
  styleUrl: './rerun-form.scss',
})
export class RerunForm {
  private readonly api = inject(SectionsApi);

  readonly section = input.required<SectionView>();
  /** Emits the section as the API answers it, queued as its next run. */
  readonly queued = output<SectionView>();

  /** Rebuilt only when another section or another run is shown, never while editing. */
  private readonly source = computed(
    () => {
      const s = this.section();
      return { id: s.id, run: s.run, input: s.input };
    },
    { equal: (a, b) => a.id === b.id && a.run === b.run },
  );
  protected readonly model = computed<RerunModel>(() => buildModel(this.source().input));

  protected readonly busy = signal(false);
  protected readonly problem = signal<Problem | null>(null);
  protected readonly located = signal<LocatedError[]>([]);
  protected readonly notice = signal<string | null>(null);
  protected readonly queuedRun = signal<number | null>(null);

  protected readonly active = computed(() => {
    const s = this.section().status;
    return s === 'queued' || s === 'running';
  });

  protected readonly errorText = errorText;
  protected readonly kindWords = caseKindWords;
  protected readonly elementWords = REINFORCEMENT_KIND_WORDS;

  /** For a file in US units: the value of a field in the file's own units. */
  protected inFileUnits(f: Field): string {
    const v = f.control.value;
    if (this.section().input.units !== 'us' || !f.quantity || typeof v !== 'number') return '';
    const si = f.inFileUnit ? toSi(v, f.quantity, 'si') : v;
    return `= ${plain(fromSi(si, f.quantity, 'us'), 3)} ${unitOf('us', f.quantity)}`;
  }

  /** A case may be removed while another case stays. */
  protected mayRemove(c: CaseEdit): boolean {
    return mayRemove(this.model(), c);
  }

  protected removeCase(c: CaseEdit): void {
    removeCase(this.model(), c);
  }

  protected keepCase(c: CaseEdit): void {
    keepCase(c);
  }

  protected fieldId(scope: string, f: Field): string {
    return `rerun-${scope}-${f.key}`.replace(/[^A-Za-z0-9_-]/g, '_');
  }

  protected addPoint(): void {
    const line = this.model().water.line;
    if (!line) return;
    const last = line.controls[line.length - 1]?.getRawValue();
    const p: Point | null =
      last && typeof last.x === 'number' && typeof last.y === 'number' ? [last.x, last.y] : null;
    line.push(newPoint(p));
    line.markAsDirty();
  }

  protected removePoint(i: number): void {
    const line = this.model().water.line;
    if (!line) return;
    line.removeAt(i);
    line.markAsDirty();
  }

  /** Adds a point of a shear–normal strength at the end (a copy of the last, to edit). */
  protected addStressPoint(p: PointsEdit): void {
    const last = p.array.controls[p.array.length - 1]?.getRawValue();
    const at: Point | null =
      last && typeof last.x === 'number' && typeof last.y === 'number' ? [last.x, last.y] : null;
    p.array.push(newStressPoint(at));
    p.array.markAsDirty();
  }

  protected removeStressPoint(p: PointsEdit, i: number): void {
    p.array.removeAt(i);
    p.array.markAsDirty();
  }

  /** Puts the stored values back. */
  protected reset(): void {
    const m = this.model();
    const resetPoints = (p: PointsEdit | null) => {
      if (!p) return;
      p.array.clear();
      for (const pt of p.original) p.array.push(newStressPoint(pt));
    };
    for (const mat of m.materials) {
      for (const f of mat.fields) f.control.reset(f.shown);
      resetPoints(mat.points);
    }
    m.water.unitWeight.control.reset(m.water.unitWeight.shown);
    m.water.ru?.control.reset(m.water.ru.shown);
    m.requiredFs.control.reset(m.requiredFs.shown);
    for (const r of m.reinforcement) for (const f of r.fields) f.control.reset(f.shown);
    for (const c of m.cases) {
      keepCase(c);
      for (const f of c.fields) f.control.reset(f.shown);
      for (const mat of c.materials) resetPoints(mat.points);
    }
    const line = m.water.line;
    if (line && m.water.originalLine) {
      line.clear();
      for (const p of m.water.originalLine) line.push(newPoint(p));
    }
    this.problem.set(null);
    this.located.set([]);
    this.notice.set(null);
  }

  protected submit(): void {
    const m = this.model();
    this.notice.set(null);
    this.problem.set(null);
    this.located.set([]);
    m.form.markAllAsTouched();
    if (m.form.invalid) {
      this.notice.set('Some values are out of range: see the marked fields.');
      return;
    }
    const patch = buildPatch(m);
    if (Object.keys(patch).length === 0) {
      this.notice.set('Nothing has changed: edit a value to run the section again.');
      return;
    }
    this.busy.set(true);
    this.api.rerun(this.section().id, patch).subscribe({
      next: (view) => {
        this.busy.set(false);
        this.queuedRun.set(view.run);
        this.queued.emit(view);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.problem.set(p);
        if (p.errors?.length) {
          placeErrors(m, p.errors);
          this.located.set(p.errors);
        }
      },
    });
  }
}
