import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router } from '@angular/router';
import type { LocatedError, Problem } from '../core/models';
import { toProblem } from '../core/problem';
import { BatchesApi } from './batches-api';
import { FileChoice } from './file-choice';

/** What the form gives: the numbers as typed, the files as chosen. */
export interface TerrainForm {
  terrain: File | null;
  alignment: File | null;
  settings: File | null;
  rock: File | null;
  topMaterial: string;
  rockMaterial: string;
  start: string;
  every: string;
  left: string;
  right: string;
  spacing: string;
  waterDepth: string;
}

/** A YAML string, quoted (a file name or a material may hold any character). */
const quoted = (s: string) => JSON.stringify(s);

/**
 * The terrain job (scarpline-terrain/1) of the form, as YAML: the files by their names, the
 * numbers as given (the API checks them and locates what is wrong by setting).
 *
 * @example terrainJob(form) // → 'format: scarpline-terrain/1\nterrain: "dem.tif"\n…'
 */
export function terrainJob(f: TerrainForm): string {
  // a number as a number; anything else as the text typed, for the API to refuse by name
  const value = (v: string) => (Number.isFinite(Number(v)) ? String(Number(v)) : quoted(v));
  const given = (v: string) => v.trim() !== '';
  const lines = [
    'format: scarpline-terrain/1',
    `terrain: ${quoted(f.terrain?.name ?? '')}`,
    `alignment: ${quoted(f.alignment?.name ?? '')}`,
  ];
  if (given(f.start)) lines.push(`start: ${value(f.start)}`);
  lines.push(`stations: { every: ${given(f.every) ? value(f.every) : 'null'} }`);
  for (const [key, v] of [
    ['left', f.left],
    ['right', f.right],
    ['spacing', f.spacing],
  ] as const)
    lines.push(`${key}: ${given(v) ? value(v) : 'null'}`);
  lines.push(`template: ${quoted(f.settings?.name ?? '')}`);
  if (f.rock && given(f.topMaterial) && given(f.rockMaterial)) {
    lines.push('strata:');
    lines.push(`  - material: ${quoted(f.topMaterial.trim())}`);
    lines.push(
      `  - { material: ${quoted(f.rockMaterial.trim())}, raster: ${quoted(f.rock.name)} }`,
    );
  }
  if (given(f.waterDepth)) lines.push(`water: { depth: ${value(f.waterDepth)} }`);
  return `${lines.join('\n')}\n`;
}

/**
 * Sections cut from a terrain model: a GeoTIFF elevation raster and an alignment (GeoJSON), the
 * stations every interval, the half-widths and the sample spacing, the corridor settings (a
 * batch without its sections), and optionally the top of a lower stratum as a raster and a
 * groundwater depth. Sent as a terrain job with its files; the API's located errors (a sample
 * without a value by station and offset) listed.
 */
@Component({
  selector: 'sl-terrain-submit',
  imports: [
    FileChoice,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './terrain-submit.html',
  styleUrl: './batch-submit.scss',
})
export class TerrainSubmit {
  private readonly api = inject(BatchesApi);
  private readonly router = inject(Router);
  private readonly snack = inject(MatSnackBar);

  readonly projectId = input.required<number>();

  protected readonly terrain = signal<File | null>(null);
  protected readonly alignment = signal<File | null>(null);
  protected readonly settings = signal<File | null>(null);
  protected readonly rock = signal<File | null>(null);
  protected readonly topMaterial = signal('');
  protected readonly rockMaterial = signal('');
  protected readonly start = signal('0');
  protected readonly every = signal('20');
  protected readonly left = signal('40');
  protected readonly right = signal('40');
  protected readonly spacing = signal('1');
  protected readonly waterDepth = signal('');
  /** The job's numbers, in the order the card asks for them. */
  protected readonly numbers = [
    { label: 'Start chainage', testId: 'terrain-start', value: this.start },
    { label: 'A section every', testId: 'terrain-every', value: this.every },
    { label: 'Half-width left', testId: 'terrain-left', value: this.left },
    { label: 'Half-width right', testId: 'terrain-right', value: this.right },
    { label: 'Sample spacing', testId: 'terrain-spacing', value: this.spacing },
    { label: 'Groundwater depth (optional)', testId: 'terrain-water', value: this.waterDepth },
  ];
  protected readonly busy = signal(false);
  protected readonly problem = signal<Problem | null>(null);
  protected readonly errors = signal<LocatedError[]>([]);

  protected readonly ready = computed(
    () => this.terrain() !== null && this.alignment() !== null && this.settings() !== null,
  );

  protected value(e: Event): string {
    return (e.target as HTMLInputElement).value;
  }

  protected submit(): void {
    if (this.busy()) return;
    this.problem.set(null);
    this.errors.set([]);
    const form: TerrainForm = {
      terrain: this.terrain(),
      alignment: this.alignment(),
      settings: this.settings(),
      rock: this.rock(),
      topMaterial: this.topMaterial(),
      rockMaterial: this.rockMaterial(),
      start: this.start(),
      every: this.every(),
      left: this.left(),
      right: this.right(),
      spacing: this.spacing(),
      waterDepth: this.waterDepth(),
    };
    if (!form.terrain || !form.alignment || !form.settings) {
      this.problem.set({
        title: 'Nothing to cut',
        status: 0,
        detail: 'Choose the terrain raster, the alignment and the corridor settings first.',
      });
      return;
    }
    const files = [form.terrain, form.alignment, form.settings];
    if (form.rock && form.topMaterial.trim() && form.rockMaterial.trim()) files.push(form.rock);
    this.busy.set(true);
    this.api.uploadTerrain(this.projectId(), terrainJob(form), files).subscribe({
      next: (b) => {
        this.busy.set(false);
        this.snack.open(
          `Batch ${b.name} submitted: ${b.progress.total} sections cut from ${form.terrain?.name}.`,
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

  /** Where an error is: its file and setting, and for a sample its station and offset. */
  protected where(e: LocatedError & { station?: number; offset?: number }): string {
    const at = [e.file ?? ''];
    if (e.path) at.push(e.path);
    if (e.station !== undefined) at.push(`station ${e.station}`);
    if (e.offset !== undefined) at.push(`offset ${e.offset}`);
    return at.filter(Boolean).join(', ');
  }
}
