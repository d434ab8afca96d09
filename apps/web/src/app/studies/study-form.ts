import {
  ChangeDetectionStrategy,
  Component,
  computed,
  DestroyRef,
  effect,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import {
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  Validators,
  type AbstractControl,
  type ValidationErrors,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import type { Section } from '@scarpline/core/model';
import type { Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { StudiesApi } from './studies-api';
import {
  caseChoices,
  DEFAULT_REALISATIONS,
  defaultRange,
  distributionText,
  fieldOf,
  initialValue,
  KIND_WORDS,
  studyRequest,
  targetChoices,
  type StudyError,
  type StudyField,
  type StudyFormValue,
} from './study-model';
import type { Study, StudyKind } from './study-types';

/** The most realisations a section file may ask for (schemas/section.schema.json), and searching. */
export const MAX_REALISATIONS = 100_000;
export const MAX_SEARCHED_REALISATIONS = 5_000;

/** The words of a control's first error: the API's, then the form's own checks. */
export function errorWords(errors: ValidationErrors | null): string {
  if (!errors) return '';
  const server: unknown = errors['server'];
  if (typeof server === 'string') return server;
  if (errors['required']) return 'Give a value.';
  if (errors['min']) return `At least ${(errors['min'] as { min: number }).min}.`;
  if (errors['max']) return `At most ${(errors['max'] as { max: number }).max}.`;
  if (errors['order']) return 'The range’s end must be above its start.';
  if (errors['searched'])
    return `At most ${MAX_SEARCHED_REALISATIONS} when the surface is searched in every realisation.`;
  return 'Check this value.';
}

const int = (min: number, max: number) => [
  Validators.required,
  Validators.min(min),
  Validators.max(max),
  Validators.pattern(/^-?\d+$/),
];

/**
 * Ask for a study of the section's current run: a probabilistic analysis (sampling method,
 * realisations, seed, surface; the section's own random variables, shown), a sensitivity (one
 * variable at a time, of a case or all), or solving for the value of one input at which a
 * case's FS is a target (the required FS unless changed) within a range. Values are SI, as the
 * section is stored. The API's located errors are put on their fields.
 */
@Component({
  selector: 'sl-study-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatRadioModule,
    MatSelectModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './study-form.html',
  styleUrl: './study-form.scss',
})
export class StudyForm {
  private readonly api = inject(StudiesApi);

  readonly sectionId = input.required<number>();
  /** The section's current input (SI). */
  readonly section = input.required<Section>();
  /** Emits the study as the API answers it (queued). */
  readonly asked = output<Study>();

  protected readonly kinds = Object.entries(KIND_WORDS) as [StudyKind, string][];
  protected readonly variables = computed(() => this.section().probability?.variables ?? []);
  protected readonly correlations = computed(() => this.section().probability?.correlations ?? []);
  protected readonly targets = computed(() => targetChoices(this.section()));
  protected readonly cases = computed(() => caseChoices(this.section()));
  protected readonly manyCases = computed(() => this.cases().length > 1);
  protected readonly distributionText = distributionText;

  protected readonly form = new FormGroup({
    kind: new FormControl<StudyKind>('probability', { nonNullable: true }),
    method: new FormControl<'monte-carlo' | 'latin-hypercube'>('monte-carlo', {
      nonNullable: true,
    }),
    realisations: new FormControl<number | null>(null, int(10, MAX_REALISATIONS)),
    seed: new FormControl<number | null>(null, int(0, 4_294_967_295)),
    surface: new FormControl<'critical' | 'search'>('critical', { nonNullable: true }),
    case: new FormControl<string>('', { nonNullable: true }),
    target: new FormControl<string>('', { nonNullable: true }),
    targetFs: new FormControl<number | null>(null, [Validators.min(0.01), Validators.max(100)]),
    from: new FormControl<number | null>(null, Validators.required),
    to: new FormControl<number | null>(null, Validators.required),
    /** Holds the API's errors about the variables (there is nothing to type here). */
    variables: new FormControl<null>(null),
  });

  protected readonly kind = signal<StudyKind>('probability');
  protected readonly busy = signal(false);
  protected readonly problem = signal<Problem | null>(null);
  /** The API's errors that no field holds. */
  protected readonly unplaced = signal<StudyError[]>([]);
  protected readonly notice = signal<string | null>(null);
  /** The API's error about the variables, shown above their list. */
  protected readonly variablesError = signal<string | null>(null);

  /** The probabilistic kinds need variables: the section's own. */
  protected readonly needsVariables = computed(
    () => this.kind() !== 'solve' && this.variables().length === 0,
  );

  constructor() {
    // A new section or run: the form starts again from its values.
    effect(() => this.reset(this.section()));
    const subs = [
      this.form.controls.kind.valueChanges.subscribe((k) => {
        this.kind.set(k);
        this.problem.set(null);
        this.unplaced.set([]);
        this.notice.set(null);
      }),
      // The target FS follows the case (its required FS) until it is typed.
      this.form.controls.case.valueChanges.subscribe((name) => {
        const fs = this.form.controls.targetFs;
        if (fs.dirty) return;
        const cases = this.cases();
        const c = cases.length === 1 ? cases[0] : cases.find((x) => x.name === name);
        fs.setValue(c?.requiredFs ?? null);
      }),
      // The realisations follow the surface (the section's own, or the default) until typed.
      this.form.controls.surface.valueChanges.subscribe((surface) => {
        const n = this.form.controls.realisations;
        if (n.dirty) return;
        const own = this.section().probability;
        n.setValue(own?.surface === surface ? own.realisations : DEFAULT_REALISATIONS[surface]);
      }),
      // The range follows the target until it is typed.
      this.form.controls.target.valueChanges.subscribe((t) => {
        const { from, to } = this.form.controls;
        if (from.dirty || to.dirty) return;
        const [a, b] = defaultRange(this.targets().find((x) => x.target === t)?.value ?? 0);
        from.setValue(a);
        to.setValue(b);
      }),
    ];
    inject(DestroyRef).onDestroy(() => subs.forEach((s) => s.unsubscribe()));
  }

  private reset(s: Section): void {
    const v = initialValue(s);
    this.form.reset(v);
    this.kind.set(v.kind);
    this.problem.set(null);
    this.unplaced.set([]);
    this.notice.set(null);
    this.variablesError.set(null);
  }

  protected control(name: StudyField): AbstractControl {
    return this.form.controls[name];
  }

  protected readonly errorWords = errorWords;

  /** The controls the kind asks for (the others are not checked). */
  private fieldsOf(kind: StudyKind): StudyField[] {
    switch (kind) {
      case 'probability':
        return ['method', 'realisations', 'seed', 'surface'];
      case 'sensitivity':
        return ['case'];
      case 'solve':
        return ['target', 'case', 'targetFs', 'from', 'to'];
    }
  }

  protected submit(): void {
    this.notice.set(null);
    this.problem.set(null);
    this.unplaced.set([]);
    this.variablesError.set(null);
    const kind = this.kind();
    const fields = this.fieldsOf(kind).map((f) => this.control(f));
    for (const c of fields) {
      c.setErrors(null);
      c.updateValueAndValidity({ emitEvent: false });
      c.markAsTouched();
    }
    const { from, to, realisations, surface } = this.form.controls;
    const n = realisations.value;
    if (
      kind === 'probability' &&
      surface.value === 'search' &&
      n !== null &&
      n > MAX_SEARCHED_REALISATIONS
    ) {
      realisations.setErrors({ ...(realisations.errors ?? {}), searched: true });
    }
    if (kind === 'solve' && from.value !== null && to.value !== null && to.value <= from.value) {
      to.setErrors({ order: true });
    }
    if (fields.some((c) => c.invalid)) {
      this.notice.set('Some values need changing: see the marked fields.');
      return;
    }
    if (this.needsVariables()) return;
    const value = this.form.getRawValue() as StudyFormValue & { variables: null };
    const request = studyRequest(this.section(), value);
    this.busy.set(true);
    this.api.ask(this.sectionId(), request).subscribe({
      next: (study) => {
        this.busy.set(false);
        this.asked.emit(study);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        const p = toProblem(err);
        this.problem.set(p);
        this.unplaced.set(this.place(p.errors ?? []));
      },
    });
  }

  /** Puts each error on its field; gives back those that belong to none. */
  private place(errors: readonly StudyError[]): StudyError[] {
    const rest: StudyError[] = [];
    for (const e of errors) {
      const f = fieldOf(e);
      if (f === 'variables') {
        this.variablesError.set(e.message);
      } else if (f !== null && f !== 'kind') {
        const c = this.control(f);
        c.setErrors({ ...(c.errors ?? {}), server: e.message });
        c.markAsTouched();
      } else {
        rest.push(e);
      }
    }
    return rest;
  }
}
